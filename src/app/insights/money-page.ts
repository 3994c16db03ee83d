import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';

import { loadEach } from '../ui/load';
import type { HeadlineFigure } from './headline-figures';
import { addressSetter, INSIGHT_PAGE_PARTS, periodFrom } from './insight-page';
import { InsightsApi } from './insights-api';
import { formatAmount, formatCount, formatShare } from './insights-format';
import { revenueChart } from './money-charts';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PeriodPicker } from './period-picker';
import { JOB_STATE_LABELS, type JobState } from '../../../shared/api/jobs';
import type { RevenueMonth, EstimateMonth } from '../../../shared/api/insights';

type MoneyKey = keyof Omit<RevenueMonth, 'month' | 'invoices'>;
type CountKey = keyof Pick<EstimateMonth, 'sent' | 'approved' | 'declined' | 'waiting'>;

/**
 * The money side for the owner: labour and parts invoiced month by month, how estimates are
 * answered, who still owes for a job handed back, and the deposits held for work not invoiced yet.
 */
@Component({
  selector: 'app-money-page',
  imports: [INSIGHT_PAGE_PARTS, PeriodPicker, RouterLink, ShopDatePipe],
  templateUrl: './money-page.html',
  styleUrl: './money-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MoneyPage {
  private readonly api = inject(InsightsApi);
  protected readonly setAddress = addressSetter();

  /** Bound from the address by the router. */
  readonly from = input<string>();
  readonly to = input<string>();

  protected readonly period = computed(() => periodFrom(this.from(), this.to()));
  protected readonly revenue = loadEach(this.period, (p) => this.api.revenue(p));
  protected readonly estimates = loadEach(this.period, (p) => this.api.estimates(p));
  protected readonly owed = loadEach(
    () => true,
    () => this.api.balancesOwed(),
  );
  protected readonly held = loadEach(
    () => true,
    () => this.api.depositsHeld(),
  );

  /** Each figure once its own answer is in. */
  protected readonly headline = computed((): HeadlineFigure[] => {
    const figures: HeadlineFigure[] = [];
    const r = this.revenue.value();
    if (r)
      figures.push({
        label: 'Invoiced in the period',
        figure: this.money(r.totals.invoiced, r.currency),
      });
    const e = this.estimates.value();
    if (e)
      figures.push({ label: 'Estimates approved', figure: formatShare(e.totals.approvalRate) });
    const o = this.owed.value();
    if (o) figures.push({ label: 'Owed now', figure: this.money(o.totalBalance, o.currency) });
    const h = this.held.value();
    if (h) figures.push({ label: 'Deposits held', figure: this.money(h.totalHeld, h.currency) });
    return figures;
  });
  protected readonly chart = computed(() => {
    const answer = this.revenue.value();
    return answer && answer.totals.invoices > 0 ? revenueChart(answer) : null;
  });

  protected readonly revenueColumns = [
    'month',
    'invoices',
    'labour',
    'parts',
    'other',
    'tax',
    'invoiced',
    'credited',
  ];
  protected readonly estimateColumns = [
    'month',
    'sent',
    'approved',
    'declined',
    'waiting',
    'rate',
    'days',
  ];
  protected readonly moneyColumns: Array<{ key: MoneyKey; label: string }> = [
    { key: 'labour', label: 'Labour' },
    { key: 'parts', label: 'Parts' },
    { key: 'other', label: 'Other lines' },
    { key: 'tax', label: 'Tax' },
    { key: 'invoiced', label: 'Invoiced' },
    { key: 'credited', label: 'Credit notes' },
  ];
  protected readonly countColumns: Array<{ key: CountKey; label: string }> = [
    { key: 'sent', label: 'Sent' },
    { key: 'approved', label: 'Approved' },
    { key: 'declined', label: 'Declined' },
    { key: 'waiting', label: 'Waiting' },
  ];
  protected readonly owedColumns = ['job', 'invoice', 'issued', 'total', 'paid', 'balance', 'days'];
  protected readonly heldColumns = ['job', 'state', 'paid', 'amount'];

  protected readonly csv = computed(() => {
    const p = this.period();
    return {
      revenue: this.api.csvUrl('revenue', { ...p }),
      estimates: this.api.csvUrl('estimates', { ...p }),
      owed: this.api.csvUrl('balances-owed', {}),
      held: this.api.csvUrl('deposits-held', {}),
    };
  });

  protected money(text: string, currency: string | undefined): string {
    return formatAmount(text, currency ?? 'EUR');
  }
  protected readonly count = formatCount;
  protected readonly share = formatShare;

  /** Median days as the table writes them: "2.5 days", or a dash when nothing was approved. */
  protected days(text: string | null): string {
    return text === null ? '—' : `${text} ${text === '1.0' ? 'day' : 'days'}`;
  }

  protected stateLabel(state: string): string {
    return JOB_STATE_LABELS[state as JobState] ?? state;
  }
}
