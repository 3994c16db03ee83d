// What the purchasing API accepts and answers: purchase orders, receiving against them, and jobs
// waiting on an order line; reorder rules, suggestions, sourcing and exchange rates are in
// reorder-api.ts, re-exported here so client and server import one module.
import * as z from '../zod';
import { skirtField, MAX_PISTONS_PER_RECEIPT } from './stock';
import { type WaitingItemJson } from './suppliers';
import {
  calendarDay,
  idField,
  moneyText,
  pageNumber,
  pageSizeField,
  pieceCount,
  sortDir,
} from './common';
import type { LengthJson } from '../lengths';
import { ORDER_STATES, type OrderState } from './order-states';

export * from './reorder';
export * from './order-states';

// ---- Purchase orders -------------------------------------------------------------------------

export const MAX_ORDER_LINES = 200;

/**
 * A unit price as exact text ("12.50"); a plain JSON number is accepted too and read by its decimal
 * writing (12.5 → "12.5"), never by binary arithmetic.
 */
const unitPriceField = z.union([
  moneyText,
  z.pipe(
    z.pipe(
      z
        .number({ error: 'must be an amount written as text, e.g. "12.50"' })
        .check(z.gte(0, 'must not be negative')),
      z.transform((n) => String(n)),
    ),
    moneyText,
  ),
]);

export const orderLineInput = z.strictObject({
  partId: idField,
  quantity: pieceCount(10_000, 'at most 10000'),
  unitPrice: unitPriceField,
});

export const orderInput = z.strictObject({
  supplierId: idField,
  lines: z
    .array(orderLineInput)
    .check(
      z.minLength(1, 'add at least one line'),
      z.maxLength(MAX_ORDER_LINES, `at most ${MAX_ORDER_LINES} lines`),
    ),
  expectedOn: z.optional(z.nullable(calendarDay)),
  notes: z.optional(z.string().check(z.maxLength(2000, 'at most 2000 characters'))),
  /** What the supplier charges to ship it, in the order's currency; default: their usual. */
  shipping: z.optional(unitPriceField),
});
export type OrderInput = z.output<typeof orderInput>;

export const orderPatch = z.strictObject({
  lines: z.optional(orderInput.shape.lines),
  expectedOn: z.optional(z.nullable(calendarDay)),
  notes: z.optional(z.string().check(z.maxLength(2000, 'at most 2000 characters'))),
  shipping: z.optional(unitPriceField),
});
export type OrderPatch = z.output<typeof orderPatch>;

export const ordersQuery = z.object({
  q: z.optional(z.string().check(z.maxLength(200))),
  state: z.optional(z.enum([...ORDER_STATES, 'open'], { error: 'must be an order state or open' })),
  supplierId: z.optional(idField),
  sort: z.optional(z.enum(['number', 'createdAt', 'expectedOn', 'supplier', 'state'])),
  dir: z.optional(sortDir),
  page: pageNumber,
  pageSize: pageSizeField(),
});
export type OrdersQuery = z.output<typeof ordersQuery>;

export const draftsInput = z.strictObject({
  /** Only these parts; all low parts when left out. */
  partIds: z.optional(z.array(idField).check(z.maxLength(500))),
  familyId: z.optional(idField),
});
export type DraftsInput = z.output<typeof draftsInput>;

export const receiptLinesInput = z.strictObject({
  lines: z
    .array(
      z.strictObject({
        lineId: idField,
        quantity: pieceCount(10_000),
        units: z.optional(
          z
            .array(z.strictObject({ skirt: z.optional(z.nullable(skirtField)) }))
            .check(z.maxLength(MAX_PISTONS_PER_RECEIPT)),
        ),
        binId: z.optional(idField),
      }),
    )
    .check(z.minLength(1, 'receive at least one line'), z.maxLength(MAX_ORDER_LINES)),
  binId: z.optional(idField),
  note: z.optional(z.string().check(z.trim(), z.maxLength(500))),
});
export type ReceiptLinesInput = z.output<typeof receiptLinesInput>;

