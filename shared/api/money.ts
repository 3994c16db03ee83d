// What the money API accepts and answers: labour prices, the job's estimate, the customer's approval,
// payment requests and payments, and the invoice. Amounts are decimal text with the currency's
// decimals ("123.40"); the zod schemas are used by the server routes and the Angular forms alike.
import * as z from '../zod';
import { singleLine } from '../text-rules';
import { parseMoney } from '../money';

export const LABOUR_PER = ['cylinder', 'job'] as const;
export type LabourPer = (typeof LABOUR_PER)[number];

/** When Stepstock puts a labour operation on a new estimate by itself. */
export const PROPOSE_FOR = ['never', 'bored', 'bored_two_stroke', 'every_job'] as const;
export type ProposeFor = (typeof PROPOSE_FOR)[number];
export const PROPOSE_FOR_LABELS: Record<ProposeFor, string> = {
  never: 'Only when added by hand',
  bored: 'Every cylinder with a step chosen',
  bored_two_stroke: 'Every cylinder with a step chosen, two-strokes only',
  every_job: 'Every job',
};

export const ESTIMATE_STATES = ['draft', 'sent', 'approved', 'declined'] as const;
export type EstimateState = (typeof ESTIMATE_STATES)[number];
export const ESTIMATE_STATE_LABELS: Record<EstimateState, string> = {
  draft: 'Being priced',
  sent: 'With the customer',
  approved: 'Agreed by the customer',
  declined: 'Turned down',
};

export const LINE_KINDS = ['labour', 'part', 'other'] as const;
export type LineKind = (typeof LINE_KINDS)[number];

export const PAYMENT_PURPOSES = ['deposit', 'balance'] as const;
export type PaymentPurpose = (typeof PAYMENT_PURPOSES)[number];
export const PAYMENT_METHODS = ['online', 'cash', 'card', 'transfer'] as const;
export type PaymentMethod = (typeof PAYMENT_METHODS)[number];
export const COUNTER_METHODS = ['cash', 'card', 'transfer'] as const;
export type CounterMethod = (typeof COUNTER_METHODS)[number];
export const PAYMENT_STATES = ['open', 'paid', 'refunded'] as const;
export type PaymentState = (typeof PAYMENT_STATES)[number];
export const PAYMENT_METHOD_LABELS: Record<PaymentMethod, string> = {
  online: 'Online',
  cash: 'Cash',
  card: 'Card at the counter',
  transfer: 'Bank transfer',
};

/** How long the customer's link stays good, in days (it also ends when the job closes). */
export const PUBLIC_LINK_DAYS = 60;

/** An amount as text ("12.50", at most 2 decimals, not negative); a JSON number is read by its writing. */
export const amountField = z.pipe(
  z.union([z.string().check(z.maxLength(20, 'at most 20 characters')), z.number()], {
    error: 'must be an amount written as text, e.g. "12.50"',
  }),
  z.transform((v, ctx) => {
    const parsed = parseMoney(String(v), { maxDecimals: 2 });
    if (!parsed.ok) {
      return z.refuse(ctx, parsed.message);
    }
    if (parsed.value.split('.')[0].length > 10) {
      return z.refuse(ctx, 'is too large (at most 9999999999.99)');
    }
    return parsed.value;
  }),
);

/** A quantity more than 0, at most 3 decimals; text or a JSON number. */
export const quantityField = z.pipe(
  z.union([
    z.string().check(z.maxLength(12)),
    z.number().check(z.refine((n) => Number.isFinite(n), 'must be a number')),
  ]),
  z.transform((v, ctx) => {
    const text = String(v).trim();
    if (!/^\d{1,5}(\.\d{1,3})?$/.test(text) || Number(text) === 0) {
      return z.refuse(
        ctx,
        'must be a number more than 0 with at most 3 decimals, e.g. "2" or "1.5"',
      );
    }
    return text.replace(/^0+(?=\d)/, '');
  }),
);

