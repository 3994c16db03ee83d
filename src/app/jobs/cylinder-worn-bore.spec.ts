import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';

import type {
  CylinderJson,
  JobJson,
  ProposalJson,
  RecommendationJson,
} from '../../../shared/api/jobs';
import type { LengthJson, LengthUnit } from '../../../shared/lengths';
import { setUpHttpTest, signIn } from '../testing/http-test';
import { cylinderJson, INVENTED_SINGLE, jobJson, L } from '../testing/job-fixtures';
import { CylinderPage } from './cylinder-page';

// A bore worn well past the first steps: every step below the one that cleans up has a negative
// clean-up (its finished bore does not reach the wear). The page must show each of them, let the
// machinist take the suggested step and then set a measured piston aside through the dialog.
//
// Lengths are written as the API sends them, both units, converted by hand with 1 in = 25.4 mm
// exactly (NIST SP 811, appendix B).

const JOB_ID = '5d0c8a3e-2b61-4f0e-9d7a-6c4b1e2f3a90';

interface Case {
  title: string;
  unit: LengthUnit;
  family: JobJson['family'];
  largest: LengthJson;
  steps: Array<{ id: string; label: string; finished: LengthJson; cleanup: LengthJson }>;
  choice: string;
  /** Clean-up column text expected for each step, in the user's unit, worked by hand. */
  cleanupShown: string[];
}

const INCH: Case = {
  title: 'an inch user and an inch family worn 0.030 in over standard',
  unit: 'in',
  // Invented air-cooled single: standard 2.5170 in, clean-up 0.0030 in, steps of 0.010 in.
  family: { ...INVENTED_SINGLE, id: 'f-in' },
  // 2.5170 + 0.030 = 2.5470 in.
  largest: L('64.6938', '2.5470'),
  steps: [
    { id: 's0', label: 'STD', finished: L('63.9318', '2.5170'), cleanup: L('-0.762', '-0.0300') },
    {
      id: 's1',
      label: '+0.010 in',
      finished: L('64.1858', '2.5270'),
      cleanup: L('-0.508', '-0.0200'),
    },
    {
      id: 's2',
      label: '+0.020 in',
      finished: L('64.4398', '2.5370'),
      cleanup: L('-0.254', '-0.0100'),
    },
    {
      id: 's3',
      label: '+0.030 in',
      finished: L('64.6938', '2.5470'),
      cleanup: L('0.000', '0.0000'),
    },
    {
      id: 's4',
      label: '+0.040 in',
      finished: L('64.9478', '2.5570'),
      cleanup: L('0.254', '0.0100'),
    },
  ],
  choice: 's4',
  // Finished bore minus 2.5470 in, by hand.
  cleanupShown: [
    'short by 0.0300 in',
    'short by 0.0200 in',
    'short by 0.0100 in',
    '0.0000 in',
    '0.0100 in',
  ],
};

const MM: Case = {
  title: 'a millimetre user and a metric two-stroke worn 0.7 mm at the top of ring travel',
  unit: 'mm',
  // Invented two-stroke: standard 54.000 mm, clean-up 0.040 mm, steps of 0.25 mm.
  family: {
    id: 'f-mm',
    code: 'ZW-54',
    name: 'Invented two-stroke',
    cylinders: 1,
    standardBore: L('54.000', '2.1260'),
    clearance: { min: L('0.040', '0.0016'), max: L('0.060', '0.0024') },
    honeAllowance: L('0.030', '0.0012'),
    cleanup: L('0.040', '0.0016'),
    maxOversize: L('1.000', '0.0394'),
    maxTaper: L('0.050', '0.0020'),
    maxOutOfRound: L('0.050', '0.0020'),
    ringGap: { min: null, max: null },
  },
  largest: L('54.700', '2.1535'),
  steps: [
    { id: 'm0', label: 'STD', finished: L('54.000', '2.1260'), cleanup: L('-0.700', '-0.0276') },
    {
      id: 'm1',
      label: '+0.25 mm',
      finished: L('54.250', '2.1358'),
      cleanup: L('-0.450', '-0.0177'),
    },
    {
      id: 'm2',
      label: '+0.50 mm',
      finished: L('54.500', '2.1457'),
      cleanup: L('-0.200', '-0.0079'),
    },
    { id: 'm3', label: '+0.75 mm', finished: L('54.750', '2.1555'), cleanup: L('0.050', '0.0020') },
    { id: 'm4', label: '+1.00 mm', finished: L('55.000', '2.1654'), cleanup: L('0.300', '0.0118') },
  ],
  choice: 'm3',
  // Finished bore minus 54.700 mm, by hand.
  cleanupShown: [
    'short by 0.700 mm',
    'short by 0.450 mm',
    'short by 0.200 mm',
    '0.050 mm',
    '0.300 mm',
  ],
};

function cylinder(c: Case, stepId: string | null): CylinderJson {
  const step = c.steps.find((s) => s.id === stepId) ?? null;
  return cylinderJson({
    readings: [{ depth: 'top', axis: 'pin', diameter: c.largest, unit: c.unit }],
    wear: {
      largest: c.largest,
      taper: L('0.000', '0.0000'),
      outOfRound: L('0.000', '0.0000'),
      overStandard: null,
    },
    measuredAt: '2026-12-02T09:00:00.000Z',
    step: step ? { id: step.id, label: step.label, nominalBore: step.finished } : null,
  });
}

