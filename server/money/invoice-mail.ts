// The e-mail that carries the invoice to the customer at hand-back: the lines and totals in plain
// text and HTML, what is still owed, and the invoice itself as a PDF attachment. A credit note gets
// a short e-mail of its own that names the invoice it corrects.
import { config } from '../config';
import { composeMail, type MailContent } from '../mail/mail-layout';
import type { MailAttachment } from '../mail/outbox';
import { formatMoney } from '../../shared/money';
import { compareMoney } from '../../shared/estimate-math';
import type { CreditNoteJson, InvoiceJson } from '../../shared/api/money';

interface ShopWords {
  shopName: string;
  shopHours: string;
}

export function invoiceMail(
  shop: ShopWords,
  invoice: InvoiceJson,
  pdf: Buffer,
): MailContent & { attachments: MailAttachment[] } {
  const money = (v: string) => formatMoney(v, invoice.currency);
  const owed = compareMoney(invoice.balance, '0') > 0;
  const content = composeMail({
    shopName: shop.shopName,
    appUrl: config.appUrl,
    subject: `${shop.shopName}: invoice ${invoice.number} for job ${invoice.jobNumber}`,
    heading: `Invoice ${invoice.number} for job ${invoice.jobNumber}`,
    paragraphs: [
      `Dear ${invoice.customerName ?? 'customer'}, thank you for collecting your job. Here is what it came to; the invoice is attached as a PDF for your records.`,
      owed
        ? `${money(invoice.balance)} is still to pay. Please settle it at the counter or by bank transfer, quoting ${invoice.number}.`
        : 'Nothing is left to pay: thank you.',
    ],
    facts: [
      ...invoice.lines.map((l): [string, string] => [
        `${l.description}${l.quantity === '1' ? '' : ` × ${l.quantity}`}`,
        money(l.total),
      ]),
      [
        invoice.pricesIncludeTax
          ? `Tax included (${invoice.taxRate} %)`
          : `Tax (${invoice.taxRate} %)`,
        money(invoice.tax),
      ],
      ['Total', money(invoice.total)],
      ['Paid so far', money(invoice.paid)],
      [owed ? 'Still to pay' : 'Balance', money(invoice.balance)],
    ],
    closing: shop.shopHours ? `Questions? Call us or come by: ${shop.shopHours}` : undefined,
  });
  return {
    ...content,
    attachments: [
      {
        filename: `invoice-${invoice.number}.pdf`,
        contentType: 'application/pdf',
        content: pdf.toString('base64'),
        encoding: 'base64',
      },
    ],
  };
}

export function creditNoteMail(
  shop: ShopWords,
  note: CreditNoteJson,
  invoice: InvoiceJson,
): MailContent {
  const money = (v: string) => formatMoney(v, note.currency);
  return composeMail({
    shopName: shop.shopName,
    appUrl: config.appUrl,
    subject: `${shop.shopName}: credit note ${note.number} on invoice ${note.invoiceNumber}`,
    heading: `Credit note ${note.number}`,
    paragraphs: [
      `Dear ${invoice.customerName ?? 'customer'}, we have corrected invoice ${note.invoiceNumber} for job ${invoice.jobNumber}: ${note.reason}`,
      compareMoney(invoice.balance, '0') > 0
        ? `Still to pay on the invoice: ${money(invoice.balance)}.`
        : compareMoney(invoice.balance, '0') < 0
          ? `You have paid ${money(invoice.balance.replace('-', ''))} more than you now owe; we will pay it back to you.`
          : 'Nothing is left to pay on the invoice.',
    ],
    facts: [
      ...note.lines.map((l): [string, string] => [
        `${l.description}${l.quantity === '1' ? '' : ` × ${l.quantity}`}`,
        money(l.total),
      ]),
      ['Taken off the invoice', money(note.total)],
    ],
    closing: shop.shopHours ? `Questions? Call us or come by: ${shop.shopHours}` : undefined,
  });
}
