// What the stock API accepts and answers: bins, receipts, adjustments, moves, scrapping, measuring,
// piston units and the ledger. Shared by the server routes and the Angular forms.
import * as z from '../zod';
import { atMost, singleLine } from '../text-rules';
import type { UnitStatus } from './catalog';
import { idField, lengthField, moneyText, pieceCount } from './common';
import type { LengthJson } from '../lengths';
import type { OrderState } from './order-states';

export const UNIT_STATUSES = ['free', 'held', 'issued', 'returned', 'scrapped'] as const;
export const LEDGER_KINDS = [
  'receipt',
  'adjustment',
  'reservation',
  'release',
  'issue',
  'return',
  'scrap',
  'transfer',
  'measure',
] as const;
export type LedgerKind = (typeof LEDGER_KINDS)[number];

/** Largest quantity one receipt or adjustment may move: a typo guard, far above any real delivery. */
export const MAX_STOCK_QUANTITY = 10_000;
/** Pistons in one receipt: each gets its own row, label and measurement. */
export const MAX_PISTONS_PER_RECEIPT = 500;

/** A measured piston skirt diameter: a piston is never larger than 500 mm across. */
export const skirtField = lengthField({ max: 500_000_000 });
const reason = z
  .string()
  .check(z.trim(), z.minLength(1, 'give a reason'), z.maxLength(500, 'at most 500 characters'));

export const binInput = z.strictObject({
  code: z
    .string()
    .check(
      z.trim(),
      z.minLength(1, 'enter a bin code'),
      z.maxLength(32, atMost(32)),
      z.regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, 'letters, digits and . _ / - only, e.g. "A-03-2"'),
    ),
  name: z.optional(singleLine(120)),
});
export type BinInput = z.output<typeof binInput>;

export const receiptInput = z.strictObject({
  partId: idField,
  quantity: pieceCount(MAX_STOCK_QUANTITY, `at most ${MAX_STOCK_QUANTITY} in one receipt`),
  binId: idField,
  unitCost: moneyText,
  note: z.optional(z.string().check(z.trim(), z.maxLength(500))),
  /** Pistons only: one entry per piston; leave out skirt (or null) for "to measure". */
  units: z.optional(
    z
      .array(z.strictObject({ skirt: z.optional(z.nullable(skirtField)) }))
      .check(z.maxLength(MAX_PISTONS_PER_RECEIPT)),
  ),
});
export type ReceiptInput = z.output<typeof receiptInput>;

/**
 * The one receiving page: a delivery taken in against an open order line of the same part (the
 * line's count and the order move on, its price is the cost), or, with no line, one nobody
 * ordered at the cost typed.
 */
export const deskReceiptInput = z
  .extend(receiptInput, { unitCost: z.optional(moneyText), orderLineId: z.optional(idField) })
  .check(
    z.superRefine((v, ctx) => {
      if (!v.orderLineId && v.unitCost === undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['unitCost'],
          message: 'give the unit cost paid, or the order line it came on',
        });
      }
    }),
  );
export type DeskReceiptInput = z.output<typeof deskReceiptInput>;

export const adjustmentInput = z.strictObject({
  partId: idField,
  quantity: z.number({ error: 'must be a whole number' }).check(
    z.int('must be a whole number'),
    z.gte(-MAX_STOCK_QUANTITY),
    z.lte(MAX_STOCK_QUANTITY),
    z.refine((q) => q !== 0, 'must not be 0: give the change, + to add, - to take away'),
  ),
  reason,
});
export type AdjustmentInput = z.output<typeof adjustmentInput>;

export const moveInput = z
  .strictObject({ unitId: z.optional(idField), partId: z.optional(idField), toBinId: idField })
  .check(
    z.refine((m) => (m.unitId ? 1 : 0) + (m.partId ? 1 : 0) === 1, {
      message: 'give either unitId (one piston) or partId (a counted part)',
      path: ['unitId'],
    }),
  );
export type MoveInput = z.output<typeof moveInput>;

export const scrapInput = z.strictObject({ reason });
export const measureInput = z.strictObject({ skirt: skirtField });

// ---- Answers ----------------------------------------------------------------------------------

export interface BinJson {
  id: string;
  code: string;
  name: string;
  /** Piston units on the shelf in this bin. */
  units: number;
  /** Counted parts kept in this bin. */
  parts: number;
}

export interface UnitJson {
  id: string;
  label: string;
  partId: string;
  sku: string;
  description: string;
  familyId: string | null;
  familyCode: string | null;
  familyName: string | null;
  stepId: string | null;
  stepLabel: string | null;
  nominalBore: LengthJson | null;
  skirt: LengthJson | null;
  status: UnitStatus;
  binId: string | null;
  bin: string | null;
  receivedAt: string;
  measuredAt: string | null;
  /** Absent for roles that may not see costs (shared/money-visibility.ts). */
  unitCost?: string;
  heldForJobId: string | null;
  heldCylinder: number | null;
  holdExpiresAt: string | null;
}

export interface LedgerJson {
  id: number;
  at: string;
  userId: string | null;
  userName: string | null;
  partId: string;
  sku: string;
  unitId: string | null;
  unitLabel: string | null;
  kind: LedgerKind;
  quantity: number;
  heldDelta: number;
  /** Absent for roles that may not see costs; salePrice (what an issue sold for) likewise. */
  unitCost?: string | null;
  salePrice?: string | null;
  jobId: string | null;
  reason: string | null;
  fromBinId: string | null;
  fromBin: string | null;
  toBinId: string | null;
  toBin: string | null;
  ref: string | null;
}

export interface LevelsJson {
  onHand: number;
  held: number;
  free: number;
  /** Absent for roles that may not see costs. */
  averageCost?: string;
}

export interface ReceiptJson {
  receiptId: string;
  ledger: LedgerJson[];
  units: UnitJson[];
  levels: LevelsJson;
}

export interface DeskReceiptJson extends ReceiptJson {
  /** The order line received against, as it stands now; null for a delivery nobody ordered. */
  order: {
    id: string;
    number: string;
    state: OrderState;
    stateLabel: string;
    lineNo: number;
    received: number;
    quantity: number;
  } | null;
  /** Arriving pistons held straight away for jobs waiting on that line. */
  holds: { jobNumber: string; cylinder: number; unitLabel: string }[];
}

export interface StockChangeJson {
  ledger: LedgerJson[];
  levels: LevelsJson;
  unit?: UnitJson;
}

export const UNIT_SORTS = ['label', 'sku', 'skirt', 'status', 'bin', 'receivedAt'] as const;
