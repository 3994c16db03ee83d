// Shop-wide settings the owner keeps: the shop's name and hours, its time zone, and the policies
// other features read (hold expiry, clearance policy, maximum cut per pass, costs for reordering,
// tax, deposits and whether a cut waits for the customer's approval).
import { z } from 'zod';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { IANAZone } from 'luxon';
import { recordAudit } from '../audit/audit';
import type { ShopSettingsJson } from '../../shared/settings-api';
import { parseLength } from '../../shared/lengths';
import { STEP_POLICIES, type StepPolicy } from '../../shared/bore-choice';
import { BAR_RESOLUTIONS, type BarResolution } from '../../shared/pass-plan';
import { isCurrencyCode, parseMoney } from '../../shared/money';
import { atMost, singleLine } from '../../shared/text-rules';

const lengthSetting = (opts: { allowEmpty?: boolean } = {}) =>
  z
    .string()
    .trim()
    .max(30, atMost(30))
    .refine(
      (v) => (opts.allowEmpty && v === '') || parseLength(v).ok,
      'must be a length with its unit, e.g. "0.020 in" or "0.50 mm"',
    );

const amountSetting = z
  .string()
  .trim()
  .max(30, atMost(30))
  .refine((v) => parseMoney(v).ok, 'must be an amount like "25.00", not negative');

const percentSetting = z
  .string()
  .trim()
  .max(10, atMost(10))
  .refine(
    (v) => /^\d{1,3}(\.\d{1,3})?$/.test(v) && Number(v) <= 100,
    'must be a percent between 0 and 100, e.g. "20" or "7.7"',
  );

export const shopSettingsSchema = z
  .object({
    shopName: singleLine(120).pipe(z.string().min(1, 'enter the shop name')),
    shopHours: z.string().trim().max(300, atMost(300)),
    timeZone: z
      .string()
      .trim()
      .min(1)
      .max(60, atMost(60))
      .refine(
        (v) => IANAZone.isValidZone(v),
        'must be a time zone name such as "Europe/Paris" or "UTC"',
      ),
    holdExpiryDays: z.number().int().min(1).max(365),
    clearancePolicy: z.enum(['min', 'mid', 'max']),
    maxCutPerPass: lengthSetting(),
    finishPass: lengthSetting({ allowEmpty: true }),
    truingPass: lengthSetting({ allowEmpty: true }),
    minCutPerPass: lengthSetting(),
    barResolution: z.enum(BAR_RESOLUTIONS as [BarResolution, ...BarResolution[]]),
    skipMarginalStep: z.boolean(),
    stepPolicy: z.enum(STEP_POLICIES as [StepPolicy, ...StepPolicy[]]),
    marginalCleanup: lengthSetting(),
    orderCost: amountSetting,
    holdingCostRate: amountSetting.refine(
      (v) => Number(v) <= 1,
      'must be a yearly rate between 0 and 1',
    ),
    serviceLevel: z.number().min(0.5).max(0.999),
    homeCurrency: z
      .string()
      .length(3, atMost(3, 'must be a three-letter code'))
      .refine(isCurrencyCode, 'must be an ISO 4217 currency code'),
    taxRate: percentSetting,
    pricesIncludeTax: z.boolean(),
    depositPercent: percentSetting,
    cutOnlyAfterApproval: z.boolean(),
  })
  .strict();

export type ShopSettings = z.infer<typeof shopSettingsSchema>;
// The API's answer shape lives in shared/ for the client; both must agree.
const _sameShape: ShopSettingsJson = {} as ShopSettings;
void _sameShape;

export const DEFAULT_SETTINGS: ShopSettings = {
  shopName: 'Stepstock',
  shopHours: 'Mon–Fri 8:00–17:00',
  timeZone: 'UTC',
  holdExpiryDays: 14,
  clearancePolicy: 'mid',
  maxCutPerPass: '0.020 in',
  finishPass: '',
  truingPass: '',
  minCutPerPass: '0.001 in',
  barResolution: '0.0001 in',
  skipMarginalStep: false,
  stepPolicy: 'first-that-cleans',
  marginalCleanup: '0.05 mm',
  orderCost: '25.00',
  holdingCostRate: '0.25',
  serviceLevel: 0.95,
  homeCurrency: 'EUR',
  taxRate: '20',
  pricesIncludeTax: false,
  depositPercent: '30',
  cutOnlyAfterApproval: true,
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
