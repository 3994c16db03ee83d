// The labour price list's queries.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { LabourPer, ProposeFor } from '../../shared/api/money';

export interface LabourRow {
  id: string;
  name: string;
  per: LabourPer;
  price: string;
  active: boolean;
  propose_for: ProposeFor;
}

const COLUMNS = ['id', 'name', 'per', 'price', 'active', 'propose_for'];

export async function listLabour(k: Knex = db, opts: { activeOnly?: boolean } = {}) {
  const q = k('labour_operations').select(COLUMNS);
  if (opts.activeOnly) q.where({ active: true });
  return (await q.orderBy([{ column: 'active', order: 'desc' }, 'name'])) as LabourRow[];
}

export async function lockLabour(trx: Knex, id: string): Promise<LabourRow | undefined> {
  return (await trx('labour_operations').select(COLUMNS).where({ id }).forUpdate().first()) as
    LabourRow | undefined;
}

export async function nameTaken(k: Knex, name: string, exceptId?: string): Promise<boolean> {
  const q = k('labour_operations').whereRaw('lower(name) = lower(?)', [name]);
  if (exceptId) q.whereNot({ id: exceptId });
  return Boolean(await q.first('id'));
}

export async function insertLabour(trx: Knex, row: Omit<LabourRow, 'id'>): Promise<LabourRow> {
  const [created] = await trx('labour_operations').insert(row).returning(COLUMNS);
  return created as LabourRow;
}

export async function updateLabour(
  trx: Knex,
  id: string,
  changes: Partial<Omit<LabourRow, 'id'>>,
): Promise<LabourRow> {
  const [updated] = await trx('labour_operations')
    .update({ ...changes, updated_at: trx.fn.now() })
    .where({ id })
    .returning(COLUMNS);
  return updated as LabourRow;
}
