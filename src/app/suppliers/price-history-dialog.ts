import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import Decimal from 'decimal.js';

import { formatMoney } from '../../../shared/money';
import type { PriceHistoryJson, SupplierItemJson } from '../../../shared/api/suppliers';
import { apiErrorMessage } from '../core/api-error';
import { SuppliersApi } from './suppliers-api';
import { ShopDatePipe } from '../core/shop-date-pipe';

export interface PriceHistoryData {
  supplierId: string;
  item: SupplierItemJson;
}

/** Every price an item has had, newest first, with the list that brought each one. */
@Component({
  selector: 'app-price-history-dialog',
  imports: [ShopDatePipe, MatButtonModule, MatDialogModule, MatIconModule, MatProgressBarModule],
  template: `
    <h2 mat-dialog-title>Price history of {{ data.item.sku }}</h2>
    <mat-dialog-content>
      <p class="what">{{ data.item.description || 'No description on the list.' }}</p>
      @if (loading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Loading the price history" />
      } @else if (problem()) {
        <div class="form-alert" role="alert">
          <mat-icon>error</mat-icon>
          <span>{{ problem() }}</span>
        </div>
      } @else {
        <table class="history">
          <caption class="visually-hidden">
            Prices of
            {{
              data.item.sku
            }}
          </caption>
          <thead>
            <tr>
              <th scope="col">From</th>
              <th scope="col" class="num">Price</th>
              <th scope="col">Change</th>
              <th scope="col">List</th>
            </tr>
          </thead>
          <tbody>
            @for (row of rows(); track row.effectiveFrom; let i = $index) {
              <tr>
                <td>{{ row.effectiveFrom | shopDate: 'datetime' }}</td>
                <td class="num">{{ money(row.price, row.currency) }}</td>
                <td class="num">{{ change(i) }}</td>
                <td>{{ row.fileName ?? '—' }}</td>
              </tr>
            } @empty {
              <tr>
                <td colspan="4">No prices recorded yet.</td>
              </tr>
            }
          </tbody>
        </table>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button mat-dialog-close type="button">Close</button>
    </mat-dialog-actions>
  `,
  styles: `
    .what {
      margin: 0 0 12px;
      color: var(--mat-sys-on-surface-variant);
    }
    .history {
      width: 100%;
      border-collapse: collapse;
    }
    th,
    td {
      padding: 8px;
      text-align: left;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
    }
    .num {
      text-align: right;
      font-variant-numeric: tabular-nums;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PriceHistoryDialog {
  protected readonly data = inject<PriceHistoryData>(MAT_DIALOG_DATA);
  private readonly api = inject(SuppliersApi);

  protected readonly loading = signal(true);
  protected readonly problem = signal('');
  protected readonly rows = signal<PriceHistoryJson[]>([]);

  constructor() {
    this.api.priceHistory(this.data.supplierId, this.data.item.id).subscribe({
      next: (page) => {
        this.rows.set(page.items);
        this.loading.set(false);
      },
      error: (error: unknown) => {
        this.problem.set(apiErrorMessage(error));
        this.loading.set(false);
      },
    });
  }

  protected money(price: string, currency: string): string {
    return formatMoney(price, currency);
  }

  /** The change from the price before, in percent, when both are in one currency. */
  protected change(index: number): string {
    const rows = this.rows();
    const now = rows[index];
    const before = rows[index + 1];
    if (!before) return 'first price';
    if (before.currency !== now.currency) return `was in ${before.currency}`;
    const pct = new Decimal(now.price).minus(before.price).dividedBy(before.price).times(100);
    if (pct.isZero()) return 'unchanged';
    return `${pct.isPositive() ? '+' : '−'}${pct.abs().toFixed(1)} %`;
  }
}
