// The only queries on the audit trail's read side. Writing stays in audit.ts (recordAudit), inside
// each feature's own transaction.
import type { Knex } from 'knex';
import { db } from '../db/knex';

export interface AuditRow {
  id: number;
  at: Date;
  user_id: string | null;
  user_name: string | null;
  user_email: string | null;
  action: string;
  entity: string;
  entity_id: string | null;
  before: unknown;
  after: unknown;
}

export interface AuditFilter {
  entity?: string;
  entityId?: string;
  action?: string;
  userId?: string;
  /** Inclusive lower and exclusive upper bound, already in the shop's time zone. */
  from?: Date;
  until?: Date;
}

function filtered(k: Knex, f: AuditFilter) {
  const q = k('audit_events as a');
  if (f.entity) q.where('a.entity', f.entity);
  if (f.entityId) q.where('a.entity_id', f.entityId);
  if (f.action) q.where('a.action', f.action);
  if (f.userId) q.where('a.user_id', f.userId);
  if (f.from) q.where('a.at', '>=', f.from);
  if (f.until) q.where('a.at', '<', f.until);
  return q;
}

export async function listAudit(
  f: AuditFilter,
  page: { offset: number; limit: number; dir: 'asc' | 'desc' },
  k: Knex = db,
): Promise<{ rows: AuditRow[]; total: number }> {
  const [rows, count] = await Promise.all([
    filtered(k, f)
      .leftJoin('users as u', 'u.id', 'a.user_id')
      .select<AuditRow[]>(
        'a.id',
        'a.at',
        'a.user_id',
        'u.name as user_name',
        'u.email as user_email',
        'a.action',
        'a.entity',
        'a.entity_id',
        'a.before',
        'a.after',
      )
      // The id breaks ties between changes made in one transaction (same timestamp).
      .orderBy([
        { column: 'a.at', order: page.dir },
        { column: 'a.id', order: page.dir },
      ])
      .offset(page.offset)
      .limit(page.limit),
    filtered(k, f).count<{ n: number }[]>('* as n').first(),
  ]);
  return { rows, total: Number(count?.n ?? 0) };
}

export async function auditEntities(k: Knex = db): Promise<string[]> {
  const rows = await k('audit_events').distinct('entity').orderBy('entity');
  return rows.map((r: { entity: string }) => r.entity);
}

export async function auditActors(
  k: Knex = db,
): Promise<{ id: string; name: string; email: string }[]> {
  return k('users as u')
    .whereExists(k('audit_events as a').whereRaw('a.user_id = u.id'))
    .select('u.id', 'u.name', 'u.email')
    .orderBy('u.name');
}
