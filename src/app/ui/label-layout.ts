import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  type Signal,
} from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { Router } from '@angular/router';

import { LABEL_SIZES, labelPageCss, rollFor, type LabelStock } from '../../../shared/label-stock';
import { Session } from '../core/session';
import { printPageRule } from './print-page';

export interface LabelLayout {
  /** One label per page (a label printer's roll) rather than a sticker sheet. */
  single: Signal<boolean>;
  /** The stock this page prints on now: 'sheet' or the shop's roll. */
  stock: Signal<LabelStock>;
  /** "62 × 29 mm": the size of one label on that stock. */
  sizeWords: Signal<string>;
}

/** "62 × 29 mm" for a stock, as the pages write it. */
export function labelSizeWords(stock: LabelStock): string {
  const { widthMm, heightMm } = LABEL_SIZES[stock];
  return `${widthMm} × ${heightMm} mm`;
}

/**
 * The layout of a label page: `?layout=sheet|single` when the person chose one, else what the
 * shop's setting says (a roll prints one per page). Sets the printed page's size to match for as
 * long as the page is open. Must be called in an injection context.
 */
export function labelLayout(layout: () => string | undefined): LabelLayout {
  const session = inject(Session);
  const setPage = printPageRule();
  const single = computed(() => {
    const chosen = layout();
    return chosen === 'single' || (chosen !== 'sheet' && session.labelStock() !== 'sheet');
  });
  const stock = computed<LabelStock>(() => (single() ? rollFor(session.labelStock()) : 'sheet'));
  effect(() => setPage(labelPageCss(stock())));
  return { single, stock, sizeWords: computed(() => labelSizeWords(stock())) };
}

/** The choice between the sticker sheet and one label per page, kept in the address. */
@Component({
  selector: 'app-label-layout-toggle',
  imports: [MatButtonToggleModule],
  template: `
    <mat-button-toggle-group
      aria-label="Label layout"
      [value]="single() ? 'single' : 'sheet'"
      (change)="choose($event.value)"
      hideSingleSelectionIndicator
    >
      <mat-button-toggle value="sheet">Sticker sheet</mat-button-toggle>
      <mat-button-toggle value="single">One per page</mat-button-toggle>
    </mat-button-toggle-group>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LabelLayoutToggle {
  private readonly router = inject(Router);

  readonly single = input.required<boolean>();

  protected choose(layout: unknown): void {
    void this.router.navigate([], {
      queryParams: { layout: layout === 'single' ? 'single' : 'sheet' },
      queryParamsHandling: 'merge',
    });
  }
}
