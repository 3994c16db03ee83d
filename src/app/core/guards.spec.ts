import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  provideHttpClientTesting,
  TestRequest,
} from '@angular/common/http/testing';
import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import type { Role } from '../../../shared/session-types';
import { Notifier } from './notifier';
import { roleGuard } from './role-guard';
import { signedInGuard } from './signed-in-guard';

@Component({ template: 'page' })
class Page {}

describe('signedInGuard and roleGuard', () => {
  let http: HttpTestingController;

  async function start(url: string) {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'sign-in', component: Page },
          {
            path: '',
            canActivate: [signedInGuard],
            children: [
              { path: '', pathMatch: 'full', component: Page },
              {
                path: 'owners',
                canActivate: [roleGuard],
                data: { roles: ['owner'] },
                component: Page,
              },
              { path: 'no-roles', canActivate: [roleGuard], component: Page },
            ],
          },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: Notifier, useValue: { error: jest.fn(), success: jest.fn() } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl(url);
    return { navigation, router: TestBed.inject(Router) };
  }

  /** The router reaches the guard a few ticks after navigation starts. */
  async function sessionRequest(): Promise<TestRequest> {
    for (let tick = 0; tick < 20; tick++) {
      const [request] = http.match('/api/session');
      if (request) return request;
      await new Promise((resolve) => setTimeout(resolve));
    }
    throw new Error('The guard never asked GET /api/session.');
  }

  async function answerSession(role: Role | null): Promise<void> {
    const request = await sessionRequest();
    if (role) {
      request.flush({ user: { id: 'u1', email: 'e@example.test', name: 'E', role, unit: 'mm' } });
    } else {
      request.flush(null, { status: 401, statusText: 'Unauthorized' });
    }
  }

  it('when nobody is signed in, then the page sends them to sign in with next set', async () => {
    const { navigation, router } = await start('/owners?tab=2');
    await answerSession(null);
    await navigation;
    expect(router.url).toBe('/sign-in?next=%2Fowners%3Ftab%3D2');
  });

  it('when an owner opens an owner page, then it opens', async () => {
    const { navigation, router } = await start('/owners');
    await answerSession('owner');
    await navigation;
    expect(router.url).toBe('/owners');
  });

  it('when a buyer opens an owner page, then they land on home with a notice', async () => {
    const { navigation, router } = await start('/owners');
    await answerSession('buyer');
    await navigation;
    expect(router.url).toBe('/');
    expect(TestBed.inject(Notifier).error).toHaveBeenCalledWith('Your role cannot open that page.');
  });

  it('when a route forgets its roles, then the guard refuses with a clear error', async () => {
    const { navigation } = await start('/no-roles');
    await answerSession('owner');
    await expect(navigation).rejects.toThrow(/needs route data `roles`/);
  });

  it('when the server is down, then the person is told and sent to sign in', async () => {
    const { navigation, router } = await start('/');
    (await sessionRequest()).error(new ProgressEvent('error'), { status: 0 });
    await navigation;
    expect(router.url).toBe('/sign-in?next=%2F');
    expect(TestBed.inject(Notifier).error).toHaveBeenCalled();
  });
});
