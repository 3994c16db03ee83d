import { HttpTestingController, TestRequest } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';

import type { AuditEventJson, AuditPageJson } from '../../../shared/api/audit';
import { provideShopDateAdapter } from '../core/shop-date-adapter';
import { setUpHttpTest } from '../testing/http-test';
import { AuditLog } from './audit-log';
import { fieldChanges } from './audit-words';

const OWNER = { id: 'u1', name: 'Ines Harrowgate', email: 'ines@example.test' };
const BUYER = { id: 'u2', name: 'Pello Varga', email: 'pello@example.test' };

const ROLE_CHANGE: AuditEventJson = {
  id: 12,
  at: '2027-03-14T09:30:00.000Z',
  user: OWNER,
  action: 'user.update',
  entity: 'user',
  entityId: 'c0ffee00-0000-4000-8000-000000000001',
  before: { role: 'staff', name: 'Oda Lind', active: true },
  after: { role: 'buyer', name: 'Oda Lind', active: true },
};
const RECEIPT: AuditEventJson = {
  id: 11,
  at: '2027-03-14T08:00:00.000Z',
  user: null,
  action: 'stock.receipt',
  entity: 'part',
  entityId: 'c0ffee00-0000-4000-8000-000000000002',
  before: { onHand: 0 },
  after: { onHand: 4, quantity: 4 },
};

function page(items: AuditEventJson[], refs: AuditPageJson['refs'] = {}): AuditPageJson {
  return {
    items,
    total: items.length,
    refs,
    facets: { entities: ['part', 'user'], users: [OWNER, BUYER] },
  };
}

describe('AuditLog', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<AuditLog>;
  let loader: HarnessLoader;

  beforeEach(async () => {
    ({ http } = setUpHttpTest({ providers: [provideShopDateAdapter()] }));
    fixture = TestBed.createComponent(AuditLog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  function request(): TestRequest {
    return http.expectOne((r) => r.url === '/api/audit' && r.method === 'GET');
  }

  async function answer(items: AuditEventJson[] = [ROLE_CHANGE, RECEIPT]): Promise<TestRequest> {
    const r = request();
    r.flush(page(items));
    await fixture.whenStable();
    return r;
  }

  it('when opened, then it asks for the newest changes first and shows who changed what, before and after', async () => {
    const r = await answer();
    expect(r.request.params.toString()).toBe('dir=desc&page=1&pageSize=50');
    const table = await loader.getHarness(MatTableHarness);
    const cells = await table.getCellTextByColumnName();
    expect(cells['user'].text).toEqual(['Ines Harrowgate', 'Stepstock itself']);
    expect(cells['action'].text).toEqual(['User changed', 'Stock received']);
    expect(cells['record'].text[0]).toBe('User c0ffee00');
    // Only the field that changed is listed; the struck-through old value comes first.
    // Array.from: the spec build has no DOM iterables.
    const lines = Array.from(
      fixture.nativeElement.querySelectorAll('tr.mat-mdc-row') as NodeListOf<Element>,
    ).map((row) =>
      Array.from(row.querySelectorAll('.changes li')).map((li) =>
        (li.textContent ?? '').replace(/\s+/g, ' ').trim(),
      ),
    );
    expect(lines).toEqual([['role: staff →became buyer'], ['onHand: 0 →became 4', 'quantity: 4']]);
  });

  it('when a record kind and a person are chosen, then the first page of that filter is asked for', async () => {
    await answer();
    const [what, who] = await loader.getAllHarnesses(MatSelectHarness);
    await what.open();
    await what.clickOptions({ text: 'Part' });
    await fixture.whenStable();
    expect(request().request.params.get('entity')).toBe('part');
    await who.open();
    await who.clickOptions({ text: 'Pello Varga' });
    await fixture.whenStable();
    const r = request();
    expect(r.request.params.get('user')).toBe('u2');
    expect(r.request.params.get('page')).toBe('1');
    r.flush(page([]));
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('No change matches these filters.');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Show everything/ }))).click();
    await fixture.whenStable();
    expect(request().request.params.toString()).toBe('dir=desc&page=1&pageSize=50');
  });

  it("when a day range is typed in the shop's pattern, then it is sent as calendar days", async () => {
    await answer();
    const [from, to] = fixture.nativeElement.querySelectorAll(
      'input.mat-datepicker-input',
    ) as HTMLInputElement[];
    // No session loaded: the default locale en-GB writes the day first.
    from.value = '01/03/2027';
    from.dispatchEvent(new Event('input'));
    from.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    request().flush(page([]));
    to.value = '31/03/2027';
    to.dispatchEvent(new Event('input'));
    to.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    const r = request();
    expect(r.request.params.get('from')).toBe('2027-03-01');
    expect(r.request.params.get('to')).toBe('2027-03-31');
  });

  it('when the When column is sorted, then the oldest changes come first', async () => {
    await answer();
    const sort = await loader.getHarness(MatSortHarness);
    const [when] = await sort.getSortHeaders();
    await when.click();
    await fixture.whenStable();
    expect(request().request.params.get('dir')).toBe('asc');
  });

  it('when the server refuses, then the message and a way to try again are shown', async () => {
    request().flush(
      { error: { code: 'forbidden', message: 'Your role may not do this.', details: [] } },
      { status: 403, statusText: 'Forbidden' },
    );
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role=alert]').textContent).toContain(
      'Your role may not do this.',
    );
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Try again' }))).click();
    await fixture.whenStable();
    await answer([]);
    expect(fixture.nativeElement.textContent).toContain('Nothing has been changed yet.');
  });
});