function job(c: Case, stepId: string | null): JobJson {
  return jobJson({
    id: JOB_ID,
    number: 'CY-2612-0077',
    customerId: 'c-ismay',
    customerName: 'Ismay Tarrow',
    family: c.family,
    createdAt: '2026-12-02T08:00:00.000Z',
    cylinderDetails: [cylinder(c, stepId)],
  });
}

function recommendation(c: Case, chosen: string | null): RecommendationJson {
  const choiceIndex = c.steps.findIndex((s) => s.id === c.choice);
  return {
    steps: c.steps.map((s, i) => ({
      stepId: s.id,
      label: s.label,
      finishedBore: s.finished,
      cleanup: s.cleanup,
      freePistons: 2,
      freeRings: 3,
      onOrder: 0,
      suitable: i >= choiceIndex,
      reason: i >= choiceIndex ? 'cleans up' : 'does not clean up',
    })),
    choice: c.choice,
    largestWorn: c.largest,
    chosenStepId: chosen,
    stepsLeft: c.steps.length - 1 - choiceIndex,
    earlierBore: null,
    cylinder: null,
  };
}

function proposal(c: Case): ProposalJson {
  const step = c.steps.find((s) => s.id === c.choice)!;
  const unit = (label: string, skirt: LengthJson) => ({
    id: `u-${label}`,
    label,
    partId: 'p1',
    sku: 'PST-ZW54-075',
    skirt,
    bin: 'B-12',
    stepLabel: step.label,
  });
  return {
    step: { id: step.id, label: step.label, nominalBore: step.finished },
    unit: unit('PU-000101', c.unit === 'in' ? L('64.8970', '2.5550') : L('54.702', '2.1536')),
    others: [unit('PU-000102', c.unit === 'in' ? L('64.9224', '2.5560') : L('54.706', '2.1538'))],
    rings: [{ partId: 'r1', sku: 'RNG-075', description: 'Ring set', free: 3 }],
    piston: null,
    cleanupBasis: null,
    heldCleansUp: null,
  };
}

describe.each([INCH, MM])('CylinderPage on a worn bore: $title', (c) => {
  let http: HttpTestingController;
  const url = `/api/jobs/${JOB_ID}/cylinders/1`;

  async function render() {
    ({ http } = setUpHttpTest());
    await signIn(http, {
      id: 'u1',
      email: 'ines@example.test',
      name: 'Ines',
      role: 'machinist',
      unit: c.unit,
    });
    const fixture = TestBed.createComponent(CylinderPage);
    fixture.componentRef.setInput('id', JOB_ID);
    fixture.componentRef.setInput('n', '1');
    await fixture.whenStable();
    http.expectOne(`/api/jobs/${JOB_ID}`).flush(job(c, null));
    await fixture.whenStable();
    http.expectOne(`${url}/recommendation`).flush(recommendation(c, null));
    // Not linked to a marked cylinder: the customer's cylinders are offered to link (none here).
    http.expectOne('/api/customers/c-ismay/cylinders').flush({ items: [] });
    await fixture.whenStable();
    return fixture;
  }

  function button(root: ParentNode, text: string): HTMLButtonElement | undefined {
    return Array.from(root.querySelectorAll('button')).find((b) => b.textContent?.includes(text));
  }

  afterEach(() => http.verify());

  it('when the steps below the suggested one fall short, then every row shows, short ones say by how much', async () => {
    const fixture = await render();
    const element = fixture.nativeElement as HTMLElement;
    const rows = Array.from(element.querySelectorAll('table.steps tbody tr'));
    expect(rows).toHaveLength(c.steps.length);
    const cleanups = rows.map((r) => r.querySelectorAll('td')[1]?.textContent?.trim());
    expect(cleanups).toEqual(c.cleanupShown);
    // Free pistons and the verdict are filled on every row, not only the first ones.
    for (const row of rows) {
      const cells = row.querySelectorAll('td');
      expect(cells[2]?.textContent?.trim()).toBe('2');
      expect(cells[5]?.textContent?.trim()).toMatch(/clean/);
    }
  });

  it('when the suggested step is taken, then a piston can be set aside and the dialog lists the measured pistons', async () => {
    const fixture = await render();
    const element = fixture.nativeElement as HTMLElement;
    const suggested = c.steps.find((s) => s.id === c.choice)!;
    button(element, `Use the suggested step (${suggested.label})`)?.click();
    const patch = http.expectOne(url);
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ stepId: c.choice });
    patch.flush(cylinder(c, c.choice));
    await fixture.whenStable();
    http.expectOne(`/api/jobs/${JOB_ID}`).flush(job(c, c.choice));
    await fixture.whenStable();
    http.expectOne(`${url}/recommendation`).flush(recommendation(c, c.choice));
    await fixture.whenStable();

    const aside = button(element, 'Set a piston aside');
    expect(aside).toBeDefined();
    aside?.click();
    await fixture.whenStable();
    http.expectOne(`${url}/proposal`).flush(proposal(c));
    await fixture.whenStable();

    const dialog = document.querySelector('mat-dialog-container');
    const text = dialog?.textContent ?? '';
    expect(text).toContain(`goes to ${suggested.label}`);
    expect(text).toContain('PU-000101');
    expect(text).toContain('PU-000102');
    const hold = button(dialog ?? document, 'Hold PU-000101');
    expect(hold?.disabled).toBe(false);
  });
});
