import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { Router } from '@angular/router';

import { DataTable } from '../ui/data-table';
import { TableColumn } from '../ui/table-column';
import { InsightChart } from './insight-chart';
import { loadEach } from '../ui/load';
import { InsightPanel } from './insight-panel';
import { InsightsApi } from './insights-api';
import { NO_FAMILY, stockValueChart } from './insights-charts';
import { formatAmount, formatCount } from './insights-format';
import { ShopDatePipe } from '../core/shop-date-pipe';

export const MONTH_CHOICES = [6, 12, 18, 24] as const;

/** The months asked for in the address (?months), or twelve. */
export function monthsFrom(text: string | undefined, fallback = 12): number {
  const n = Number(text);
  return Number.isInteger(n) && n >= 1 && n <= 120 ? n : fallback;
}

/** What sits: stock at moving average cost, turnover per family, and parts that have not moved. */
@Component({
  selector: 'app-stock-page',
  imports: [
    ShopDatePipe,
    InsightChart,
    InsightPanel,
    MatButtonToggleModule,
    DataTable,
    TableColumn,
  ],
  templateUrl: './stock-page.html',
  styleUrl: './stock-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StockPage {
  private readonly api = inject(InsightsApi);
  private readonly router = inject(Router);

  /** Bound from the address: months without an issue that make a part dead stock. */
  readonly months = input<string>();

  protected readonly deadMonths = computed(() => monthsFrom(this.months()));
  protected readonly choices = MONTH_CHOICES;

  protected readonly value = loadEach(
    () => 12,
    (m) => this.api.stockValue(m),
  );
  protected readonly dead = loadEach(this.deadMonths, (m) => this.api.deadStock(m));

  protected readonly valueChart = computed(() => {
    const answer = this.value.value();
    return answer ? stockValueChart(answer) : null;
  });
  protected readonly deadShare = computed(() => {
    const total = this.value.value()?.totalValue;
    const dead = this.dead.value()?.totalValue;
    if (!total || !dead || Number(total) === 0) return null;
    return ((Number(dead) / Number(total)) * 100).toFixed(1);
  });

  protected readonly valueColumns = ['family', 'onHand', 'value', 'issued', 'turnover', 'cover'];
  protected readonly deadColumns = ['part', 'family', 'onHand', 'value', 'lastIssued'];
  protected readonly noFamily = NO_FAMILY;
  protected readonly count = formatCount;

  protected readonly csv = computed(() => ({
    value: this.api.csvUrl('stock-value', { months: 12 }),
    dead: this.api.csvUrl('dead-stock', { months: this.deadMonths() }),
  }));

  protected money(text: string, currency: string): string {
    return formatAmount(text, currency);
  }

  protected setMonths(months: number): void {
    void this.router.navigate([], {
      queryParams: { months },
      queryParamsHandling: 'merge',
      replaceUrl: true,
    });
  }
}
