import { Routes } from '@angular/router';

import { roleGuard } from '../core/role-guard';
import { may } from '../../../shared/access';

/** Reorder rules, sourcing, purchase orders and receiving against them. */
export const purchasingRoutes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'orders' },
  {
    path: 'reorder',
    title: 'Reorder',
    canActivate: [roleGuard],
    data: { roles: may.buy },
    loadComponent: () => import('./reorder-list').then((m) => m.ReorderList),
  },
  {
    path: 'reorder-defaults',
    title: 'Reorder defaults',
    canActivate: [roleGuard],
    data: { roles: may.buy },
    loadComponent: () => import('./reorder-defaults-page').then((m) => m.ReorderDefaultsPage),
  },
  {
    path: 'reorder/:partId',
    title: 'Reorder rule',
    canActivate: [roleGuard],
    data: { roles: may.buy },
    loadComponent: () => import('./reorder-rule-page').then((m) => m.ReorderRulePage),
  },
  {
    path: 'sourcing',
    title: 'Sourcing',
    canActivate: [roleGuard],
    data: { roles: may.buy },
    loadComponent: () => import('./sourcing-page').then((m) => m.SourcingPage),
  },
  {
    path: 'rates',
    title: 'Exchange rates',
    canActivate: [roleGuard],
    data: { roles: may.buy },
    loadComponent: () => import('./rates-page').then((m) => m.RatesPage),
  },
  {
    path: 'orders',
    title: 'Purchase orders',
    loadComponent: () => import('./order-list').then((m) => m.OrderList),
  },
  {
    path: 'orders/new',
    title: 'New purchase order',
    canActivate: [roleGuard],
    data: { roles: may.buy },
    loadComponent: () => import('./order-form').then((m) => m.OrderForm),
  },
  {
    path: 'orders/:id',
    title: 'Purchase order',
    loadComponent: () => import('./order-page').then((m) => m.OrderPage),
  },
  {
    path: 'orders/:id/receive',
    title: 'Receive against an order',
    canActivate: [roleGuard],
    data: { roles: may.receiveStock },
    loadComponent: () => import('./receive-order').then((m) => m.ReceiveOrder),
  },
  // Receiving has one page, under stock: it offers the part's open order lines first.
  { path: 'receiving', pathMatch: 'full', redirectTo: '/stock/receive' },
];
