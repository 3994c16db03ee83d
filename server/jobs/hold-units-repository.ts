// The pistons and counted parts a hold reads or gives back, and the free stock at a step that a
// proposal reads. The claim itself is part of the hold's one write (stock-movements.ts's
// unitHoldCtes): a conditional UPDATE decides who gets a unit; see holds-service.ts.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { PartKind } from '../../shared/api/catalog';

export interface HoldPartRow {
  id: string;
  kind: PartKind;
  sku: string;
  description: string;
  active: boolean;
  family_id: string | null;
  step_id: string | null;
  step_label: string | null;
  sale_price: string;
  average_cost: string;
  material: string | null;
}

export interface HoldUnitRow {
  id: string;
  label: string;
  part_id: string;
  status: 'free' | 'held' | 'issued' | 'returned' | 'scrapped';
  skirt_nm: number | null;
  held_for_job_id: string | null;
  family_id: string | null;
  step_id: string | null;
  step_label: string | null;
  sku: string;
  description: string;
  material: string | null;
  bin_code: string | null;
}

export interface FreeUnitRow {
  id: string;
  label: string;
  part_id: string;
  sku: string;
  skirt_nm: number;
  material: string | null;
  bin_code: string | null;
  step_label: string | null;
}

export interface StepStockRow {
  step_id: string;
  free_pistons: number;
  free_rings: number;
  on_order: number;
}

// ---- Units and parts --------------------------------------------------------------------------

export async function holdUnit(
  where: { id: string } | { label: string },
  k: Knex = db,
): Promise<HoldUnitRow | undefined> {
  const q = k('piston_units as u')
    .join('parts as p', 'p.id', 'u.part_id')
    .leftJoin('series_steps as s', 's.id', 'p.step_id')
    .leftJoin('bins as b', 'b.id', 'u.bin_id')
    .select(
      'u.id',
      'u.label',
      'u.part_id',
      'u.status',
      'u.skirt_nm',
      'u.held_for_job_id',
      'p.family_id',
      'p.step_id',
      's.label as step_label',
      // What the hold's answer shows, read here so placing a hold needs no re-read afterwards.
      'p.sku',
      'p.description',
      'p.material',
      'b.code as bin_code',
    );
  if ('id' in where) q.where('u.id', where.id);
  else q.where('u.label', where.label.trim().toUpperCase());
  return (await q.first()) as HoldUnitRow | undefined;
}

/** The part columns a hold reads, with its step's label. */
function holdParts(k: Knex) {
  return k('parts as p')
    .leftJoin('series_steps as s', 's.id', 'p.step_id')
    .select(
      'p.id',
      'p.kind',
      'p.sku',
      'p.description',
      'p.active',
      'p.family_id',
      'p.step_id',
      's.label as step_label',
      'p.sale_price',
      'p.average_cost',
      'p.material',
    );
}

export async function holdPart(id: string, k: Knex = db): Promise<HoldPartRow | undefined> {
  return holdParts(k).where('p.id', id).first();
}

export function partsByIds(ids: string[], k: Knex = db): Promise<HoldPartRow[]> {
  if (ids.length === 0) return Promise.resolve([]);
  return holdParts(k).whereIn('p.id', ids);
}

/** Moves a held unit's marks to another job or cylinder (the unit stays held). */
export async function remarkUnit(
  trx: Knex,
  unitId: string,
  hold: { jobId: string; cylinder: number; holdId: string; expiresAt: Date | null },
): Promise<boolean> {
  const count = await trx('piston_units')
    .update({
      held_for_job_id: hold.jobId,
      held_cylinder: hold.cylinder,
      hold_id: hold.holdId,
      hold_expires_at: hold.expiresAt,
      updated_at: trx.fn.now(),
    })
    .where({ id: unitId, status: 'held' });
  return count === 1;
}

