import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';
import { BaseChartDirective } from 'ng2-charts';

import { chartFontReady } from '../insights/chart-setup';
import type { BoreChart } from './bore-chart';

/** The bore chart on a canvas, drawn once our font is usable, with its sentence for readers. */
@Component({
  selector: 'app-bore-chart',
  imports: [BaseChartDirective],
  template: `
    <div class="chart-box">
      @if (fontReady()) {
        <canvas
          baseChart
          type="line"
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
      height: 300px;
    }
    .chart-summary {
      margin: 8px 0 0;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BoreChartView {
  readonly chart = input.required<BoreChart>();
  protected readonly fontReady = signal(false);

  constructor() {
    void chartFontReady().then(() => this.fontReady.set(true));
  }
}
