import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { provideRouter } from '@angular/router';

import type { FamilyJson, LadderJson } from '../../../shared/api/catalog';
import { toLengthJson } from '../../../shared/lengths';
import type { SessionUser } from '../../../shared/session-types';
import { Session } from '../core/session';
import { StepLadder } from './step-ladder';

const MACHINIST: SessionUser = {
  id: 'u1',
  email: 'mach@example.test',
  name: 'Orla Penhallow',
  role: 'machinist',
  unit: 'mm',
};

// Lengths from exact nanometres: 2.5 in = 63 500 000 nm (1 in = 25.4 mm exactly, NIST SP 811).
const FAMILY = {
  id: 'f1',
  code: 'TR-2',
  name: 'Test twin',
  strokeType: 'two',
  cylinders: 2,
  cooling: 'air',
  standardBore: toLengthJson(63_500_000),
  stroke: toLengthJson(57_150_000),
  clearance: { min: toLengthJson(38_100), max: toLengthJson(63_500) },
  honeAllowance: toLengthJson(25_400),
  cleanup: toLengthJson(50_800),
  maxOversize: toLengthJson(508_000),
  maxTaper: null,
  maxOutOfRound: null,
  ringGap: { min: null, max: null },
  stepSeriesId: 's1',
  stepSeries: { id: 's1', code: 'IMP', name: 'Imperial' },
  notes: '',
  active: true,
  stock: { pistonsOnHand: 2, pistonsFree: 1, emptySteps: 1 },
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
} as FamilyJson;

const LADDER: LadderJson = {
  family: FAMILY,
  steps: [
    {
      stepId: 'st0',
      label: 'STD',
      offset: toLengthJson(0),
      nominalBore: toLengthJson(63_500_000),
      pistons: { onHand: 1, held: 1, free: 0, onOrder: 2 },
      rings: { onHand: 0, held: 0, free: 0, onOrder: 0 },
      pistonsToMeasure: 0,
      kitsFree: 0,
      nothingFree: true,
      missing: ['piston', 'rings'],
      units: [
        {
          id: 'u-held',
          partId: 'p0',
          label: 'PU-000001',
          skirt: toLengthJson(63_449_200),
          status: 'held',
          bin: 'A-1',
          binId: 'b1',
        },
      ],
      unitsTotal: 1,
    },
    {
      stepId: 'st1',
      label: '+0.010 in',
      offset: toLengthJson(254_000),
      nominalBore: toLengthJson(63_754_000),
      pistons: { onHand: 2, held: 0, free: 2, onOrder: 0 },
      rings: { onHand: 3, held: 1, free: 2, onOrder: 0 },
      pistonsToMeasure: 1,
      kitsFree: 2,
      nothingFree: false,
      missing: [],
      units: [
        // 2.5083 in = 63 710 820 nm
        {
          id: 'u1',
          partId: 'p1',
          label: 'PU-000002',
          skirt: toLengthJson(63_710_820),
          status: 'free',
          bin: 'A-2',
          binId: 'b2',
        },
        {
          id: 'u2',
          partId: 'p1',
          label: 'PU-000003',
          skirt: null,
          status: 'free',
          bin: 'A-2',
          binId: 'b2',
        },
      ],
      // A third piston on the shelf that the ladder leaves to "show the other".
      unitsTotal: 3,
    },
    {
      // A free piston but no free ring set: still an empty step, a cylinder bored to it waits.
      stepId: 'st2',
      label: '+0.020 in',
      offset: toLengthJson(508_000),
      nominalBore: toLengthJson(64_008_000),
      pistons: { onHand: 1, held: 0, free: 1, onOrder: 0 },
      pistonsToMeasure: 0,
      rings: { onHand: 1, held: 1, free: 0, onOrder: 0 },
      kitsFree: 0,
      nothingFree: true,
      missing: ['rings'],
      units: [],
      unitsTotal: 0,
    },
  ],
};

