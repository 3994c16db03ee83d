// Shop-wide settings the owner keeps: the shop's name and hours, its time zone, and the policies
// other features read (hold expiry, clearance policy, maximum cut per pass, costs for reordering).
import { z } from 'zod';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';

export const shopSettingsSchema = z
  .object({
    shopName: z.string().trim().min(1).max(120),
    shopHours: z.string().trim().max(300),
    timeZone: z.string().trim().min(1).max(60),
    holdExpiryDays: z.number().int().min(1).max(365),
    clearancePolicy: z.enum(['min', 'mid', 'max']),
    maxCutPerPass: z.string().trim().max(30),
    finishPass: z.string().trim().max(30),
    skipMarginalStep: z.boolean(),
    marginalCleanup: z.string().trim().max(30),
    orderCost: z.string().trim().max(30),
    holdingCostRate: z.string().trim().max(30),
    serviceLevel: z.number().min(0.5).max(0.999),
    homeCurrency: z.string().length(3),
  })
  .strict();

export type ShopSettings = z.infer<typeof shopSettingsSchema>;

export const DEFAULT_SETTINGS: ShopSettings = {
  shopName: 'Stepstock',
  shopHours: 'Mon–Fri 8:00–17:00',
  timeZone: 'UTC',
  holdExpiryDays: 14,
  clearancePolicy: 'mid',
  maxCutPerPass: '0.020 in',
  finishPass: '',
  skipMarginalStep: false,
  marginalCleanup: '0.05 mm',
  orderCost: '25.00',
  holdingCostRate: '0.25',
  serviceLevel: 0.95,
  homeCurrency: 'EUR',
};

export async function getSettings(q: Knex = db): Promise<ShopSettings> {
  const row = await q('settings').where({ key: 'shop' }).first();
  return { ...DEFAULT_SETTINGS, ...((row?.value as Partial<ShopSettings>) ?? {}) };
}

export async function saveSettings(
  actorId: string | null,
  patch: Partial<ShopSettings>,
  q: Knex = db,
): Promise<ShopSettings> {
  return q.transaction(async (trx) => {
    const before = await getSettings(trx);
    const after = shopSettingsSchema.parse({ ...before, ...patch });
    await trx('settings')
      .insert({ key: 'shop', value: JSON.stringify(after), updated_at: trx.fn.now() })
      .onConflict('key')
      .merge();
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
