// What the purchasing API accepts and answers about reordering: reorder rules and defaults, the
// computed suggestion with its figures, the reorder list, sourcing offers and exchange rates.
import * as z from '../zod';
import { atMost } from '../text-rules';
import {
  calendarDay,
  currencyCode,
  idField,
  pageNumber,
  pageSizeField,
  type PartLineJson,
} from './common';
import type { WaitingItemJson } from './suppliers';

const count = (max = 1_000_000) =>
  z
    .number({ error: 'must be a whole number' })
    .check(
      z.int('must be a whole number'),
      z.gte(0, 'must be 0 or more'),
      z.lte(max, `at most ${max}`),
    );

// ---- Reorder rules -----------------------------------------------------------------------------

export const reorderRuleInput = z
  .strictObject({
    reorderPoint: z.nullable(count()),
    orderUpTo: z.nullable(count()),
  })
  .check(
    z.refine(
      (r) => r.reorderPoint === null || r.orderUpTo === null || r.orderUpTo >= r.reorderPoint,
      {
        message: 'must not be below the reorder point',
        path: ['orderUpTo'],
      },
    ),
    z.refine((r) => r.reorderPoint !== null || r.orderUpTo === null, {
      message: 'set a reorder point first (an order-up-to level alone watches nothing)',
      path: ['reorderPoint'],
    }),
  );
export type ReorderRuleInput = z.output<typeof reorderRuleInput>;

export const RULE_SOURCES = ['part', 'step', 'family', 'none'] as const;
export type RuleSource = (typeof RULE_SOURCES)[number];

export interface ReorderRuleJson {
  partId: string;
  reorderPoint: number | null;
  orderUpTo: number | null;
  /** The rule the part is watched by: its own, its step's default, its family's, or none. */
  effective: { reorderPoint: number | null; orderUpTo: number | null; source: RuleSource };
}

export const reorderDefaultInput = z
  .strictObject({
    familyId: idField,
    stepId: z.nullable(idField),
    kind: z.enum(['piston', 'rings'], { error: 'must be piston or rings' }),
    reorderPoint: count(),
    orderUpTo: count(),
  })
  .check(
    z.refine((r) => r.orderUpTo >= r.reorderPoint, {
      message: 'must not be below the reorder point',
      path: ['orderUpTo'],
    }),
  );
export type ReorderDefaultInput = z.output<typeof reorderDefaultInput>;

export interface ReorderDefaultJson {
  id: string;
  familyId: string;
  familyCode: string;
  stepId: string | null;
  stepLabel: string | null;
  kind: 'piston' | 'rings';
  reorderPoint: number;
  orderUpTo: number;
  updatedAt: string;
}

export const reorderSuggestionQuery = z.object({
  windowDays: z._default(
    z.coerce.number().check(z.int(), z.gte(14, 'at least 14 days'), z.lte(730, 'at most 730 days')),
    180,
  ),
  leadDays: z.optional(z.coerce.number().check(z.int(), z.gte(0), z.lte(365))),
  serviceLevel: z.optional(
    z.coerce
      .number()
      .check(z.gte(0.5, 'at least 0.5 (50%)'), z.lte(0.999, 'at most 0.999 (99.9%)')),
  ),
});
export type ReorderSuggestionQuery = z.output<typeof reorderSuggestionQuery>;

/** One computed figure and how it was reached. */
export interface Figure {
  value: number;
  how: string;
}

export interface ReorderSuggestionJson {
  partId: string;
  sku: string;
  window: { from: string; to: string; days: number };
  issued: Figure;
  /** Asked for when none was free and never supplied: counted in the demand. */
  lostDemand: Figure;
  meanDaily: Figure;
  sigmaDaily: Figure;
  annualDemand: Figure;
  leadDays: Figure;
  /** The supplier's delivery-time spread, when it has delivered often enough to measure it. */
  sigmaLeadDays: Figure | null;
  serviceLevel: Figure;
  z: Figure;
  demandOverLead: Figure;
  safetyStock: Figure;
  reorderPoint: Figure;
  /** Null when no unit cost is known to price holding stock. */
  orderQuantity: Figure | null;
  orderUpTo: Figure;
  current: ReorderRuleJson['effective'];
  notes: string[];
}

