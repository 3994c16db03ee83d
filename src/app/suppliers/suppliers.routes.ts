import { Routes } from '@angular/router';

import { roleGuard } from '../core/role-guard';
import { may } from '../../../shared/access';

/** Suppliers, their offers with price history, and the queue of items to map: buyer and owner keep them, staff read. */
export const suppliersRoutes: Routes = [
  {
    path: '',
    title: 'Suppliers',
    loadComponent: () => import('./supplier-list').then((m) => m.SupplierList),
  },
  {
    path: 'new',
    title: 'New supplier',
    canActivate: [roleGuard],
    data: { roles: may.editSuppliers },
    loadComponent: () => import('./supplier-form').then((m) => m.SupplierForm),
  },
  {
    path: 'unmapped',
    title: 'Items to map',
    loadComponent: () => import('./mapping-queue').then((m) => m.MappingQueue),
  },
  {
    path: ':id',
    title: 'Supplier',
    loadComponent: () => import('./supplier-detail').then((m) => m.SupplierDetail),
  },
  {
    path: ':id/edit',
    title: 'Edit supplier',
    canActivate: [roleGuard],
    data: { roles: may.editSuppliers },
    loadComponent: () => import('./supplier-form').then((m) => m.SupplierForm),
  },
];