describe('AuditLog names the records a change is about', () => {
  const JOB = 'a0000000-0000-4000-8000-0000000000j1';
  const UNIT = 'a0000000-0000-4000-8000-0000000000u1';
  const PART = 'a0000000-0000-4000-8000-0000000000p1';
  const HOLD = 'a0000000-0000-4000-8000-0000000000h1';
  const HELD: AuditEventJson = {
    id: 30,
    at: '2027-03-14T10:00:00.000Z',
    user: OWNER,
    action: 'hold.create',
    entity: 'hold',
    entityId: HOLD,
    before: null,
    after: { jobId: JOB, cylinder: 2, unitId: UNIT, partId: PART },
  };

  it('when the server names the ids, then the record and its fields read as job number, label and SKU, each linked to its page', async () => {
    const { http } = setUpHttpTest({ providers: [provideShopDateAdapter()] });
    const fixture = TestBed.createComponent(AuditLog);
    await fixture.whenStable();
    http
      .expectOne((r) => r.url === '/api/audit')
      .flush(
        page([HELD], {
          [`hold:${HOLD}`]: {
            kind: 'hold',
            id: HOLD,
            label: 'job CY-2703-0012, cylinder 2',
            link: `/jobs/${JOB}`,
          },
          [`job:${JOB}`]: { kind: 'job', id: JOB, label: 'CY-2703-0012', link: `/jobs/${JOB}` },
          [`piston_unit:${UNIT}`]: {
            kind: 'piston_unit',
            id: UNIT,
            label: 'PU-000031',
            link: '/stock/ledger',
            query: { unitId: UNIT },
          },
          [`part:${PART}`]: {
            kind: 'part',
            id: PART,
            label: 'BT-72-PC-025',
            link: `/catalog/parts/${PART}`,
          },
        }),
      );
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    const row = element.querySelector('tr.mat-mdc-row') as HTMLElement;
    // No raw id anywhere in the row: people know these by number, label and SKU.
    expect(row.textContent).not.toMatch(/a0000000/);
    const links = Array.from(row.querySelectorAll('a.ref')).map((a) => [
      a.textContent?.trim(),
      a.getAttribute('href'),
    ]);
    expect(links).toEqual([
      ['job CY-2703-0012, cylinder 2', `/jobs/${JOB}`],
      ['CY-2703-0012', `/jobs/${JOB}`],
      ['PU-000031', `/stock/ledger?unitId=${UNIT}`],
      ['BT-72-PC-025', `/catalog/parts/${PART}`],
    ]);
    const fields = Array.from(row.querySelectorAll('.changes li')).map((li) =>
      (li.textContent ?? '').replace(/\s+/g, ' ').trim(),
    );
    expect(fields).toEqual([
      'job: CY-2703-0012',
      'cylinder: 2',
      'unit: PU-000031',
      'part: BT-72-PC-025',
    ]);
    http.verify();
  });

  it('when a change holds a list of lines, then each line reads in words with its part by SKU', async () => {
    const { http } = setUpHttpTest({ providers: [provideShopDateAdapter()] });
    const fixture = TestBed.createComponent(AuditLog);
    await fixture.whenStable();
    const SUPPLIER = 'a0000000-0000-4000-8000-0000000000s1';
    http
      .expectOne((r) => r.url === '/api/audit')
      .flush(
        page(
          [
            {
              id: 31,
              at: '2027-03-14T11:00:00.000Z',
              user: BUYER,
              action: 'purchase_order.create',
              entity: 'purchase_order',
              entityId: 'a0000000-0000-4000-8000-0000000000o1',
              before: null,
              after: {
                supplierId: SUPPLIER,
                lines: [{ partId: PART, quantity: 3, unitPrice: '14.20' }],
              },
            },
          ],
          {
            [`supplier:${SUPPLIER}`]: {
              kind: 'supplier',
              id: SUPPLIER,
              label: 'Morrow Ring Works',
              link: `/suppliers/${SUPPLIER}`,
            },
            [`part:${PART}`]: { kind: 'part', id: PART, label: 'BT-72-RC-050', link: null },
          },
        ),
      );
    await fixture.whenStable();
    const row = (fixture.nativeElement as HTMLElement).querySelector('tr.mat-mdc-row');
    const fields = Array.from(row?.querySelectorAll('.changes li') ?? []).map((li) =>
      (li.textContent ?? '').replace(/\s+/g, ' ').trim(),
    );
    expect(fields).toEqual([
      'supplier: Morrow Ring Works',
      'lines: part BT-72-RC-050, quantity 3, unit price 14.20',
    ]);
    http.verify();
  });
});

describe('fieldChanges', () => {
  it('when a record was created, then every recorded field is listed with its value', () => {
    expect(fieldChanges(null, { role: 'staff', active: true })).toEqual([
      { field: 'role', before: null, after: 'staff' },
      { field: 'active', before: null, after: 'true' },
    ]);
    expect(fieldChanges({ a: 1, b: 'x' }, { a: 1, b: 'y' })).toEqual([
      { field: 'b', before: 'x', after: 'y' },
    ]);
  });
});
