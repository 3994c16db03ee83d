import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';

import { loadEach } from '../ui/load';
import type { HeadlineFigure } from './headline-figures';
import { addressSetter, INSIGHT_PAGE_PARTS, monthsFrom, MONTH_TOGGLES } from './insight-page';
import { InsightsApi } from './insights-api';
import { NO_FAMILY, stockValueChart } from './insights-charts';
import { formatAmount, formatCount } from './insights-format';
import { ShopDatePipe } from '../core/shop-date-pipe';

/** What sits: stock at moving average cost, turnover per family, and parts that have not moved. */
@Component({
  selector: 'app-stock-page',
  imports: [INSIGHT_PAGE_PARTS, ShopDatePipe],
  templateUrl: './stock-page.html',
  styleUrl: './stock-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StockPage {
  private readonly api = inject(InsightsApi);
  protected readonly setAddress = addressSetter();

  /** Bound from the address: months without an issue that make a part dead stock. */
  readonly months = input<string>();

  protected readonly deadMonths = computed(() => monthsFrom(this.months()));
  protected readonly monthToggles = MONTH_TOGGLES;

  protected readonly value = loadEach(
    () => 12,
    (m) => this.api.stockValue(m),
  );
  protected readonly dead = loadEach(this.deadMonths, (m) => this.api.deadStock(m));

  protected readonly valueChart = computed(() => {
    const answer = this.value.value();
    return answer ? stockValueChart(answer) : null;
  });
  protected readonly headline = computed((): HeadlineFigure[] => {
    const answer = this.value.value();
    if (!answer) return [];
    const figures: HeadlineFigure[] = [
      { label: 'On the shelf', figure: this.money(answer.totalValue, answer.currency) },
      { label: 'Pieces on hand', figure: formatCount(answer.totalOnHand) },
      { label: 'Turnover, last 12 months', figure: `${answer.totalTurnover ?? '—'}×` },
    ];
    const dead = this.dead.value();
    if (dead) {
      const total = Number(answer.totalValue);
      figures.push({
        label: `Not moved in ${dead.months} months`,
        figure: this.money(dead.totalValue, dead.currency),
        aside: total === 0 ? null : `(${((Number(dead.totalValue) / total) * 100).toFixed(1)} %)`,
      });
    }
    return figures;
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
}
