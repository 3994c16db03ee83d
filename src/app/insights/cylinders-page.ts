import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';

import { NEAR_LAST_STEP_MAX } from '../../../shared/api/customers';
import { LengthPipe } from '../core/length-pipe';
import { loadEach } from '../ui/load';
import type { Choice } from './choice-toggles';
import type { HeadlineFigure } from './headline-figures';
import { addressSetter, INSIGHT_PAGE_PARTS } from './insight-page';
import { InsightsApi } from './insights-api';
import { formatCount } from './insights-format';
import { nearLastStepChart } from './near-last-step-chart';
import { ShopDatePipe } from '../core/shop-date-pipe';

/** 0, 1, 2 or 3 steps left; anything else reads as the default of one. */
export function withinFrom(value: string | undefined): number {
  const n = Number(value ?? 1);
  return Number.isInteger(n) && n >= 0 && n <= NEAR_LAST_STEP_MAX ? n : 1;
}

/**
 * Cylinders near their last step: the customers to tell before their next rebore, and the sleeves
 * to expect (cylinders with no step left). Each cylinder's steps left follow from its bores.
 */
@Component({
  selector: 'app-cylinders-page',
  imports: [INSIGHT_PAGE_PARTS, LengthPipe, RouterLink, ShopDatePipe],
  templateUrl: './cylinders-page.html',
  styleUrl: './cylinders-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylindersPage {
  private readonly api = inject(InsightsApi);
  protected readonly setAddress = addressSetter();

  readonly within = input<string>();
  protected readonly steps = computed(() => withinFrom(this.within()));
  protected readonly withinToggles: readonly Choice<number>[] = [0, 1, 2, 3].map((n) => ({
    value: n,
    label: n === 0 ? 'None left' : 'At most ' + n,
  }));

  protected readonly near = loadEach(this.steps, (w) => this.api.nearLastStep(w));
  protected readonly chart = computed(() => {
    const answer = this.near.value();
    return answer && answer.items.length ? nearLastStepChart(answer) : null;
  });
  protected readonly csv = computed(() =>
    this.api.csvUrl('cylinders-near-last-step', { within: this.steps() }),
  );
  protected readonly headline = computed((): HeadlineFigure[] => {
    const answer = this.near.value();
    if (!answer) return [];
    return [
      { label: 'Sleeves to expect', figure: formatCount(answer.sleevesToExpect) },
      { label: 'One step left', figure: formatCount(answer.lastStepNext) },
    ];
  });
  protected readonly columns = ['mark', 'customer', 'family', 'last', 'left'];
}
