// The invoice at hand-back and the credit notes that correct it. The invoice is issued inside the
// hand-back's transaction (jobs-service collectJob), after the held parts were issued, so it
// charges exactly what left the shelf; its number is taken from the locked counter in that same
// transaction. Once issued nothing about it changes: what was paid or credited since is added up
// when it is read.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { AppError, BadRequest, NotFound } from '../errors';
import { faultPoint } from '../testing-faults';
import { enqueueMail } from '../mail/outbox';
import { getSettings } from '../settings/settings-service';
import { insertEvent } from '../jobs/job-records-repository';
import { formatMoney } from '../../shared/money';
import { compareMoney, estimateTotals, fixedMoney, minusMoney } from '../../shared/estimate-math';
import { invoiceLines, type EstimatedLine } from '../../shared/invoice-lines';
import type { CreditNoteInput, CreditNoteJson, InvoiceJson } from '../../shared/api/money';
import * as estimateRepo from './estimate-repository';
import { paymentsOf } from './payments-repository';
import * as repo from './invoice-repository';
import { creditNoteNumber, invoiceJson, invoiceNumber } from './invoice-json';
import { taxRule } from './estimate-json';
import { customerContact } from './customer-contact';
import { creditNoteMail, invoiceMail } from './invoice-mail';
import { invoicePdf } from './invoice-pdf';
import type { ShopSettings } from '../../shared/settings-schema';

type Conn = Knex;

/** The lines the customer agreed to: the approved version when there is one, else the estimate as it stands. */
async function agreedLines(
  trx: Conn,
  jobId: string,
): Promise<{ lines: EstimatedLine[]; version: number | null; approved: boolean }> {
  const est = await estimateRepo.findEstimate(jobId, trx);
  if (!est) return { lines: [], version: null, approved: false };
  if (est.approved_snapshot && est.approved_version) {
    return {
      lines: est.approved_snapshot.lines,
      version: est.approved_version,
      approved: true,
    };
  }
  const lines = (await estimateRepo.linesOf(jobId, trx)).map((l) => ({
    kind: l.kind,
    description: l.description,
    quantity: l.quantity,
    unitPrice: l.unit_price,
    partId: l.part_id,
  }));
  return { lines, version: est.version, approved: false };
}

async function loadJson(k: Conn, invoice: repo.InvoiceRow): Promise<InvoiceJson> {
  const job = await repo.jobOfInvoice(invoice.job_id, k);
  if (!job) throw new Error(`job ${invoice.job_id} of invoice ${invoice.number} is missing`);
  return invoiceJson({
    invoice,
    lines: await repo.invoiceLinesOf(invoice.id, k),
    job,
    payments: await paymentsOf(invoice.job_id, k),
    creditNotes: await repo.creditNotesOf(invoice.id, k),
  });
}

function pdfOf(invoice: InvoiceJson, settings: ShopSettings): Promise<Buffer> {
  return invoicePdf({
    invoice,
    shopName: settings.shopName,
    shopHours: settings.shopHours,
    dates: { locale: settings.locale, timeZone: settings.timeZone },
  });
}

/** Issues the job's invoice inside the hand-back's transaction and mails it to the customer. */
export async function issueInvoice(
  trx: Knex.Transaction,
  actorId: string,
  jobId: string,
): Promise<InvoiceJson> {
  const settings = await getSettings(trx);
  const rule = taxRule(settings);
  const agreed = await agreedLines(trx, jobId);
  const issued = (await repo.issuedParts(jobId, trx)).map((p) => ({
    partId: p.part_id,
    description: `${p.description} (${p.sku})`,
    quantity: Number(p.quantity),
    salePrice: p.sale_price ?? '0',
  }));
  const lines = invoiceLines(agreed.lines, issued, rule.currency);
  const totals = estimateTotals(lines, rule);
  // Taken last, so the counter row is held for as short a time as the transaction allows.
  const seq = await repo.takeNumber(trx, 'invoice');
  faultPoint('invoices.issue.afterNumber');
  const row = await repo.insertInvoice(
    trx,
    {
      job_id: jobId,
      seq,
      number: invoiceNumber(seq),
      issued_by: actorId,
      currency: rule.currency,
      tax_rate: rule.ratePercent,
      prices_include_tax: rule.pricesIncludeTax,
      subtotal: totals.subtotal,
      tax: totals.tax,
      total: totals.total,
      estimate_version: agreed.version,
      estimate_approved: agreed.approved,
    },
    lines.map((l) => ({
      kind: l.kind,
      description: l.description,
      quantity: l.quantity,
      unit_price: l.unitPrice,
      total: l.total,
      part_id: l.partId,
      since_estimate: l.sinceEstimate,
    })),
  );
  const json = await loadJson(trx, row);
  const contact = await customerContact(jobId, trx);
  if (contact?.email) {
    const mail = invoiceMail(settings, json, await pdfOf(json, settings));
    await enqueueMail(trx, { to: contact.email, ...mail, dedupeKey: `invoice:${row.id}` });
  }
  const owed = compareMoney(json.balance, '0') > 0;
  await insertEvent(trx, {
    jobId,
    userId: actorId,
    kind: 'system',
    text:
      `Invoice ${json.number} issued: ${formatMoney(json.total, json.currency)}; ` +
      (owed ? `${formatMoney(json.balance, json.currency)} still owed.` : 'nothing owed.') +
      (contact?.email
        ? ` Mailed to ${contact.email}.`
        : ' Not mailed: the customer has no e-mail.'),
  });
  return json;
}

