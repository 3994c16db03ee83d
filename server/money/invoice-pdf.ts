// The invoice as a one-page printable PDF (A4): the shop, the customer, the job number, every line,
// the totals with the rounding rule said in words, what has been paid and what is still owed.
// A job with very many lines gets a smaller type rather than a second page; past what even that
// holds, the last row says how many lines are left out and where to read them.
import PDFDocument from 'pdfkit';
import type { InvoiceJson } from '../../shared/api/money';
import { currencyDecimals, formatMoney } from '../../shared/money';
import { formatShopDate, type DateContext } from '../../shared/dates';

const PAGE = { width: 595.28, height: 841.89, margin: 48 };
const COLUMNS = { description: 48, quantity: 330, unitPrice: 390, total: 470, end: 547 };
const MIN_STEP = 9;
const MAX_TOTAL_ROWS = 20;

/**
 * The PDF's built-in fonts write only the Windows-1252 characters; anything else (typed by a
 * person) is shown as '?' rather than as a wrong glyph.
 */
const WINANSI_EXTRA = '€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ';
function printable(text: string): string {
  return Array.from(text.normalize('NFC'))
    .map((ch) => {
      const code = ch.codePointAt(0) ?? 0;
      if (code === 9 || code === 10) return ' ';
      if ((code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff)) return ch;
      return WINANSI_EXTRA.includes(ch) ? ch : '?';
    })
    .join('');
}

export interface InvoicePdfInput {
  invoice: InvoiceJson;
  shopName: string;
  shopHours: string;
  dates: DateContext;
}

/** Says the rule the totals follow (shared/estimate-math.ts), in the invoice's own terms. */
export function roundingRule(invoice: InvoiceJson): string {
  const tax = invoice.pricesIncludeTax
    ? `Prices include tax at ${invoice.taxRate} %; the tax shown is the part of the subtotal that is tax, worked out once on the subtotal.`
    : `Tax at ${invoice.taxRate} % is worked out once, on the subtotal.`;
  const unit = currencyDecimals(invoice.currency) === 0 ? 'a whole unit' : 'the cent';
  return `Each line is quantity × unit price, rounded half-up to ${unit}; the subtotal is the sum of the rounded lines. ${tax} Tax is rounded half-up to ${unit}.`;
}

