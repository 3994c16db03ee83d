import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';

import { isRole, type Role } from '../../../shared/session-types';
import { Notifier } from './notifier';
import { Session } from './session';

/**
 * Lets a route through only for the roles listed in its `data.roles`. A route that names no roles
 * is refused: access is denied unless granted, as on the server. Runs after `signedInGuard`.
 */
export const roleGuard: CanActivateFn = (route) => {
  const user = inject(Session).user();
  const allowed = rolesOf(route.data['roles']);
  if (user && allowed.includes(user.role)) {
    return true;
  }
  inject(Notifier).error('Your role cannot open that page.');
  return inject(Router).createUrlTree(['/']);
};

function rolesOf(value: unknown): Role[] {
  if (!Array.isArray(value) || !value.every(isRole)) {
    throw new Error(
      'roleGuard needs route data `roles`: a list of owner, buyer, machinist, staff.',
    );
  }
  return value;
}
