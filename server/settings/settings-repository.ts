// The shop's settings as stored: one JSON value under the key 'shop' (defaults fill what it lacks).
import type { Knex } from 'knex';
import { db } from '../db/knex';

/** The stored settings as written, or null before the owner first saves any. */
export async function readShopSettings(q: Knex = db): Promise<Record<string, unknown> | null> {
  const row = await q('settings').where({ key: 'shop' }).first();
  return (row?.value as Record<string, unknown> | undefined) ?? null;
}

export async function writeShopSettings(trx: Knex, value: object): Promise<void> {
  await trx('settings')
    .insert({ key: 'shop', value: JSON.stringify(value), updated_at: trx.fn.now() })
    .onConflict('key')
    .merge();
}
