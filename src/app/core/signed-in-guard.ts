import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';

import { Notifier } from './notifier';
import { Session } from './session';

/** Lets signed-in people through; everyone else goes to /sign-in and comes back afterwards. */
export const signedInGuard: CanActivateFn = async (_route, state) => {
  const session = inject(Session);
  const router = inject(Router);
  const notifier = inject(Notifier); // inject() only works before the first await
  try {
    if (await session.ensureLoaded()) {
      return true;
    }
  } catch {
    void notifier.error('The server did not answer. Check the connection, then sign in again.');
  }
  return router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
};
