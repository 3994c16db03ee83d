import type { AbcAnswer, MonthlyAnswer, SalesAnswer } from '../../../shared/api/insights';
import { SERIES_COLOURS } from './chart-palette';
import { ABC_COLOURS, monthlyChart, paretoChart, salesByFamilyChart } from './insights-charts';

const period = { from: '2026-01-01', to: '2026-03-31', timeZone: 'UTC' };

const sales: SalesAnswer = {
  rows: [
    row('QV', 1, 5, '300.00'),
    row('QV', 0, 2, '100.00'),
    row('BT', 1, 3, '210.00'),
    { ...row(null, null, 4, '20.00'), familyId: null, stepId: null },
  ],
  totals: { units: 14, revenue: '630.00', margin: '250.00' },
  by: ['family', 'step'],
  period,
  currency: 'EUR',
};

function row(family: string | null, position: number | null, units: number, revenue: string) {
  return {
    familyId: family ? `id-${family}` : null,
    stepId: position === null ? null : `step-${family}-${position}`,
    familyCode: family,
    familyName: family ? `Family ${family}` : null,
    stepLabel: position === null ? null : position === 0 ? 'STD' : `+0.${position}5 mm`,
    stepPosition: position,
    units,
    revenue,
    margin: '0',
  };
}

describe('insight charts', () => {
  it('when sales are charted by family, then each oversize position is one stacked series', () => {
    const chart = salesByFamilyChart(sales, 'revenue');
    expect(chart.data.labels).toEqual(['QV', 'BT', 'No family']);
    expect(chart.data.datasets.map((d) => d.label)).toEqual([
      'STD',
      '1st oversize',
      'Not sized (small parts)',
    ]);
    expect(chart.data.datasets.map((d) => d.data)).toEqual([
      [100, 0, 0],
      [300, 210, 0],
      [0, 0, 20],
    ]);
    expect(chart.data.datasets[0].backgroundColor).toBe(SERIES_COLOURS[0]);
    expect(chart.summary).toContain('€630.00');
    const units = salesByFamilyChart(sales, 'units');
    expect(units.data.datasets[1].data).toEqual([5, 3, 0]);
  });

  it('when months are charted, then revenue is the bar and units the line on a second axis', () => {
    const months: MonthlyAnswer = {
      months: [
        { month: '2026-01', units: 3, revenue: '90.00', margin: '30.00' },
        { month: '2026-02', units: 7, revenue: '250.50', margin: '80.00' },
      ],
      period,
      currency: 'EUR',
    };
    const chart = monthlyChart(months, 'EUR');
    expect(chart.data.datasets[0].data).toEqual([90, 250.5]);
    expect(chart.data.datasets[1]).toMatchObject({ type: 'line', yAxisID: 'y1', data: [3, 7] });
    expect(chart.summary).toContain('2026-02');
  });

  it('when ABC classes are charted, then bars take their class colour and the line the running share in percent', () => {
    const answer: AbcAnswer = {
      items: [
        item('p1', '800', '0.8000', '0.8000', 'A'),
        item('p2', '150', '0.1500', '0.9500', 'B'),
        item('p3', '50', '0.0500', '1.0000', 'C'),
      ],
      classes: [
        { class: 'A', parts: 1, value: '800.00', share: '0.8000' },
        { class: 'B', parts: 1, value: '150.00', share: '0.1500' },
        { class: 'C', parts: 1, value: '50.00', share: '0.0500' },
      ],
      totalValue: '1000.00',
      months: 12,
      currency: 'EUR',
    };
    const chart = paretoChart(answer);
    expect(chart.data.datasets[0].backgroundColor).toEqual([
      ABC_COLOURS.A,
      ABC_COLOURS.B,
      ABC_COLOURS.C,
    ]);
    expect(chart.data.datasets[1].data).toEqual([80, 95, 100]);
    expect(chart.summary).toBe(
      '1 parts (class A) carry 80.0 % of the value issued in the last 12 months.',
    );
  });
});

function item(
  partId: string,
  value: string,
  share: string,
  cumulative: string,
  cls: 'A' | 'B' | 'C',
) {
  return {
    partId,
    value,
    share,
    cumulative,
    class: cls,
    sku: partId.toUpperCase(),
    description: 'Test part',
    familyCode: null,
    stepLabel: null,
    onHand: 1,
  };
}
