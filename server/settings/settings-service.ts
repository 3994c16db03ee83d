// Shop-wide settings the owner keeps: the shop's name and hours, its time zone, and the policies
// other features read (hold expiry, clearance policy, maximum cut per pass, costs for reordering,
// tax, deposits and whether a cut waits for the customer's approval).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import * as repo from './settings-repository';
import {
  DEFAULT_SETTINGS,
  shopSettingsSchema,
  type ShopSettings,
} from '../../shared/settings-schema';

// The schema and defaults live in shared/ so the settings form checks each field as it is typed.

export async function getSettings(q: Knex = db): Promise<ShopSettings> {
  return settingsFromStored(await repo.readShopSettings(q));
}

/** The settings from their stored value (read by a caller's own query), defaults filling gaps. */
export function settingsFromStored(stored: Record<string, unknown> | null): ShopSettings {
  return { ...DEFAULT_SETTINGS, ...((stored as Partial<ShopSettings> | null) ?? {}) };
}

export async function saveSettings(
  actorId: string | null,
  patch: Partial<ShopSettings>,
  q: Knex = db,
): Promise<ShopSettings> {
  return q.transaction(async (trx) => {
    const before = await getSettings(trx);
    const after = shopSettingsSchema.parse({ ...before, ...patch });
    await repo.writeShopSettings(trx, after);
    await recordAudit(trx, {
      userId: actorId,
      action: 'settings.update',
      entity: 'settings',
      entityId: 'shop',
      before,
      after,
    });
    return after;
  });
}
