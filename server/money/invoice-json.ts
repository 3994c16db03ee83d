// The invoice as the API answers it: the lines and totals as issued (never changed), with what has
// been paid and credited since worked out now, so the balance owed is always today's.
import type { CreditNoteJson, InvoiceJson, InvoicePaymentJson } from '../../shared/api/money';
import { fixedMoney, minusMoney, sumMoney } from '../../shared/estimate-math';
import { quantityText } from './estimate-json';
import type { PaymentRow } from './payments-repository';
import type {
  CreditNoteLineRow,
  CreditNoteRow,
  InvoiceJobRow,
  InvoiceLineRow,
  InvoiceRow,
} from './invoice-repository';

/** The shop's invoice numbers ("INV-000042") and credit note numbers ("CRN-000007"). */
export function invoiceNumber(seq: number): string {
  return `INV-${String(seq).padStart(6, '0')}`;
}
export function creditNoteNumber(seq: number): string {
  return `CRN-${String(seq).padStart(6, '0')}`;
}

export function creditNoteJson(
  note: CreditNoteRow,
  lines: CreditNoteLineRow[],
  invoice: InvoiceRow,
): CreditNoteJson {
  const c = invoice.currency;
  return {
    number: note.number,
    invoiceNumber: invoice.number,
    issuedAt: note.issued_at.toISOString(),
    reason: note.reason,
    lines: lines
      .filter((l) => l.credit_note_id === note.id)
      .map((l) => ({
        description: l.description,
        quantity: quantityText(l.quantity),
        unitPrice: fixedMoney(l.unit_price, c),
        total: fixedMoney(l.total, c),
      })),
    subtotal: fixedMoney(note.subtotal, c),
    tax: fixedMoney(note.tax, c),
    total: fixedMoney(note.total, c),
    currency: c,
  };
}

/** Payments that count against the invoice: received and not given back. */
export function countedPayments(payments: PaymentRow[], currency: string): InvoicePaymentJson[] {
  return payments
    .filter((p) => p.state === 'paid')
    .map((p) => ({
      purpose: p.purpose,
      method: p.method,
      amount: fixedMoney(p.amount, currency),
      paidAt: p.paid_at ? p.paid_at.toISOString() : null,
    }));
}

export function invoiceJson(parts: {
  invoice: InvoiceRow;
  lines: InvoiceLineRow[];
  job: InvoiceJobRow;
  payments: PaymentRow[];
  creditNotes: { notes: CreditNoteRow[]; lines: CreditNoteLineRow[] };
}): InvoiceJson {
  const { invoice } = parts;
  const c = invoice.currency;
  const payments = countedPayments(parts.payments, c);
  const creditNotes = parts.creditNotes.notes.map((n) =>
    creditNoteJson(n, parts.creditNotes.lines, invoice),
  );
  const paid = sumMoney(
    payments.map((p) => p.amount),
    c,
  );
  const credited = sumMoney(
    creditNotes.map((n) => n.total),
    c,
  );
  return {
    number: invoice.number,
    issuedAt: invoice.issued_at.toISOString(),
    jobNumber: parts.job.number,
    customerName: parts.job.customer_name,
    lines: parts.lines.map((l) => ({
      kind: l.kind,
      description: l.description,
      quantity: quantityText(l.quantity),
      unitPrice: fixedMoney(l.unit_price, c),
      total: fixedMoney(l.total, c),
      sinceEstimate: l.since_estimate,
    })),
    subtotal: fixedMoney(invoice.subtotal, c),
    tax: fixedMoney(invoice.tax, c),
    total: fixedMoney(invoice.total, c),
    paid,
    credited,
    balance: minusMoney(minusMoney(invoice.total, credited, c), paid, c),
    currency: c,
    taxRate: quantityText(invoice.tax_rate),
    pricesIncludeTax: invoice.prices_include_tax,
    estimateVersion: invoice.estimate_version,
    estimateApproved: invoice.estimate_approved,
    payments,
    creditNotes,
  };
}
