// Jobs waiting on a purchase order line: the waits themselves, the lines a job could wait on, and
// the locks a receipt takes on them; orders-repository.ts re-exports these with the orders.
import type { Knex } from 'knex';
import { db } from '../db/knex';

export interface WaitRow {
  id: string;
  line_id: string;
  order_id: string;
  order_number: string;
  job_id: string;
  job_number: string;
  customer_name: string;
  cylinder: number;
  sku: string;
  created_at: Date;
  fulfilled_at: Date | null;
  cancelled_at: Date | null;
  unit_label: string | null;
}

// ---- Waits --------------------------------------------------------------------------------------

function waitsBase(k: Knex) {
  return k('order_line_waits as w')
    .join('purchase_order_lines as l', 'l.id', 'w.line_id')
    .join('purchase_orders as o', 'o.id', 'l.order_id')
    .join('parts as p', 'p.id', 'l.part_id')
    .join('jobs as j', 'j.id', 'w.job_id')
    .leftJoin('holds as h', 'h.id', 'w.hold_id')
    .leftJoin('piston_units as pu', 'pu.id', 'h.unit_id')
    .select(
      'w.id',
      'w.line_id',
      'o.id as order_id',
      'o.number as order_number',
      'w.job_id',
      'j.number as job_number',
      'j.customer_name',
      'w.cylinder',
      'p.sku',
      'w.created_at',
      'w.fulfilled_at',
      'w.cancelled_at',
      'pu.label as unit_label',
    );
}

export async function listWaits(
  f: { jobId?: string; lineId?: string; lineIds?: string[]; active: boolean },
  k: Knex = db,
): Promise<WaitRow[]> {
  return (await waitsBase(k)
    .modify((qb) => {
      if (f.jobId) qb.where('w.job_id', f.jobId);
      if (f.lineId) qb.where('w.line_id', f.lineId);
      if (f.lineIds) qb.whereIn('w.line_id', f.lineIds);
      if (f.active) qb.whereNull('w.fulfilled_at').whereNull('w.cancelled_at');
    })
    .orderBy([{ column: 'j.created_at' }, { column: 'w.created_at' }])) as WaitRow[];
}

export async function findWait(id: string, k: Knex = db): Promise<WaitRow | undefined> {
  return (await waitsBase(k).where('w.id', id).first()) as WaitRow | undefined;
}

/** The line's active waits, oldest job first, locked so two deliveries never serve one wait. */
export async function lockActiveWaits(
  k: Knex,
  lineId: string,
): Promise<{ id: string; job_id: string; cylinder: number }[]> {
  return k('order_line_waits as w')
    .join('jobs as j', 'j.id', 'w.job_id')
    .where('w.line_id', lineId)
    .whereNull('w.fulfilled_at')
    .whereNull('w.cancelled_at')
    .orderBy([{ column: 'j.created_at' }, { column: 'w.created_at' }])
    .forUpdate('w')
    .select('w.id', 'w.job_id', 'w.cylinder');
}

export async function insertWait(
  k: Knex,
  w: { line_id: string; job_id: string; cylinder: number; created_by: string },
): Promise<string> {
  const [row] = await k('order_line_waits').insert(w).returning('id');
  return (row as { id: string }).id;
}

export async function fulfillWait(k: Knex, id: string, holdId: string): Promise<void> {
  await k('order_line_waits').where({ id }).update({ fulfilled_at: k.fn.now(), hold_id: holdId });
}

export async function cancelWait(k: Knex, id: string): Promise<boolean> {
  return (
    (await k('order_line_waits')
      .where({ id })
      .whereNull('fulfilled_at')
      .whereNull('cancelled_at')
      .update({ cancelled_at: k.fn.now() })) > 0
  );
}

export async function cancelWaitsOfOrder(k: Knex, orderId: string): Promise<number> {
  return k('order_line_waits')
    .whereIn('line_id', k('purchase_order_lines').where({ order_id: orderId }).select('id'))
    .whereNull('fulfilled_at')
    .whereNull('cancelled_at')
    .update({ cancelled_at: k.fn.now() });
}

export interface WaitJobRow {
  id: string;
  number: string;
  state: string;
  family_id: string;
  cylinders: number;
  customer_name: string;
  customer_email: string | null;
  notify_customer: boolean;
}

export async function jobForWait(id: string, k: Knex = db): Promise<WaitJobRow | undefined> {
  return k('jobs')
    .where({ id })
    .first(
      'id',
      'number',
      'state',
      'family_id',
      'cylinders',
      'customer_name',
      'customer_email',
      'notify_customer',
    );
}

export async function cylinderState(
  jobId: string,
  n: number,
  k: Knex = db,
): Promise<
  { chosen_step_id: string | null; cut_at: Date | null; piston_held: boolean } | undefined
> {
  const row = await k('job_cylinders as c')
    .where({ 'c.job_id': jobId, 'c.n': n })
    .first(
      'c.chosen_step_id',
      'c.cut_at',
      k.raw(
        `EXISTS (SELECT 1 FROM holds h WHERE h.job_id = c.job_id AND h.cylinder = c.n
                  AND h.released_at IS NULL AND h.unit_id IS NOT NULL) AS piston_held`,
      ),
    );
  return row as
    { chosen_step_id: string | null; cut_at: Date | null; piston_held: boolean } | undefined;
}

/**
 * Open jobs with a cylinder that needs this line's piston: same family, the cylinder's chosen step
 * is the part's step, nothing held for it, not cut, and not already waiting.
 */
export async function waitCandidates(
  familyId: string,
  stepId: string,
  k: Knex = db,
): Promise<
  {
    job_id: string;
    job_number: string;
    customer_name: string;
    cylinder: number;
    created_at: Date;
  }[]
> {
  return k('job_cylinders as c')
    .join('jobs as j', 'j.id', 'c.job_id')
    .where({ 'j.family_id': familyId, 'c.chosen_step_id': stepId })
    .whereNotIn('j.state', ['handed_back', 'called_off'])
    .whereNull('c.cut_at')
    .whereNotExists(
      k('holds as h')
        .whereRaw('h.job_id = c.job_id AND h.cylinder = c.n')
        .whereNull('h.released_at')
        .whereNotNull('h.unit_id'),
    )
    .whereNotExists(
      k('order_line_waits as w')
        .whereRaw('w.job_id = c.job_id AND w.cylinder = c.n')
        .whereNull('w.fulfilled_at')
        .whereNull('w.cancelled_at'),
    )
    .select(
      'j.id as job_id',
      'j.number as job_number',
      'j.customer_name',
      'c.n as cylinder',
      'j.created_at',
    )
    .orderBy([{ column: 'j.created_at' }, { column: 'c.n' }]);
}

/** People told when a piston they wait for arrives. */
export async function machinistAddresses(k: Knex = db): Promise<string[]> {
  return k('users')
    .where({ role: 'machinist', active: true })
    .whereNot('mail_mode', 'none')
    .orderBy('email')
    .pluck('email');
}
