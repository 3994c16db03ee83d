import { inject, Pipe, PipeTransform } from '@angular/core';

import {
  formatLength,
  lengthJsonToNm,
  type LengthJson,
  type LengthUnit,
} from '../../../shared/lengths';
import { Session } from './session';

/**
 * Shows a length from the API (`{ mm, in }`) in the signed-in person's unit, at the trade's
 * resolution: 0.001 mm or 0.0001 in, e.g. "64.910 mm" or "2.5555 in". `| length:'in'` forces a
 * unit (a printed sheet for a machine that reads inches). null shows "—". A difference the API sends
 * negative (a step that falls short of the wear) shows with its minus sign, "−0.120 mm": a pipe must
 * never throw, because one throwing cell stops the whole page from rendering.
 *
 * Impure on purpose: it reads the session's unit signal, so every length on screen switches the
 * moment a person changes their unit, without each page passing the unit in.
 */
@Pipe({ name: 'length', pure: false })
export class LengthPipe implements PipeTransform {
  private readonly session = inject(Session);

  transform(value: LengthJson | null | undefined, unit?: LengthUnit): string {
    if (value === null || value === undefined) {
      return '—';
    }
    const shown = unit ?? this.session.unit();
    // Each unit is read from its own string, so a value typed in inches is never routed through mm.
    try {
      return formatLength(lengthJsonToNm(value, shown), shown);
    } catch (error) {
      // Only a malformed answer gets here: show what was sent rather than break the page, and
      // still report it, so the browser tests (which fail on any console error) catch it.
      console.error('LengthPipe: not a length from the API', value, error);
      return `${shown === 'in' ? value.in : value.mm} ${shown}`;
    }
  }
}
