import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';
import { BaseChartDirective } from 'ng2-charts';

import { chartFontReady } from './chart-setup';
import type { BarChart } from './insights-charts';

/**
 * One chart on a canvas. The canvas is drawn only once our font can be used on it, and carries a
 * sentence saying what it shows (a canvas has no text of its own for a screen reader).
 */
@Component({
  selector: 'app-insight-chart',
  imports: [BaseChartDirective],
  template: `
    <div class="chart-box" [style.height.px]="height()">
      @if (fontReady()) {
        <canvas
          baseChart
          type="bar"
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
  readonly chart = input.required<BarChart>();
  readonly height = input(320);

  protected readonly fontReady = signal(false);

  constructor() {
    void chartFontReady().then(() => this.fontReady.set(true));
  }
}
