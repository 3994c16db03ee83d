import { Routes } from '@angular/router';

/** Bringing price lists in and their log: staff, buyer and owner (guarded where the feature is mounted). */
export const importsRoutes: Routes = [
  {
    path: '',
    title: 'Price-list log',
    loadComponent: () => import('./import-log').then((m) => m.ImportLog),
  },
  {
    path: 'new',
    title: 'Bring in a price list',
    loadComponent: () => import('./import-upload').then((m) => m.ImportUpload),
  },
  {
    path: ':id',
    title: 'Price list',
    loadComponent: () => import('./import-detail').then((m) => m.ImportDetail),
  },
];
