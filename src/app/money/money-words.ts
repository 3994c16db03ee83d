// How money reads on the money pages: amounts, the estimate's rule and where it stands, in words.
import type { EstimateJson } from '../../../shared/api/money';
import type { JobState } from '../../../shared/api/jobs';
import { formatAmount } from '../insights/insights-format';

export { formatAmount };

/** The estimate's rule, said the same way the shared sums work it out (shared/estimate-math). */
export function roundingRule(pricesIncludeTax: boolean, taxRate: string): string {
  const tax = pricesIncludeTax
    ? `the prices include tax at ${taxRate} %, so the tax shown is the part of the subtotal that is tax`
    : `tax at ${taxRate} % is worked out once, on the subtotal, and added`;
  return `Each line is quantity × unit price, rounded half-up to the cent; ${tax}.`;
}

/** A line's kind in words (the API keeps labour, part, other). */
export const LINE_KIND_LABELS = { labour: 'Labour', part: 'Part', other: 'Other' } as const;

/** "1.5" and "2" as typed; a quantity more than 0 with at most 3 decimals (the server's rule). */
export const QUANTITY_PATTERN = /^\d{1,5}(\.\d{1,3})?$/;
/** An amount as exact decimal text, at most 2 decimals, never negative. */
export const AMOUNT_PATTERN = /^\d{1,10}(\.\d{1,2})?$/;

/** What a money panel needs of its job (the job page hands it the whole job). */
export interface MoneyJob {
  id: string;
  number: string;
  /** A closed job's money is only read; a handed-back one has its invoice. */
  state: JobState;
  /** Each answer of the job page is a new job: the panel reads its figures again with it. */
  updatedAt: string;
}

/** Where an estimate stands with the customer, for staff; `date` writes a time the shop's way. */
export function standingText(e: EstimateJson, date: (at: string | null) => string): string {
  switch (e.state) {
    case 'draft':
      return `Not sent yet${e.version > 1 ? ` (version ${e.version})` : ''}. The cylinders are cut only once the customer agrees.`;
    case 'sent':
      return `Sent to the customer ${date(e.sentAt)}; waiting for their answer.`;
    case 'declined':
      return `The customer turned it down ${date(e.decidedAt)}. Change it and send it again, or talk to them.`;
    case 'approved': {
      const a = e.approval;
      const how = !a
        ? ''
        : a.how === 'link'
          ? ' from the e-mailed link'
          : a.how === 'phone'
            ? ' by phone'
            : ' at the counter';
      const by = a?.by ? `, taken by ${a.by}` : '';
      const note = a?.note ? ` Note: “${a.note}”.` : '';
      return `The customer agreed ${date(e.decidedAt)}${how}${by}.${note}`;
    }
  }
}

/** Two job values ask for the same money figures: the same job, unchanged since. */
export function sameJobVersion(a: MoneyJob, b: MoneyJob): boolean {
  return a.id === b.id && a.updatedAt === b.updatedAt && a.state === b.state;
}