const positiveAmount = amountField.check(z.refine((v) => Number(v) > 0, 'must be more than 0'));
const text = (max: number, what: string) =>
  z.pipe(singleLine(max, `enter ${what}`), z.string().check(z.minLength(1, `enter ${what}`)));

export const labourInput = z.strictObject({
  name: text(80, 'a name'),
  per: z.enum(LABOUR_PER, { error: 'must be cylinder or job' }),
  price: amountField,
  active: z.optional(z.boolean()),
  proposeFor: z.optional(
    z.enum(PROPOSE_FOR, { error: `must be one of ${PROPOSE_FOR.join(', ')}` }),
  ),
});
export type LabourInput = z.output<typeof labourInput>;
export const labourPatch = z
  .partial(labourInput)
  .check(z.refine((p) => Object.values(p).some((v) => v !== undefined), 'nothing to change'));
export type LabourPatch = z.output<typeof labourPatch>;

export const lineInput = z.strictObject({
  description: text(200, 'a description'),
  quantity: quantityField,
  unitPrice: amountField,
});
export type LineInput = z.output<typeof lineInput>;
export const linePatch = z
  .partial(lineInput)
  .check(z.refine((p) => Object.values(p).some((v) => v !== undefined), 'nothing to change'));
export type LinePatch = z.output<typeof linePatch>;

export const discountInput = z.strictObject({
  amount: positiveAmount,
  reason: text(200, 'the reason for the discount'),
});
export type DiscountInput = z.output<typeof discountInput>;

export const approvalInput = z.strictObject({
  note: z.optional(z.string().check(z.trim(), z.maxLength(500, 'at most 500 characters'))),
  how: z.optional(z.enum(['counter', 'phone'], { error: 'must be counter or phone' })),
});
export type ApprovalInput = z.output<typeof approvalInput>;

export const paymentRequestInput = z.strictObject({
  purpose: z.enum(PAYMENT_PURPOSES, { error: 'must be deposit or balance' }),
  amount: z.optional(positiveAmount),
});
export type PaymentRequestInput = z.output<typeof paymentRequestInput>;

export const counterPaymentInput = z.strictObject({
  method: z.enum(COUNTER_METHODS, { error: 'must be cash, card or transfer' }),
  amount: positiveAmount,
  purpose: z.optional(z.enum(PAYMENT_PURPOSES, { error: 'must be deposit or balance' })),
});
export type CounterPaymentInput = z.output<typeof counterPaymentInput>;

export const refundInput = z.strictObject({ reason: text(300, 'the reason for the refund') });
export type RefundInput = z.output<typeof refundInput>;

// ---- Answers ----------------------------------------------------------------------------------

export interface LabourOperationJson {
  id: string;
  name: string;
  per: LabourPer;
  price: string;
  active: boolean;
  proposeFor: ProposeFor;
}

export interface EstimateLineJson {
  id: string;
  kind: LineKind;
  description: string;
  quantity: string;
  unitPrice: string;
  total: string;
  /** Put there by Stepstock from the job (labour proposed, a hold); false once edited by hand. */
  fromJob: boolean;
}

export interface EstimateJson {
  state: EstimateState;
  lines: EstimateLineJson[];
  subtotal: string;
  tax: string;
  total: string;
  currency: string;
  taxRate: string;
  pricesIncludeTax: boolean;
  /** Changes since the first version; an approval is for one version. */
  version: number;
  sentAt: string | null;
  decidedAt: string | null;
  approval: { how: 'link' | 'counter' | 'phone'; by: string | null; note: string | null } | null;
  /** The version the customer approved last, kept when the estimate changes afterwards. */
  approvedVersion: { version: number; total: string; approvedAt: string } | null;
}

export interface PublicPaymentJson {
  purpose: PaymentPurpose;
  amount: string;
  state: PaymentState;
  url: string | null;
}

export interface PublicJobJson {
  shop: { name: string; hours: string };
  job: { number: string; state: string; stateText: string; cylinders: number };
  estimate: EstimateJson;
  payments: PublicPaymentJson[];
}

