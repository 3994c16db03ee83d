// The home page's summary of the day's work, for whoever is signed in; what it holds depends on
// the role (shared/api/home.ts says which sections each role gets).
import type { Router } from 'express';
import { route } from '../http/route';
import { homeFor } from './home-service';

export function registerHomeRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/home',
    access: 'signed-in',
    handler: ({ user }) => homeFor(user.role),
  });
}
