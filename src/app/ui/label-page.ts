import { ChangeDetectionStrategy, Component, computed, input, type Signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

import { LabelLayoutToggle } from './label-layout';

/** A sticker sheet holds 3 × 7 labels (62 × 35 mm inside 10 mm margins on A4 and Letter). */
export const LABELS_PER_SHEET = 21;

/**
 * The labels as the pages they print on: sheets of 21, or one label each on a label printer's
 * roll. Each inner list is a `.sheet` of `_label-sheet.scss`, which starts a printed page.
 */
export function labelSheets<T>(items: () => readonly T[], single: () => boolean): Signal<T[][]> {
  return computed(() => {
    const all = items();
    const size = single() ? 1 : LABELS_PER_SHEET;
    const sheets: T[][] = [];
    for (let i = 0; i < all.length; i += size) sheets.push(all.slice(i, i + size));
    return sheets;
  });
}

/**
 * The top of a label page, left off paper: its title, the choice of sheet or one per page, and
 * Print (held while there is nothing to print):
 * `<app-label-page-header heading="Bin labels" [single]="single()" [empty]="bins().length === 0" />`.
 */
@Component({
  selector: 'app-label-page-header',
  imports: [LabelLayoutToggle, MatButtonModule, MatIconModule],
  template: `
    <header class="page-header no-print">
      <h1>{{ heading() }}</h1>
      <app-label-layout-toggle [single]="single()" />
      <button mat-flat-button type="button" [disabled]="empty()" (click)="print()">
        <mat-icon>print</mat-icon>Print
      </button>
    </header>
  `,
  // The header stands in the page as if the page had written it.
  host: { style: 'display: contents' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LabelPageHeader {
  readonly heading = input.required<string>();
  readonly single = input.required<boolean>();
  readonly empty = input.required<boolean>();

  protected print(): void {
    window.print();
  }
}
