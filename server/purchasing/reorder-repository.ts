// Queries for reorder rules, defaults, the reorder list and the issue history behind a suggestion.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { updateRow } from '../db/rows';
import type { ReorderListQuery, RuleSource } from '../../shared/api/purchasing';

export interface ReorderPartRow {
  id: string;
  sku: string;
  description: string;
  kind: string;
  active: boolean;
  family_id: string | null;
  family_code: string | null;
  step_id: string | null;
  step_label: string | null;
  average_cost: string;
  reorder_point: number | null;
  order_up_to: number | null;
  on_hand: number;
  held: number;
  free: number;
  on_order: number;
  rule_point: number | null;
  rule_up_to: number | null;
  rule_source: RuleSource;
}

function reorderBase(k: Knex) {
  return k('parts as p')
    .join('part_levels as pl', 'pl.part_id', 'p.id')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as s', 's.id', 'p.step_id')
    .leftJoin(k.raw('LATERAL part_reorder_rule(p.id) AS r ON true'))
    .leftJoin(
      k.raw(
        '(SELECT part_id, sum(quantity)::int AS quantity FROM parts_on_order() GROUP BY part_id) AS oo',
      ),
      'oo.part_id',
      'p.id',
    )
    .select(
      'p.id',
      'p.sku',
      'p.description',
      'p.kind',
      'p.active',
      'p.family_id',
      'f.code as family_code',
      'p.step_id',
      's.label as step_label',
      'p.average_cost',
      'p.reorder_point',
      'p.order_up_to',
      'pl.on_hand',
      'pl.held',
      k.raw('(pl.on_hand - pl.held)::int AS free'),
      k.raw('coalesce(oo.quantity, 0)::int AS on_order'),
      'r.reorder_point as rule_point',
      'r.order_up_to as rule_up_to',
      k.raw(`coalesce(r.source, 'none') AS rule_source`),
    );
}

export async function reorderPart(id: string, k: Knex = db): Promise<ReorderPartRow | undefined> {
  return (await reorderBase(k).where('p.id', id).first()) as ReorderPartRow | undefined;
}

export async function reorderParts(ids: string[], k: Knex = db): Promise<ReorderPartRow[]> {
  if (ids.length === 0) return [];
  return (await reorderBase(k).whereIn('p.id', ids).orderBy('p.sku')) as ReorderPartRow[];
}

export async function listReorder(
  q: ReorderListQuery,
  k: Knex = db,
): Promise<{ rows: ReorderPartRow[]; total: number }> {
  const filtered = reorderBase(k)
    .where('p.active', true)
    .andWhereNot('p.kind', 'kit')
    .modify((qb) => {
      if (q.familyId) qb.where('p.family_id', q.familyId);
      if (q.q) {
        const like = `%${q.q.replace(/[\\%_]/g, '\\$&')}%`;
        qb.where((w) => w.whereILike('p.sku', like).orWhereILike('p.description', like));
      }
      if (q.low) {
        qb.whereNotNull('r.reorder_point').andWhereRaw(
          '(pl.on_hand - pl.held) + coalesce(oo.quantity, 0) <= r.reorder_point',
        );
      }
    });
  const [{ count }] = await k
    .from(filtered.clone().as('x'))
    .count<{ count: number }[]>('* as count');
  const rows = await filtered
    .clone()
    .orderBy([
      { column: 'f.code', order: 'asc' },
      { column: 'p.sku', order: 'asc' },
    ])
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize);
  return { rows: rows as ReorderPartRow[], total: Number(count) };
}

/** Every active part (not a kit) at or below its reorder point, counting what is on order. */
export async function lowParts(
  opts: { partIds?: string[]; familyId?: string },
  k: Knex = db,
): Promise<ReorderPartRow[]> {
  return (await reorderBase(k)
    .where('p.active', true)
    .andWhereNot('p.kind', 'kit')
    .whereNotNull('r.reorder_point')
    .andWhereRaw('(pl.on_hand - pl.held) + coalesce(oo.quantity, 0) <= r.reorder_point')
    .modify((qb) => {
      if (opts.partIds) qb.whereIn('p.id', opts.partIds);
      if (opts.familyId) qb.where('p.family_id', opts.familyId);
    })
    .orderBy('p.sku')) as ReorderPartRow[];
}

export async function lockPart(
  k: Knex,
  id: string,
): Promise<{ reorder_point: number | null; order_up_to: number | null } | undefined> {
  return k('parts').where({ id }).forUpdate().first('reorder_point', 'order_up_to');
}

export function setPartRule(
  k: Knex,
  id: string,
  rule: { reorder_point: number | null; order_up_to: number | null },
): Promise<void> {
  return updateRow(k, 'parts', id, rule);
}

/** One part's demand over the shop's calendar days in [from, to). */
export interface DemandWindow {
  partId: string;
  from: Date;
  to: Date;
  timeZone: string;
}

export interface DayQuantity {
  day: string;
  quantity: number;
}

/** Runs a per-day count whose bindings are the window's zone, part and ends, in that order. */
async function perDay(k: Knex, sql: string, w: DemandWindow): Promise<DayQuantity[]> {
  const { rows } = (await k.raw(sql, [w.timeZone, w.partId, w.from, w.to])) as {
    rows: DayQuantity[];
  };
  return rows;
}

