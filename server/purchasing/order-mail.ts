// The e-mail purchasing sends: the order to the supplier (lines as a CSV attachment), and the news
// that a piston a job waited for has arrived and is held for it, to the machinists and the customer.
import { stringify } from 'csv-stringify/sync';
import { config } from '../config';
import { composeMail, type MailContent } from '../mail/mail-layout';
import type { MailAttachment } from '../mail/outbox';
import { neutralizeCell } from '../../shared/csv-safety';
import type { LengthJson } from '../../shared/lengths';
import { D, moneyOut } from '../../shared/purchase-money';
import type { LineRow, OrderRow } from './orders-repository';
import { formatShopDate, type DateContext } from '../../shared/dates';

export function orderCsv(order: OrderRow, lines: LineRow[]): string {
  return stringify([
    [
      'line',
      'supplier_sku',
      'our_sku',
      'description',
      'quantity',
      'unit_price',
      'currency',
      'line_total',
    ],
    ...lines.map((l) => [
      String(l.line_no),
      neutralizeCell(l.supplier_sku ?? ''),
      neutralizeCell(l.sku),
      neutralizeCell(l.description),
      String(l.quantity),
      moneyOut(l.unit_price),
      order.currency,
      moneyOut(new D(l.unit_price).times(l.quantity)),
    ]),
  ]);
}

export function orderMail(
  shopName: string,
  order: OrderRow,
  lines: LineRow[],
  expectedOn: string | null,
  dates: DateContext,
): MailContent & { attachments: MailAttachment[] } {
  const total = lines.reduce((sum, l) => sum.plus(new D(l.unit_price).times(l.quantity)), new D(0));
  const content = composeMail({
    shopName,
    appUrl: config.appUrl,
    subject: `Purchase order ${order.number} from ${shopName}`,
    heading: `Purchase order ${order.number}`,
    paragraphs: [
      `Please supply the ${lines.length === 1 ? 'line' : `${lines.length} lines`} below; the same lines are attached as a CSV file.`,
      ...lines.map(
        (l) =>
          `${l.line_no}. ${l.quantity} × ${l.supplier_sku ?? l.sku} — ${l.description} at ${moneyOut(l.unit_price)} ${order.currency}`,
      ),
      ...(order.notes ? [`Note: ${order.notes}`] : []),
      'Please quote our order number on the delivery note and reply if anything cannot be supplied.',
    ],
    facts: [
      ['Order', order.number],
      ['Total', `${moneyOut(total)} ${order.currency}`],
      // Written the shop's way; the attached CSV keeps the ISO day for the supplier's systems.
      ['Wanted by', expectedOn ? formatShopDate(expectedOn, 'date', dates) : 'as soon as possible'],
    ],
  });
  return {
    ...content,
    attachments: [
      { filename: `${order.number}.csv`, contentType: 'text/csv', content: orderCsv(order, lines) },
    ],
  };
}

export interface ArrivedPiston {
  cylinder: number;
  unitLabel: string;
  sku: string;
  skirt: LengthJson | null;
}

/** Everything one delivery brought for one waiting job. */
export interface JobArrival {
  jobId: string;
  jobNumber: string;
  customerName: string;
  orderNumber: string;
  pistons: ArrivedPiston[];
}

function skirtText(skirt: LengthJson | null): string {
  return skirt === null ? 'not measured' : `${skirt.mm} mm (${skirt.in} in)`;
}

function cylinderList(pistons: ArrivedPiston[]): string {
  const ns = pistons.map((p) => String(p.cylinder));
  return ns.length === 1 ? ns[0] : `${ns.slice(0, -1).join(', ')} and ${ns[ns.length - 1]}`;
}

export function arrivalMailForMachinist(shopName: string, a: JobArrival): MailContent {
  const one = a.pistons.length === 1;
  return composeMail({
    shopName,
    appUrl: config.appUrl,
    subject: one
      ? `Piston in for job ${a.jobNumber}: ${a.pistons[0].unitLabel} held for cylinder ${a.pistons[0].cylinder}`
      : `${a.pistons.length} pistons in for job ${a.jobNumber}: held for cylinders ${cylinderList(a.pistons)}`,
    heading: `What job ${a.jobNumber} waited for has arrived`,
    paragraphs: [
      `Order ${a.orderNumber} came in, and ${one ? 'a piston is' : 'pistons are'} now held for job ${a.jobNumber} (${a.customerName}):`,
      ...a.pistons.map(
        (p) =>
          `Cylinder ${p.cylinder}: ${p.unitLabel} (${p.sku}), measured skirt ${skirtText(p.skirt)}.`,
      ),
      'Check each skirt against the bore sheet before cutting; the machine maker\u2019s instructions come first.',
    ],
    link: { label: 'Open the job', path: `/jobs/${a.jobId}` },
  });
}

export function arrivalMailForCustomer(
  shopName: string,
  shopHours: string,
  a: JobArrival,
): MailContent {
  const one = a.pistons.length === 1;
  return composeMail({
    shopName,
    appUrl: config.appUrl,
    subject: `${shopName}: the parts for job ${a.jobNumber} have arrived`,
    heading: `Good news about job ${a.jobNumber}`,
    paragraphs: [
      `Dear ${a.customerName}, the ${one ? 'piston' : 'pistons'} your job was waiting for ${one ? 'has' : 'have'} arrived and ${one ? 'is' : 'are'} set aside for it. We can now carry on with the work.`,
      'We will let you know when everything is ready to collect.',
    ],
    facts: [['Job number', a.jobNumber]],
    closing: shopHours ? `Our hours: ${shopHours}` : undefined,
  });
}
