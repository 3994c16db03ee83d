// The invoices' and credit notes' queries: the numbering counters, the issued documents and their
// lines (written once, never changed), and the parts the ledger says were issued to a job.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { LineKind } from '../../shared/api/money';

export type Series = 'invoice' | 'credit_note';

/**
 * The next number of a series. The counter row stays locked until the caller's transaction ends,
 * so hand-backs take their numbers one after another, and a rollback returns the number with it.
 */
export async function takeNumber(trx: Knex.Transaction, series: Series): Promise<number> {
  const row = (await trx('document_counters').where({ series }).forUpdate().first()) as
    { last_number: number } | undefined;
  if (!row) throw new Error(`the ${series} counter row is missing`);
  const next = row.last_number + 1;
  await trx('document_counters').update({ last_number: next }).where({ series });
  return next;
}

export interface InvoiceRow {
  id: string;
  job_id: string;
  seq: number;
  number: string;
  issued_at: Date;
  currency: string;
  tax_rate: string;
  prices_include_tax: boolean;
  subtotal: string;
  tax: string;
  total: string;
  estimate_version: number | null;
  estimate_approved: boolean;
}

export interface InvoiceLineRow {
  kind: LineKind;
  description: string;
  quantity: string;
  unit_price: string;
  total: string;
  part_id: string | null;
  since_estimate: boolean;
}

export async function insertInvoice(
  trx: Knex,
  row: Omit<InvoiceRow, 'id' | 'issued_at'> & { issued_by: string | null },
  lines: InvoiceLineRow[],
): Promise<InvoiceRow> {
  const [created] = (await trx('invoices').insert(row).returning('*')) as InvoiceRow[];
  if (lines.length) {
    await trx('invoice_lines').insert(
      lines.map((l, i) => ({ ...l, invoice_id: created.id, position: i + 1 })),
    );
  }
  return created;
}

export async function findInvoiceOfJob(
  jobId: string,
  k: Knex = db,
  lock = false,
): Promise<InvoiceRow | undefined> {
  const q = k('invoices').where({ job_id: jobId }).first();
  return (await (lock ? q.forUpdate() : q)) as InvoiceRow | undefined;
}

export async function invoiceLinesOf(invoiceId: string, k: Knex = db): Promise<InvoiceLineRow[]> {
  return (await k('invoice_lines')
    .where({ invoice_id: invoiceId })
    .orderBy('position')
    .select(
      'kind',
      'description',
      'quantity',
      'unit_price',
      'total',
      'part_id',
      'since_estimate',
    )) as InvoiceLineRow[];
}

export interface IssuedPartRow {
  part_id: string;
  sku: string;
  description: string;
  quantity: number;
  sale_price: string | null;
}

/** Every part the ledger issued to the job, in order of issue (returns are taken off). */
export async function issuedParts(jobId: string, k: Knex = db): Promise<IssuedPartRow[]> {
  return (await k('stock_ledger as l')
    .join('parts as p', 'p.id', 'l.part_id')
    .where('l.job_id', jobId)
    .where('l.kind', 'issue')
    .where('l.quantity', '<', 0)
    .orderBy([{ column: 'l.at' }, { column: 'l.id' }])
    .select(
      'l.part_id',
      'p.sku',
      'p.description',
      k.raw('-l.quantity AS quantity'),
      'l.sale_price',
    )) as IssuedPartRow[];
}

export interface CreditNoteRow {
  id: string;
  invoice_id: string;
  number: string;
  issued_at: Date;
  reason: string;
  subtotal: string;
  tax: string;
  total: string;
}

export interface CreditNoteLineRow {
  credit_note_id: string;
  description: string;
  quantity: string;
  unit_price: string;
  total: string;
}

export async function insertCreditNote(
  trx: Knex,
  row: Omit<CreditNoteRow, 'id' | 'issued_at'> & { seq: number; issued_by: string },
  lines: Omit<CreditNoteLineRow, 'credit_note_id'>[],
): Promise<CreditNoteRow> {
  const [created] = (await trx('credit_notes').insert(row).returning('*')) as CreditNoteRow[];
  await trx('credit_note_lines').insert(
    lines.map((l, i) => ({ ...l, credit_note_id: created.id, position: i + 1 })),
  );
  return created;
}

export async function creditNotesOf(
  invoiceId: string,
  k: Knex = db,
): Promise<{ notes: CreditNoteRow[]; lines: CreditNoteLineRow[] }> {
  const notes = (await k('credit_notes')
    .where({ invoice_id: invoiceId })
    .orderBy('seq')) as CreditNoteRow[];
  const lines = notes.length
    ? ((await k('credit_note_lines')
        .whereIn(
          'credit_note_id',
          notes.map((n) => n.id),
        )
        .orderBy(['credit_note_id', 'position'])) as CreditNoteLineRow[])
    : [];
  return { notes, lines };
}

export interface InvoiceJobRow {
  number: string;
  customer_name: string | null;
}

export async function jobOfInvoice(
  jobId: string,
  k: Knex = db,
): Promise<InvoiceJobRow | undefined> {
  return (await k('jobs').where({ id: jobId }).first('number', 'customer_name')) as
    InvoiceJobRow | undefined;
}
