import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { catchError, combineLatest, map, Observable, of, startWith, switchMap } from 'rxjs';

import type { UnitJson } from '../../../shared/api/stock';
import { apiErrorMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Barcode } from '../ui/barcode';
import { labelLayout, LabelLayoutToggle } from '../ui/label-layout';
import { StockApi } from './stock-api';

const LABELS_PER_SHEET = 21;

type Loaded =
  { state: 'loading' } | { state: 'ok'; units: UnitJson[] } | { state: 'error'; message: string };

/**
 * Printable piston labels: family, step, the measured size in both units, the label code as a
 * Code 128 barcode and the bin. A sticker sheet of 3 × 7 labels (62 × 35 mm) that fits both A4 and
 * Letter inside 10 mm margins, or one label per page at the size of the shop's label roll.
 */
@Component({
  selector: 'app-unit-labels',
  imports: [
    Barcode,
    LabelLayoutToggle,
    LengthPipe,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    RouterLink,
  ],
  templateUrl: './unit-labels.html',
  styleUrl: './unit-labels.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UnitLabels {
  private readonly api = inject(StockApi);

  /** From the address: ?receipt=<receipt id> or ?unit=<unit id>, and ?layout=sheet|single. */
  readonly receipt = input<string>();
  readonly unit = input<string>();
  readonly layout = input<string>();

  protected readonly layoutNow = labelLayout(this.layout);
  protected readonly single = this.layoutNow.single;

  private readonly loaded = toSignal(
    combineLatest([toObservable(this.receipt), toObservable(this.unit)]).pipe(
      switchMap(([receipt, unit]): Observable<Loaded> => {
        const source: Observable<UnitJson[]> | null = receipt
          ? this.api
              .units({ receiptId: receipt, sort: 'label', page: 1, pageSize: 500 })
              .pipe(map((page) => page.items))
          : unit
            ? this.api.unit(unit).pipe(map((u) => [u]))
            : null;
        if (!source) {
          return of<Loaded>({
            state: 'error',
            message: 'Open this page from a receipt or a piston.',
          });
        }
        return source.pipe(
          map((units): Loaded => ({ state: 'ok', units })),
          catchError((error: unknown) =>
            of<Loaded>({ state: 'error', message: apiErrorMessage(error) }),
          ),
          startWith<Loaded>({ state: 'loading' }),
        );
      }),
    ),
    { initialValue: { state: 'loading' } as Loaded },
  );
  protected readonly units = computed(() => {
    const loaded = this.loaded();
    return loaded.state === 'ok' ? loaded.units : [];
  });
  /** Sheets of 21 labels; each prints on its own page. */
  protected readonly sheets = computed(() => {
    const units = this.units();
    const size = this.single() ? 1 : LABELS_PER_SHEET;
    const sheets: UnitJson[][] = [];
    for (let i = 0; i < units.length; i += size) sheets.push(units.slice(i, i + size));
    return sheets;
  });
  protected readonly loading = computed(() => this.loaded().state === 'loading');
  protected readonly error = computed(() => {
    const loaded = this.loaded();
    return loaded.state === 'error' ? loaded.message : '';
  });

  protected print(): void {
    window.print();
  }
}
