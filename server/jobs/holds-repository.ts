// Every Knex query of holds: claiming a piston unit, counting ring sets aside, ending holds, and
// what is free per step. Lock order, the same as stock's: the hold row, then the piston unit row,
// then the part's levels row. A claim is one conditional UPDATE (… WHERE status = 'free'), so when
// many people reach for the last piston at once exactly one UPDATE finds it free.
import type { Knex } from 'knex';
import { db } from '../db/knex';

// The units and counted parts a hold claims, and the free stock a proposal reads, and the three
// statements of placing a hold: files of their own.
export * from './hold-units-repository';
export * from './hold-place-repository';

export type ReleaseReason = 'released' | 'moved' | 'expired' | 'cancelled' | 'issued';

export interface HoldRow {
  id: string;
  job_id: string;
  job_number: string;
  cylinder: number;
  part_id: string;
  sku: string;
  kind: 'piston' | 'rings' | 'other';
  description: string;
  step_id: string | null;
  step_label: string | null;
  unit_id: string | null;
  unit_label: string | null;
  skirt_nm: number | null;
  material: string | null;
  bin_code: string | null;
  quantity: number;
  expires_at: Date | null;
  created_at: Date;
  released_at: Date | null;
  release_reason: ReleaseReason | null;
}

function holdBase(k: Knex) {
  return (
    k('holds as h')
      .join('jobs as j', 'j.id', 'h.job_id')
      .join('parts as p', 'p.id', 'h.part_id')
      .leftJoin('series_steps as s', 's.id', 'p.step_id')
      .leftJoin('piston_units as u', 'u.id', 'h.unit_id')
      .leftJoin('part_levels as pl', 'pl.part_id', 'p.id')
      // A piston has its own bin; counted parts sit in the part's bin.
      .leftJoin('bins as b', 'b.id', k.raw('coalesce(u.bin_id, pl.bin_id)'))
      .select(
        'h.id',
        'h.job_id',
        'j.number as job_number',
        'h.cylinder',
        'h.part_id',
        'p.sku',
        'p.kind',
        'p.description',
        'p.step_id',
        's.label as step_label',
        'h.unit_id',
        'u.label as unit_label',
        'u.skirt_nm',
        'p.material',
        'b.code as bin_code',
        'h.quantity',
        'h.expires_at',
        'h.created_at',
        'h.released_at',
        'h.release_reason',
      )
  );
}

export async function holdsOfJob(
  jobId: string,
  opts: { activeOnly: boolean },
  k: Knex = db,
): Promise<HoldRow[]> {
  const q = holdBase(k).where('h.job_id', jobId);
  if (opts.activeOnly) q.whereNull('h.released_at');
  return (await q.orderBy([
    { column: 'h.cylinder' },
    { column: k.raw('(h.unit_id IS NULL)') as never },
    { column: 'h.created_at' },
  ])) as HoldRow[];
}

export async function findHold(id: string, k: Knex = db): Promise<HoldRow | undefined> {
  return (await holdBase(k).where('h.id', id).first()) as HoldRow | undefined;
}

/** Locks the hold row; the caller re-checks released_at under the lock. */
export async function lockHold(
  trx: Knex,
  id: string,
): Promise<
  | {
      id: string;
      job_id: string;
      cylinder: number;
      part_id: string;
      unit_id: string | null;
      quantity: number;
      expires_at: Date | null;
      released_at: Date | null;
    }
  | undefined
> {
  return trx('holds')
    .select(
      'id',
      'job_id',
      'cylinder',
      'part_id',
      'unit_id',
      'quantity',
      'expires_at',
      'released_at',
    )
    .where({ id })
    .forUpdate()
    .first();
}

/** Active holds of a job, locked, pistons in unit order so two closers never cross. */
export function lockActiveHoldsOfJob(
  trx: Knex,
  jobId: string,
): Promise<
  { id: string; cylinder: number; part_id: string; unit_id: string | null; quantity: number }[]