export interface OrderLineJson {
  id: string;
  lineNo: number;
  partId: string;
  sku: string;
  description: string;
  partKind: string;
  familyCode: string | null;
  stepLabel: string | null;
  supplierSku: string | null;
  /** GTINs that identify this line when scanned: the part's and the supplier item's. */
  gtins: string[];
  quantity: number;
  received: number;
  open: number;
  /** Prices are the shop's costs: absent for roles that may not see them. */
  unitPrice?: string;
  lineTotal?: string;
  waits: WaitJson[];
}

export interface OrderJson {
  id: string;
  number: string;
  supplierId: string;
  supplierName: string;
  supplierEmail: string | null;
  currency: string;
  state: OrderState;
  stateLabel: string;
  expectedOn: string | null;
  notes: string;
  /** Absent for roles that may not see costs. */
  total?: string;
  /** Shipping for the order, spread into the received units' cost; absent like total. */
  shipping?: string;
  lines: OrderLineJson[];
  createdAt: string;
  createdBy: string | null;
  sentAt: string | null;
  closedAt: string | null;
  /**
   * Why the last sending did not reach the supplier (its mail server refused the message for
   * good); the order went back to drafting. Null when nothing failed or it was sent again.
   */
  sendError: string | null;
}

export interface OrderListItemJson {
  id: string;
  number: string;
  supplierId: string;
  supplierName: string;
  currency: string;
  state: OrderState;
  stateLabel: string;
  expectedOn: string | null;
  lines: number;
  quantity: number;
  received: number;
  /** Absent for roles that may not see costs. */
  total?: string;
  createdAt: string;
  sentAt: string | null;
}

/** One supplier's share of a suggested quantity on the drafts. */
export interface DraftShareJson {
  supplierId: string;
  supplierName: string;
  orderId: string;
  orderNumber: string;
  quantity: number;
  /** What the supplier says it has (null: not stated). */
  available: number | null;
}

/** A low part whose drafted quantity is not the suggestion as one line, and why in words. */
export interface DraftAdjustmentJson {
  partId: string;
  sku: string;
  suggested: number;
  shares: DraftShareJson[];
  /** What no supplier said it has: order it by hand or wait for a new price list. */
  uncovered: number;
  why: string;
}

export interface DraftsJson {
  orders: OrderJson[];
  /** Parts split between suppliers or cut short because a supplier stated less stock. */
  adjusted: DraftAdjustmentJson[];
  /**
   * Low parts no active supplier offers: nothing to draft for them, with the items in the mapping
   * queue that might be them.
   */
  unsourced: { partId: string; sku: string; quantity: number; waiting: WaitingItemJson[] }[];
}

export interface ReceivedHoldJson {
  jobId: string;
  jobNumber: string;
  cylinder: number;
  unitId: string;
  unitLabel: string;
  skirt: LengthJson | null;
}

export interface OrderReceiptJson {
  receiptId: string;
  order: OrderJson;
  units: { id: string; label: string; partId: string; skirt: LengthJson | null }[];
  holds: ReceivedHoldJson[];
  /** Waits that could not take a piston from this delivery (unmeasured, wrong step), with why. */
  notHeld: { jobNumber: string; cylinder: number; reason: string }[];
}

export interface OpenLineJson {
  orderId: string;
  orderNumber: string;
  supplierName: string;
  expectedOn: string | null;
  line: OrderLineJson;
}

// ---- Jobs waiting on an order line --------------------------------------------------------------

export const waitInput = z.strictObject({
  jobId: idField,
  cylinder: z.number().check(z.int(), z.gte(1), z.lte(24)),
  lineId: idField,
});
export type WaitInput = z.output<typeof waitInput>;

export const waitsQuery = z.object({
  jobId: z.optional(idField),
  lineId: z.optional(idField),
  active: z.pipe(
    z.optional(z.enum(['true', 'false'])),
    z.transform((v) => v !== 'false'),
  ),
});

export interface WaitJson {
  id: string;
  jobId: string;
  jobNumber: string;
  customerName: string;
  cylinder: number;
  lineId: string;
  orderId: string;
  orderNumber: string;
  sku: string;
  createdAt: string;
  fulfilledAt: string | null;
  cancelledAt: string | null;
  unitLabel: string | null;
}

export interface WaitCandidateJson {
  jobId: string;
  jobNumber: string;
  customerName: string;
  cylinder: number;
  createdAt: string;
}
