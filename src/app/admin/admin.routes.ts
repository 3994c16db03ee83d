import { Routes } from '@angular/router';

/** Owner-only pages; the parent route in app.routes.ts holds the role guard. */
export const adminRoutes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'users' },
  {
    path: 'users',
    title: 'Users',
    loadComponent: () => import('./user-list').then((m) => m.UserList),
  },
  {
    path: 'settings',
    title: 'Shop settings',
    loadComponent: () => import('./settings-page').then((m) => m.SettingsPage),
  },
  {
    path: 'audit',
    title: 'Audit trail',
    loadComponent: () => import('./audit-log').then((m) => m.AuditLog),
  },
];
