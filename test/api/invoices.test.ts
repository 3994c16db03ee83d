// The invoice at hand-back, against the real app, PostgreSQL and a real SMTP server on loopback:
// 404 before, the agreed lines plus a part issued beyond the estimate, the deposit taken off, the
// balance owed; the PDF (one page), the e-mail with the PDF attached; numbers without gaps under
// twenty hand-backs at once and after a hand-back that rolled back; credit notes that name their
// invoice; issued rows that the database refuses to change.
import { inflateSync } from 'node:zlib';
import type { Response } from 'superagent';
import { db } from '../../server/db/knex';
import { insertPayment } from '../../server/money/payments-repository';
import { armFault, disarmFaults } from '../../server/testing-faults';
import { invoicePdf } from '../../server/money/invoice-pdf';
import type { InvoiceJson } from '../../shared/api/money';
import { closeTestApp, everyRoleSignedIn, uniq } from '../support/api';
import { localMailbox } from '../support/mailbox';
import { makePricedJob, moneyShop } from '../support/money-fixtures';
import { makeBin, makeFamily, makeJob, makePart, receiveCounted } from '../support/jobs-fixtures';

const smtp = localMailbox();
const { owner, staff, machinist, buyer } = everyRoleSignedIn({ machinist: 'in' });

beforeAll(async () => {
  await moneyShop(owner, {
    shopName: 'Quillmoor Bore & Hone',
    homeCurrency: 'EUR',
  });
});
afterAll(async () => {
  disarmFaults();
  await closeTestApp();
});

/** Binary bodies (the PDF) as a Buffer. */
function asBuffer(res: Response, done: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

/**
 * Pages of a PDF, counted the way the format defines them (ISO 32000-1 §7.7.3.3): each page is a
 * dictionary of /Type /Page, and the page tree's root gives their /Count.
 */
function pageCount(pdf: Buffer): { pages: number; count: number | null } {
  const text = pdf.toString('latin1');
  const pages = (text.match(/\/Type\s*\/Page(?![a-z])/g) ?? []).length;
  const count = /\/Type\s*\/Pages[^>]*\/Count\s+(\d+)/.exec(text);
  return { pages, count: count ? Number(count[1]) : null };
}

/**
 * The text a PDF shows, read back from its page content: Flate-compressed streams (ISO 32000-1
 * §7.4.4) whose text-showing operators (TJ, §9.4.3) carry hex strings in the font's encoding.
 */
function pdfText(pdf: Buffer): string {
  const raw = pdf.toString('latin1');
  const shown: string[] = [];
  for (const m of raw.matchAll(/stream\r?\n([\s\S]*?)\r?\nendstream/g)) {
    let content: string;
    try {
      content = inflateSync(Buffer.from(m[1], 'latin1')).toString('latin1');
    } catch {
      continue;
    }
    for (const tj of content.matchAll(/\[([^\]]*)\]\s*TJ/g)) {
      const hex = [...tj[1].matchAll(/<([0-9a-fA-F]*)>/g)].map((h) => h[1]).join('');
      shown.push(Buffer.from(hex, 'hex').toString('latin1'));
    }
  }
  return shown.join('\n');
}

/** Every invoice number issued so far, read in one statement with the counter. */
async function series(): Promise<{ last: number; count: number; max: number; min: number }> {
  const { rows } = await db.raw(`
    SELECT (SELECT last_number FROM document_counters WHERE series = 'invoice') AS last,
           count(*)::int AS count, coalesce(max(seq), 0) AS max, coalesce(min(seq), 1) AS min
      FROM invoices`);
  return rows[0];
}

const TWO_DECIMALS = /^-?\d+\.\d{2}$/;

