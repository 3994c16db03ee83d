import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { Router } from '@angular/router';

import type { AbcClass } from '../../../shared/api/insights';
import { DataTable } from '../ui/data-table';
import { TableColumn, titleOf } from '../ui/table-column';
import { InsightChart } from './insight-chart';
import { loadEach } from '../ui/load';
import { InsightPanel } from './insight-panel';
import { InsightsApi } from './insights-api';
import { paretoChart } from './insights-charts';
import { formatAmount, formatCount, formatShare } from './insights-format';
import { MONTH_CHOICES, monthsFrom } from './stock-page';

const CLASS_MEANING: Record<AbcClass, string> = {
  A: 'The few parts that carry about 80 % of the value: count them often, never run out.',
  B: 'The next 15 % of the value: check them at each order.',
  C: 'The long tail, the last 5 %: order in bulk, rarely.',
};

/** ABC classes: parts ranked by the value that went out at cost, with the Pareto split 80/15/5. */
@Component({
  selector: 'app-abc-page',
  imports: [InsightChart, InsightPanel, MatButtonToggleModule, DataTable, TableColumn],
  templateUrl: './abc-page.html',
  styleUrl: './abc-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AbcPage {
  private readonly api = inject(InsightsApi);
  private readonly router = inject(Router);

  readonly months = input<string>();
  protected readonly window = computed(() => monthsFrom(this.months()));
  protected readonly choices = MONTH_CHOICES;
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

  protected setMonths(months: number): void {
    void this.router.navigate([], {
      queryParams: { months },
      queryParamsHandling: 'merge',
      replaceUrl: true,
    });
  }
}
