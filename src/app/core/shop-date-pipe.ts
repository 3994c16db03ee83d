import { inject, Pipe, PipeTransform } from '@angular/core';

import { formatShopDate, type DateStyle } from '../../../shared/dates';
import { Session } from './session';

/**
 * Every date and time on every page, written the one way the shop's locale setting gives
 * ("31/12/2026", "31/12/2026 14:05", "Thu 31/12"), in the shop's time zone:
 * `{{ job.dueDate | shopDate: 'shortday' }}`. Not pure: it follows the session's locale.
 */
@Pipe({ name: 'shopDate', pure: false })
export class ShopDatePipe implements PipeTransform {
  private readonly session = inject(Session);

  transform(value: string | Date | null | undefined, style: DateStyle = 'date'): string {
    return formatShopDate(value, style, {
      locale: this.session.locale(),
      timeZone: this.session.timeZone(),
    });
  }
}
