import { HttpTestingController } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatRadioGroupHarness } from '@angular/material/radio/testing';
import { Router } from '@angular/router';

import type { SessionUser } from '../../../shared/session-types';
import { Session } from '../core/session';
import { unauthorizedInterceptor } from '../core/unauthorized-interceptor';
import { setUpHttpTest, signIn, type NotifierMock } from '../testing/http-test';
import { AccountPage } from './account-page';

const ME: SessionUser = {
  id: 'u3',
  email: 'tove@example.test',
  name: 'Tove Lindqvar',
  role: 'machinist',
  unit: 'mm',
};

describe('AccountPage', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<AccountPage>;
  let loader: HarnessLoader;
  let notifier: NotifierMock;

  beforeEach(async () => {
    // The real interceptor: a wrong current password (401) must not sign the person out.
    ({ http, notifier } = setUpHttpTest({ interceptors: [unauthorizedInterceptor] }));
    await signIn(http, ME);
    fixture = TestBed.createComponent(AccountPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  function sampleText(): string {
    return (fixture.nativeElement as HTMLElement).querySelector('.sample')?.textContent ?? '';
  }

  async function input(selector: string): Promise<MatInputHarness> {
    return loader.getHarness(MatInputHarness.with({ selector }));
  }

  it('when inches are chosen, then the server saves it and every length switches to inches', async () => {
    // 2.5555 in = 64.9097 mm exactly (1 in = 25.4 mm, NIST SP 811 appendix B); shown to 0.001 mm.
    expect(sampleText()).toContain('reads as 64.910 mm');

    const group = await loader.getHarness(MatRadioGroupHarness);
    await group.checkRadioButton({ label: /Inches/ });
    const patch = http.expectOne('/api/account');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ unit: 'in' });
    patch.flush({ user: { ...ME, unit: 'in' } });
    await fixture.whenStable();

    expect(TestBed.inject(Session).unit()).toBe('in');
    expect(sampleText()).toContain('reads as 2.5555 in');
    expect(notifier.success).toHaveBeenCalledWith('Lengths now show in inches.');
  });

  it('when saving the unit fails, then the choice goes back and the error is told', async () => {
    const group = await loader.getHarness(MatRadioGroupHarness);
    await group.checkRadioButton({ label: /Inches/ });
    http.expectOne('/api/account').flush(null, { status: 500, statusText: 'Server Error' });
    await fixture.whenStable();
    expect(await group.getCheckedValue()).toBe('mm');
    expect(TestBed.inject(Session).unit()).toBe('mm');
    expect(notifier.error).toHaveBeenCalled();
  });

  it('when the current password is wrong (401), then the message shows and the person stays signed in', async () => {
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate');
    await (await input('[formControlName=currentPassword]')).setValue('old password?');
    await (await input('[formControlName=newPassword]')).setValue('a much longer one');
    await (await input('[formControlName=repeat]')).setValue('a much longer one');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Change password' }))).click();

    const request = http.expectOne('/api/account/password');
    expect(request.request.body).toEqual({
      currentPassword: 'old password?',
      newPassword: 'a much longer one',
    });
    request.flush(
      { error: { code: 'wrong_password', message: 'The current password is not right.' } },
      { status: 401, statusText: 'Unauthorized' },
    );
    await fixture.whenStable();

    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role=alert]');
    expect(alert?.textContent).toContain('The current password is not right.');
    expect(navigate).not.toHaveBeenCalled();
    expect(TestBed.inject(Session).user()).not.toBeNull();
  });

  it('when the two new passwords differ, then nothing is sent', async () => {
    await (await input('[formControlName=currentPassword]')).setValue('old password?');
    await (await input('[formControlName=newPassword]')).setValue('a much longer one');
    await (await input('[formControlName=repeat]')).setValue('a much longer two');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Change password' }))).click();
    http.expectNone('/api/account/password');
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'The two new passwords differ.',
    );
  });

  it('when the change is accepted (204), then the form empties and success is told', async () => {
    await (await input('[formControlName=currentPassword]')).setValue('old password?');
    await (await input('[formControlName=newPassword]')).setValue('a much longer one');
    await (await input('[formControlName=repeat]')).setValue('a much longer one');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Change password' }))).click();
    http.expectOne('/api/account/password').flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect(await (await input('[formControlName=newPassword]')).getValue()).toBe('');
    expect(notifier.success).toHaveBeenCalled();
  });
});
