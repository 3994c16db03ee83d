import { Routes } from '@angular/router';

import { roleGuard } from '../core/role-guard';
import { may } from '../../../shared/access';

/** Engine families, their step ladders and parts: everyone reads, owner and buyer edit. */
export const catalogRoutes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'families' },
  {
    path: 'families',
    title: 'Engine families',
    loadComponent: () => import('./family-list').then((m) => m.FamilyList),
  },
  {
    path: 'families/new',
    title: 'New engine family',
    canActivate: [roleGuard],
    data: { roles: may.editCatalog },
    loadComponent: () => import('./family-form').then((m) => m.FamilyForm),
  },
  {
    path: 'families/:id/edit',
    title: 'Edit engine family',
    canActivate: [roleGuard],
    data: { roles: may.editCatalog },
    loadComponent: () => import('./family-form').then((m) => m.FamilyForm),
  },
  {
    path: 'families/:id/ladder',
    title: 'Step ladder',
    loadComponent: () => import('./step-ladder').then((m) => m.StepLadder),
  },
  {
    path: 'parts',
    title: 'Parts',
    loadComponent: () => import('./part-list').then((m) => m.PartList),
  },
  {
    path: 'parts/new',
    title: 'New part',
    canActivate: [roleGuard],
    data: { roles: may.editCatalog },
    loadComponent: () => import('./part-form').then((m) => m.PartForm),
  },
  {
    path: 'parts/:id',
    title: 'Part',
    loadComponent: () => import('./part-form').then((m) => m.PartForm),
  },
];
