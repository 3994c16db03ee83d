import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { catchError, map, of, startWith } from 'rxjs';

import type { BinJson } from '../../../shared/api/stock';
import { apiErrorMessage } from '../core/api-error';
import { Barcode } from '../ui/barcode';
import { labelLayout } from '../ui/label-layout';
import { labelSheets, LabelPageHeader } from '../ui/label-page';
import { StockApi } from './stock-api';
import { FormAlert } from '../ui/form-alert';

type Loaded =
  { state: 'loading' } | { state: 'ok'; bins: BinJson[] } | { state: 'error'; message: string };

/**
 * Bin labels on the same sticker sheet as piston labels, or one per page on the shop's label roll:
 * the code large, and as Code 128.
 */
@Component({
  selector: 'app-bin-labels',
  imports: [FormAlert, Barcode, LabelPageHeader, MatProgressBarModule, RouterLink],
  template: `
    <section class="page labels-page">
      <app-label-page-header
        heading="Bin labels"
        [single]="single()"
        [empty]="bins().length === 0"
      />
      <p class="intro no-print">
        @if (single()) {
          One {{ layoutNow.sizeWords() }} label per page, for a label printer.
        } @else {
          62 × 35 mm stickers, three across and seven down, for A4 or Letter. Print at 100 %.
        }
      </p>
      @if (loaded().state === 'loading') {
        <mat-progress-bar mode="indeterminate" aria-label="Loading bins" />
      }
      <app-form-alert [message]="error()" />
      @if (loaded().state === 'ok' && bins().length === 0) {
        <p class="empty">No bins to label. Add bins first.</p>
      }
      @for (sheet of sheets(); track $index) {
        <div class="sheet" [class]="'stock-' + layoutNow.stock()" [class.single]="single()">
          @for (b of sheet; track b.id) {
            <article class="label bin" [attr.aria-label]="'Label for bin ' + b.code">
              <p class="bin-code">{{ b.code }}</p>
              <app-barcode class="code" [value]="b.code" />
              <p class="bin-name">{{ b.name }}</p>
            </article>
          }
        </div>
      }
      <p class="no-print back"><a routerLink="/stock/bins">Bins</a></p>
    </section>
  `,
  styleUrl: './bin-labels.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BinLabels {
  private readonly api = inject(StockApi);

  /** ?ids=a,b,c for chosen bins; all bins without it. ?layout=sheet|single. */
  readonly ids = input<string>();
  readonly layout = input<string>();

  protected readonly layoutNow = labelLayout(this.layout);
  protected readonly single = this.layoutNow.single;

  protected readonly loaded = toSignal(
    this.api.bins({ page: 1, pageSize: 500 }).pipe(
      map((page): Loaded => ({ state: 'ok', bins: page.items })),
      catchError((error: unknown) =>
        of<Loaded>({ state: 'error', message: apiErrorMessage(error) }),
      ),
      startWith<Loaded>({ state: 'loading' }),
    ),
    { initialValue: { state: 'loading' } as Loaded },
  );
  protected readonly bins = computed(() => {
    const loaded = this.loaded();
    if (loaded.state !== 'ok') return [];
    const wanted = (this.ids() ?? '').split(',').filter(Boolean);
    return wanted.length ? loaded.bins.filter((b) => wanted.includes(b.id)) : loaded.bins;
  });
  protected readonly sheets = labelSheets(this.bins, this.single);
  protected readonly error = computed(() => {
    const loaded = this.loaded();
    return loaded.state === 'error' ? loaded.message : '';
  });
}
