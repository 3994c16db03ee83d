import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { map, type Observable } from 'rxjs';

import type { UnitJson } from '../../../shared/api/stock';
import { LengthPipe } from '../core/length-pipe';
import { Barcode } from '../ui/barcode';
import { labelLayout } from '../ui/label-layout';
import { labelSheets, LabelPageHeader } from '../ui/label-page';
import { StockApi } from './stock-api';
import { loadEach } from '../ui/load';
import { ListState } from '../ui/list-state';

/**
 * Printable piston labels: family, step, the measured size in both units, the label code as a
 * Code 128 barcode and the bin. A sticker sheet of 3 × 7 labels (62 × 35 mm) that fits both A4 and
 * Letter inside 10 mm margins, or one label per page at the size of the shop's label roll.
 */
@Component({
  selector: 'app-unit-labels',
  imports: [ListState, Barcode, LabelPageHeader, LengthPipe, RouterLink],
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

  /** The pistons of one receipt (?receipt=) or the one piston (?unit=). */
  protected readonly loaded = loadEach(
    () => {
      const receipt = this.receipt();
      const unit = this.unit();
      return receipt || unit ? { receipt, unit } : null;
    },
    ({ receipt, unit }): Observable<UnitJson[]> =>
      receipt
        ? this.api
            .units({ receiptId: receipt, sort: 'label', page: 1, pageSize: 500 })
            .pipe(map((page) => page.items))
        : this.api.unit(unit ?? '').pipe(map((u) => [u])),
  );
  protected readonly units = computed(() => this.loaded.value() ?? []);
  protected readonly error = computed(() =>
    this.receipt() || this.unit()
      ? this.loaded.error()
      : 'Open this page from a receipt or a piston.',
  );
  protected readonly sheets = labelSheets(this.units, this.single);
}
