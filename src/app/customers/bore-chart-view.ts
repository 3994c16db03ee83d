import { ChangeDetectionStrategy, Component, input } from '@angular/core';

import { InsightChart } from '../insights/insight-chart';
import type { BoreChart } from './bore-chart';

/** The bore chart: the app's chart view as a line chart, 300 px high. */
@Component({
  selector: 'app-bore-chart',
  imports: [InsightChart],
  template: `<app-insight-chart type="line" [chart]="chart()" [height]="300" />`,
  styles: `
    :host {
      display: block;
      min-width: 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BoreChartView {
  readonly chart = input.required<BoreChart>();
}
