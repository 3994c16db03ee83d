import { Routes } from '@angular/router';

import { roleGuard } from '../core/role-guard';
import { may } from '../../../shared/access';

/**
 * Cylinder jobs: everyone reads the bench and a job; the counter and the workshop take jobs in;
 * measuring, choosing the step, holding pistons and the bore sheet are machine work.
 */
export const jobsRoutes: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Job bench',
    loadComponent: () => import('./job-board').then((m) => m.JobBoard),
  },
  {
    path: 'new',
    title: 'Take in a job',
    canActivate: [roleGuard],
    data: { roles: may.runCounter },
    loadComponent: () => import('./job-intake').then((m) => m.JobIntake),
  },
  {
    path: ':id',
    title: 'Job',
    loadComponent: () => import('./job-page').then((m) => m.JobPage),
  },
  {
    path: ':id/cylinders/:n',
    title: 'Measure and choose',
    canActivate: [roleGuard],
    data: { roles: may.machine },
    loadComponent: () => import('./cylinder-page').then((m) => m.CylinderPage),
  },
  {
    path: ':id/cylinders/:n/sheet',
    title: 'Bore sheet',
    canActivate: [roleGuard],
    data: { roles: may.machine },
    loadComponent: () => import('./bore-sheet-page').then((m) => m.BoreSheetPage),
  },
];
