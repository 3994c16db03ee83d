// The chart of a cylinder's bores over time against its family's step ladder: pure functions, so
// what the chart shows can be checked without a canvas. The table beside it has the same figures.
import type { ChartData, ChartOptions } from 'chart.js';

import type { CylinderDetailJson } from '../../../shared/api/customers';
import { formatLength, lengthJsonToNm, type LengthUnit } from '../../../shared/lengths';
import { GRID, INK, LINE_COLOUR, NEUTRAL_COLOUR } from '../insights/chart-palette';

export interface BoreChart {
  data: ChartData<'line', (number | null)[], string>;
  options: ChartOptions<'line'>;
  summary: string;
}

/** Chart positions only: the figures a person reads come from the API's strings. */
function plotted(length: { mm: string; in: string }, unit: LengthUnit): number {
  return Number(unit === 'in' ? length.in : length.mm);
}

/** `day` writes a YYYY-MM-DD date the shop's way (the page passes the shop's format). */
export function boreChart(
  c: CylinderDetailJson,
  unit: LengthUnit,
  day: (date: string) => string = (date) => date,
): BoreChart | null {
  if (c.bores.length === 0) return null;
  // A first place on the axis for the standard bore, so the ladder's lines have two ends even
  // when the cylinder has one bore.
  const labels = ['Standard', ...c.bores.map((b) => `${day(b.date)} (${b.jobNumber})`)];
  const bores = [null, ...c.bores.map((b) => plotted(b.finishedBore, unit))];
  const ladder = c.steps
    .filter((s) => !s.pastWall)
    .map((s) => ({ label: s.label, value: plotted(s.finishedBore, unit) }));
  const standard = plotted(c.family.standardBore, unit);
  const data: ChartData<'line', (number | null)[], string> = {
    labels,
    datasets: [
      {
        label: 'Finished bore',
        data: bores,
        borderColor: LINE_COLOUR,
        backgroundColor: LINE_COLOUR,
        borderWidth: 3,
        pointRadius: 5,
        order: 0,
      },
      {
        label: 'Standard bore',
        data: labels.map(() => standard),
        borderColor: INK,
        borderWidth: 1,
        pointRadius: 0,
        order: 1,
      },
      ...ladder.map((s) => ({
        label: `Step ${s.label}`,
        data: labels.map(() => s.value),
        borderColor: NEUTRAL_COLOUR,
        borderDash: [6, 4],
        borderWidth: 1,
        pointRadius: 0,
        order: 2,
      })),
    ],
  };
  const options: ChartOptions<'line'> = {
    plugins: {
      // Every step line would crowd the legend: the table names them.
      legend: {
        position: 'bottom',
        labels: {
          color: INK,
          filter: (item) => !String(item.text).startsWith('Step '),
        },
      },
      tooltip: { mode: 'nearest', intersect: false },
    },
    scales: {
      x: { grid: { display: false }, ticks: { color: INK } },
      y: {
        grid: { color: GRID },
        ticks: { color: INK },
        title: { display: true, text: `Finished bore (${unit})`, color: INK },
      },
    },
  };
  const last = c.bores[c.bores.length - 1];
  const summary =
    `Finished bore of ${c.mark} at each of its ${c.bores.length} bore${c.bores.length === 1 ? '' : 's'}, ` +
    `the last at ${formatLength(lengthJsonToNm(last.finishedBore, unit), unit)} on ${day(last.date)}, ` +
    `drawn against the standard bore and the ${ladder.length} steps of ${c.family.code}; ` +
    `${c.stepsLeft} step${c.stepsLeft === 1 ? '' : 's'} left.`;
  return { data, options, summary };
}
