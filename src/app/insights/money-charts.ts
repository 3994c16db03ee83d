// The money page's chart: each month's invoiced labour and parts as stacked bars (the lines staff
// typed by hand, discounts among them, as a third part), with the table beside it holding the same
// figures and the tax and credit notes.
import type { RevenueAnswer } from '../../../shared/api/insights';
import { axisOptions, stackedBarOptions, type BarChart } from './insights-charts';
import { seriesColour } from './chart-palette';
import { formatAmount } from './insights-format';

export function revenueChart(answer: RevenueAnswer): BarChart {
  const labels = answer.months.map((m) => m.month);
  const part = (
    label: string,
    pick: (m: RevenueAnswer['months'][number]) => string,
    i: number,
  ) => ({
    label,
    data: answer.months.map((m) => Number(pick(m))),
    backgroundColor: seriesColour(i),
    stack: 'invoiced',
  });
  const best = answer.months.reduce<RevenueAnswer['months'][number] | null>(
    (top, m) => (!top || Number(m.invoiced) > Number(top.invoiced) ? m : top),
    null,
  );
  return {
    data: {
      labels,
      datasets: [
        part('Labour', (m) => m.labour, 0),
        part('Parts', (m) => m.parts, 2),
        part('Other lines', (m) => m.other, 4),
      ],
    },
    options: stackedBarOptions(axisOptions(answer.currency, 'Invoiced')),
    summary:
      best && Number(best.invoiced) > 0
        ? `Labour, parts and other lines invoiced per month from ${labels[0]} to ${labels[labels.length - 1]}; the most was invoiced in ${best.month}, ${formatAmount(best.invoiced, answer.currency)}.`
        : `Nothing was invoiced from ${labels[0]} to ${labels[labels.length - 1]}.`,
  };
}
