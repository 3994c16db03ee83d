// Stock alerts, for the people who reorder: the buyer and the owner.
import type { Router } from 'express';
import { z } from 'zod';
import { route, uuidParam } from '../http/route';
import { alertsQuery } from '../../shared/alerts-api';
import type { Role } from '../../shared/session-types';
import { acknowledgeAlert, listAlerts } from './alerts-service';

const READERS: Role[] = ['owner', 'buyer'];

export function registerAlertsRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/alerts',
    access: READERS,
    query: alertsQuery,
    handler: ({ query }) => listAlerts(query),
  });
  route(router, {
    method: 'post',
    path: '/api/alerts/:id/acknowledge',
    access: READERS,
    params: z.object({ id: uuidParam }),
    handler: ({ params, user }) => acknowledgeAlert(user.id, params.id),
  });
}
