// Chart data and options built from the insights answers: pure functions, so what a chart shows can
// be checked without a canvas. Every chart has a table beside it with the same figures.
import type { ChartData, ChartOptions, TooltipItem } from 'chart.js';

import type {
  AbcAnswer,
  ExposureAnswer,
  MonthlyAnswer,
  SalesAnswer,
  StockValueAnswer,
  SupplierReliabilityAnswer,
  TopSellerRank,
  TopSellersAnswer,
} from '../../../shared/api/insights';
import { GRID, INK, LINE_COLOUR, NEUTRAL_COLOUR, seriesColour } from './chart-palette';
import { formatAmount, formatAmountShort, formatCount, stepPositionName } from './insights-format';

export const NO_FAMILY = 'No family';

export type Measure = 'revenue' | 'units' | 'margin';

/** A bar chart, possibly with a line over it (the line's own type is set on its dataset). */
export interface BarChart {
  data: ChartData<'bar', number[], string>;
  options: ChartOptions<'bar'>;
  /** One sentence that says what the chart shows, for screen readers and the print. */
  summary: string;
}

/** A figure axis from zero: amounts in the currency given (short, "€12K"), counts otherwise. */
export function axisOptions(money: string | null, title?: string) {
  return {
    beginAtZero: true,
    grid: { color: GRID },
    ticks: {
      color: INK,
      callback: (value: string | number) =>
        money ? formatAmountShort(Number(value), money) : formatCount(Number(value)),
    },
    ...(title ? { title: { display: true, text: title, color: INK } } : {}),
  };
}

function baseOptions(): ChartOptions<'bar'> {
  return {
    plugins: {
      legend: { position: 'bottom', labels: { color: INK, boxWidth: 14, boxHeight: 14 } },
      tooltip: { mode: 'index', intersect: false },
    },
    scales: { x: { grid: { display: false }, ticks: { color: INK } } },
  };
}

/**
 * Bars stacked per label (a family's steps, a month's labour and parts), the legend below, over the
 * figure axis given; several charts share it so their stacks read alike.
 */
export function stackedBarOptions(y: ReturnType<typeof axisOptions>): ChartOptions<'bar'> {
  const options = baseOptions();
  options.scales = {
    x: { stacked: true, grid: { display: false }, ticks: { color: INK } },
    y: { stacked: true, ...y },
  };
  return options;
}

/** A line drawn over the bars on the right-hand axis (y1): Chart.js mixes chart types per dataset. */
function lineOverBars(label: string, data: number[]) {
  return {
    type: 'line' as unknown as 'bar',
    label,
    data,
    borderColor: LINE_COLOUR,
    backgroundColor: LINE_COLOUR,
    borderWidth: 2,
    yAxisID: 'y1',
    order: 1,
  };
}

function measureLabel(measure: Measure): string {
  return measure === 'units' ? 'Units' : measure === 'revenue' ? 'Revenue' : 'Margin';
}

function measureValue(row: { units: number; revenue: string; margin: string }, m: Measure) {
  return m === 'units' ? row.units : Number(row[m]);
}

/**
 * Sales per family, one stacked segment per oversize position (STD, 1st, 2nd …), so families on
 * metric and imperial series compare step for step.
 */
export function salesByFamilyChart(answer: SalesAnswer, measure: Measure): BarChart {
  const families = [...new Set(answer.rows.map((r) => r.familyCode ?? NO_FAMILY))];
  const positions = [...new Set(answer.rows.map((r) => r.stepPosition))].sort(
    (a, b) => (a ?? 99) - (b ?? 99),
  );
  const datasets = positions.map((position, i) => ({
    label: stepPositionName(position),
    data: families.map((family) =>
      answer.rows
        .filter((r) => (r.familyCode ?? NO_FAMILY) === family && r.stepPosition === position)
        .reduce((sum, r) => sum + measureValue(r, measure), 0),
    ),
    backgroundColor: position === null ? NEUTRAL_COLOUR : seriesColour(i),
    borderColor: '#ffffff',
    borderWidth: 1,
    stack: 'steps',
  }));
  const money = measure === 'units' ? null : answer.currency;
  const options = stackedBarOptions(axisOptions(money, measureLabel(measure)));
  options.plugins = {
    ...options.plugins,
    tooltip: {
      mode: 'index',
      intersect: false,
      callbacks: {
        label: (item: TooltipItem<'bar'>) =>
          `${item.dataset.label}: ${
            money ? formatAmount(String(item.parsed.y), money) : formatCount(item.parsed.y ?? 0)
          }`,
      },
    },
  };
  const total =
    measure === 'units'
      ? formatCount(answer.totals.units)
      : formatAmount(answer.totals[measure], answer.currency);
  return {
    data: { labels: families, datasets },
    options,
    summary: `${measureLabel(measure)} by engine family from ${answer.period.from} to ${answer.period.to}, split by oversize step; ${families.length} families, ${total} in all.`,
  };
}

/** Revenue per month as bars, units as a line on their own axis. */
export function monthlyChart(answer: MonthlyAnswer, currency: string): BarChart {
  const labels = answer.months.map((m) => m.month);
  const options = baseOptions();
  options.scales = {
    x: { grid: { display: false }, ticks: { color: INK } },
    y: { ...axisOptions(currency, 'Revenue'), position: 'left' },
    y1: { ...axisOptions(null, 'Units'), position: 'right', grid: { display: false } },
  };
  const best = answer.months.reduce<MonthlyAnswer['months'][number] | null>(
    (top, m) => (!top || Number(m.revenue) > Number(top.revenue) ? m : top),
    null,
  );
  return {
    data: {
      labels,
      datasets: [
        {
          label: 'Revenue',
          data: answer.months.map((m) => Number(m.revenue)),
          backgroundColor: seriesColour(2),
          yAxisID: 'y',
          order: 2,
        },
        lineOverBars(
          'Units',
          answer.months.map((m) => m.units),
        ),
      ],
    },
    options,
    summary: best
      ? `Revenue and units per month from ${labels[0]} to ${labels[labels.length - 1]}; the best month was ${best.month} with ${formatAmount(best.revenue, currency)}.`
      : 'No months in the period.',
  };
}

