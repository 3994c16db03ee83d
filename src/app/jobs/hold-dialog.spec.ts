import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatDialog } from '@angular/material/dialog';

import type { ProposalJson } from '../../../shared/api/jobs';
import type { SessionResponse } from '../../../shared/session-types';
import type { StockChangeJson, UnitJson } from '../../../shared/api/stock';
import { Session } from '../core/session';
import { HoldDialog, type HoldDialogData } from './hold-dialog';

// The machinist measures the proposed piston at the bench before holding it. Lengths as the API
// sends them, converted by hand with 1 in = 25.4 mm exactly (NIST SP 811, appendix B).
const JOB_ID = '7a1e2c3d-4b5f-4a6b-8c7d-9e0f1a2b3c4d';
const DATA: HoldDialogData = { jobId: JOB_ID, jobNumber: 'CY-2612-0088', cylinder: 1 };

const PROPOSAL: ProposalJson = {
  step: { id: 's4', label: '+0.040 in', nominalBore: { mm: '75.6285', in: '2.9775' } },
  unit: {
    id: 'u1',
    label: 'PU-000255',
    partId: 'p1',
    sku: 'PST-040',
    skirt: { mm: '75.62786', in: '2.9759' },
    bin: 'P-06',
    stepLabel: '+0.040 in',
  },
  others: [],
  rings: [],
  piston: null,
  cleanupBasis: null,
  heldCleansUp: null,
};

describe('HoldDialog', () => {
  let http: HttpTestingController;

  async function open() {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    const session: SessionResponse = {
      user: { id: 'm1', email: 'rafe@example.test', name: 'Rafe', role: 'machinist', unit: 'in' },
    };
    const loading = TestBed.inject(Session).load();
    http.expectOne('/api/session').flush(session);
    await loading;
    TestBed.inject(MatDialog).open(HoldDialog, { data: DATA });
    await settle();
    http.expectOne(`/api/jobs/${JOB_ID}/cylinders/1/proposal`).flush(PROPOSAL);
    await settle();
  }

  async function settle() {
    await new Promise((r) => setTimeout(r));
    TestBed.tick();
  }

  function container(): HTMLElement {
    const el = document.querySelector<HTMLElement>('mat-dialog-container');
    if (!el) throw new Error('no dialog');
    return el;
  }

  function button(text: string): HTMLButtonElement {
    const b = Array.from(container().querySelectorAll('button')).find((x) =>
      x.textContent?.includes(text),
    );
    if (!b) throw new Error(`no button ${text}`);
    return b;
  }

  function typeSkirt(value: string) {
    const input = Array.from(container().querySelectorAll('input')).find((i) =>
      i.closest('form.measure'),
    );
    if (!input) throw new Error('no skirt field');
    input.value = value;
    input.dispatchEvent(new Event('input'));
  }

  afterEach(() => {
    http.verify();
    TestBed.inject(MatDialog).closeAll();
  });

  it('when the proposed piston is measured in the dialog, then its new skirt is sent exactly, shown, and that piston is held', async () => {
    await open();
    expect(container().textContent).toContain('PU-000255');
    expect(container().textContent).toContain('2.9759 in');

    typeSkirt('2.9761');
    await settle();
    button('Save size').click();
    const measure = http.expectOne('/api/stock/units/u1/measure');
    expect(measure.request.method).toBe('POST');
    expect(measure.request.body).toEqual({ skirt: '2.9761 in' });
    // 2.9761 in × 25.4 = 75.59294 mm.
    const change: StockChangeJson = {
      ledger: [],
      levels: { onHand: 8, held: 0, free: 8, averageCost: '41.20' },
      unit: { id: 'u1', skirt: { mm: '75.59294', in: '2.9761' } } as UnitJson,
    };
    measure.flush(change);
    await settle();
    const text = container().textContent ?? '';
    expect(text).toContain('Skirt 2.9761 in');
    expect(text).toContain('Measured just now');

    button('Hold PU-000255').click();
    const hold = http.expectOne(`/api/jobs/${JOB_ID}/holds`);
    expect(hold.request.body).toEqual({ cylinder: 1, unitId: 'u1' });
  });

  it('when the typed skirt is not a length, then the field says why and nothing is sent', async () => {
    await open();
    typeSkirt('2,97,61');
    await settle();
    button('Save size').click();
    await settle();
    expect(container().querySelector('.field-error')?.textContent).toMatch(/decimal separator/);
    http.expectNone('/api/stock/units/u1/measure');
  });
});
