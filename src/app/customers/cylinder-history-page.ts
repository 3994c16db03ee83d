import { ChangeDetectionStrategy, Component, computed, effect, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import { stepsLeftWarning } from '../../../shared/bore-history';
import { formatShopDate } from '../../../shared/dates';
import { JOB_STATE_LABELS } from '../../../shared/api/jobs';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { loadEach } from '../ui/load';
import { labelPageCss, rollFor } from '../../../shared/label-stock';
import { labelSizeWords } from '../ui/label-layout';
import { printPageRule } from '../ui/print-page';
import { boreChart } from './bore-chart';
import { BoreChartView } from './bore-chart-view';
import { CustomersApi } from './customers-api';
import { CylinderBores } from './cylinder-bores';
import { CylinderTag } from './cylinder-tag';
import { ShopDatePipe } from '../core/shop-date-pipe';

/**
 * The life of one cylinder: every bore it has had, drawn against its family's step ladder, the
 * steps it has left before a sleeve, and its tag label (printing this page prints the label alone).
 */
@Component({
  selector: 'app-cylinder-history-page',
  imports: [
    ShopDatePipe,
    BoreChartView,
    CylinderBores,
    CylinderTag,
    LengthPipe,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    RouterLink,
  ],
  templateUrl: './cylinder-history-page.html',
  styleUrl: './cylinder-history-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylinderHistoryPage {
  private readonly api = inject(CustomersApi);
  private readonly session = inject(Session);
  private readonly setPage = printPageRule();

  /** From the route: /customers/:id/cylinders/:cylinderId. */
  readonly id = input.required<string>();
  readonly cylinderId = input.required<string>();

  protected readonly cylinder = loadEach(this.cylinderId, (id) => this.api.cylinder(id));
  protected readonly chart = computed(() => {
    const c = this.cylinder.value();
    const ctx = { locale: this.session.locale(), timeZone: this.session.timeZone() };
    return c ? boreChart(c, this.session.unit(), (d) => formatShopDate(d, 'date', ctx)) : null;
  });
  protected readonly lastStepWarning = computed(() => {
    const c = this.cylinder.value();
    return c && c.bores.length > 0 ? stepsLeftWarning(c.stepsLeft) : null;
  });
  protected readonly stateLabels = JOB_STATE_LABELS;
  /** The tag prints alone, one label on one page: the shop's roll, or 62 × 35 mm with sheets. */
  protected readonly tagStock = computed(() => rollFor(this.session.labelStock()));
  protected readonly tagSize = computed(() => labelSizeWords(this.tagStock()));

  constructor() {
    effect(() => this.setPage(labelPageCss(this.tagStock())));
  }

  protected print(): void {
    window.print();
  }
}
