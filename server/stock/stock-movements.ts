// The one door to what stock is: every write to part_levels (on hand, held, bin, value), to a
// part's average cost, and to the append-only stock_ledger goes through here, from receipts,
// adjustments and moves (stock) as from holds, releases and hand-backs (jobs). Callers hold the
// part's levels lock (lockLevels) or another lock that orders changes to the part.
import type { Knex } from 'knex';
import type { LedgerKind } from '../../shared/api/stock';
import type { LevelsRow } from './stock-repository';

export interface NewLedgerRow {
  user_id: string | null;
  part_id: string;
  unit_id?: string | null;
  kind: LedgerKind;
  quantity: number;
  held_delta?: number;
  unit_cost?: string | null;
  sale_price?: string | null;
  job_id?: string | null;
  reason?: string | null;
  from_bin_id?: string | null;
  to_bin_id?: string | null;
  ref?: string | null;
}

/** Locks the part's levels row: every stock change to one part queues here. */
export async function lockLevels(
  k: Knex,
  partId: string,
): Promise<LevelsRow & { average_cost: string; stock_value: string }> {
  const row = await k('part_levels as pl')
    .join('parts as p', 'p.id', 'pl.part_id')
    .select('pl.on_hand', 'pl.held', 'pl.bin_id', 'pl.stock_value', 'p.average_cost')
    .where('pl.part_id', partId)
    .forUpdate('pl')
    .first();
  if (!row) throw new Error(`part_levels row missing for part ${partId}`);
  return row;
}

export async function changeLevels(
  k: Knex,
  partId: string,
  change: { onHand?: number; held?: number; binId?: string | null; stockValue?: string },
): Promise<LevelsRow> {
  const update: Record<string, unknown> = { updated_at: k.fn.now() };
  // Stock coming in says what it is worth; stock going out leaves that to the database's trigger.
  if (change.stockValue !== undefined) update.stock_value = change.stockValue;
  if (change.onHand) update.on_hand = k.raw('on_hand + ?', [change.onHand]);
  if (change.held) update.held = k.raw('held + ?', [change.held]);
  if (change.binId !== undefined) update.bin_id = change.binId;
  const [row] = await k('part_levels')
    .update(update)
    .where({ part_id: partId })
    .returning<LevelsRow[]>(['on_hand', 'held', 'bin_id']);
  return row;
}

export async function setAverageCost(k: Knex, partId: string, averageCost: string): Promise<void> {
  await k('parts').update({ average_cost: averageCost }).where({ id: partId });
}

export async function insertLedger(k: Knex, rows: NewLedgerRow[]): Promise<number[]> {
  if (rows.length === 0) return [];
  const inserted = await k('stock_ledger').insert(rows).returning<{ id: number }[]>('id');
  return inserted.map((r) => Number(r.id));
}

/** Part of one SQL statement: its text with named bindings (`:name`), their values, and a name for this text. */
export interface SqlPart {
  name: string;
  sql: string;
  bindings: Record<string, unknown>;
}

/** What a hold sets aside, for whom, and the ledger's reason. */
export interface HoldStock {
  holdId: string;
  jobId: string;
  cylinder: number;
  expiresAt: Date | null;
  userId: string | null;
  reason: string;
}

/**
 * The stock half of holding one measured piston, as data-modifying CTEs for the hold's one
 * statement (one round trip, one snapshot): the unit claimed only while it is still free, its
 * part's held + 1 (the levels' CHECK refuses more held than on hand), the hold row and the
 * ledger's reservation row. Defines `hold(created_at)`, empty with nothing written when the unit
 * was no longer free (someone else won it), and `levels(part_id)`, the level rows changed.
 */
export function unitHoldCtes(unitId: string, c: HoldStock): SqlPart {
  return {
    name: 'unit',
    sql: `claimed AS (
       UPDATE piston_units
          SET status = 'held', held_for_job_id = :jobId, held_cylinder = :cylinder,
              hold_id = :holdId, hold_expires_at = :expiresAt, updated_at = now()
        WHERE id = :unitId AND status = 'free'
       RETURNING id, part_id
     ), levels AS (
       UPDATE part_levels SET held = held + 1, updated_at = now()
        WHERE part_id = (SELECT part_id FROM claimed)
       RETURNING part_id
     ), hold AS (
       INSERT INTO holds (id, job_id, cylinder, part_id, unit_id, quantity, expires_at, created_by)
       SELECT :holdId, :jobId, :cylinder, part_id, id, 1, :expiresAt, :userId FROM claimed
       RETURNING created_at
     ), ledger AS (
       INSERT INTO stock_ledger (user_id, part_id, unit_id, kind, quantity, held_delta, job_id, reason, ref)
       SELECT :userId, part_id, id, 'reservation', 0, 1, :jobId, :reason, :holdId FROM claimed
     )`,
    bindings: { ...holdBindings(c), unitId },
  };
}

/**
 * The stock half of setting counted parts aside (ring sets, sundries), as CTEs like
 * unitHoldCtes: held + n only while at least n are free, the hold row and the reservation row.
 * `hold` is empty, with nothing written, when fewer than n are free.
 */
export function countedHoldCtes(partId: string, quantity: number, c: HoldStock): SqlPart {
  return {
    name: 'counted',
    sql: `levels AS (
       UPDATE part_levels SET held = held + :quantity, updated_at = now()
        WHERE part_id = :partId AND on_hand - held >= :quantity
       RETURNING part_id
     ), hold AS (
       INSERT INTO holds (id, job_id, cylinder, part_id, unit_id, quantity, expires_at, created_by)
       SELECT :holdId, :jobId, :cylinder, part_id, NULL, :quantity, :expiresAt, :userId FROM levels
       RETURNING created_at
     ), ledger AS (
       INSERT INTO stock_ledger (user_id, part_id, unit_id, kind, quantity, held_delta, job_id, reason, ref)
       SELECT :userId, part_id, NULL, 'reservation', 0, :quantity, :jobId, :reason, :holdId FROM levels
     )`,
    bindings: { ...holdBindings(c), partId, quantity },
  };
}

function holdBindings(c: HoldStock): Record<string, unknown> {
  return {
    holdId: c.holdId,
    jobId: c.jobId,
    cylinder: c.cylinder,
    expiresAt: c.expiresAt,
    userId: c.userId,
    reason: c.reason,
  };
}
