import { Routes } from '@angular/router';

import { provideInsightCharts } from '../insights/chart-setup';

/**
 * Customers: every signed-in role reads the list, a customer and their cylinders; editing,
 * merging and erasing are checked on each action (and by the server).
 */
export const customersRoutes: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Customers',
    loadComponent: () => import('./customer-list').then((m) => m.CustomerList),
  },
  {
    path: ':id',
    title: 'Customer',
    loadComponent: () => import('./customer-page').then((m) => m.CustomerPage),
  },
  {
    path: ':id/cylinders/:cylinderId',
    title: 'Cylinder',
    // The bore chart: Chart.js loads with this page only.
    providers: [provideInsightCharts()],
    loadComponent: () => import('./cylinder-history-page').then((m) => m.CylinderHistoryPage),
  },
];
