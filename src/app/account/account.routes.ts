import { Routes } from '@angular/router';

export const accountRoutes: Routes = [
  {
    path: '',
    title: 'My account',
    loadComponent: () => import('./account-page').then((m) => m.AccountPage),
  },
];
