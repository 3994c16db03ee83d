import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';

import { toLengthJson } from '../../../shared/lengths';
import type { OrderJson, OrderLineJson } from '../../../shared/api/purchasing';
import type { SessionUser } from '../../../shared/session-types';
import { setUpHttpTest, signIn } from '../testing/http-test';
import { ReceiveOrder } from './receive-order';

const STAFF: SessionUser = {
  id: 'u1',
  email: 'staff@example.test',
  name: 'Nell Ashby',
  role: 'staff',
  unit: 'in',
};

function line(extra: Partial<OrderLineJson>): OrderLineJson {
  return {
    id: 'l1',
    lineNo: 1,
    partId: 'p1',
    sku: 'TW-PC-025',
    description: 'Piston +0.25 mm',
    partKind: 'piston',
    familyCode: 'TW',
    stepLabel: '+0.25 mm',
    supplierSku: 'S-1',
    gtins: ['4006381333931'],
    quantity: 3,
    received: 1,
    open: 2,
    unitPrice: '40.00',
    lineTotal: '120.00',
    waits: [],
    ...extra,
  };
}

const ORDER: OrderJson = {
  id: 'o1',
  number: 'PO-2612-0009',
  supplierId: 's1',
  supplierName: 'Invented Supply',
  supplierEmail: 'orders@invented.test',
  currency: 'EUR',
  state: 'partly_in',
  stateLabel: 'Partly in',
  expectedOn: null,
  notes: '',
  total: '146.00',
  lines: [
    line({}),
    line({
      id: 'l2',
      lineNo: 2,
      partId: 'p2',
      sku: 'TW-RS-025',
      description: 'Ring set +0.25 mm',
      partKind: 'rings',
      gtins: [],
      quantity: 1,
      received: 0,
      open: 1,
      unitPrice: '26.00',
      lineTotal: '26.00',
    }),
  ],
  createdAt: '2026-12-01T08:00:00.000Z',
  createdBy: 'Teodor Vance',
  sentAt: '2026-12-01T09:00:00.000Z',
  closedAt: null,
  sendError: null,
};

/** The order as staff get it: purchase prices are the shop's costs, which staff may not see. */
function asStaffSees(order: OrderJson): OrderJson {
  const { total: _total, ...rest } = order;
  return {
    ...rest,
    lines: order.lines.map(({ unitPrice: _u, lineTotal: _l, ...l }) => l),
  };
}

describe('ReceiveOrder', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<ReceiveOrder>;

  beforeEach(async () => {
    ({ http } = setUpHttpTest());
    await signIn(http, STAFF);
    fixture = TestBed.createComponent(ReceiveOrder);
    fixture.componentRef.setInput('id', 'o1');
    await fixture.whenStable();
    http.expectOne('/api/purchase-orders/o1').flush(asStaffSees(ORDER));
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  function el(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  async function type(input: HTMLInputElement, value: string) {
    input.value = value;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  it('when a box is scanned, then its line counts one piston and asks for its skirt', async () => {
    // The same GTIN typed as UPC-A-in-EAN form with a leading zero still finds the line.
    await type(el().querySelector('input[name="scan"]') as HTMLInputElement, '04006381333931');
    (el().querySelector('form.scan') as HTMLFormElement).dispatchEvent(new Event('submit'));
    await fixture.whenStable();
    const picked = el().querySelector('li.line.picked');
    expect(picked?.textContent).toContain('TW-PC-025');
    expect(picked?.querySelectorAll('.skirts input')).toHaveLength(1);
    expect(el().textContent).toContain('Line 1: TW-PC-025.');
  });

  it('when sizes are typed without a unit, then they are sent in the person\u2019s unit and an empty one as to measure', async () => {
    const qty = el().querySelectorAll<HTMLInputElement>('li.line input[type="number"]');
    await type(qty[0], '2');
    await type(qty[1], '1');
    const skirts = el().querySelectorAll<HTMLInputElement>('.skirts input');
    expect(skirts).toHaveLength(2);
    await type(skirts[0], '2.8423');
    // 2.8423 in × 25.4 = 72.19442 mm, shown under the field before anything is saved.
    expect(el().textContent).toContain('= 72.194 mm');
    const take = Array.from(el().querySelectorAll('button')).find((b) =>
      b.textContent?.includes('Take it in'),
    ) as HTMLButtonElement;
    take.click();
    const req = http.expectOne('/api/purchase-orders/o1/receipts');
    expect(req.request.body).toEqual({
      lines: [
        { lineId: 'l1', quantity: 2, units: [{ skirt: '2.8423 in' }, {}] },
        { lineId: 'l2', quantity: 1 },
      ],
    });
    req.flush({
      receiptId: 'r1',
      order: { ...ORDER, state: 'all_in', stateLabel: 'All in', lines: [] },
      units: [
        { id: 'u1', label: 'PU-000100', partId: 'p1', skirt: toLengthJson(72_194_420) },
        { id: 'u2', label: 'PU-000101', partId: 'p1', skirt: null },
      ],
      holds: [
        {
          jobId: 'j1',
          jobNumber: 'CY-2612-0003',
          cylinder: 1,
          unitId: 'u1',
          unitLabel: 'PU-000100',
          skirt: toLengthJson(72_194_420),
        },
      ],
      notHeld: [],
    });
    await fixture.whenStable();
    expect(el().querySelector('.outcome')?.textContent).toContain(
      'PU-000100 (2.8423 in) is held for job',
    );
    expect(el().querySelector('.outcome')?.textContent).toContain('all in');
  });

  it('when the server refuses a quantity, then its reason shows under the line it is about, in words, once', async () => {
    // Only line 2 is sent, so the server's "lines.0" is line 2 on the page.
    const qty = el().querySelectorAll<HTMLInputElement>('li.line input[type="number"]');
    await type(qty[1], '1');
    (
      Array.from(el().querySelectorAll('button')).find((b) =>
        b.textContent?.includes('Take it in'),
      ) as HTMLButtonElement
    ).click();
    http.expectOne('/api/purchase-orders/o1/receipts').flush(
      {
        error: {
          code: 'invalid',
          message: 'lines.0.quantity: must be at most the 1 still to come',
          details: [{ field: 'lines.0.quantity', message: 'must be at most the 1 still to come' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    const lines = el().querySelectorAll('li.line');
    expect(lines[1].querySelector('.field-error')?.textContent?.trim()).toBe(
      'Must be at most the 1 still to come.',
    );
    expect(lines[0].querySelector('.field-error')).toBeNull();
    expect(el().textContent).not.toContain('lines.0');
  });
});
