import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { provideRouter, Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { Session } from '../session';
import { safeNext, SignIn } from './sign-in';

@Component({ template: 'elsewhere' })
class Elsewhere {}

describe('SignIn', () => {
  let http: HttpTestingController;

  async function open(url = '/sign-in') {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'sign-in', component: SignIn },
          { path: '**', component: Elsewhere },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    const harness = await RouterTestingHarness.create(url);
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    return { harness, loader };
  }

  async function fillAndSubmit(
    loader: Awaited<ReturnType<typeof open>>['loader'],
    email: string,
    password: string,
  ) {
    await (
      await loader.getHarness(MatInputHarness.with({ selector: '[type=email]' }))
    ).setValue(email);
    await (
      await loader.getHarness(MatInputHarness.with({ selector: '[autocomplete=current-password]' }))
    ).setValue(password);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
  }

  function alertText(harness: RouterTestingHarness): string | undefined {
    return harness.routeNativeElement?.querySelector('[role=alert]')?.textContent?.trim();
  }

  afterEach(() => http.verify());

  it('when the server answers 401, then "Wrong e-mail or password" shows and the password is cleared', async () => {
    const { harness, loader } = await open();
    await fillAndSubmit(loader, 'mira@example.test', 'not-the-password');

    const request = http.expectOne('/api/session');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      email: 'mira@example.test',
      password: 'not-the-password',
    });
    request.flush(
      { error: { code: 'unauthenticated', message: 'Sign-in failed' } },
      { status: 401, statusText: 'Unauthorized' },
    );
    await harness.fixture.whenStable();

    expect(alertText(harness)).toContain('Wrong e-mail or password');
    const password = await loader.getHarness(
      MatInputHarness.with({ selector: '[autocomplete=current-password]' }),
    );
    expect(await password.getValue()).toBe('');
    expect(TestBed.inject(Router).url).toBe('/sign-in');
  });

  it('when the server answers 429, then its own message shows', async () => {
    const { harness, loader } = await open();
    await fillAndSubmit(loader, 'mira@example.test', 'whatever-it-is');
    http
      .expectOne('/api/session')
      .flush(
        { error: { code: 'too_many_attempts', message: 'Too many tries. Wait 10 minutes.' } },
        { status: 429, statusText: 'Too Many Requests' },
      );
    await harness.fixture.whenStable();
    expect(alertText(harness)).toContain('Too many tries. Wait 10 minutes.');
  });

  it('when sign-in succeeds, then the session holds the user and the page in `next` opens', async () => {
    const { harness, loader } = await open('/sign-in?next=%2Fadmin%2Fusers');
    await fillAndSubmit(loader, ' mira@example.test ', 'correct horse battery');
    const request = http.expectOne('/api/session');
    expect(request.request.body.email).toBe('mira@example.test');
    request.flush({
      user: {
        id: 'u7',
        email: 'mira@example.test',
        name: 'Mira Castellan',
        role: 'owner',
        unit: 'in',
      },
    });
    await harness.fixture.whenStable();

    expect(TestBed.inject(Session).user()?.name).toBe('Mira Castellan');
    expect(TestBed.inject(Router).url).toBe('/admin/users');
  });

  it('when the fields are empty, then nothing is sent and each field says what it needs', async () => {
    const { harness, loader } = await open();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
    await harness.fixture.whenStable();
    http.expectNone('/api/session');
    const fields = await loader.getAllHarnesses(MatFormFieldHarness);
    const errors = await Promise.all(fields.map((field) => field.getTextErrors()));
    expect(errors).toEqual([['Enter your e-mail address.'], ['Enter your password.']]);
  });
});

describe('safeNext', () => {
  it.each([
    [null, '/'],
    ['', '/'],
    ['/jobs/12?tab=readings', '/jobs/12?tab=readings'],
    ['//evil.example/path', '/'],
    ['/\\evil.example', '/'],
    ['https://evil.example/', '/'],
    ['/sign-in?next=/', '/'],
  ])('when next is %p, then sign-in goes to %p', (next, expected) => {
    expect(safeNext(next)).toBe(expected);
  });
});
