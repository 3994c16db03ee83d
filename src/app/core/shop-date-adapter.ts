import { inject, type Provider } from '@angular/core';
import { MAT_DATE_FORMATS, type MatDateFormats } from '@angular/material/core';
import { provideLuxonDateAdapter } from '@angular/material-luxon-adapter';
import type { DateTime } from 'luxon';

import { datePattern, parsePatterns } from '../../../shared/dates';
import { Session } from './session';

/**
 * Every date field reads and shows the shop's one date pattern (from its locale setting), the
 * same the shopDate pipe writes. The formats are read at each use, so a change of the setting
 * applies without a reload.
 */
export function shopDateFormats(session: Session): MatDateFormats {
  return {
    get parse() {
      return { dateInput: parsePatterns(session.locale()) };
    },
    get display() {
      return {
        dateInput: datePattern(session.locale()),
        monthYearLabel: 'LLL yyyy',
        dateA11yLabel: 'DDD',
        monthYearA11yLabel: 'LLLL yyyy',
      };
    },
  };
}

export function provideShopDateAdapter(): Provider[] {
  return [
    ...provideLuxonDateAdapter(),
    { provide: MAT_DATE_FORMATS, useFactory: () => shopDateFormats(inject(Session)) },
  ];
}

/** A date field's value as the API takes it: "2099-01-01", or null when empty or not a date. */
export function dayOf(value: DateTime | null | undefined): string | null {
  return value && value.isValid ? value.toISODate() : null;
}
