import { booleanAttribute, ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import type { Filters } from './paged-list';

// The fields of a list page's filter row: its search box and the selects that narrow it. Each
// drives a `PagedList` (or anything shaped like one) and takes a field's room in the row
// (`.filters` in `_list-page.scss`), so a page writes one line where it wrote a form field.

// Each field's host is the box in the page's layout and the form field fills it. The two fields
// write that box each in their own way on purpose: @angular/build 21.2 never exits `ng build`
// when two components carry byte-identical inline styles (it finishes the bundle, then hangs).

/** What the search reads and drives: a `PagedList`, or anything else with search text. */
export interface Searched {
  text(): string;
  onSearch(value: string): void;
}

/**
 * A list page's search box: `<app-search-field label="Find a bin" [list]="list" />`. It shows the
 * list's text and hands each key press to `onSearch` (the list waits for a pause before asking).
 * `(enter)` is for a page whose search takes a scanned code, which a scanner ends with Enter.
 * At least 360 px on its own; in a `.filters` row it grows beside the selects.
 */
@Component({
  selector: 'app-search-field',
  imports: [MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic" [hintLabel]="hint()">
      <mat-label>{{ label() }}</mat-label>
      <mat-icon matPrefix>{{ icon() }}</mat-icon>
      <input
        matInput
        type="search"
        autocomplete="off"
        [value]="list().text()"
        (input)="list().onSearch($any($event.target).value)"
        (keydown.enter)="enter.emit()"
      />
    </mat-form-field>
  `,
  styles: `
    :host {
      display: inline-flex;
      flex-direction: column;
      min-width: min(360px, 100%);
      flex: 1 1 320px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SearchField {
  readonly label = input.required<string>();
  readonly list = input.required<Searched>();
  /** What may be typed, under the field ("Name, phone or e-mail"). */
  readonly hint = input('');
  /** `barcode_scanner` where a scanned code is the usual search. */
  readonly icon = input('search');
  readonly enter = output<void>();
}

/** One choice of a filter: the value the list sends and the words the person reads. */
export interface Choice {
  value: string;
  label: string;
}

/** Each value as a choice, in its words (a page puts its "All …" choice, value '', beside them). */
export function choicesOf<V extends string>(
  values: readonly V[],
  words: (value: V) => string,
): Choice[] {
  return values.map((value) => ({ value, label: words(value) }));
}

/** What a filter select narrows: a `PagedList` (its `filters` and `setFilters`). */
export interface Filtered {
  filters(): Filters;
  setFilters(changes: Record<string, string>): void;
}

/**
 * A select that narrows a list by one of its filters:
 * `<app-filter-select label="Kind" [list]="list" field="kind" [choices]="kinds" />` shows
 * `list.filters().kind` and sets it when another choice is picked (so the list goes back to its
 * first page); `(picked)` tells the page, for a filter that clears another.
 */
@Component({
  selector: 'app-filter-select',
  imports: [MatFormFieldModule, MatSelectModule],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic" [hintLabel]="hint()">
      <mat-label>{{ label() }}</mat-label>
      <mat-select
        [value]="list().filters()[field()]"
        [disabled]="disabled()"
        (selectionChange)="pick($event.value)"
      >
        @for (c of choices(); track c.value) {
          <mat-option [value]="c.value">{{ c.label }}</mat-option>
        }
      </mat-select>
    </mat-form-field>
  `,
  host: { style: 'display: inline-flex; flex-direction: column' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FilterSelect {
  readonly label = input.required<string>();
  readonly list = input.required<Filtered>();
  /** The filter's name in the list's request. */
  readonly field = input.required<string>();
  readonly choices = input.required<readonly Choice[]>();
  readonly disabled = input(false, { transform: booleanAttribute });
  readonly hint = input('');
  readonly picked = output<string>();

  protected pick(value: string): void {
    this.list().setFilters({ [this.field()]: value });
    this.picked.emit(value);
  }
}
