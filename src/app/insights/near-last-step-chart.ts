// The chart beside "cylinders near their last step": per engine family, how many cylinders have
// no step left (sleeves to expect) and how many have a few left (customers to tell).
import type { NearLastStepAnswer } from '../../../shared/api/customers';
import { seriesColour } from './chart-palette';
import { axisOptions, stackedBarOptions, type BarChart } from './insights-charts';

export function nearLastStepChart(answer: NearLastStepAnswer): BarChart {
  const families = [...new Set(answer.items.map((i) => i.familyCode))].sort();
  const count = (family: string, left: (n: number) => boolean) =>
    answer.items.filter((i) => i.familyCode === family && left(i.stepsLeft)).length;
  // Cylinders come whole: no tick between one and two.
  const counts = axisOptions(null, 'Cylinders');
  const wholeCounts = { ...counts, ticks: { ...counts.ticks, precision: 0 } };
  return {
    data: {
      labels: families,
      datasets: [
        {
          label: 'No step left (sleeve next)',
          data: families.map((f) => count(f, (n) => n === 0)),
          backgroundColor: seriesColour(0),
        },
        {
          label: answer.within === 1 ? 'One step left' : `1 to ${answer.within} steps left`,
          data: families.map((f) => count(f, (n) => n > 0)),
          backgroundColor: seriesColour(1),
        },
      ],
    },
    options: stackedBarOptions(wholeCounts),
    summary: answer.items.length
      ? `${answer.sleevesToExpect} cylinder${answer.sleevesToExpect === 1 ? '' : 's'} with no step left and ${answer.items.length - answer.sleevesToExpect} within ${answer.within} step${answer.within === 1 ? '' : 's'} of the last, across ${families.length} famil${families.length === 1 ? 'y' : 'ies'}.`
      : 'No marked cylinder is near its last step.',
  };
}
