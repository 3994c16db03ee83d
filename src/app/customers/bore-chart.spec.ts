import type { CylinderDetailJson } from '../../../shared/api/customers';
import { boreChart } from './bore-chart';

const mm = (v: string) => ({ mm: v, in: (Number(v) / 25.4).toFixed(4) });

function detail(bores: CylinderDetailJson['bores']): CylinderDetailJson {
  return {
    id: 'c1',
    mark: 'K-12',
    castNumber: null,
    familyId: 'f1',
    familyCode: 'KX-50',
    customerId: 'u1',
    customerName: 'Oriel Fenwright',
    bores,
    stepsLeft: 2,
    family: {
      id: 'f1',
      code: 'KX-50',
      name: 'Invented single',
      standardBore: mm('40.000'),
      cleanup: mm('0.040'),
      maxOversize: mm('1.000'),
    },
    steps: [
      {
        id: 's1',
        label: '+0.25 mm',
        offset: mm('0.250'),
        finishedBore: mm('40.250'),
        pastWall: false,
      },
      {
        id: 's2',
        label: '+0.50 mm',
        offset: mm('0.500'),
        finishedBore: mm('40.500'),
        pastWall: false,
      },
      {
        id: 's3',
        label: '+1.00 mm',
        offset: mm('1.000'),
        finishedBore: mm('41.000'),
        pastWall: false,
      },
      {
        id: 's4',
        label: '+1.50 mm',
        offset: mm('1.500'),
        finishedBore: mm('41.500'),
        pastWall: true,
      },
    ],
    openJobs: [],
  };
}

describe('boreChart', () => {
  it('when the cylinder was never bored, then there is no chart (the page says so in words)', () => {
    expect(boreChart(detail([]), 'mm')).toBeNull();
  });

  it('when it has one bore, then the standard bore opens the axis so the ladder lines have two ends', () => {
    const chart = boreChart(
      detail([
        {
          jobId: 'j1',
          jobNumber: 'CY-1',
          n: 1,
          stepId: 's1',
          stepLabel: '+0.25 mm',
          finishedBore: mm('40.262'),
          measured: true,
          date: '2026-03-14',
          piston: 'PU-1',
        },
      ]),
      'mm',
    );
    expect(chart).not.toBeNull();
    expect(chart!.data.labels).toEqual(['Standard', '2026-03-14 (CY-1)']);
    const [bores, standard, ...ladder] = chart!.data.datasets;
    expect(bores.data).toEqual([null, 40.262]);
    expect(standard.data).toEqual([40, 40]);
    // Steps past the wall are not drawn: the cylinder can never reach them.
    expect(ladder.map((d) => d.label)).toEqual(['Step +0.25 mm', 'Step +0.50 mm', 'Step +1.00 mm']);
    expect(chart!.summary).toContain('the last at 40.262 mm on 2026-03-14');
    expect(chart!.summary).toContain('2 steps left');
  });
});
