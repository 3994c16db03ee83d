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
