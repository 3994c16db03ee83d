// The live previews of price lists (uploaded, checked and staged, not yet committed): one per
// supplier and file, replaced by a newer upload of the same file, and expired after a while so
// staged rows cannot pile up.
import type { Knex } from 'knex';
import { db } from '../db/knex';

const LIVE = ['previewed', 'failed'];

/**
 * Serialises uploads of the same file for the same supplier until the transaction ends, so the
 * second sees the first's preview (committed) instead of racing it. Other files and other
 * suppliers do not wait.
 */
export async function lockPreviewSlot(k: Knex, supplierId: string, sha256: string): Promise<void> {
  await k.raw(`SELECT pg_advisory_xact_lock(hashtext(?), hashtext(?))`, [
    `stepstock:preview:${supplierId}`,
    sha256,
  ]);
}

export async function livePreview(
  k: Knex,
  supplierId: string,
  sha256: string,
): Promise<{ id: string; mapping: Record<string, unknown> } | undefined> {
  return k('price_list_imports')
    .select('id', 'mapping')
    .where({ supplier_id: supplierId, sha256, status: 'previewed' })
    .first();
}

/** Earlier previews of the same file for the supplier are replaced by a new one. */
export async function deleteStalePreviews(
  k: Knex,
  supplierId: string,
  sha256: string,
): Promise<void> {
  await k('price_list_imports')
    .where({ supplier_id: supplierId, sha256 })
    .whereIn('status', LIVE)
    .delete();
}

/**
 * Deletes live previews older than `hours` (their staged rows go with them, ON DELETE CASCADE).
 * Only one process sweeps at a time: a transaction-scoped advisory lock, let go at commit; a
 * second caller returns null. A preview being committed holds its row lock, so the sweep waits
 * for that commit and then finds it committed, not live.
 */
export async function deleteExpiredPreviews(hours: number, k: Knex = db): Promise<number | null> {
  return k.transaction(async (trx): Promise<number | null> => {
    const { rows } = (await trx.raw(
      `SELECT pg_try_advisory_xact_lock(hashtext('stepstock:preview-sweep')) AS got`,
    )) as { rows: { got: boolean }[] };
    if (!rows[0]?.got) return null;
    return await trx('price_list_imports')
      .whereIn('status', LIVE)
      .where('created_at', '<', trx.raw(`now() - ? * interval '1 hour'`, [hours]))
      .delete();
  });
}
