// The e-mail that asks the customer for a payment: how much and what for, the button to pay online
// on the payment service's page, and the link to their job's page, in plain text and HTML.
import { config } from '../config';
import { appLink, composeMail, type MailContent } from '../mail/mail-layout';
import { formatMoney } from '../../shared/money';
import type { PaymentPurpose } from '../../shared/api/money';

export function paymentRequestMail(opts: {
  shopName: string;
  shopHours: string;
  customerName: string;
  jobNumber: string;
  purpose: PaymentPurpose;
  amount: string;
  currency: string;
  payUrl: string;
  pagePath: string;
}): MailContent {
  const money = formatMoney(opts.amount, opts.currency);
  const deposit = opts.purpose === 'deposit';
  return composeMail({
    shopName: opts.shopName,
    appUrl: config.appUrl,
    subject: deposit
      ? `${opts.shopName}: a deposit for job ${opts.jobNumber}`
      : `${opts.shopName}: what is left to pay on job ${opts.jobNumber}`,
    heading: deposit
      ? `A deposit for job ${opts.jobNumber}`
      : `What is left to pay on job ${opts.jobNumber}`,
    paragraphs: [
      deposit
        ? `Dear ${opts.customerName}, before we order and fit the parts for your job we ask for a deposit of ${money}. It counts towards the final price.`
        : `Dear ${opts.customerName}, ${money} is left to pay on your job.`,
      'You can pay online with the link below, or at the counter when you come by. Your job’s page shows what is paid.',
    ],
    facts: [
      ['Amount', money],
      ['Your job’s page', appLink(config.appUrl, opts.pagePath)],
    ],
    link: { label: `Pay ${money} online`, path: opts.payUrl },
    closing: opts.shopHours ? `Questions? Call us or come by: ${opts.shopHours}` : undefined,
  });
}
