import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';

import type { AbcClass } from '../../../shared/api/insights';
import { titleOf } from '../ui/table-column';
import { loadEach } from '../ui/load';
import type { Choice } from './choice-toggles';
import { addressSetter, INSIGHT_PAGE_PARTS, monthsFrom, MONTH_TOGGLES } from './insight-page';
import { InsightsApi } from './insights-api';
import { paretoChart } from './insights-charts';
import { formatAmount, formatCount, formatShare } from './insights-format';

const CLASS_MEANING: Record<AbcClass, string> = {
  A: 'The few parts that carry about 80 % of the value: count them often, never run out.',
  B: 'The next 15 % of the value: check them at each order.',
  C: 'The long tail, the last 5 %: order in bulk, rarely.',
};

const CLASS_TOGGLES: readonly Choice<AbcClass | 'all'>[] = [
  { value: 'all', label: 'All' },
  ...(['A', 'B', 'C'] as const).map((c) => ({ value: c, label: c })),
];

/** ABC classes: parts ranked by the value that went out at cost, with the Pareto split 80/15/5. */
@Component({
  selector: 'app-abc-page',
  imports: [INSIGHT_PAGE_PARTS],
  templateUrl: './abc-page.html',
  styleUrl: './abc-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AbcPage {
  private readonly api = inject(InsightsApi);
  protected readonly setAddress = addressSetter();

  readonly months = input<string>();
  protected readonly window = computed(() => monthsFrom(this.months()));
  protected readonly monthToggles = MONTH_TOGGLES;
  protected readonly classToggles = CLASS_TOGGLES;
  protected readonly only = signal<AbcClass | 'all'>('all');

  protected readonly abc = loadEach(this.window, (m) => this.api.abc(m));
  protected readonly chart = computed(() => {
    const answer = this.abc.value();
    return answer ? paretoChart(answer) : null;
  });
  protected readonly rows = computed(() => {
    const items = this.abc.value()?.items ?? [];
    const only = this.only();
    return only === 'all' ? items : items.filter((i) => i.class === only);
  });

  protected readonly columns = ['class', 'part', 'value', 'share', 'cumulative', 'onHand'];
  protected readonly meaning = CLASS_MEANING;
  protected readonly count = formatCount;
  protected readonly partTitle = titleOf('description');
  protected readonly share = formatShare;
  protected readonly csv = computed(() => this.api.csvUrl('abc', { months: this.window() }));

  protected money(text: string, currency: string): string {
    return formatAmount(text, currency);
  }
}
