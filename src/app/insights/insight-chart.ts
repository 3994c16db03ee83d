import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';
import type { ChartData, ChartOptions, ChartType } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';

import { chartFontReady } from './chart-setup';

/** What a chart view draws: the figures, their look, and the sentence that says what they show. */
export interface DrawnChart<T extends ChartType> {
  data: ChartData<T, (number | null)[], string>;
  options: ChartOptions<T>;
  summary: string;
}

/**
 * One chart on a canvas (bars by default, `type="line"` for a line chart). The canvas is drawn
 * only once our font can be used on it, and carries a sentence saying what it shows (a canvas has
 * no text of its own for a screen reader).
 */
@Component({
  selector: 'app-insight-chart',
  imports: [BaseChartDirective],
  template: `
    <div class="chart-box" [style.height.px]="height()">
      @if (fontReady()) {
        <canvas
          baseChart
          [type]="type()"
          role="img"
          [attr.aria-label]="chart().summary"
          [data]="chart().data"
          [options]="chart().options"
        ></canvas>
      }
    </div>
    <p class="chart-summary">{{ chart().summary }}</p>
  `,
  styles: `
    :host {
      display: block;
      min-width: 0;
    }
    .chart-box {
      position: relative;
      width: 100%;
    }
    .chart-summary {
      margin: 8px 0 0;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
    @media print {
      .chart-box {
        break-inside: avoid;
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InsightChart {
  readonly type = input<'bar' | 'line'>('bar');
  readonly chart = input.required<DrawnChart<ChartType>>();
  readonly height = input(320);

  protected readonly fontReady = signal(false);

  constructor() {
    void chartFontReady().then(() => this.fontReady.set(true));
  }
}