> {
  return trx('holds')
    .select('id', 'cylinder', 'part_id', 'unit_id', 'quantity')
    .where({ job_id: jobId })
    .whereNull('released_at')
    .orderBy([{ column: 'part_id' }, { column: 'unit_id' }, { column: 'id' }])
    .forUpdate();
}

export async function activePistonHold(
  trx: Knex,
  jobId: string,
  cylinder: number,
  opts: { lock?: boolean } = {},
): Promise<{ id: string; unit_id: string; part_id: string } | undefined> {
  const q = trx('holds')
    .select('id', 'unit_id', 'part_id')
    .where({ job_id: jobId, cylinder })
    .whereNotNull('unit_id')
    .whereNull('released_at')
    .first();
  return opts.lock ? q.forUpdate() : q;
}

/** The job's cylinders that have a step to bore to, each with whether its measured piston is held. */
export async function pistonsForSteps(
  k: Knex,
  jobId: string,
): Promise<{ n: number; held: boolean }[]> {
  return k('job_cylinders as c')
    .select(
      'c.n',
      k.raw(
        `exists (select 1 from holds h where h.job_id = c.job_id and h.cylinder = c.n
           and h.unit_id is not null and h.released_at is null) as held`,
      ),
    )
    .where('c.job_id', jobId)
    .whereNotNull('c.chosen_step_id')
    .orderBy('c.n');
}

/** A piston whose cylinder is cut stays with it: its hold no longer lapses. */
export async function clearExpiry(trx: Knex, holdId: string, unitId: string): Promise<void> {
  await trx('holds').update({ expires_at: null }).where({ id: holdId });
  await trx('piston_units').update({ hold_expires_at: null }).where({ id: unitId });
}

export async function insertHold(
  trx: Knex,
  hold: {
    id: string;
    job_id: string;
    cylinder: number;
    part_id: string;
    unit_id: string | null;
    quantity: number;
    expires_at: Date | null;
    created_by: string | null;
    moved_from_hold_id?: string | null;
  },
): Promise<void> {
  await trx('holds').insert(hold);
}

export async function endHold(
  trx: Knex,
  id: string,
  reason: ReleaseReason,
  userId: string | null,
): Promise<void> {
  await trx('holds')
    .update({ released_at: trx.fn.now(), release_reason: reason, released_by: userId })
    .where({ id })
    .whereNull('released_at');
}

// ---- The expiry sweep -------------------------------------------------------------------------

/**
 * Only one process sweeps at a time: a transaction-scoped advisory lock, let go at commit. A
 * process that does not get it skips this round.
 */
export async function trySweepLock(trx: Knex): Promise<boolean> {
  const r = await trx.raw(
    `SELECT pg_try_advisory_xact_lock(hashtext('stepstock:hold-sweep')) AS got`,
  );
  return Boolean(r.rows[0]?.got);
}

export function lockExpiredHolds(
  trx: Knex,
  limit: number,
): Promise<{ id: string; job_id: string }[]> {
  return trx('holds')
    .select('id', 'job_id')
    .whereNull('released_at')
    .whereNotNull('expires_at')
    .where('expires_at', '<=', trx.fn.now())
    .orderBy([{ column: 'expires_at' }, { column: 'id' }])
    .limit(limit)
    .forUpdate()
    .skipLocked();
}

/** The job's family and the step of the unit or part a hold asked for (for shortage notes). */
export async function holdTargetStep(
  jobId: string,
  input: { unitId?: string; partId?: string },
  k: Knex = db,
): Promise<{ familyId: string; stepId: string | null; kind: string | null } | null> {
  const job = await k('jobs').where({ id: jobId }).first('family_id');
  if (!job) return null;
  const part = input.unitId
    ? await k('piston_units as u')
        .join('parts as p', 'p.id', 'u.part_id')
        .where('u.id', input.unitId)
        .first('p.step_id', 'p.kind')
    : input.partId
      ? await k('parts').where({ id: input.partId }).first('step_id', 'kind')
      : null;
  return { familyId: job.family_id, stepId: part?.step_id ?? null, kind: part?.kind ?? null };
}
