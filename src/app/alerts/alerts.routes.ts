import { Routes } from '@angular/router';

import { roleGuard } from '../core/role-guard';
import { may } from '../../../shared/access';

/** Stock alerts for the people who reorder, and the owner's view of the local mailbox. */
export const alertsRoutes: Routes = [
  {
    path: '',
    title: 'Stock alerts',
    loadComponent: () => import('./alert-list').then((m) => m.AlertList),
  },
  {
    path: 'mailbox',
    title: 'Mailbox',
    canActivate: [roleGuard],
    data: { roles: may.administer },
    loadComponent: () => import('./mailbox-page').then((m) => m.MailboxPage),
  },
];