describe('StepLadder', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<StepLadder>;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    const loading = TestBed.inject(Session).load();
    http.expectOne('/api/session').flush({ user: MACHINIST });
    await loading;
    fixture = TestBed.createComponent(StepLadder);
    fixture.componentRef.setInput('id', 'f1');
    await fixture.whenStable();
    http.expectOne('/api/engine-families/f1/ladder').flush(LADDER);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  function el(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  it('when loaded, then each step shows its bore and counts, and an empty step says which part is missing', () => {
    const steps = el().querySelectorAll('li.step');
    expect(steps).toHaveLength(3);
    expect(steps[0].classList).toContain('nothing-free');
    expect(steps[0].querySelector('.flag')?.textContent).toContain(
      'No free piston and no free ring set',
    );
    expect(steps[0].textContent).toContain('63.500 mm');
    expect(steps[1].classList).not.toContain('nothing-free');
    expect(steps[1].querySelector('.flag')).toBeNull();
    expect(steps[1].textContent).toMatch(/To measure\s*1/);
    expect(steps[2].classList).toContain('nothing-free');
    const flag = steps[2].querySelector('.flag')?.textContent ?? '';
    expect(flag).toContain('No free ring set');
    expect(flag).not.toContain('piston');
    // A step with a free piston but no ring set is not "every step has a free piston".
    const summary = el().querySelector('.summary')?.textContent ?? '';
    expect(summary).toMatch(
      /2 of 3\s+steps are empty: 1 with no free\s+piston, 2 with no free ring set/,
    );
    expect(summary).not.toContain('Every step');
  });

  it('when a step has free pistons, then each shows as a chip with its measured size or "to measure"', () => {
    const chips = Array.from(el().querySelectorAll('li.step')[1].querySelectorAll('.chip'));
    // 2.5083 in × 25.4 = 63.71082 mm → 63.711 mm at the trade's 0.001 mm.
    expect(chips.map((c) => c.getAttribute('aria-label'))).toEqual([
      '63.711 mm, free, PU-000002, bin A-2',
      'to measure, free, PU-000003, bin A-2',
    ]);
    expect(chips[0].textContent?.trim()).toBe('63.711 mm');
  });

  it('when the unit toggle is set to inches, then the sizes read in inches', async () => {
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const inch = await loader.getHarness(MatButtonToggleHarness.with({ text: 'in' }));
    await inch.check();
    await fixture.whenStable();
    const step = el().querySelectorAll('li.step')[1];
    expect(step.textContent).toContain('2.5100 in');
    expect(step.querySelector('.chip')?.textContent?.trim()).toBe('2.5083 in');
  });

  it('when a step has more pistons than shown, then a button loads the whole shelf of that step', async () => {
    const step = () => el().querySelectorAll('li.step')[1];
    const more = step().querySelector<HTMLButtonElement>('button.show-more');
    expect(more?.textContent).toMatch(/Show the other 1\s+piston/);
    expect(el().querySelectorAll('li.step')[0].querySelector('button.show-more')).toBeNull();
    more?.click();
    const req = http.expectOne(
      (r) =>
        r.url === '/api/engine-families/f1/ladder/steps/st1/units' && r.params.get('page') === '1',
    );
    const unit = (id: string, label: string, nm: number | null) => ({
      id,
      partId: 'p1',
      label,
      skirt: nm === null ? null : toLengthJson(nm),
      status: 'free',
      bin: 'A-2',
      binId: 'b2',
    });
    req.flush({
      items: [
        unit('u3', 'PU-000004', 63_700_000),
        unit('u1', 'PU-000002', 63_710_820),
        unit('u2', 'PU-000003', null),
      ],
      total: 3,
    });
    await fixture.whenStable();
    expect(step().querySelectorAll('.chip')).toHaveLength(3);
    expect(step().querySelector('button.show-more')).toBeNull();
  });
});
