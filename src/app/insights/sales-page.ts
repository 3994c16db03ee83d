import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { Router } from '@angular/router';

import { defaultPeriod, type TopSellerRank } from '../../../shared/api/insights';
import { DataTable } from '../ui/data-table';
import { TableColumn, titleOf } from '../ui/table-column';
import { InsightChart } from './insight-chart';
import { loadEach } from '../ui/load';
import { InsightPanel } from './insight-panel';
import { InsightsApi, type DayRange } from './insights-api';
import {
  NO_FAMILY,
  monthlyChart,
  salesByFamilyChart,
  topSellersChart,
  type Measure,
} from './insights-charts';
import { formatAmount, formatCount, formatShare } from './insights-format';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PeriodPicker } from './period-picker';
import { isCalendarDay } from '../../../shared/api/common';

/** The period in the address (?from&to), or the last twelve months. */
export function periodFrom(from: string | undefined, to: string | undefined): DayRange {
  if (from && to && isCalendarDay(from) && isCalendarDay(to) && from <= to) return { from, to };
  return defaultPeriod(Intl.DateTimeFormat().resolvedOptions().timeZone);
}

/** What sells: units, revenue and margin by family and step, month by month, and the best sellers. */
@Component({
  selector: 'app-sales-page',
  imports: [
    InsightChart,
    InsightPanel,
    MatButtonToggleModule,
    DataTable,
    TableColumn,
    PeriodPicker,
    ShopDatePipe,
  ],
  templateUrl: './sales-page.html',
  styleUrl: './sales-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SalesPage {
  private readonly api = inject(InsightsApi);
  private readonly router = inject(Router);

  /** Bound from the address by the router. */
  readonly from = input<string>();
  readonly to = input<string>();

  protected readonly period = computed(() => periodFrom(this.from(), this.to()));
  protected readonly measure = signal<Measure>('revenue');
  protected readonly rank = signal<TopSellerRank>('revenue');

  protected readonly sales = loadEach(this.period, (p) => this.api.sales(p));
  protected readonly months = loadEach(this.period, (p) => this.api.monthly(p));
  protected readonly top = loadEach(
    () => ({ period: this.period(), rank: this.rank() }),
    ({ period, rank }) => this.api.topSellers(period, rank, 10),
  );

  protected readonly familyChart = computed(() => {
    const answer = this.sales.value();
    return answer ? salesByFamilyChart(answer, this.measure()) : null;
  });
  protected readonly monthChart = computed(() => {
    const answer = this.months.value();
    const currency = this.sales.value()?.currency;
    return answer && currency ? monthlyChart(answer, currency) : null;
  });
  protected readonly topChart = computed(() => {
    const answer = this.top.value();
    return answer ? topSellersChart(answer) : null;
  });
  protected readonly marginShare = computed(() => {
    const totals = this.sales.value()?.totals;
    if (!totals || Number(totals.revenue) === 0) return null;
    return String(Number(totals.margin) / Number(totals.revenue));
  });

  protected readonly salesColumns = ['family', 'units', 'revenue', 'margin'];
  protected readonly monthColumns = ['month', 'units', 'revenue', 'margin'];
  protected readonly topColumns = ['part', 'units', 'revenue', 'margin'];
  protected readonly noFamily = NO_FAMILY;

  protected readonly csv = computed(() => {
    const p = this.period();
    return {
      sales: this.api.csvUrl('sales', { ...p, by: 'family,step' }),
      months: this.api.csvUrl('sales/monthly', { ...p }),
      top: this.api.csvUrl('top-sellers', { ...p, rank: this.rank(), limit: 10 }),
    };
  });

  protected money(text: string, currency: string | undefined): string {
    return formatAmount(text, currency ?? 'EUR');
  }
  protected readonly count = formatCount;
  protected readonly familyTitle = titleOf('familyName');
  protected readonly partTitle = titleOf('description');
  protected readonly share = formatShare;

  protected setPeriod(period: DayRange): void {
    void this.router.navigate([], {
      queryParams: { from: period.from, to: period.to },
      queryParamsHandling: 'merge',
      replaceUrl: true,
    });
  }
}
