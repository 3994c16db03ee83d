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

/** A record the trail names by id, read as people know it: its number, SKU, label or name. */
export interface RefRow {
  id: string;
  label: string;
  /** For a hold: the job it is for, and its cylinder. */
  job_id?: string;
  cylinder?: number;
  /** For an order line: the order it is on. */
  order_id?: string;
}

const REF_SQL: Record<string, string> = {
  job: `SELECT id::text, number AS label FROM jobs WHERE id::text = ANY(?)`,
  part: `SELECT id::text, sku AS label FROM parts WHERE id::text = ANY(?)`,
  piston_unit: `SELECT id::text, label FROM piston_units WHERE id::text = ANY(?)`,
  customer: `SELECT id::text, name AS label FROM customers WHERE id::text = ANY(?)`,
  supplier: `SELECT id::text, name AS label FROM suppliers WHERE id::text = ANY(?)`,
  purchase_order: `SELECT id::text, number AS label FROM purchase_orders WHERE id::text = ANY(?)`,
  engine_family: `SELECT id::text, code AS label FROM engine_families WHERE id::text = ANY(?)`,
  bin: `SELECT id::text, code AS label FROM bins WHERE id::text = ANY(?)`,
  user: `SELECT id::text, name AS label FROM users WHERE id::text = ANY(?)`,
  step_series: `SELECT id::text, name AS label FROM step_series WHERE id::text = ANY(?)`,
  order_line: `SELECT l.id::text, o.number || ' line ' || l.line_no AS label, o.id::text AS order_id
                 FROM purchase_order_lines l JOIN purchase_orders o ON o.id = l.order_id
                WHERE l.id::text = ANY(?)`,
  hold: `SELECT h.id::text, j.number AS label, j.id::text AS job_id, h.cylinder
           FROM holds h JOIN jobs j ON j.id = h.job_id WHERE h.id::text = ANY(?)`,
};

/** The kinds of record the trail can name. */
export const REF_KINDS = Object.keys(REF_SQL);

/** Labels for the given ids of one kind (ids compared as text: the trail keeps them as text). */
export async function refLabels(kind: string, ids: string[], k: Knex = db): Promise<RefRow[]> {
  const sql = REF_SQL[kind];
  if (!sql || ids.length === 0) return [];
  const result = await k.raw<{ rows: RefRow[] }>(sql, [ids]);
  return result.rows;
}