describe('the invoice of a priced, approved job with a part beyond the estimate and a deposit', () => {
  let job: Awaited<ReturnType<typeof makePricedJob>>;
  let email: string;
  let invoice: InvoiceJson;

  beforeAll(async () => {
    email = `${uniq('cust')}@example.test`;
    job = await makePricedJob(owner, staff, machinist, { customerEmail: email });
    const approved = await staff.post(`/api/jobs/${job.id}/estimate/approval`, {
      note: 'Agreed at the counter.',
    });
    expect(approved.status).toBe(200);
    // After the approval: a second ring set for cylinder 1 at 36.00, which the estimate did not have.
    const binId = await makeBin(owner);
    const spare = await makePart(owner, job.family, '+0.040 in', 'rings', '36.00');
    await receiveCounted(owner, spare, binId, 1);
    const hold = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      partId: spare,
      quantity: 1,
    });
    expect(hold.status).toBe(201);
    // A deposit of 100.00 taken at the counter before the hand-back.
    await insertPayment(db, {
      job_id: job.id,
      purpose: 'deposit',
      method: 'cash',
      amount: '100.00',
      currency: 'EUR',
      state: 'paid',
      paid_at: new Date(),
      created_by: null,
    });
  });

  it('when the job is not handed back yet, then GET invoice is 404 and the PDF too', async () => {
    const res = await staff.get(`/api/jobs/${job.id}/invoice`);
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/handed back/);
    expect((await staff.get(`/api/jobs/${job.id}/invoice.pdf`)).status).toBe(404);
  });

  it('when it is handed back, then the invoice has the agreed lines, the extra ring set, tax, the deposit and the balance', async () => {
    const collected = await staff.post(`/api/jobs/${job.id}/collect`);
    expect(collected.status).toBe(200);
    const res = await machinist.get(`/api/jobs/${job.id}/invoice`);
    expect(res.status).toBe(200);
    invoice = res.body;
    expect(Object.keys(invoice)).toEqual(
      expect.arrayContaining([
        'number',
        'issuedAt',
        'lines',
        'subtotal',
        'tax',
        'total',
        'paid',
        'balance',
      ]),
    );
    expect(invoice.number).toMatch(/^INV-\d{6}$/);
    expect(Number.isNaN(Date.parse(invoice.issuedAt))).toBe(false);
    // Worked by hand from the fixture's prices (two bored two-stroke cylinders):
    //   labour: bore 2 × 55.00 + hone 2 × 25.00 + chamfer 2 × 18.50 + clean 12.00 = 209.00
    //   parts:  pistons 2 × 89.00 + ring sets 2 × 34.50                         = 247.00
    //   issued beyond the estimate: one ring set at 36.00                        =  36.00
    //   subtotal 492.00; tax 20 % of it 98.40; total 590.40; deposit 100.00; balance 490.40.
    expect(invoice.subtotal).toBe('492.00');
    expect(invoice.tax).toBe('98.40');
    expect(invoice.total).toBe('590.40');
    expect(invoice.paid).toBe('100.00');
    expect(invoice.balance).toBe('490.40');
    const sum = (kind: string) =>
      invoice.lines
        .filter((l) => l.kind === kind)
        .reduce((s, l) => s + Math.round(Number(l.total) * 100), 0) / 100;
    expect(sum('labour')).toBe(209);
    expect(sum('part')).toBe(283);
    const extra = invoice.lines.filter((l) => l.sinceEstimate);
    expect(extra).toEqual([
      expect.objectContaining({ kind: 'part', quantity: '1', unitPrice: '36.00', total: '36.00' }),
    ]);
    for (const l of invoice.lines) {
      expect(l.unitPrice).toMatch(TWO_DECIMALS);
      expect(l.total).toMatch(TWO_DECIMALS);
    }
    for (const v of [invoice.subtotal, invoice.tax, invoice.total, invoice.paid, invoice.balance])
      expect(v).toMatch(TWO_DECIMALS);
    expect(invoice.payments).toEqual([
      expect.objectContaining({ purpose: 'deposit', amount: '100.00' }),
    ]);
    const events = await db('job_events').where({ job_id: job.id, kind: 'system' }).pluck('text');
    expect(events.join('\n')).toMatch(
      new RegExp(`Invoice ${invoice.number} issued.*490\\.40.*still owed`),
    );
    expect((await buyer.get(`/api/jobs/${job.id}/invoice`)).status).toBe(200);
  });

  it('when the PDF is asked for, then it is application/pdf, one page, with the shop, customer, job and totals', async () => {
    const res = await buyer.get(`/api/jobs/${job.id}/invoice.pdf`).buffer(true).parse(asBuffer);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/pdf/);
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pageCount(pdf)).toEqual({ pages: 1, count: 1 });
    const text = pdfText(pdf);
    for (const expected of [
      'Quillmoor Bore & Hone',
      'Odile Farrant',
      `Job ${job.number}`,
      `Invoice ${invoice.number}`,
      '590.40 EUR',
      '-100.00 EUR',
      '490.40 EUR',
      'Still to pay',
      '(added since the estimate)',
    ]) {
      expect({ expected, found: text.includes(expected) }).toEqual({ expected, found: true });
    }
    expect(text.replace(/\n/g, ' ')).toMatch(/rounded half-up/);
  });

  it('when the outbox is sent, then the customer gets text and HTML with the totals and the PDF attached', async () => {
    const mail = await smtp.deliveredTo(email);
    expect(mail?.subject).toContain(invoice.number);
    expect(mail?.subject).toContain('Quillmoor Bore & Hone');
    expect(mail?.text).toMatch(/490\.40 EUR is still to pay/);
    expect(mail?.html).toContain(invoice.number);
    expect(mail?.attachments).toEqual([
      expect.objectContaining({
        filename: `invoice-${invoice.number}.pdf`,
        contentType: 'application/pdf',
      }),
    ]);
    expect(mail?.attachments[0].content.startsWith('%PDF-')).toBe(true);
  });

  it('when staff issue a credit note of 20.00 with a reason, then it has its own number, names the invoice and lowers the balance', async () => {
    const res = await staff.post(`/api/jobs/${job.id}/invoice/credit-notes`, {
      reason: 'Chamfer charged twice on cylinder 2',
      amount: '20.00',
    });
    expect(res.status).toBe(201);
    expect(res.body.number).toMatch(/^CRN-\d{6}$/);
    expect(res.body.invoiceNumber).toBe(invoice.number);
    // Priced as the invoice is (before tax): 20.00 + 20 % tax 4.00 = 24.00 taken off.
    expect(res.body).toEqual(
      expect.objectContaining({ subtotal: '20.00', tax: '4.00', total: '24.00' }),
    );
    const after = (await staff.get(`/api/jobs/${job.id}/invoice`)).body as InvoiceJson;
    expect(after.credited).toBe('24.00');
    expect(after.balance).toBe('466.40');
    expect(after.total).toBe(invoice.total);
    expect(after.creditNotes.map((n) => n.number)).toEqual([res.body.number]);
    const row = await db('credit_notes as c')
      .join('invoices as i', 'i.id', 'c.invoice_id')
      .where('c.number', res.body.number)
      .first('i.number');
    expect(row.number).toBe(invoice.number);
  });

  it('when a credit note would take off more than the invoice still holds, then 400 and nothing is written', async () => {
    const before = await db('credit_notes').count<{ count: string }[]>('* as count');
    const counter = await db('document_counters').where({ series: 'credit_note' }).first();
    // 590.40 − 24.00 = 566.40 is left; 500.00 before tax is 600.00 with it.
    const res = await staff.post(`/api/jobs/${job.id}/invoice/credit-notes`, {
      reason: 'Too much',
      amount: '500.00',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('amount');
    for (const body of [
      {
        reason: 'Both',
        amount: '1.00',
        lines: [{ description: 'x', quantity: '1', unitPrice: '1' }],
      },
      { reason: 'Neither' },
      { reason: 'Negative', amount: '-5.00' },
      { reason: 'NaN', amount: 'NaN' },
      { amount: '5.00' },
    ]) {
      const bad = await staff.post(`/api/jobs/${job.id}/invoice/credit-notes`, body);
      expect({ body, status: bad.status }).toEqual({ body, status: 400 });
    }
    expect(await db('credit_notes').count<{ count: string }[]>('* as count')).toEqual(before);
    expect(await db('document_counters').where({ series: 'credit_note' }).first()).toEqual(counter);
  });

  it('when a machinist tries to issue a credit note, then 403', async () => {
    const res = await machinist.post(`/api/jobs/${job.id}/invoice/credit-notes`, {
      reason: 'Not mine to give',
      amount: '1.00',
    });
    expect(res.status).toBe(403);
  });

  it('when anything tries to change or delete an issued invoice or its lines, then the database refuses', async () => {
    await expect(
      db('invoices').where({ number: invoice.number }).update({ total: '1.00' }),
    ).rejects.toThrow(/never changed/);
    await expect(db('invoice_lines').whereRaw('true').delete()).rejects.toThrow(/never changed/);
    await expect(db('credit_notes').whereRaw('true').update({ reason: 'x' })).rejects.toThrow(
      /never changed/,
    );
  });
});

