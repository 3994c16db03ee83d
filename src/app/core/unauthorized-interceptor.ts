import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';

import { HANDLES_OWN_401 } from './http-context';
import { Notifier } from './notifier';
import { Session } from './session';

/**
 * When an API call answers 401 the session has ended (timed out, or signed out elsewhere): forget
 * the user and send them to sign in, coming back to the page they were on. GET /api/session and
 * requests marked HANDLES_OWN_401 are left alone, since their 401 is an answer, not an expiry.
 */
export const unauthorizedInterceptor: HttpInterceptorFn = (request, next) => {
  const session = inject(Session);
  const router = inject(Router);
  const notifier = inject(Notifier);
  const exempt =
    request.context.get(HANDLES_OWN_401) ||
    !isApiUrl(request.url) ||
    (request.method === 'GET' && isSessionUrl(request.url));

  return next(request).pipe(
    catchError((error: unknown) => {
      if (!exempt && error instanceof HttpErrorResponse && error.status === 401) {
        const here = router.url;
        session.clear();
        if (!here.startsWith('/sign-in')) {
          notifier.error('Your session has ended. Sign in again to carry on.');
          void router.navigate(['/sign-in'], { queryParams: { next: here } });
        }
      }
      return throwError(() => error);
    }),
  );
};

function isApiUrl(url: string): boolean {
  return url.startsWith('/api/') || url === '/api';
}

function isSessionUrl(url: string): boolean {
  return url.split('?')[0] === '/api/session';
}
