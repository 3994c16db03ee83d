// The writes most tables take the same way, written once: a new row that answers its id, a change
// that stamps updated_at, and a row lock taken before reading what a change starts from.
import type { Knex } from 'knex';

/** Inserts one row and answers its id. */
export async function insertRow(k: Knex, table: string, row: object): Promise<string> {
  const [created] = await k(table).insert(row).returning<{ id: string }[]>('id');
  return created.id;
}

/** Changes the row with this id and stamps its updated_at. */
export async function updateRow(
  k: Knex,
  table: string,
  id: string,
  changes: object,
): Promise<void> {
  await k(table)
    .update({ ...changes, updated_at: k.fn.now() })
    .where({ id });
}

/** Locks the row with this id FOR UPDATE in the caller's transaction; false when there is none. */
export async function lockRow(k: Knex, table: string, id: string): Promise<boolean> {
  const row = await k(table).select('id').where({ id }).forUpdate().first();
  return Boolean(row);
}
