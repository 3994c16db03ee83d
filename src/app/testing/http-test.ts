import { provideHttpClient, withInterceptors, type HttpInterceptorFn } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import type { EnvironmentProviders, Provider } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import type { SessionResponse, SessionUser } from '../../../shared/session-types';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';

/** A Notifier that records what a page told the person instead of showing a snack bar. */
export interface NotifierMock {
  success: jest.Mock;
  error: jest.Mock;
}

export interface HttpTestOptions {
  /** The page's other needs (a date adapter, a stand-in service…). */
  providers?: (Provider | EnvironmentProviders)[];
  /** Real interceptors to run in front of the testing backend. */
  interceptors?: HttpInterceptorFn[];
}

/**
 * The TestBed of a component spec that talks to the server: a router with no routes, the HTTP
 * testing backend (every request is answered by the spec with `http.expectOne(...).flush(...)`)
 * and a recording Notifier. Call in `beforeEach` (or a spec's own render function).
 */
export function setUpHttpTest(options: HttpTestOptions = {}): {
  http: HttpTestingController;
  notifier: NotifierMock;
} {
  const notifier: NotifierMock = { success: jest.fn(), error: jest.fn() };
  TestBed.configureTestingModule({
    providers: [
      provideRouter([]),
      provideHttpClient(withInterceptors(options.interceptors ?? [])),
      provideHttpClientTesting(),
      { provide: Notifier, useValue: notifier },
      ...(options.providers ?? []),
    ],
  });
  return { http: TestBed.inject(HttpTestingController), notifier };
}

/**
 * Signs this person in, as the app does at start: the session asks `/api/session` once (with the
 * shop's name, time zone and currency when the spec gives them).
 */
export async function signIn(
  http: HttpTestingController,
  user: SessionUser,
  shop?: SessionResponse['shop'],
): Promise<void> {
  const loading = TestBed.inject(Session).load();
  http.expectOne('/api/session').flush(shop ? { user, shop } : { user });
  await loading;
}
