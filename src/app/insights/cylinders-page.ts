import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { Router, RouterLink } from '@angular/router';

import { NEAR_LAST_STEP_MAX } from '../../../shared/api/customers';
import { LengthPipe } from '../core/length-pipe';
import { DataTable } from '../ui/data-table';
import { TableColumn } from '../ui/table-column';
import { InsightChart } from './insight-chart';
import { loadEach } from '../ui/load';
import { InsightPanel } from './insight-panel';
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
  imports: [
    ShopDatePipe,
    InsightChart,
    InsightPanel,
    LengthPipe,
    MatButtonToggleModule,
    DataTable,
    TableColumn,
    RouterLink,
  ],
  templateUrl: './cylinders-page.html',
  styleUrl: './cylinders-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylindersPage {
  private readonly api = inject(InsightsApi);
  private readonly router = inject(Router);

  readonly within = input<string>();
  protected readonly steps = computed(() => withinFrom(this.within()));
  protected readonly choices = [0, 1, 2, 3];

  protected readonly near = loadEach(this.steps, (w) => this.api.nearLastStep(w));
  protected readonly chart = computed(() => {
    const answer = this.near.value();
    return answer && answer.items.length ? nearLastStepChart(answer) : null;
  });
  protected readonly csv = computed(() =>
    this.api.csvUrl('cylinders-near-last-step', { within: this.steps() }),
  );
  protected readonly columns = ['mark', 'customer', 'family', 'last', 'left'];
  protected readonly count = formatCount;

  protected setWithin(within: number): void {
    void this.router.navigate([], {
      queryParams: { within },
      queryParamsHandling: 'merge',
      replaceUrl: true,
    });
  }
}
