// The e-mail that carries the estimate to the customer, with the link to the job's public page
// where they agree to it or turn it down, in plain text and HTML with the shop's name.
import { config } from '../config';
import { composeMail, type MailContent } from '../mail/mail-layout';
import { formatMoney } from '../../shared/money';
import type { EstimateJson } from '../../shared/api/money';

export function estimateMail(opts: {
  shopName: string;
  shopHours: string;
  customerName: string;
  jobNumber: string;
  estimate: EstimateJson;
  linkPath: string;
}): MailContent {
  const e = opts.estimate;
  const money = (v: string) => formatMoney(v, e.currency);
  return composeMail({
    shopName: opts.shopName,
    appUrl: config.appUrl,
    subject: `${opts.shopName}: the price for job ${opts.jobNumber}`,
    heading: `The price for job ${opts.jobNumber}`,
    paragraphs: [
      `Dear ${opts.customerName}, here is what we propose to do and what it costs. Nothing is cut until you agree.`,
      'Open the link below to see every line, then agree to the price or turn it down. You do not need an account.',
    ],
    facts: [
      ...e.lines.map((l): [string, string] => [
        `${l.description}${l.quantity === '1' ? '' : ` × ${l.quantity}`}`,
        money(l.total),
      ]),
      [e.pricesIncludeTax ? `Tax included (${e.taxRate} %)` : `Tax (${e.taxRate} %)`, money(e.tax)],
      ['Total', money(e.total)],
    ],
    link: { label: 'See the price and answer', path: opts.linkPath },
    closing: opts.shopHours ? `Questions? Call us or come by: ${opts.shopHours}` : undefined,
  });
}
