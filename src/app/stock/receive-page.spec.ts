import { HttpTestingController } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatRadioButtonHarness } from '@angular/material/radio/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

import type { PartDetailJson } from '../../../shared/api/catalog';
import { toLengthJson } from '../../../shared/lengths';
import type { SessionUser } from '../../../shared/session-types';
import { setUpHttpTest, signIn } from '../testing/http-test';
import { ReceivePage } from './receive-page';

const STAFF: SessionUser = {
  id: 'u1',
  email: 's@example.test',
  name: 'Ned Quarrie',
  role: 'staff',
  unit: 'in',
};

const PISTON = {
  id: 'p1',
  sku: 'TR-2-PC-010',
  kind: 'piston',
  familyId: 'f1',
  familyCode: 'TR-2',
  stepId: 'st1',
  stepLabel: '+0.010 in',
  description: 'Piston +0.010 in',
  material: 'cast',
  ringCount: 2,
  pinDiameter: null,
  gtin: null,
  salePrice: '60.00',
  averageCost: '0.00',
  onHand: 0,
  held: 0,
  free: 0,
  reorderPoint: null,
  orderUpTo: null,
  binId: null,
  bin: null,
  active: true,
  family: { id: 'f1', code: 'TR-2', name: 'Test twin' },
  // 2.5100 in bore = 63 754 000 nm
  step: {
    id: 'st1',
    label: '+0.010 in',
    offset: toLengthJson(254_000),
    nominalBore: toLengthJson(63_754_000),
  },
  components: [],
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
} as PartDetailJson;

