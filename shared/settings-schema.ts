// The shop's settings as the owner may set them: one schema for the API (PATCH /api/settings) and
// for the settings form, which checks each field with it as it is typed.
import { IANAZone } from 'luxon';
import * as z from './zod';

import { STEP_POLICIES, type StepPolicy } from './bore-choice';
import { DEFAULT_LOCALE, isShopLocale } from './dates';
import { LABEL_STOCKS } from './label-stock';
import { parseLength } from './lengths';
import { isCurrencyCode, parseMoney } from './money';
import { BAR_RESOLUTIONS, type BarResolution } from './pass-plan';
import type { ShopSettingsJson } from './api/settings';
import { SHIPPING_ALLOCATIONS } from './shipping-share';
import { atMost, singleLine } from './text-rules';

const lengthSetting = (opts: { allowEmpty?: boolean } = {}) =>
  z.string().check(
    z.trim(),
    z.maxLength(30, atMost(30)),
    z.refine(
      (v) => (opts.allowEmpty && v === '') || parseLength(v).ok,
      'must be a length with its unit, e.g. "0.020 in" or "0.50 mm"',
    ),
  );

const amountSetting = z.string().check(
  z.trim(),
  z.maxLength(30, atMost(30)),
  z.refine((v) => parseMoney(v).ok, 'must be an amount like "25.00", not negative'),
);

const percentSetting = z.string().check(
  z.trim(),
  z.maxLength(10, atMost(10)),
  z.refine(
    (v) => /^\d{1,3}(\.\d{1,3})?$/.test(v) && Number(v) <= 100,
    'must be a percent between 0 and 100, e.g. "20" or "7.7"',
  ),
);

export const shopSettingsSchema = z.strictObject({
  shopName: z.pipe(singleLine(120), z.string().check(z.minLength(1, 'enter the shop name'))),
  shopHours: z.string().check(z.trim(), z.maxLength(300, atMost(300))),
  timeZone: z.string().check(
    z.trim(),
    z.minLength(1, 'enter a time zone'),
    z.maxLength(60, atMost(60)),
    z.refine(
      (v) => IANAZone.isValidZone(v),
      'must be a time zone name such as "Europe/Paris" or "UTC"',
    ),
  ),
  locale: z
    .string()
    .check(
      z.trim(),
      z.maxLength(35, atMost(35)),
      z.refine(isShopLocale, 'must be a locale such as "en-GB" or "en-US"'),
    ),
  holdExpiryDays: z
    .number({ error: 'must be a whole number of days' })
    .check(
      z.int('must be a whole number of days'),
      z.gte(1, 'must be at least 1 day'),
      z.lte(365, 'must be at most 365 days'),
    ),
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
  holdingCostRate: amountSetting.check(
    z.refine((v) => Number(v) <= 1, 'must be a yearly rate between 0 and 1'),
  ),
  serviceLevel: z
    .number({ error: 'must be a number such as 0.95' })
    .check(z.gte(0.5, 'must be at least 0.5'), z.lte(0.999, 'must be at most 0.999')),
  homeCurrency: z
    .string()
    .check(
      z.length(3, atMost(3, 'must be a three-letter code')),
      z.refine(isCurrencyCode, 'must be an ISO 4217 currency code'),
    ),
  taxRate: percentSetting,
  pricesIncludeTax: z.boolean(),
  depositPercent: percentSetting,
  cutOnlyAfterApproval: z.boolean(),
  shippingAllocation: z.enum(SHIPPING_ALLOCATIONS, {
    error: 'must be value, quantity or none',
  }),
  labelStock: z.enum(LABEL_STOCKS, {
    error: 'must be sheet, roll-62x35, roll-62x29 or roll-50x25',
  }),
});

export type ShopSettings = z.infer<typeof shopSettingsSchema>;
// The API's answer shape lives in shared/ for the client; both must agree.
const _sameShape: ShopSettingsJson = {} as ShopSettings;
void _sameShape;

export const DEFAULT_SETTINGS: ShopSettings = {
  shopName: 'Stepstock',
  shopHours: 'Mon–Fri 8:00–17:00',
  timeZone: 'UTC',
  locale: DEFAULT_LOCALE,
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
  shippingAllocation: 'value',
  labelStock: 'sheet',
};
