import { Routes } from '@angular/router';

import { roleGuard } from './core/role-guard';
import { signedInGuard } from './core/signed-in-guard';
import { may } from '../../shared/access';

/**
 * Every page is lazy. Signed-in pages are children of the shell; a page limited to some roles
 * adds `canActivate: [roleGuard]` with `data: { roles: may.<action> }` (shared/access.ts), the
 * same action as its nav entry.
 */
export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in',
    loadComponent: () => import('./core/sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    // The customer's page from the e-mailed link: no sign-in, outside the shell, the token is the key.
    path: 'c/:token',
    title: 'Your job',
    loadComponent: () => import('./money/public-job-page').then((m) => m.PublicJobPage),
  },
  {
    path: '',
    canActivate: [signedInGuard],
    loadComponent: () => import('./core/shell').then((m) => m.Shell),
    children: [
      {
        path: '',
        pathMatch: 'full',
        title: 'Home',
        loadComponent: () => import('./home/home').then((m) => m.Home),
      },
      {
        path: 'admin',
        canActivate: [roleGuard],
        data: { roles: may.administer },
        loadChildren: () => import('./admin/admin.routes').then((m) => m.adminRoutes),
      },
      {
        path: 'money',
        canActivate: [roleGuard],
        data: { roles: may.setRates },
        loadChildren: () => import('./money/money.routes').then((m) => m.moneyRoutes),
      },
      {
        path: 'catalog',
        loadChildren: () => import('./catalog/catalog.routes').then((m) => m.catalogRoutes),
      },
      {
        path: 'stock',
        loadChildren: () => import('./stock/stock.routes').then((m) => m.stockRoutes),
      },
      {
        path: 'jobs',
        loadChildren: () => import('./jobs/jobs.routes').then((m) => m.jobsRoutes),
      },
      {
        path: 'customers',
        loadChildren: () => import('./customers/customers.routes').then((m) => m.customersRoutes),
      },
      {
        path: 'insights',
        canActivate: [roleGuard],
        data: { roles: may.readStockFigures },
        loadChildren: () => import('./insights/insights.routes').then((m) => m.insightsRoutes),
      },
      {
        path: 'suppliers',
        canActivate: [roleGuard],
        data: { roles: may.readSuppliers },
        loadChildren: () => import('./suppliers/suppliers.routes').then((m) => m.suppliersRoutes),
      },
      {
        path: 'imports',
        canActivate: [roleGuard],
        data: { roles: may.importPriceLists },
        loadChildren: () => import('./imports/imports.routes').then((m) => m.importsRoutes),
      },
      {
        path: 'purchasing',
        loadChildren: () =>
          import('./purchasing/purchasing.routes').then((m) => m.purchasingRoutes),
      },
      {
        path: 'alerts',
        canActivate: [roleGuard],
        data: { roles: may.handleAlerts },
        loadChildren: () => import('./alerts/alerts.routes').then((m) => m.alertsRoutes),
      },
      {
        path: 'account',
        loadChildren: () => import('./account/account.routes').then((m) => m.accountRoutes),
      },
      {
        path: '**',
        title: 'Not found',
        loadComponent: () => import('./core/not-found').then((m) => m.NotFound),
      },
    ],
  },
];
