import { HttpInterceptorFn, HttpResponse } from '@angular/common/http';
import { inject } from '@angular/core';
import { tap } from 'rxjs';

import { OfflineStatus } from './offline-status';

/**
 * Hands the `Date` of every API answer read to OfflineStatus, which tells a live answer from the
 * service worker's cached copy, so the shell can say the page is "shown as of" an earlier time.
 */
export const offlineInterceptor: HttpInterceptorFn = (request, next) => {
  if (request.method !== 'GET' || !request.url.startsWith('/api/')) return next(request);
  const status = inject(OfflineStatus);
  return next(request).pipe(
    tap((event) => {
      if (event instanceof HttpResponse) status.noteAnswer(request.urlWithParams, event.headers.get('Date'));
    }),
  );
};
