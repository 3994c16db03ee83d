import { Routes } from '@angular/router';
import { provideLuxonDateAdapter } from '@angular/material-luxon-adapter';

import { roleGuard } from '../core/role-guard';
import { provideInsightCharts } from './chart-setup';

const OWNER = { roles: ['owner'] };
const STOCK_SIDE = { roles: ['owner', 'buyer'] };

/** Dates are typed and shown as YYYY-MM-DD: one form for every shop, whatever the locale. */
const DAY_FORMATS = {
  parse: { dateInput: ['yyyy-MM-dd', 'yyyy-M-d', 'D'] },
  display: {
    dateInput: 'yyyy-MM-dd',
    monthYearLabel: 'LLL yyyy',
    dateA11yLabel: 'DDD',
    monthYearA11yLabel: 'LLLL yyyy',
  },
};

/**
 * The owner's insights (what sells, what sits, ABC classes, where the shop ran short); the buyer
 * sees the stock side. Charts and the luxon date adapter load with these pages only.
 */
export const insightsRoutes: Routes = [
  {
    path: '',
    providers: [provideInsightCharts(), provideLuxonDateAdapter(DAY_FORMATS)],
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'stock' },
      {
        path: 'sales',
        title: 'What sells',
        canActivate: [roleGuard],
        data: OWNER,
        loadComponent: () => import('./sales-page').then((m) => m.SalesPage),
      },
      {
        path: 'stock',
        title: 'What sits',
        canActivate: [roleGuard],
        data: STOCK_SIDE,
        loadComponent: () => import('./stock-page').then((m) => m.StockPage),
      },
      {
        path: 'abc',
        title: 'ABC classes',
        canActivate: [roleGuard],
        data: STOCK_SIDE,
        loadComponent: () => import('./abc-page').then((m) => m.AbcPage),
      },
      {
        path: 'exposure',
        title: 'Ran short',
        canActivate: [roleGuard],
        data: STOCK_SIDE,
        loadComponent: () => import('./exposure-page').then((m) => m.ExposurePage),
      },
    ],
  },
];