describe('invoice numbers', () => {
  let family: Awaited<ReturnType<typeof makeFamily>>;
  beforeAll(async () => {
    family = await makeFamily(owner, { cylinders: 1 });
  });

  it('when a hand-back fails after taking its number, then it rolls back, and the next hand-back takes that number', async () => {
    const job = await makeJob(staff, family.id);
    const before = await series();
    armFault('invoices.issue.afterNumber');
    const failed = await staff.post(`/api/jobs/${job.id}/collect`);
    expect(failed.status).toBe(500);
    disarmFaults();
    expect((await db('jobs').where({ id: job.id }).first('state')).state).toBe(job.state);
    expect(await db('invoices').where({ job_id: job.id }).first()).toBeUndefined();
    expect(await series()).toEqual(before);

    const again = await staff.post(`/api/jobs/${job.id}/collect`);
    expect(again.status).toBe(200);
    const inv = await db('invoices').where({ job_id: job.id }).first('seq');
    expect(inv.seq).toBe(before.last + 1);
  });

  it('when twenty jobs are handed back at once, then each gets its own number and the series has no gap', async () => {
    const jobs = [];
    for (let i = 0; i < 20; i++) jobs.push(await makeJob(staff, family.id));
    const results = await Promise.all(jobs.map((j) => staff.post(`/api/jobs/${j.id}/collect`)));
    expect(results.map((r) => r.status)).toEqual(jobs.map(() => 200));
    const numbers = await db('invoices')
      .whereIn(
        'job_id',
        jobs.map((j) => j.id),
      )
      .pluck('number');
    expect(new Set(numbers).size).toBe(20);
    const s = await series();
    // Gapless: the numbers issued are exactly 1 … N, and the counter stands at N.
    expect(s).toEqual({ last: s.count, count: s.count, max: s.count, min: 1 });
  }, 120000);

  it('when a job with no estimate and no parts is handed back, then its invoice is 0.00 and nothing is owed', async () => {
    const job = await makeJob(staff, family.id, { customerEmail: '' });
    expect((await staff.post(`/api/jobs/${job.id}/collect`)).status).toBe(200);
    const res = await owner.get(`/api/jobs/${job.id}/invoice`);
    expect(res.body).toEqual(
      expect.objectContaining({
        lines: [],
        subtotal: '0.00',
        tax: '0.00',
        total: '0.00',
        balance: '0.00',
      }),
    );
  });
});

