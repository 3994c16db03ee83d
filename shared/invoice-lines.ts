// What the invoice charges at hand-back: the estimate's lines (the version the customer approved),
// with its part lines brought in line with the parts actually issued to the job. A part on the
// estimate is charged at the agreed price for as many as were issued; a part issued beyond the
// estimate (another piston, a second ring set) is added at its sale price on the day of issue and
// marked so; a part on the estimate that was never issued is not charged. Labour and other lines
// (a discount among them) stay as agreed.
import Decimal from 'decimal.js';
import { fixedMoney, lineTotal } from './estimate-math';
import type { LineKind } from './api/money';

export interface EstimatedLine {
  kind: LineKind;
  description: string;
  /** Decimal text, more than 0. */
  quantity: string;
  /** Decimal text; a discount is negative. */
  unitPrice: string;
  partId: string | null;
}

export interface IssuedPart {
  partId: string;
  /** Shown on a line added for a part the estimate did not have. */
  description: string;
  /** Whole units issued (a ledger issue row's quantity, as a positive number). */
  quantity: number;
  /** The part's sale price recorded on the issue, decimal text. */
  salePrice: string;
}

export interface InvoiceLineDraft {
  kind: LineKind;
  description: string;
  quantity: string;
  unitPrice: string;
  total: string;
  partId: string | null;
  sinceEstimate: boolean;
}

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });

/** Quantity text without trailing zeros ("2.000" → "2", "1.500" → "1.5"). */
function qtyText(value: Decimal.Value): string {
  return new D(value).toString();
}

export function invoiceLines(
  estimate: readonly EstimatedLine[],
  issued: readonly IssuedPart[],
  currency: string,
): InvoiceLineDraft[] {
  const left = new Map<string, Decimal>();
  for (const p of issued) {
    if (!Number.isInteger(p.quantity) || p.quantity <= 0) {
      throw new Error(`An issued quantity must be a whole number above 0, not ${p.quantity}.`);
    }
    left.set(p.partId, (left.get(p.partId) ?? new D(0)).plus(p.quantity));
  }
  const out: InvoiceLineDraft[] = [];
  const push = (l: Omit<InvoiceLineDraft, 'total'>) =>
    out.push({ ...l, total: lineTotal(l, currency) });

  for (const line of estimate) {
    const unitPrice = fixedMoney(line.unitPrice, currency);
    if (line.kind !== 'part' || line.partId === null) {
      push({ ...line, quantity: qtyText(line.quantity), unitPrice, sinceEstimate: false });
      continue;
    }
    const available = left.get(line.partId) ?? new D(0);
    const charged = Decimal.min(available, new D(line.quantity));
    if (charged.lte(0)) continue;
    left.set(line.partId, available.minus(charged));
    push({ ...line, quantity: qtyText(charged), unitPrice, sinceEstimate: false });
  }

  // What is left was issued beyond the estimate: one line per part and price, in order of issue.
  const extra = new Map<string, Omit<InvoiceLineDraft, 'total'> & { count: Decimal }>();
  for (const p of issued) {
    const remaining = left.get(p.partId) ?? new D(0);
    if (remaining.lte(0)) continue;
    const take = Decimal.min(remaining, p.quantity);
    left.set(p.partId, remaining.minus(take));
    const unitPrice = fixedMoney(p.salePrice, currency);
    const key = `${p.partId} ${unitPrice}`;
    const have = extra.get(key);
    if (have) have.count = have.count.plus(take);
    else {
      extra.set(key, {
        kind: 'part',
        description: p.description,
        quantity: '0',
        unitPrice,
        partId: p.partId,
        sinceEstimate: true,
        count: take,
      });
    }
  }
  for (const { count, ...line } of extra.values()) push({ ...line, quantity: qtyText(count) });
  return out;
}
