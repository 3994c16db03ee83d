// Stock alerts, for the people who reorder: the buyer and the owner.
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField } from '../../shared/api/common';
import { alertsQuery } from '../../shared/api/alerts';
import { acknowledgeAlert, listAlerts, mailModeOf } from './alerts-service';
import { may } from '../../shared/access';

export function registerAlertsRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/alerts',
    access: may.handleAlerts,
    query: alertsQuery,
    handler: ({ query }) => listAlerts(query),
  });
  // How the signed-in person gets alert e-mail; they change it with PATCH /api/account {mailMode}.
  route(router, {
    method: 'get',
    path: '/api/alerts/mail-mode',
    access: may.handleAlerts,
    handler: ({ user }) => mailModeOf(user.id),
  });
  route(router, {
    method: 'post',
    path: '/api/alerts/:id/acknowledge',
    access: may.handleAlerts,
    params: z.object({ id: idField }),
    handler: ({ params, user }) => acknowledgeAlert(user.id, params.id),
  });
}