describe('ReceivePage', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<ReceivePage>;
  let loader: HarnessLoader;

  beforeEach(async () => {
    ({ http } = setUpHttpTest());
    await signIn(http, STAFF, { name: 'Invented Bore Works', currency: 'GBP' });
    fixture = TestBed.createComponent(ReceivePage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.componentRef.setInput('partId', 'p1');
    await fixture.whenStable();
    http
      .expectOne((r) => r.url === '/api/bins')
      .flush({ items: [{ id: 'b1', code: 'A-1', name: 'Pistons', units: 0, parts: 0 }], total: 1 });
    http.expectOne('/api/parts/p1').flush(PISTON);
    await fixture.whenStable();
  });

  /** The open order lines the page asks for once the part is known; none unless a test gives some. */
  async function answerLines(items: unknown[] = []): Promise<void> {
    const request = http.expectOne((r) => r.url === '/api/purchase-orders/open-lines');
    expect(request.request.params.get('partId')).toBe('p1');
    request.flush({ items, total: items.length });
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  async function fill(selector: string, value: string): Promise<void> {
    await (await loader.getHarness(MatInputHarness.with({ selector }))).setValue(value);
  }

  async function fillDelivery(): Promise<void> {
    await fill('[formControlName=quantity]', '2');
    await fixture.whenStable();
    await fill('[data-unit-index="0"]', '2.5083');
    const later = await loader.getAllHarnesses(MatCheckboxHarness.with({ label: 'To measure' }));
    expect(later).toHaveLength(2);
    await later[1].check();
    await (await loader.getHarness(MatSelectHarness)).clickOptions({ text: /A-1/ });
    await fill('[formControlName=unitCost]', '41.00');
  }

  it('when pistons are typed in inches, then each is sent with its unit and "to measure" as null', async () => {
    await answerLines();
    await fillDelivery();
    // 2.5083 in × 25.4 = 63.71082 mm, shown at 0.001 mm under the field.
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('= 63.711 mm');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Receive into stock/ }))).click();
    const request = http.expectOne('/api/stock/receipts');
    expect(request.request.body).toEqual({
      partId: 'p1',
      quantity: 2,
      binId: 'b1',
      unitCost: '41.00',
      note: undefined,
      units: [{ skirt: '2.5083 in' }, { skirt: null }],
    });
    request.flush({
      receiptId: 'r1',
      ledger: [{ quantity: 1 }, { quantity: 1 }],
      units: [],
      levels: { onHand: 2, held: 0, free: 2, averageCost: '41.00' },
      order: null,
      holds: [],
    });
    await fixture.whenStable();
    const done = (fixture.nativeElement as HTMLElement).querySelector('.done')?.textContent;
    expect(done).toContain('2 × TR-2-PC-010');
    // The average cost says its currency: the shop's home currency.
    expect(done).toContain('(average cost 41.00 GBP)');
  });

  it('when the answer carries no average cost (staff may not see costs), then the receipt still shows what came in', async () => {
    await answerLines();
    await fillDelivery();
    await (await loader.getHarness(MatButtonHarness.with({ text: /Receive into stock/ }))).click();
    http.expectOne('/api/stock/receipts').flush({
      receiptId: 'r2',
      ledger: [{ quantity: 1 }, { quantity: 1 }],
      units: [],
      levels: { onHand: 2, held: 0, free: 2 },
      order: null,
      holds: [],
    });
    await fixture.whenStable();
    const done = (fixture.nativeElement as HTMLElement).querySelector('.done')?.textContent ?? '';
    expect(done).toContain('2 × TR-2-PC-010');
    expect(done).toContain('On hand now:');
    expect(done).not.toMatch(/average cost|undefined/i);
  });

  it('when the server refuses one skirt, then its message shows under that piston', async () => {
    await answerLines();
    await fillDelivery();
    await (await loader.getHarness(MatButtonHarness.with({ text: /Receive into stock/ }))).click();
    http.expectOne('/api/stock/receipts').flush(
      {
        error: {
          code: 'invalid',
          message: 'units.0.skirt: far from the bore',
          details: [{ field: 'units.0.skirt', message: 'far from the bore' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    // Said once, at the piston's own field, in words; no raw path above the form.
    const errors = (fixture.nativeElement as HTMLElement).querySelectorAll('mat-error');
    expect(Array.from(errors, (e) => e.textContent?.trim())).toEqual(['Far from the bore.']);
    expect(text).not.toContain('units.0.skirt');
  });

  it('when the part is on order, then its open line is offered first, the quantity still to come and the usual bin filled, and the receipt names the line', async () => {
    await answerLines([
      {
        orderId: 'o1',
        orderNumber: 'PO-2612-0004',
        supplierName: 'Invented Supply',
        expectedOn: '2026-12-09',
        line: { id: 'l1', lineNo: 2, quantity: 2, received: 0, open: 2, unitPrice: '38.00' },
      },
    ]);
    const radios = await loader.getAllHarnesses(MatRadioButtonHarness);
    expect(await Promise.all(radios.map((r) => r.getLabelText()))).toEqual([
      expect.stringContaining('PO-2612-0004 line 2 from Invented Supply: 2 of 2 still to come'),
      'Not on any order',
    ]);
    expect(await radios[0].isChecked()).toBe(true);
    const quantity = await loader.getHarness(
      MatInputHarness.with({ selector: '[formControlName=quantity]' }),
    );
    expect(await quantity.getValue()).toBe('2');
    // Against a line the order's price is the cost: no cost field to fill.
    expect(
      await loader.getAllHarnesses(
        MatInputHarness.with({ selector: '[formControlName=unitCost]' }),
      ),
    ).toHaveLength(0);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain("the order's price");
    await fill('[data-unit-index="0"]', '2.5083');
    const later = await loader.getAllHarnesses(MatCheckboxHarness.with({ label: 'To measure' }));
    await later[1].check();
    await (await loader.getHarness(MatSelectHarness)).clickOptions({ text: /A-1/ });
    await (await loader.getHarness(MatButtonHarness.with({ text: /Receive into stock/ }))).click();
    const request = http.expectOne('/api/stock/receipts');
    expect(request.request.body).toEqual({
      partId: 'p1',
      quantity: 2,
      binId: 'b1',
      orderLineId: 'l1',
      note: undefined,
      units: [{ skirt: '2.5083 in' }, { skirt: null }],
    });
    request.flush({
      receiptId: 'r1',
      ledger: [{ quantity: 1 }, { quantity: 1 }],
      units: [],
      levels: { onHand: 2, held: 0, free: 2, averageCost: '38.00' },
      order: {
        id: 'o1',
        number: 'PO-2612-0004',
        state: 'all_in',
        stateLabel: 'All in',
        lineNo: 2,
        received: 2,
        quantity: 2,
      },
      holds: [{ jobNumber: 'CY-2612-0009', cylinder: 1, unitLabel: 'PU-000031' }],
    });
    await fixture.whenStable();
    const done = (fixture.nativeElement as HTMLElement).querySelector('.done')?.textContent ?? '';
    expect(done).toMatch(/PO-2612-0004\s+line 2: 2 of 2 in\. The order is now\s+all in/);
    expect(done).toContain('PU-000031 held for job CY-2612-0009, cylinder 1');
  });
});