async function requireInvoice(jobId: string, k: Conn, lock = false): Promise<repo.InvoiceRow> {
  const invoice = await repo.findInvoiceOfJob(jobId, k, lock);
  if (invoice) return invoice;
  const job = await repo.jobOfInvoice(jobId, k);
  if (!job) throw new NotFound('That job');
  throw new AppError(
    404,
    'no_invoice',
    `Job ${job.number} has no invoice yet: one is issued when the job is handed back.`,
  );
}

export async function getInvoice(jobId: string, k: Conn = db): Promise<InvoiceJson> {
  return loadJson(k, await requireInvoice(jobId, k));
}

export async function getInvoicePdf(
  jobId: string,
  k: Conn = db,
): Promise<{ number: string; data: Buffer }> {
  const json = await getInvoice(jobId, k);
  return { number: json.number, data: await pdfOf(json, await getSettings(k)) };
}

/** A correction: its own number, naming the invoice; never more than the invoice still holds. */
export async function issueCreditNote(
  actorId: string,
  jobId: string,
  input: CreditNoteInput,
  k: Conn = db,
): Promise<CreditNoteJson> {
  const settings = await getSettings(k);
  return k.transaction(async (trx) => {
    // Locked, so two corrections of one invoice cannot both fit under what it still holds.
    const invoice = await requireInvoice(jobId, trx, true);
    const before = await loadJson(trx, invoice);
    const c = invoice.currency;
    const lines = (
      input.lines ?? [
        {
          description: `Correction: ${input.reason}`,
          quantity: '1',
          unitPrice: input.amount ?? '0',
        },
      ]
    ).map((l) => ({ ...l, unitPrice: fixedMoney(l.unitPrice, c) }));
    const totals = estimateTotals(lines, {
      ratePercent: invoice.tax_rate,
      pricesIncludeTax: invoice.prices_include_tax,
      currency: c,
    });
    const left = minusMoney(before.total, before.credited, c);
    if (compareMoney(totals.total, left) > 0) {
      const field = input.lines ? 'lines' : 'amount';
      throw new BadRequest(
        `${field}: the credit note would take off ${totals.total}, more than the ${left} invoice ${invoice.number} still holds.`,
        [{ field, message: `more than the invoice still holds (${left})` }],
      );
    }
    const seq = await repo.takeNumber(trx, 'credit_note');
    const note = await repo.insertCreditNote(
      trx,
      {
        invoice_id: invoice.id,
        seq,
        number: creditNoteNumber(seq),
        issued_by: actorId,
        reason: input.reason,
        subtotal: totals.subtotal,
        tax: totals.tax,
        total: totals.total,
      },
      lines.map((l, i) => ({
        description: l.description,
        quantity: l.quantity,
        unit_price: l.unitPrice,
        total: totals.lineTotals[i],
      })),
    );
    const after = await loadJson(trx, invoice);
    const json = after.creditNotes.find((n) => n.number === note.number) as CreditNoteJson;
    const contact = await customerContact(jobId, trx);
    if (contact?.email) {
      await enqueueMail(trx, {
        to: contact.email,
        ...creditNoteMail(settings, json, after),
        dedupeKey: `credit-note:${note.id}`,
      });
    }
    await insertEvent(trx, {
      jobId,
      userId: actorId,
      kind: 'system',
      text: `Credit note ${note.number} on invoice ${invoice.number}: ${formatMoney(json.total, c)} off (${input.reason}).`,
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'invoice.credit_note',
      entity: 'job',
      entityId: jobId,
      before: { invoice: invoice.number, credited: before.credited },
      after: { creditNote: note.number, total: json.total, reason: input.reason },
    });
    return json;
  });
}
