import { Routes } from '@angular/router';

import { roleGuard } from '../core/role-guard';

const BUYERS = { roles: ['owner', 'buyer'] };
const RECEIVERS = { roles: ['owner', 'buyer', 'staff'] };

/** Reorder rules, sourcing, purchase orders and receiving against them. */
export const purchasingRoutes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'orders' },
  {
    path: 'reorder',
    title: 'Reorder',
    canActivate: [roleGuard],
    data: BUYERS,
    loadComponent: () => import('./reorder-list').then((m) => m.ReorderList),
  },
  {
    path: 'reorder-defaults',
    title: 'Reorder defaults',
    canActivate: [roleGuard],
    data: BUYERS,
    loadComponent: () => import('./reorder-defaults-page').then((m) => m.ReorderDefaultsPage),
  },
  {
    path: 'reorder/:partId',
    title: 'Reorder rule',
    canActivate: [roleGuard],
    data: BUYERS,
    loadComponent: () => import('./reorder-rule-page').then((m) => m.ReorderRulePage),
  },
  {
    path: 'sourcing',
    title: 'Sourcing',
    canActivate: [roleGuard],
    data: BUYERS,
    loadComponent: () => import('./sourcing-page').then((m) => m.SourcingPage),
  },
  {
    path: 'rates',
    title: 'Exchange rates',
    canActivate: [roleGuard],
    data: BUYERS,
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
    data: BUYERS,
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
    data: RECEIVERS,
    loadComponent: () => import('./receive-order').then((m) => m.ReceiveOrder),
  },
  // Receiving has one page, under stock: it offers the part's open order lines first.
  { path: 'receiving', pathMatch: 'full', redirectTo: '/stock/receive' },
];
