import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatDatepickerModule } from '@angular/material/datepicker';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { DateTime } from 'luxon';

import { dayOf } from '../core/shop-date-adapter';
import type { Filtered } from './list-fields';

/**
 * A day that narrows a list by one of its filters:
 * `<app-filter-date label="From" [list]="list" field="from" />` shows `list.filters().from` (an
 * ISO day, or nothing) in a date field with its calendar, and sets it when a day is typed or
 * picked (`''` when the field is cleared), so the list goes back to its first page.
 */
@Component({
  selector: 'app-filter-date',
  imports: [MatDatepickerModule, MatFormFieldModule, MatInputModule],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>{{ label() }}</mat-label>
      <input
        matInput
        [matDatepicker]="picker"
        [value]="list().filters()[field()] || null"
        (dateChange)="pick($event.value)"
      />
      <mat-datepicker-toggle matIconSuffix [for]="picker" />
      <mat-datepicker #picker />
    </mat-form-field>
  `,
  // The host is the field's box in the `.filters` row (`_list-page.scss` gives it its width).
  host: { style: 'display: inline-flex; flex-direction: column' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FilterDate {
  readonly label = input.required<string>();
  readonly list = input.required<Filtered>();
  /** The filter's name in the list's request. */
  readonly field = input.required<string>();

  protected pick(value: DateTime | null): void {
    this.list().setFilters({ [this.field()]: dayOf(value) ?? '' });
  }
}
