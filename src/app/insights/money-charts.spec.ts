import type { RevenueAnswer } from '../../../shared/api/insights';
import { revenueChart } from './money-charts';

const month = (m: string, labour: string, parts: string, other: string, invoiced: string) => ({
  month: m,
  invoices: invoiced === '0.00' ? 0 : 1,
  labour,
  parts,
  other,
  tax: '0.00',
  invoiced,
  credited: '0.00',
});

const answer: RevenueAnswer = {
  months: [
    month('2026-01', '209.00', '247.00', '-10.00', '446.00'),
    month('2026-02', '0.00', '0.00', '0.00', '0.00'),
    month('2026-03', '55.00', '89.00', '0.00', '144.00'),
  ],
  totals: { ...month('', '264.00', '336.00', '-10.00', '590.00'), invoices: 2 },
  period: { from: '2026-01-01', to: '2026-03-31', timeZone: 'UTC' },
  currency: 'EUR',
};

describe('revenueChart', () => {
  it('when months were invoiced, then labour, parts and other lines stack per month', () => {
    const chart = revenueChart(answer);
    expect(chart.data.labels).toEqual(['2026-01', '2026-02', '2026-03']);
    expect(chart.data.datasets.map((d) => [d.label, d.data, d.stack])).toEqual([
      ['Labour', [209, 0, 55], 'invoiced'],
      ['Parts', [247, 0, 89], 'invoiced'],
      ['Other lines', [-10, 0, 0], 'invoiced'],
    ]);
    expect(chart.options.scales?.['x']).toEqual(expect.objectContaining({ stacked: true }));
    expect(chart.options.scales?.['y']).toEqual(expect.objectContaining({ stacked: true }));
  });

  it('when it is read aloud, then its sentence names the period and the month invoiced most', () => {
    expect(revenueChart(answer).summary).toBe(
      'Labour, parts and other lines invoiced per month from 2026-01 to 2026-03; the most was invoiced in 2026-01, €446.00.',
    );
  });

  it('when nothing was invoiced, then the sentence says so', () => {
    const empty = { ...answer, months: answer.months.map((m) => ({ ...m, invoiced: '0.00' })) };
    expect(revenueChart(empty).summary).toBe('Nothing was invoiced from 2026-01 to 2026-03.');
  });
});
