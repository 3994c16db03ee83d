import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';

import type { ExposureItem } from '../../../shared/api/insights';
import { waitingForWords, type NeededPart } from '../../../shared/part-needs';
import { titleOf } from '../ui/table-column';
import { loadEach } from '../ui/load';
import type { HeadlineFigure } from './headline-figures';
import { addressSetter, INSIGHT_PAGE_PARTS, monthsFrom, MONTH_TOGGLES } from './insight-page';
import { InsightsApi } from './insights-api';
import { exposureChart, supplierChart } from './insights-charts';
import { formatCount, formatShare } from './insights-format';

/**
 * Where the shop ran short: steps asked for with no measured piston or ring set free, the jobs that waited and
 * for how long; and which suppliers deliver when they said they would.
 */
@Component({
  selector: 'app-exposure-page',
  imports: [INSIGHT_PAGE_PARTS],
  templateUrl: './exposure-page.html',
  styleUrl: './exposure-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ExposurePage {
  private readonly api = inject(InsightsApi);
  protected readonly setAddress = addressSetter();

  readonly months = input<string>();
  protected readonly window = computed(() => monthsFrom(this.months()));
  protected readonly monthToggles = MONTH_TOGGLES;

  protected readonly exposure = loadEach(this.window, (m) => this.api.exposure(m));
  protected readonly suppliers = loadEach(this.window, (m) => this.api.supplierReliability(m));

  protected readonly shortChart = computed(() => {
    const answer = this.exposure.value();
    return answer ? exposureChart(answer) : null;
  });
  protected readonly supplyChart = computed(() => {
    const answer = this.suppliers.value();
    return answer && answer.items.length ? supplierChart(answer) : null;
  });
  protected readonly headline = computed((): HeadlineFigure[] => {
    const answer = this.exposure.value();
    if (!answer) return [];
    return [
      { label: 'Steps that ran short', figure: formatCount(answer.items.length) },
      { label: 'Jobs waiting for parts now', figure: formatCount(answer.jobsWaitingNow) },
    ];
  });

  protected readonly shortColumns = ['step', 'parts', 'times', 'jobs', 'days', 'waiting'];
  protected readonly supplierColumns = [
    'supplier',
    'orders',
    'promised',
    'actual',
    'late',
    'onTime',
  ];
  protected readonly count = formatCount;
  protected readonly familyTitle = titleOf('familyName');
  protected readonly waitingTitle = (i: ExposureItem): string | null =>
    i.waitingFor.length ? 'Waiting for ' + waitingForWords(i.waitingFor) : null;
  protected readonly share = formatShare;
  protected readonly csv = computed(() => ({
    exposure: this.api.csvUrl('exposure', { months: this.window() }),
    suppliers: this.api.csvUrl('supplier-reliability', { months: this.window() }),
  }));

  /** "piston", "ring set", "piston and ring set". */
  protected partWords(parts: readonly NeededPart[]): string {
    return parts.map((p) => (p === 'piston' ? 'piston' : 'ring set')).join(' and ');
  }

  /** Days with one decimal, "32.0" rather than "32", so the column lines up. */
  protected days(value: number): string {
    return value.toFixed(1);
  }
}
