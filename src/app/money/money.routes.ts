import { Routes } from '@angular/router';

/** The owner's money pages; the parent route in app.routes.ts holds the role guard. */
export const moneyRoutes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'labour' },
  {
    path: 'labour',
    title: 'Labour prices',
    loadComponent: () => import('./labour-list').then((m) => m.LabourList),
  },
];