export interface PaymentJson {
  id: string;
  purpose: PaymentPurpose;
  method: PaymentMethod;
  amount: string;
  state: PaymentState;
  url: string | null;
  createdAt: string;
  paidAt: string | null;
  refundedAt: string | null;
  refundReason: string | null;
}

export interface PaymentsJson {
  items: PaymentJson[];
  paid: string;
  balance: string;
  currency: string;
}

export interface InvoiceLineJson {
  kind: LineKind;
  description: string;
  quantity: string;
  unitPrice: string;
  total: string;
  /** A part issued to the job that the estimate did not have. */
  sinceEstimate: boolean;
}

export interface CreditNoteLineJson {
  description: string;
  quantity: string;
  unitPrice: string;
  total: string;
}

export interface CreditNoteJson {
  number: string;
  /** The invoice it corrects. */
  invoiceNumber: string;
  issuedAt: string;
  reason: string;
  lines: CreditNoteLineJson[];
  subtotal: string;
  tax: string;
  /** What it takes off the invoice (a positive amount). */
  total: string;
  currency: string;
}

/** A payment counted on the invoice: paid, not refunded. */
export interface InvoicePaymentJson {
  purpose: PaymentPurpose;
  method: PaymentMethod;
  amount: string;
  paidAt: string | null;
}

export interface InvoiceJson {
  number: string;
  issuedAt: string;
  jobNumber: string;
  customerName: string | null;
  lines: InvoiceLineJson[];
  subtotal: string;
  tax: string;
  total: string;
  /** Deposits and payments received for the job, now (paid and not refunded). */
  paid: string;
  /** Taken off the total by credit notes. */
  credited: string;
  /** total − credited − paid; more than 0 means the customer still owes it. */
  balance: string;
  currency: string;
  taxRate: string;
  pricesIncludeTax: boolean;
  /** The estimate the lines came from, and whether the customer had approved that version. */
  estimateVersion: number | null;
  estimateApproved: boolean;
  payments: InvoicePaymentJson[];
  creditNotes: CreditNoteJson[];
}

/**
 * A correction of an issued invoice: a reason, and either lines or one amount (one line of that
 * price). Lines are priced as the invoice's are (with or without tax, as the invoice says).
 */
export const creditNoteInput = z
  .strictObject({
    reason: text(300, 'the reason for the correction'),
    lines: z.optional(
      z
        .array(lineInput, { error: 'must be a list of lines' })
        .check(z.minLength(1, 'give at least one line'), z.maxLength(50, 'at most 50 lines')),
    ),
    amount: z.optional(positiveAmount),
  })
  .check(
    z.superRefine((v, ctx) => {
      if ((v.lines === undefined) === (v.amount === undefined)) {
        ctx.addIssue({
          code: 'custom',
          path: [v.lines === undefined ? 'amount' : 'lines'],
          message: 'give either lines or an amount (not both)',
        });
      }
      for (const [i, line] of (v.lines ?? []).entries()) {
        if (Number(line.unitPrice) <= 0) {
          ctx.addIssue({
            code: 'custom',
            path: ['lines', i, 'unitPrice'],
            message: 'must be more than 0 (a credit note takes money off)',
          });
        }
      }
    }),
  );
export type CreditNoteInput = z.output<typeof creditNoteInput>;

/** Where the job stands, in words for the customer (the public page). */
export const CUSTOMER_JOB_WORDS: Record<string, string> = {
  booked_in: 'We have your job and will measure the bores soon.',
  gauged: 'The bores are measured; the pistons are being chosen to fit them.',
  parts_set_aside: 'The pistons for your bores are set aside for you.',
  on_the_bar: 'Your cylinders are being bored.',
  at_the_hone: 'Your cylinders are being honed and finished.',
  ready_to_go: 'Your job is finished and ready to collect.',
  handed_back: 'You have collected this job.',
  called_off: 'This job was called off.',
};