export const reorderListQuery = z.object({
  q: z.optional(z.string().check(z.maxLength(200))),
  familyId: z.optional(idField),
  /** Only parts at or below their reorder point, counting what is on order. */
  low: z.pipe(
    z.optional(z.enum(['true', 'false'], { error: 'must be true or false' })),
    z.transform((v) => v !== 'false'),
  ),
  page: pageNumber,
  pageSize: pageSizeField(),
});
export type ReorderListQuery = z.output<typeof reorderListQuery>;

export interface ReorderLineJson extends PartLineJson {
  onHand: number;
  held: number;
  free: number;
  onOrder: number;
  reorderPoint: number | null;
  orderUpTo: number | null;
  ruleSource: RuleSource;
  /** free + on order is at or below the reorder point. */
  low: boolean;
  /** What to order to reach the order-up-to level; 0 when not low. */
  suggestedQuantity: number;
}

// ---- Sourcing and exchange rates ------------------------------------------------------------------

export const sourcingQuery = z
  .object({
    familyId: z.optional(idField),
    stepId: z.optional(idField),
    partId: z.optional(idField),
    neededBy: z.optional(calendarDay),
    /** Units wanted: the shipping share is spread over them. */
    quantity: z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(10_000)), 1),
  })
  .check(
    z.refine((q) => Boolean(q.partId) !== Boolean(q.familyId && q.stepId), {
      message: 'give either partId, or familyId and stepId',
      path: ['partId'],
    }),
    z.refine((q) => !(q.familyId && !q.stepId) && !(q.stepId && !q.familyId), {
      message: 'familyId and stepId go together',
      path: ['stepId'],
    }),
  );
export type SourcingQuery = z.output<typeof sourcingQuery>;

export interface OfferJson {
  supplierId: string;
  supplierName: string;
  itemId: string;
  supplierSku: string;
  partId: string;
  sku: string;
  price: string;
  currency: string;
  /** Price plus this quantity's share of the supplier's shipping, in the home currency; null without a rate. */
  landedCost: string | null;
  /** The price alone and the supplier's shipping for one order, each in the home currency. */
  priceHome: string | null;
  shippingHome: string | null;
  homeCurrency: string;
  landedHow: string;
  available: number | null;
  leadDays: number;
  /** When the information was brought in: the commit of the price list it came from. */
  seenAt: string;
  /** Today plus the lead time (shop's time zone). */
  arrivesBy: string;
  meetsNeededBy: boolean;
}

export interface SourcingJson {
  offers: OfferJson[];
  best: OfferJson | null;
  bestHow: string;
  /** Nothing free and at most one supplier offering it. */
  scarce: boolean;
  free: number;
  suppliersOffering: number;
  homeCurrency: string;
  neededBy: string | null;
  quantity: number;
  /** The part asked about (?partId=), with its family and step so the page can fill them in. */
  part: {
    id: string;
    sku: string;
    description: string;
    familyId: string | null;
    stepId: string | null;
  } | null;
  /** Items in the mapping queue that might be the part(s) asked about. */
  waiting: WaitingItemJson[];
}

export const rateInput = z.strictObject({
  rate: z.string({ error: 'must be a rate written as text, e.g. "0.9215"' }).check(
    z.trim(),
    z.maxLength(20, atMost(20)),
    z.regex(
      /^\d{1,6}(\.\d{1,8})?$/,
      'must be a positive number like "0.9215" (at most 8 decimals)',
    ),
    z.refine((v) => Number(v) > 0, 'must be above 0'),
  ),
});

export const currencyParam = z.object({ currency: currencyCode });

export interface ExchangeRateJson {
  currency: string;
  /** One unit of the currency is worth this much of the home currency. */
  rate: string;
  homeCurrency: string;
  updatedAt: string;
  updatedBy: string | null;
}
