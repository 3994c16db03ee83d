import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';

import type { ShopSettingsJson } from '../../../shared/settings-api';
import { Notifier } from '../core/notifier';
import { SettingsPage } from './settings-page';

const SETTINGS: ShopSettingsJson = {
  shopName: 'Quillfen Cylinder Works',
  shopHours: 'Mon–Fri 8–16',
  timeZone: 'UTC',
  holdExpiryDays: 14,
  clearancePolicy: 'mid',
  maxCutPerPass: '0.020 in',
  finishPass: '',
  truingPass: '',
  minCutPerPass: '0.001 in',
  barResolution: '0.0001 in',
  skipMarginalStep: false,
  stepPolicy: 'first-that-cleans',
  marginalCleanup: '0.05 mm',
  orderCost: '25.00',
  holdingCostRate: '0.25',
  serviceLevel: 0.95,
  homeCurrency: 'EUR',
  taxRate: '20',
  pricesIncludeTax: false,
  depositPercent: '30',
  cutOnlyAfterApproval: true,
};

describe('SettingsPage', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<SettingsPage>;
  let loader: HarnessLoader;
  let notifier: { success: jest.Mock; error: jest.Mock };

  beforeEach(async () => {
    notifier = { success: jest.fn(), error: jest.fn() };
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: Notifier, useValue: notifier },
      ],
    });
    http = TestBed.inject(HttpTestingController);
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
  });

  it('when the server refuses a field, then its message is shown to the owner', async () => {
    const zone = await loader.getHarness(
      MatInputHarness.with({ selector: '[formControlName=timeZone]' }),
    );
    await zone.setValue('Mars/Olympus');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save settings' }))).click();
    http.expectOne('/api/settings').flush(
      {
        error: {
          code: 'invalid',
          message: 'timeZone: must be a time zone name',
          details: [{ field: 'timeZone', message: 'must be a time zone name' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(notifier.error).toHaveBeenCalled();
  });
});
