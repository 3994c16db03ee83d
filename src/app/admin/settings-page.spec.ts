import { HttpTestingController } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';

import type { ShopSettingsJson } from '../../../shared/api/settings';
import { DEFAULT_SETTINGS } from '../../../shared/settings-schema';
import { setUpHttpTest, type NotifierMock } from '../testing/http-test';
import { SettingsPage } from './settings-page';

// The shop's defaults, under a shop name and hours of its own.
const SETTINGS: ShopSettingsJson = {
  ...DEFAULT_SETTINGS,
  shopName: 'Quillfen Cylinder Works',
  shopHours: 'Mon–Fri 8–16',
};

describe('SettingsPage', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<SettingsPage>;
  let loader: HarnessLoader;
  let notifier: NotifierMock;

  beforeEach(async () => {
    ({ http, notifier } = setUpHttpTest());
    fixture = TestBed.createComponent(SettingsPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http.expectOne('/api/settings').flush(SETTINGS);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  it('when the settings load, then the form shows them', async () => {
    const name = await loader.getHarness(
      MatInputHarness.with({ selector: '[formControlName=shopName]' }),
    );
    expect(await name.getValue()).toBe('Quillfen Cylinder Works');
  });

  it('when the hold expiry is changed and saved, then the whole settings object is sent once', async () => {
    const days = await loader.getHarness(
      MatInputHarness.with({ selector: '[formControlName=holdExpiryDays]' }),
    );
    await days.setValue('21');
    const save = await loader.getHarness(MatButtonHarness.with({ text: 'Save settings' }));
    await save.click();
    const req = http.expectOne('/api/settings');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ ...SETTINGS, holdExpiryDays: 21 });
    req.flush({ ...SETTINGS, holdExpiryDays: 21 });
    await fixture.whenStable();
    expect(notifier.success).toHaveBeenCalledWith('Shop settings saved.');
    // The session is asked again, so dates everywhere follow a changed locale at once.
    http.expectOne('/api/session').flush({ user: null });
  });

  async function field(name: string): Promise<MatInputHarness> {
    return loader.getHarness(MatInputHarness.with({ selector: `[formControlName=${name}]` }));
  }

  function errorText(): string[] {
    const errors = fixture.nativeElement.querySelectorAll('mat-error') as NodeListOf<HTMLElement>;
    return Array.from(errors, (e) => e.textContent?.trim() ?? '').filter(Boolean);
  }

  it('when an unknown time zone, the currency "XYZ" or letters for a cut are typed, then each is refused at its field at once and nothing is sent', async () => {
    await (await field('timeZone')).setValue('Mars/Olympus');
    await (await field('homeCurrency')).setValue('XYZ');
    await (await field('maxCutPerPass')).setValue('deep');
    await fixture.whenStable();
    expect(errorText()).toEqual([
      'Must be a time zone name such as "Europe/Paris" or "UTC".',
      'Must be an ISO 4217 currency code.',
      'Must be a length with its unit, e.g. "0.020 in" or "0.50 mm".',
    ]);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save settings' }))).click();
    http.expectNone('/api/settings');
  });

  it('when the deepest cut per pass is 0.5 in, then a caution shows the usual range and it still saves', async () => {
    // Usual range: common practice (no source), kept in shared/settings-ranges.ts.
    await (await field('maxCutPerPass')).setValue('0.5 in');
    await fixture.whenStable();
    const warning = fixture.nativeElement.querySelector('.setting-warning') as HTMLElement;
    expect(warning.textContent).toContain('Far outside the usual 0.0020–0.0394 in');
    expect(warning.textContent).toContain('(0.050–1.000 mm)');
    expect(errorText()).toEqual([]);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save settings' }))).click();
    const req = http.expectOne('/api/settings');
    expect(req.request.body.maxCutPerPass).toBe('0.5 in');
    req.flush({ ...SETTINGS, maxCutPerPass: '0.5 in' });
    await fixture.whenStable();
    http.expectOne('/api/session').flush({ user: null });
  });

  it('when the server refuses a field, then its reason shows at that field in words, once, and no snack bar opens', async () => {
    await (await field('orderCost')).setValue('26.00');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save settings' }))).click();
    http.expectOne('/api/settings').flush(
      {
        error: {
          code: 'invalid',
          message: 'orderCost: must be at most 10000',
          details: [
            { field: 'orderCost', message: 'must be at most 10000' },
            { field: 'orderCost', message: 'must be at most 10000' },
          ],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(errorText()).toEqual(['Must be at most 10000.']);
    expect(fixture.nativeElement.textContent).not.toContain('orderCost');
    expect(notifier.error).not.toHaveBeenCalled();
  });
});
