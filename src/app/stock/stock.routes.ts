import { Routes } from '@angular/router';

import { roleGuard } from '../core/role-guard';
import { may } from '../../../shared/access';

/** Receiving, pistons on the shelf, labels, bins, movements and empty steps. */
export const stockRoutes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'units' },
  {
    path: 'receive',
    title: 'Receive',
    canActivate: [roleGuard],
    data: { roles: may.receiveStock },
    loadComponent: () => import('./receive-page').then((m) => m.ReceivePage),
  },
  {
    path: 'units',
    title: 'Pistons on the shelf',
    loadComponent: () => import('./unit-list').then((m) => m.UnitList),
  },
  {
    path: 'labels',
    title: 'Piston labels',
    loadComponent: () => import('./unit-labels').then((m) => m.UnitLabels),
  },
  {
    path: 'bins',
    title: 'Bins',
    canActivate: [roleGuard],
    data: { roles: may.receiveStock },
    loadComponent: () => import('./bin-list').then((m) => m.BinList),
  },
  {
    path: 'bins/labels',
    title: 'Bin labels',
    canActivate: [roleGuard],
    data: { roles: may.receiveStock },
    loadComponent: () => import('./bin-labels').then((m) => m.BinLabels),
  },
  {
    path: 'ledger',
    title: 'Stock movements',
    loadComponent: () => import('./ledger-list').then((m) => m.LedgerList),
  },
  {
    path: 'exposure',
    title: 'Empty steps',
    loadComponent: () => import('./exposure-list').then((m) => m.ExposureList),
  },
];
