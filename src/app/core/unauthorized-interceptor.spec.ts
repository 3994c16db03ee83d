import { HttpClient, HttpContext, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';

import { HANDLES_OWN_401 } from './http-context';
import { Notifier } from './notifier';
import { Session } from './session';
import { unauthorizedInterceptor } from './unauthorized-interceptor';

describe('unauthorizedInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let navigate: jest.SpyInstance;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([unauthorizedInterceptor])),
        provideHttpClientTesting(),
        { provide: Notifier, useValue: { error: jest.fn(), success: jest.fn() } },
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);

    const loading = TestBed.inject(Session).load();
    backend.expectOne('/api/session').flush({
      user: { id: 'u1', email: 'a@example.test', name: 'Ana Brisk', role: 'staff', unit: 'mm' },
    });
    await loading;
  });

  afterEach(() => backend.verify());

  async function answer401(request: Promise<unknown>, url: string): Promise<void> {
    backend
      .expectOne(url)
      .flush(
        { error: { code: 'unauthenticated', message: 'Sign in first.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    await expect(request).rejects.toMatchObject({ status: 401 });
  }

  it('when an API call answers 401, then the user is forgotten and sent to sign in', async () => {
    await answer401(firstValueFrom(http.get('/api/users')), '/api/users');
    expect(TestBed.inject(Session).user()).toBeNull();
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], { queryParams: { next: '/' } });
  });

  it('when GET /api/session answers 401, then no redirect happens (it is the question itself)', async () => {
    await answer401(firstValueFrom(http.get('/api/session')), '/api/session');
    expect(navigate).not.toHaveBeenCalled();
  });

  it('when a request handles its own 401, then no redirect happens and the user stays', async () => {
    const context = new HttpContext().set(HANDLES_OWN_401, true);
    await answer401(
      firstValueFrom(http.post('/api/account/password', {}, { context })),
      '/api/account/password',
    );
    expect(navigate).not.toHaveBeenCalled();
    expect(TestBed.inject(Session).user()?.name).toBe('Ana Brisk');
  });

  it('when an API call answers 403, then nobody is signed out', async () => {
    const request = firstValueFrom(http.get('/api/users'));
    backend.expectOne('/api/users').flush(null, { status: 403, statusText: 'Forbidden' });
    await expect(request).rejects.toMatchObject({ status: 403 });
    expect(navigate).not.toHaveBeenCalled();
    expect(TestBed.inject(Session).user()).not.toBeNull();
  });
});