export function invoicePdf(input: InvoicePdfInput): Promise<Buffer> {
  const { invoice: inv } = input;
  const money = (v: string) => printable(formatMoney(v, inv.currency));
  const doc = new PDFDocument({
    size: 'A4',
    margin: PAGE.margin,
    info: { Title: `Invoice ${inv.number}`, Author: printable(input.shopName) },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  // Nothing below may start a second page: every text call is placed by hand and kept short.
  const put = (text: string, x: number, y: number, opts: PDFKit.Mixins.TextOptions = {}) =>
    doc.text(printable(text), x, y, { lineBreak: false, ...opts });

  doc.font('Helvetica-Bold').fontSize(18);
  put(input.shopName, PAGE.margin, PAGE.margin, { width: 330, ellipsis: true });
  doc.font('Helvetica').fontSize(9);
  if (input.shopHours) put(input.shopHours, PAGE.margin, 72, { width: 330, ellipsis: true });
  doc.font('Helvetica-Bold').fontSize(14);
  put(`Invoice ${inv.number}`, 330, PAGE.margin, { width: 217, align: 'right' });
  doc.font('Helvetica').fontSize(10);
  put(`Issued ${formatShopDate(inv.issuedAt, 'date', input.dates)}`, 330, 68, {
    width: 217,
    align: 'right',
  });
  put(`Job ${inv.jobNumber}`, 330, 82, { width: 217, align: 'right' });

  doc.font('Helvetica-Bold').fontSize(10);
  put('For', PAGE.margin, 110);
  doc.font('Helvetica').fontSize(11);
  put(inv.customerName ?? 'Customer at the counter', PAGE.margin, 124, {
    width: 300,
    ellipsis: true,
  });

  const totals: Array<[string, string, boolean?]> = [
    ['Subtotal', money(inv.subtotal)],
    [
      inv.pricesIncludeTax ? `Of which tax (${inv.taxRate} %)` : `Tax (${inv.taxRate} %)`,
      money(inv.tax),
    ],
    ['Total', money(inv.total), true],
    ...inv.creditNotes.map((n): [string, string] => [
      `Credit note ${n.number}`,
      `-${money(n.total)}`,
    ]),
    ...inv.payments.map((p): [string, string] => [
      `${p.purpose === 'deposit' ? 'Deposit' : 'Payment'} received${p.paidAt ? ` ${formatShopDate(p.paidAt, 'date', input.dates)}` : ''}`,
      `-${money(p.amount)}`,
    ]),
    [Number(inv.balance) > 0 ? 'Still to pay' : 'Balance', money(inv.balance), true],
  ];
  // The balance is the last row and always shown.
  const shownTotals =
    totals.length > MAX_TOTAL_ROWS
      ? [...totals.slice(0, MAX_TOTAL_ROWS - 1), totals[totals.length - 1]]
      : totals;

  // Lines: the type shrinks for long jobs so the totals and the rule always fit on this page.
  const foot = PAGE.height - PAGE.margin - 36;
  const room = foot - 12 - shownTotals.length * 15 - 8 - 174;
  const fits = (n: number) => Math.min(14, room / Math.max(n, 1));
  let rows = inv.lines.length;
  if (fits(rows) < MIN_STEP) rows = Math.max(0, Math.floor(room / MIN_STEP) - 1);
  const step = fits(rows + (rows < inv.lines.length ? 1 : 0));
  const size = Math.max(5, Math.min(9, step - 4));
  let y = 160;
  doc.font('Helvetica-Bold').fontSize(9);
  put('What', COLUMNS.description, y);
  put('Qty', COLUMNS.quantity, y, { width: 50, align: 'right' });
  put('Each', COLUMNS.unitPrice, y, { width: 75, align: 'right' });
  put('Amount', COLUMNS.total, y, { width: COLUMNS.end - COLUMNS.total, align: 'right' });
  y += 14;
  doc
    .moveTo(PAGE.margin, y - 3)
    .lineTo(COLUMNS.end, y - 3)
    .lineWidth(0.5)
    .stroke();
  doc.font('Helvetica').fontSize(size);
  for (const line of inv.lines.slice(0, rows)) {
    const what = line.sinceEstimate
      ? `${line.description} (added since the estimate)`
      : line.description;
    put(what, COLUMNS.description, y, { width: 275, ellipsis: true });
    put(line.quantity, COLUMNS.quantity, y, { width: 50, align: 'right' });
    put(money(line.unitPrice), COLUMNS.unitPrice, y, { width: 75, align: 'right' });
    put(money(line.total), COLUMNS.total, y, {
      width: COLUMNS.end - COLUMNS.total,
      align: 'right',
    });
    y += step;
  }
  if (rows < inv.lines.length) {
    put(
      `… and ${inv.lines.length - rows} more lines, included in the totals below (ask us for the full list).`,
      COLUMNS.description,
      y,
      { width: 480 },
    );
    y += step;
  }
  if (inv.lines.length === 0) {
    put('Nothing was charged on this job.', COLUMNS.description, y);
    y += step;
  }

  y += 8;
  for (const [label, value, bold] of shownTotals) {
    doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(10);
    put(label, 300, y, { width: 160, align: 'right' });
    put(value, COLUMNS.total - 20, y, { width: COLUMNS.end - COLUMNS.total + 20, align: 'right' });
    y += 15;
  }

  doc.font('Helvetica').fontSize(8);
  doc.text(printable(roundingRule(inv)), PAGE.margin, foot, {
    width: COLUMNS.end - PAGE.margin,
    height: 34,
    ellipsis: true,
  });
  doc.end();
  return done;
}