/** The best sellers as horizontal bars of the figure they are ranked by. */
export function topSellersChart(answer: TopSellersAnswer): BarChart {
  const rank: TopSellerRank = answer.rank;
  const money = rank === 'units' ? null : answer.currency;
  const options = baseOptions();
  options.indexAxis = 'y';
  options.plugins = { ...options.plugins, legend: { display: false } };
  options.scales = {
    x: axisOptions(money, measureLabel(rank)),
    y: { grid: { display: false }, ticks: { color: INK } },
  };
  return {
    data: {
      labels: answer.items.map((i) => i.sku),
      datasets: [
        {
          label: measureLabel(rank),
          data: answer.items.map((i) => measureValue(i, rank)),
          backgroundColor: seriesColour(0),
        },
      ],
    },
    options,
    summary: answer.items.length
      ? `The ${answer.items.length} best sellers by ${rank}; first ${answer.items[0].sku}.`
      : 'Nothing sold in the period.',
  };
}

/** What sits on the shelf per family at average cost, beside what went out at cost in the window. */
export function stockValueChart(answer: StockValueAnswer): BarChart {
  const labels = answer.items.map((i) => i.familyCode ?? NO_FAMILY);
  const options = baseOptions();
  options.scales = {
    x: { grid: { display: false }, ticks: { color: INK } },
    y: axisOptions(answer.currency, 'At cost'),
  };
  return {
    data: {
      labels,
      datasets: [
        {
          label: 'On the shelf now',
          data: answer.items.map((i) => Number(i.value)),
          backgroundColor: seriesColour(0),
        },
        {
          label: `Issued in the last ${answer.months} months`,
          data: answer.items.map((i) => Number(i.costOfIssues)),
          backgroundColor: seriesColour(1),
        },
      ],
    },
    options,
    summary: `Stock on the shelf is worth ${formatAmount(answer.totalValue, answer.currency)} at average cost across ${labels.length} families.`,
  };
}

export const ABC_COLOURS = { A: seriesColour(0), B: seriesColour(1), C: seriesColour(4) } as const;

/** The parts that carry most of the value as bars, with the running share as a line (a Pareto chart). */
export function paretoChart(answer: AbcAnswer, top = 30): BarChart {
  const items = answer.items.slice(0, top);
  const options = baseOptions();
  options.scales = {
    x: { grid: { display: false }, ticks: { color: INK, maxRotation: 70, minRotation: 45 } },
    y: axisOptions(answer.currency, 'Issue value at cost'),
    y1: {
      position: 'right',
      min: 0,
      max: 100,
      grid: { display: false },
      ticks: { color: INK, callback: (v: string | number) => `${v} %` },
      title: { display: true, text: 'Running share', color: INK },
    },
  };
  const a = answer.classes.find((c) => c.class === 'A');
  return {
    data: {
      labels: items.map((i) => i.sku),
      datasets: [
        {
          label: 'Issue value (bar colour: class A, B, C)',
          data: items.map((i) => Number(i.value)),
          backgroundColor: items.map((i) => ABC_COLOURS[i.class]),
          yAxisID: 'y',
          order: 2,
        },
        lineOverBars(
          'Running share of value',
          items.map((i) => Number(i.cumulative) * 100),
        ),
      ],
    },
    options,
    summary: a
      ? `${a.parts} parts (class A) carry ${(Number(a.share) * 100).toFixed(1)} % of the value issued in the last ${answer.months} months.`
      : 'No parts were issued.',
  };
}

/** Steps that ran short: how often, and how many jobs waited. */
export function exposureChart(answer: ExposureAnswer, top = 15): BarChart {
  const items = answer.items.slice(0, top);
  const options = baseOptions();
  options.indexAxis = 'y';
  options.scales = {
    x: axisOptions(null, 'Count'),
    y: { grid: { display: false }, ticks: { color: INK } },
  };
  return {
    data: {
      labels: items.map((i) => `${i.familyCode} ${i.stepLabel}`),
      datasets: [
        {
          label: 'Times nothing was free',
          data: items.map((i) => i.timesShort),
          backgroundColor: seriesColour(0),
        },
        {
          label: 'Jobs that waited',
          data: items.map((i) => i.jobsWaited),
          backgroundColor: seriesColour(1),
        },
      ],
    },
    options,
    summary: items.length
      ? `Most often short: ${items[0].familyCode} ${items[0].stepLabel}, ${items[0].timesShort} times.`
      : 'No step ran short.',
  };
}

/** Promised against actual days from order to arrival, per supplier. */
export function supplierChart(answer: SupplierReliabilityAnswer): BarChart {
  const options = baseOptions();
  options.scales = {
    x: { grid: { display: false }, ticks: { color: INK } },
    y: axisOptions(null, 'Days'),
  };
  return {
    data: {
      labels: answer.items.map((i) => i.supplierName),
      datasets: [
        {
          label: 'Promised',
          data: answer.items.map((i) => Number(i.promisedDays ?? 0)),
          backgroundColor: seriesColour(2),
        },
        {
          label: 'Actual',
          data: answer.items.map((i) => Number(i.actualDays ?? 0)),
          backgroundColor: seriesColour(5),
        },
      ],
    },
    options,
    summary: `Promised and actual lead times for ${answer.items.length} suppliers.`,
  };
}
