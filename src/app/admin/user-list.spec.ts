import { HttpTestingController, TestRequest } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';

import { setUpHttpTest, signIn, type NotifierMock } from '../testing/http-test';
import { UserList } from './user-list';
import type { UserRow } from './users-api';

const OWNER: UserRow = {
  id: 'u1',
  name: 'Ines Harrowgate',
  email: 'ines@example.test',
  role: 'owner',
  active: true,
  createdAt: '2026-01-05T09:00:00.000Z',
};
const BUYER: UserRow = {
  id: 'u2',
  name: 'Pello Varga',
  email: 'pello@example.test',
  role: 'buyer',
  active: true,
  createdAt: '2026-01-06T09:00:00.000Z',
};

describe('UserList', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<UserList>;
  let loader: HarnessLoader;
  let notifier: NotifierMock;

  beforeEach(async () => {
    ({ http, notifier } = setUpHttpTest());
    await signIn(http, { ...OWNER, unit: 'mm' });

    fixture = TestBed.createComponent(UserList);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  function listRequest(): TestRequest {
    return http.expectOne((request) => request.url === '/api/users' && request.method === 'GET');
  }

  async function loadRows(rows: UserRow[] = [OWNER, BUYER]): Promise<TestRequest> {
    const request = listRequest();
    request.flush({ items: rows, total: rows.length });
    await fixture.whenStable();
    return request;
  }

  it('when opened, then it asks for the first page sorted by name and shows the rows', async () => {
    const request = await loadRows();
    expect(request.request.params.toString()).toBe('sort=name&dir=asc&page=1&pageSize=25');

    const table = await loader.getHarness(MatTableHarness);
    const cells = await table.getCellTextByColumnName();
    expect(cells['name'].text).toEqual(['Ines Harrowgate (you)', 'Pello Varga']);
    expect(cells['email'].text).toEqual(['ines@example.test', 'pello@example.test']);
    expect(cells['active'].text).toEqual(['check_circleAllowed', 'check_circleAllowed']);
  });

  it('when the e-mail header is clicked, then the server is asked for that order from page 1', async () => {
    await loadRows();
    const sort = await loader.getHarness(MatSortHarness);
    const [, emailHeader] = await sort.getSortHeaders();
    await emailHeader.click();
    const request = listRequest();
    expect(request.request.params.get('sort')).toBe('email');
    expect(request.request.params.get('dir')).toBe('asc');
    expect(request.request.params.get('page')).toBe('1');
    request.flush({ items: [OWNER, BUYER], total: 2 });
  });

  it('when another role is chosen in a row, then it is saved and the row shows the answer', async () => {
    await loadRows();
    const selects = await loader.getAllHarnesses(MatSelectHarness);
    expect(await selects[0].isDisabled()).toBe(true); // nobody demotes themselves by accident
    await selects[1].open();
    await selects[1].clickOptions({ text: 'Staff' });

    const patch = http.expectOne('/api/users/u2');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ role: 'staff' });
    patch.flush({ user: { ...BUYER, role: 'staff' } });
    await fixture.whenStable();

    expect(await selects[1].getValueText()).toBe('Staff');
    expect(notifier.success).toHaveBeenCalledWith('Pello Varga is now Staff.');
  });

  it('when a role change is refused, then the row goes back to the role in force', async () => {
    await loadRows();
    const select = (await loader.getAllHarnesses(MatSelectHarness))[1];
    await select.open();
    await select.clickOptions({ text: 'Machinist' });
    http
      .expectOne('/api/users/u2')
      .flush(
        { error: { code: 'forbidden', message: 'Only owners may change roles.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    expect(await select.getValueText()).toBe('Buyer');
    expect(notifier.error).toHaveBeenCalledWith('Only owners may change roles.');
  });

  it('when the list cannot load, then the error shows and "Try again" asks again', async () => {
    listRequest().flush(null, { status: 503, statusText: 'Service Unavailable' });
    await fixture.whenStable();
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role=alert]');
    expect(alert?.textContent).toContain('error 503');

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Try again' }))).click();
    await loadRows([OWNER]);
    expect((fixture.nativeElement as HTMLElement).querySelector('[role=alert]')).toBeNull();
  });
});