export async function freeUnit(trx: Knex, unitId: string): Promise<boolean> {
  const count = await trx('piston_units')
    .update({
      status: 'free',
      held_for_job_id: null,
      held_cylinder: null,
      hold_id: null,
      hold_expires_at: null,
      updated_at: trx.fn.now(),
    })
    .where({ id: unitId, status: 'held' });
  return count === 1;
}

/** The piston leaves with the job; it keeps the job and hold it went out with. */
export async function issueUnit(trx: Knex, unitId: string): Promise<boolean> {
  const count = await trx('piston_units')
    .update({ status: 'issued', hold_expires_at: null, updated_at: trx.fn.now() })
    .where({ id: unitId, status: 'held' });
  return count === 1;
}

export async function freeCount(partId: string, k: Knex = db): Promise<number> {
  const row = await k('part_levels')
    .select(k.raw('(on_hand - held)::int AS free'))
    .where({ part_id: partId })
    .first();
  return Number(row?.free ?? 0);
}

/** Free measured pistons of a step, the skirt nearest the given size first. */
export function nearestFreeUnits(
  familyId: string,
  stepId: string,
  targetNm: number,
  opts: { excludeId?: string; limit: number },
  k: Knex = db,
): Promise<FreeUnitRow[]> {
  const q = k('piston_units as u')
    .join('parts as p', 'p.id', 'u.part_id')
    .leftJoin('series_steps as s', 's.id', 'p.step_id')
    .leftJoin('bins as b', 'b.id', 'u.bin_id')
    .select(
      'u.id',
      'u.label',
      'u.part_id',
      'p.sku',
      'u.skirt_nm',
      'p.material',
      'b.code as bin_code',
      's.label as step_label',
    )
    .where({ 'p.family_id': familyId, 'p.step_id': stepId, 'p.kind': 'piston', 'u.status': 'free' })
    .whereNotNull('u.skirt_nm');
  if (opts.excludeId) q.whereNot('u.id', opts.excludeId);
  return q.orderByRaw('abs(u.skirt_nm::bigint - ?::bigint), u.label', [targetNm]).limit(opts.limit);
}

/** Ring sets (and other counted parts) of a step with how many are free, most first. */
export function freeRingParts(
  familyId: string,
  stepId: string,
  k: Knex = db,
): Promise<{ id: string; sku: string; description: string; free: number }[]> {
  return k('parts as p')
    .join('part_levels as pl', 'pl.part_id', 'p.id')
    .select('p.id', 'p.sku', 'p.description', k.raw('(pl.on_hand - pl.held)::int AS free'))
    .where({ 'p.family_id': familyId, 'p.step_id': stepId, 'p.kind': 'rings', 'p.active': true })
    .orderByRaw('(pl.on_hand - pl.held) DESC, p.sku');
}

/** Per step of a family: free measured pistons, free ring sets, pistons on order. */
export function stepStock(familyId: string, k: Knex = db): Promise<StepStockRow[]> {
  return k
    .raw(
      `SELECT p.step_id,
              coalesce(sum(CASE WHEN p.kind = 'piston' THEN
                (SELECT count(*) FROM piston_units u
                  WHERE u.part_id = p.id AND u.status = 'free' AND u.skirt_nm IS NOT NULL) END), 0)::int
                AS free_pistons,
              coalesce(sum(CASE WHEN p.kind = 'rings' AND p.active THEN pl.on_hand - pl.held END), 0)::int
                AS free_rings,
              coalesce(sum(CASE WHEN p.kind = 'piston' THEN oo.quantity END), 0)::int AS on_order
         FROM parts p
         JOIN part_levels pl ON pl.part_id = p.id
         LEFT JOIN (SELECT part_id, sum(quantity) AS quantity FROM parts_on_order() GROUP BY part_id) oo
           ON oo.part_id = p.id
        WHERE p.family_id = ? AND p.step_id IS NOT NULL
        GROUP BY p.step_id`,
      [familyId],
    )
    .then((r: { rows: StepStockRow[] }) => r.rows);
}
