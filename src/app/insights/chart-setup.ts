import {
  BarController,
  BarElement,
  CategoryScale,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  Tooltip,
} from 'chart.js';
import { provideCharts } from 'ng2-charts';

import { GRID, INK } from './chart-palette';

/** Our type face, as the rest of the app sets it in styles.scss. */
export const CHART_FONT = "'IBM Plex Sans', system-ui, sans-serif";

/**
 * Chart.js with only the pieces the insights pages draw (bars, a line over them, two linear axes,
 * a legend and tooltips), so the lazy chunk stays small. No animation: a chart that is printed or
 * photographed shows its final state.
 */
export function provideInsightCharts() {
  return provideCharts({
    registerables: [
      BarController,
      BarElement,
      LineController,
      LineElement,
      PointElement,
      CategoryScale,
      LinearScale,
      Legend,
      Tooltip,
    ],
    defaults: {
      font: { family: CHART_FONT, size: 13 },
      color: INK,
      borderColor: GRID,
      animation: false,
      maintainAspectRatio: false,
      responsive: true,
    },
  });
}

/** Resolves once the chart font can be drawn on a canvas (a canvas does not wait for web fonts). */
export async function chartFontReady(): Promise<void> {
  if (typeof document === 'undefined' || !('fonts' in document)) return;
  try {
    await Promise.all([
      document.fonts.load(`400 13px ${CHART_FONT}`),
      document.fonts.load(`600 13px ${CHART_FONT}`),
    ]);
  } catch {
    // A font that cannot load leaves the fallback face: the chart is still drawn.
  }
}
