import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';

import type { TopSellerRank } from '../../../shared/api/insights';
import { titleOf } from '../ui/table-column';
import { loadEach } from '../ui/load';
import type { HeadlineFigure } from './headline-figures';
import { addressSetter, FIGURE_TOGGLES, INSIGHT_PAGE_PARTS, periodFrom } from './insight-page';
import { InsightsApi } from './insights-api';
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

/** What sells: units, revenue and margin by family and step, month by month, and the best sellers. */
@Component({
  selector: 'app-sales-page',
  imports: [INSIGHT_PAGE_PARTS, PeriodPicker, ShopDatePipe],
  templateUrl: './sales-page.html',
  styleUrl: './sales-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SalesPage {
  private readonly api = inject(InsightsApi);
  protected readonly setAddress = addressSetter();

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
  protected readonly headline = computed((): HeadlineFigure[] => {
    const answer = this.sales.value();
    if (!answer) return [];
    const { units, revenue, margin } = answer.totals;
    return [
      { label: 'Units sold', figure: formatCount(units) },
      { label: 'Revenue', figure: this.money(revenue, answer.currency) },
      { label: 'Margin', figure: this.money(margin, answer.currency) },
      {
        label: 'Margin on revenue',
        figure: formatShare(
          Number(revenue) === 0 ? null : String(Number(margin) / Number(revenue)),
        ),
      },
    ];
  });

  protected readonly salesColumns = ['family', 'units', 'revenue', 'margin'];
  protected readonly monthColumns = ['month', 'units', 'revenue', 'margin'];
  protected readonly topColumns = ['part', 'units', 'revenue', 'margin'];
  protected readonly noFamily = NO_FAMILY;
  protected readonly figureToggles = FIGURE_TOGGLES;

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
}
