import { Routes } from '@angular/router';

import { roleGuard } from '../core/role-guard';
import { may } from '../../../shared/access';
import { provideInsightCharts } from './chart-setup';

/**
 * The owner's insights (what sells, what sits, ABC classes, where the shop ran short); the buyer
 * sees the stock side. Charts load with these pages only; dates follow the shop's one pattern (app.config.ts).
 */
export const insightsRoutes: Routes = [
  {
    path: '',
    providers: [provideInsightCharts()],
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'stock' },
      {
        path: 'sales',
        title: 'What sells',
        canActivate: [roleGuard],
        data: { roles: may.readSales },
        loadComponent: () => import('./sales-page').then((m) => m.SalesPage),
      },
      {
        path: 'money',
        title: 'Invoiced and owed',
        canActivate: [roleGuard],
        data: { roles: may.readSales },
        loadComponent: () => import('./money-page').then((m) => m.MoneyPage),
      },
      {
        path: 'stock',
        title: 'What sits',
        canActivate: [roleGuard],
        data: { roles: may.readStockFigures },
        loadComponent: () => import('./stock-page').then((m) => m.StockPage),
      },
      {
        path: 'abc',
        title: 'ABC classes',
        canActivate: [roleGuard],
        data: { roles: may.readStockFigures },
        loadComponent: () => import('./abc-page').then((m) => m.AbcPage),
      },
      {
        path: 'cylinders',
        title: 'Near their last step',
        canActivate: [roleGuard],
        data: { roles: may.readSales },
        loadComponent: () => import('./cylinders-page').then((m) => m.CylindersPage),
      },
      {
        path: 'exposure',
        title: 'Ran short',
        canActivate: [roleGuard],
        data: { roles: may.readStockFigures },
        loadComponent: () => import('./exposure-page').then((m) => m.ExposurePage),
      },
    ],
  },
];
