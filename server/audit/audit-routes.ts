// The audit trail, for the owner only: who changed what, when, and what it was before and after.
import type { Router } from 'express';
import { route } from '../http/route';
import { auditQuery } from '../../shared/api/audit';
import { browseAudit } from './audit-service';
import { may } from '../../shared/access';

export function registerAuditRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/audit',
    access: may.administer,
    query: auditQuery,
    handler: ({ query }) => browseAudit(query),
  });
}
