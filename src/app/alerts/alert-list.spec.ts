import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';

import type { AlertJson } from '../../../shared/api/alerts';
import { setUpHttpTest } from '../testing/http-test';
import { AlertList } from './alert-list';

const ALERT: AlertJson = {
  id: 'a1',
  partId: 'p1',
  kind: 'reorder_point',
  raisedAt: '2026-12-01T10:00:00.000Z',
  sku: 'TW-PC-025',
  description: 'Piston +0.25 mm',
  partKind: 'piston',
  familyId: 'f1',
  familyCode: 'TW',
  stepLabel: '+0.25 mm',
  freeAtRaise: 2,
  reorderPoint: 2,
  free: 1,
  onOrder: 0,
  recoveredAt: null,
  acknowledgedAt: null,
  acknowledgedBy: null,
};

describe('AlertList', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<AlertList>;

  beforeEach(async () => {
    ({ http } = setUpHttpTest());
    fixture = TestBed.createComponent(AlertList);
    await fixture.whenStable();
    http.expectOne('/api/alerts/mail-mode').flush({ mailMode: 'instant', alertsByMail: true });
    http
      .expectOne((r) => r.url === '/api/alerts' && r.params.get('state') === 'open')
      .flush({ items: [ALERT], total: 1 });
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  function el(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  it('when an alert is open, then it shows the part, the point it reached and that it is still low', () => {
    const row = el().querySelector('tr.mat-mdc-row');
    expect(row?.textContent).toContain('TW-PC-025');
    expect(row?.textContent).toContain('2 free, point 2');
    expect(row?.textContent).toContain('still low');
  });

  it('when the buyer marks it as seen, then it is acknowledged and the list asked again', async () => {
    const seen = el().querySelector(
      'button[aria-label="Mark the alert for TW-PC-025 as seen"]',
    ) as HTMLButtonElement;
    seen.click();
    const ack = http.expectOne('/api/alerts/a1/acknowledge');
    expect(ack.request.method).toBe('POST');
    ack.flush({ ...ALERT, acknowledgedAt: '2026-12-01T11:00:00.000Z', acknowledgedBy: 'T. V.' });
    await fixture.whenStable();
    http.expectOne((r) => r.url === '/api/alerts').flush({ items: [], total: 0 });
    await fixture.whenStable();
    expect(el().textContent).toContain('Nothing waiting');
  });

  it('when the buyer chooses a daily summary, then their account is changed', async () => {
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const daily = await loader.getHarness(
      MatButtonToggleHarness.with({ text: 'One summary a day' }),
    );
    await daily.check();
    const req = http.expectOne('/api/account');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ mailMode: 'digest' });
    req.flush({});
    await fixture.whenStable();
  });
});