/** Units issued per day (shop's calendar days) in [from, to). Days without issues are absent. */
export function dailyIssues(w: DemandWindow, k: Knex = db): Promise<DayQuantity[]> {
  return perDay(
    k,
    `SELECT to_char((at AT TIME ZONE ?)::date, 'YYYY-MM-DD') AS day, sum(-quantity)::int AS quantity
       FROM stock_ledger
      WHERE part_id = ? AND kind = 'issue' AND at >= ? AND at < ?
      GROUP BY 1 ORDER BY 1`,
    w,
  );
}

/**
 * Demand the shop could not meet, per day asked: each time a piston of this part's family and step
 * was needed and none was free (a refused hold, a counter request, a step chosen with nothing on the
 * shelf), counted when that need was never met by an issue of such a piston to the same job. A job
 * that later got its piston is demand already counted by its issue; a counter request is always
 * lost. Only pistons: shortages are recorded per step, which rings do not have.
 */
export function dailyLostDemand(w: DemandWindow, k: Knex = db): Promise<DayQuantity[]> {
  return perDay(
    k,
    `SELECT to_char((s.at AT TIME ZONE ?)::date, 'YYYY-MM-DD') AS day, count(*)::int AS quantity
       FROM parts p
       JOIN step_shortages s ON s.family_id = p.family_id AND s.step_id = p.step_id
      WHERE p.id = ? AND p.kind = 'piston' AND s.at >= ? AND s.at < ?
        AND (s.job_id IS NULL OR NOT EXISTS (
              SELECT 1 FROM stock_ledger l JOIN parts lp ON lp.id = l.part_id
               WHERE l.job_id = s.job_id AND l.kind = 'issue' AND lp.kind = 'piston'
                 AND lp.family_id = s.family_id AND lp.step_id = s.step_id))
      GROUP BY 1 ORDER BY 1`,
    w,
  );
}

/**
 * Days from sending an order to each delivery of it, per receipt, for a supplier's orders received
 * in the last year (calendar days in the shop's time zone): how long this supplier really takes.
 */
export async function deliveryLeadDays(
  supplierId: string,
  timeZone: string,
  k: Knex = db,
): Promise<number[]> {
  const { rows } = (await k.raw(
    `SELECT ((r.received_at AT TIME ZONE :tz)::date - (o.sent_at AT TIME ZONE :tz)::date)::int AS days
       FROM purchase_order_receipts r
       JOIN purchase_orders o ON o.id = r.order_id
      WHERE o.supplier_id = :supplierId AND o.sent_at IS NOT NULL
        AND r.received_at >= now() - interval '1 year'
      ORDER BY r.received_at`,
    { tz: timeZone, supplierId },
  )) as { rows: { days: number }[] };
  return rows.map((r) => r.days);
}

// ---- Defaults -------------------------------------------------------------------------------

export interface DefaultRow {
  id: string;
  family_id: string;
  family_code: string;
  step_id: string | null;
  step_label: string | null;
  kind: 'piston' | 'rings';
  reorder_point: number;
  order_up_to: number;
  updated_at: Date;
}

function defaultsBase(k: Knex) {
  return k('reorder_defaults as d')
    .join('engine_families as f', 'f.id', 'd.family_id')
    .leftJoin('series_steps as s', 's.id', 'd.step_id')
    .select(
      'd.id',
      'd.family_id',
      'f.code as family_code',
      'd.step_id',
      's.label as step_label',
      'd.kind',
      'd.reorder_point',
      'd.order_up_to',
      'd.updated_at',
    );
}

export async function listDefaults(
  familyId: string | undefined,
  k: Knex = db,
): Promise<DefaultRow[]> {
  return (await defaultsBase(k)
    .modify((qb) => {
      if (familyId) qb.where('d.family_id', familyId);
    })
    .orderBy([
      { column: 'f.code' },
      { column: 'd.kind' },
      { column: 's.position', nulls: 'first' },
    ])) as DefaultRow[];
}

export async function findDefault(id: string, k: Knex = db): Promise<DefaultRow | undefined> {
  return (await defaultsBase(k).where('d.id', id).first()) as DefaultRow | undefined;
}

export async function upsertDefault(
  k: Knex,
  d: {
    family_id: string;
    step_id: string | null;
    kind: string;
    reorder_point: number;
    order_up_to: number;
    updated_by: string;
  },
): Promise<string> {
  const existing = await k('reorder_defaults')
    .where({ family_id: d.family_id, kind: d.kind })
    .modify((qb) => (d.step_id ? qb.where('step_id', d.step_id) : qb.whereNull('step_id')))
    .forUpdate()
    .first('id');
  if (existing) {
    await k('reorder_defaults')
      .where({ id: existing.id })
      .update({ ...d, updated_at: k.fn.now() });
    return existing.id as string;
  }
  const [row] = await k('reorder_defaults').insert(d).returning('id');
  return (row as { id: string }).id;
}

export async function deleteDefault(k: Knex, id: string): Promise<boolean> {
  return (await k('reorder_defaults').where({ id }).delete()) > 0;
}

export async function stepOfFamily(
  familyId: string,
  stepId: string | null,
  k: Knex = db,
): Promise<{ family: boolean; step: boolean }> {
  const family = await k('engine_families').where({ id: familyId }).first('step_series_id');
  if (!family) return { family: false, step: false };
  if (!stepId) return { family: true, step: true };
  const step = await k('series_steps')
    .where({ id: stepId, series_id: family.step_series_id })
    .first('id');
  return { family: true, step: Boolean(step) };
}