describe('the PDF of a job with very many lines', () => {
  it('when an invoice has 150 lines and many payments, then the PDF is still one page', async () => {
    const line = (i: number) => ({
      kind: 'other' as const,
      description: `Sundry item number ${i} with a rather long description that must be cut short`,
      quantity: '1',
      unitPrice: '1.00',
      total: '1.00',
      sinceEstimate: false,
    });
    const pdf = await invoicePdf({
      invoice: {
        number: 'INV-000999',
        issuedAt: '2026-03-14T10:00:00.000Z',
        jobNumber: 'J-0001',
        customerName: 'Perrin Oakhollow — ☃ unicode',
        lines: Array.from({ length: 150 }, (_, i) => line(i)),
        subtotal: '150.00',
        tax: '30.00',
        total: '180.00',
        paid: '30.00',
        credited: '0.00',
        balance: '150.00',
        currency: 'EUR',
        taxRate: '20',
        pricesIncludeTax: false,
        estimateVersion: 1,
        estimateApproved: true,
        payments: Array.from({ length: 30 }, () => ({
          purpose: 'balance' as const,
          method: 'cash' as const,
          amount: '1.00',
          paidAt: null,
        })),
        creditNotes: [],
      },
      shopName: 'Quillmoor Bore & Hone',
      shopHours: 'Mon–Fri 8:00–17:00',
      dates: { locale: 'en-GB', timeZone: 'UTC' },
    });
    expect(pageCount(pdf)).toEqual({ pages: 1, count: 1 });
    const text = pdfText(pdf);
    expect(text).toMatch(/more lines, included in the totals/);
    expect(text).toContain('Still to pay');
    expect(text).toContain('150.00 EUR');
    // The em dash is in the built-in fonts' encoding (byte 0x97); the snowman is not, so it reads '?'.
    expect(text).toContain('Perrin Oakhollow \x97 ? unicode');
  });
});
