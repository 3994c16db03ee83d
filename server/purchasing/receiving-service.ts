// Receiving a delivery against a purchase order, in one transaction: each line goes into stock
// through the stock receipt (pistons one by one with their measured skirts), the line's received
// count and the order's state move on, every arriving measured piston is held for the oldest job
// waiting on that line, and the machinists (and the customer, when the job has an address) get an
// e-mail through the outbox.
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { AppError, BadRequest, Conflict, NotFound } from '../errors';
import { placeHold } from '../jobs/holds-service';
import { logger } from '../logger';
import { enqueueMail } from '../mail/outbox';
import { getSettings } from '../settings/settings-service';
import { createBin, receive } from '../stock/stock-service';
import { faultPoint } from '../testing-faults';
import {
  ORDER_STATE_LABELS,
  type OrderReceiptJson,
  type ReceiptLinesInput,
  type ReceivedHoldJson,
} from '../../shared/api/purchasing';
import type { ReceiptJson, UnitJson } from '../../shared/api/stock';
import { D } from '../../shared/purchase-money';
import { shippingPerUnit } from '../../shared/shipping-share';
import { arrivalMailForCustomer, arrivalMailForMachinist, type JobArrival } from './order-mail';
import * as repo from './orders-repository';
import * as receipts from './receiving-repository';
import { getOrder } from './orders-service';

/** Where deliveries go when nobody says where and the part has no place yet. */
export const ARRIVALS_BIN = 'ARRIVALS';

function fieldError(field: string, message: string): BadRequest {
  return new BadRequest(`${field}: ${message}`, [{ field, message }]);
}

/** A stock error about "units.0.skirt" becomes one about "lines.2.units.0.skirt". */
function underLine(e: unknown, i: number): unknown {
  if (!(e instanceof BadRequest)) return e;
  const details = e.details.map((d) => ({
    ...d,
    field: d.field ? `lines.${i}.${d.field}` : `lines.${i}`,
  }));
  const first = details[0];
  return new BadRequest(first ? `${first.field}: ${first.message}` : e.message, details);
}

async function arrivalsBin(actorId: string, k: Knex): Promise<string> {
  const existing = await repo.binByCode(ARRIVALS_BIN, k);
  if (existing) return existing;
  try {
    return (await createBin(actorId, { code: ARRIVALS_BIN, name: 'Deliveries not yet shelved' }, k))
      .id;
  } catch (e) {
    // Another receipt made it first.
    const again = await repo.binByCode(ARRIVALS_BIN, k);
    if (again) return again;
    throw e;
  }
}

function requireOpen(order: repo.OrderRow): void {
  if (order.state === 'sent_out' || order.state === 'partly_in') return;
  throw new Conflict(
    order.state === 'drafting'
      ? `${order.number} has not been sent yet: send it before receiving against it.`
      : `${order.number} is ${ORDER_STATE_LABELS[order.state].toLowerCase()}: nothing more can be received against it.`,
    'order_not_open',
  );
}

interface Planned {
  index: number;
  line: repo.LineRow;
  quantity: number;
  units: { skirt?: number | null }[] | undefined;
  binId: string | null;
}

export async function receiveAgainstOrder(
  actorId: string,
  orderId: string,
  input: ReceiptLinesInput,
  k: Knex = db,
): Promise<OrderReceiptJson> {
  const { stockReceipts: _stock, ...answer } = await receiveWithStock(actorId, orderId, input, k);
  return answer;
}

/** As receiveAgainstOrder, with each line's stock receipt too (for the one receiving page). */
export async function receiveWithStock(
  actorId: string,
  orderId: string,
  input: ReceiptLinesInput,
  k: Knex = db,
): Promise<OrderReceiptJson & { stockReceipts: ReceiptJson[] }> {
  const order = await repo.findOrder(orderId, k);
  if (!order) throw new NotFound('That purchase order');
  requireOpen(order);
  const lines = await repo.orderLines([orderId], k);
  const seen = new Set<string>();
  const planned: Planned[] = input.lines.map((l, i) => {
    const line = lines.find((x) => x.id === l.lineId);
    if (!line) throw fieldError(`lines.${i}.lineId`, `not a line of ${order.number}`);
    if (seen.has(l.lineId))
      throw fieldError(`lines.${i}.lineId`, `line ${line.line_no} is given twice`);
    seen.add(l.lineId);
    const open = line.quantity - line.received_quantity;
    if (l.quantity > open) {
      throw fieldError(
        `lines.${i}.quantity`,
        open === 0
          ? `line ${line.line_no} (${line.sku}) is already received in full`
          : `only ${open} of line ${line.line_no} (${line.sku}) are still to come; receive the rest as a plain stock receipt`,
      );
    }
    if (line.part_kind === 'piston' && (l.units?.length ?? 0) !== l.quantity) {
      throw fieldError(
        `lines.${i}.units`,
        `give one entry per piston: ${l.quantity} for a quantity of ${l.quantity} (leave the skirt out for a piston still to measure)`,
      );
    }
    return {
      index: i,
      line,
      quantity: l.quantity,
      units: l.units,
      binId: l.binId ?? input.binId ?? null,
    };
  });

  // Stock is kept at cost in the home currency: the order's prices are converted at the owner's rate.
  const settings = await getSettings(k);
  let rate = new D(1);
  if (order.currency !== settings.homeCurrency) {
    const kept = await repo.rateFor(order.currency, k);
    if (!kept) {
      throw new Conflict(
        `There is no exchange rate for ${order.currency}: the owner adds one under exchange rates, then receive again.`,
        'no_rate',
      );
    }
    rate = new D(kept);
  }
  for (const p of planned) {
    p.binId ??= (await repo.usualBin(p.line.part_id, k)) ?? (await arrivalsBin(actorId, k));
  }
  // Each unit costs its price plus its share of the order's shipping, in the home currency.
  const ordered = lines.map((l) => ({ quantity: l.quantity, unitPrice: l.unit_price }));
  const unitCostOf = (line: repo.LineRow) =>
    new D(line.unit_price)
      .plus(
        shippingPerUnit(ordered, order.shipping_cost, line.unit_price, settings.shippingAllocation),
      )
      .times(rate)
      .toDecimalPlaces(4)
      .toFixed(4);
  const machinists = await repo.machinistAddresses(k);

  const receiptId = randomUUID();
  return k.transaction(async (trx) => {
    const locked = await repo.lockOrder(trx, orderId);
    if (!locked) throw new NotFound('That purchase order');
    requireOpen(locked);
    await repo.lockLines(trx, orderId);
    await receipts.insertReceipt(trx, {
      id: receiptId,
      order_id: orderId,
      received_by: actorId,
      note: input.note ?? '',
    });

    const received: UnitJson[] = [];
    const stockReceipts: ReceiptJson[] = [];
    const holds: ReceivedHoldJson[] = [];
    const notHeld: OrderReceiptJson['notHeld'] = [];
    const arrivals = new Map<string, JobArrival & { tellCustomer: string | null }>();
    for (const p of planned) {
      let stock;
      try {
        stock = await receive(
          actorId,
          {
            partId: p.line.part_id,
            quantity: p.quantity,
            binId: p.binId as string,
            unitCost: unitCostOf(p.line),
            note: `${locked.number} line ${p.line.line_no}${input.note ? `: ${input.note}` : ''}`,
            units: p.line.part_kind === 'piston' ? p.units : undefined,
          },
          trx,
        );
      } catch (e) {
        throw underLine(e, p.index);
      }
      // The database CHECK refuses more received than ordered if two deliveries raced.
      await receipts.addReceived(trx, p.line.id, p.quantity);
      await receipts.insertReceiptLine(trx, {
        receipt_id: receiptId,
        line_id: p.line.id,
        quantity: p.quantity,
        stock_receipt_id: stock.receiptId,
      });
      received.push(...stock.units);
      stockReceipts.push(stock);
      faultPoint('purchasing.receipt.afterStock');

      if (p.line.part_kind !== 'piston') continue;
      const waits = await repo.lockActiveWaits(trx, p.line.id);
      const measured = stock.units.filter((u) => u.skirt !== null);
      let next = 0;
      for (const wait of waits) {
        const job = await repo.jobForWait(wait.job_id, trx);
        if (!job) continue;
        if (next >= measured.length) {
          if (stock.units.length > measured.length) {
            notHeld.push({
              jobNumber: job.number,
              cylinder: wait.cylinder,
              reason:
                'The piston for it came in unmeasured: measure it, then hold it from the job.',
            });
          }
          continue;
        }
        const unit = measured[next];
        try {
          const hold = await placeHold(
            actorId,
            job.id,
            { cylinder: wait.cylinder, unitId: unit.id },
            'mm',
            trx,
          );
          await repo.fulfillWait(trx, wait.id, hold.id);
          next++;
          holds.push({
            jobId: job.id,
            jobNumber: job.number,
            cylinder: wait.cylinder,
            unitId: unit.id,
            unitLabel: unit.label,
            skirt: unit.skirt,
          });
          const arrival = arrivals.get(job.id) ?? {
            jobId: job.id,
            jobNumber: job.number,
            customerName: job.customer_name,
            orderNumber: locked.number,
            pistons: [],
            tellCustomer: job.notify_customer ? job.customer_email : null,
          };
          arrival.pistons.push({
            cylinder: wait.cylinder,
            unitLabel: unit.label,
            sku: p.line.sku,
            skirt: unit.skirt,
          });
          arrivals.set(job.id, arrival);
        } catch (e) {
          // The hold was refused (the job moved on, the cylinder got a piston another way): the
          // wait stays open and the piston stays free for the next job in line.
          if (!(e instanceof AppError)) throw e;
          logger.info(
            { waitId: wait.id, reason: e.message },
            'arriving piston not held for a waiting job',
          );
          notHeld.push({ jobNumber: job.number, cylinder: wait.cylinder, reason: e.message });
        }
      }
    }

    // One message per waiting job, whatever number of its cylinders this delivery served.
    for (const arrival of arrivals.values()) {
      for (const to of machinists) {
        await enqueueMail(trx, { to, ...arrivalMailForMachinist(settings.shopName, arrival) });
      }
      if (arrival.tellCustomer) {
        await enqueueMail(trx, {
          to: arrival.tellCustomer,
          ...arrivalMailForCustomer(settings.shopName, settings.shopHours, arrival),
        });
      }
    }

    const totals = await repo.lineTotals(trx, orderId);
    const complete = totals.received >= totals.quantity;
    await repo.updateOrder(trx, orderId, {
      state: complete ? 'all_in' : 'partly_in',
      closed_at: complete ? trx.fn.now() : null,
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'purchase_order.receipt',
      entity: 'purchase_order',
      entityId: orderId,
      after: {
        receiptId,
        lines: planned.map((p) => ({ lineId: p.line.id, quantity: p.quantity })),
        holds: holds.map((h) => ({ jobId: h.jobId, cylinder: h.cylinder, unitId: h.unitId })),
      },
    });
    return {
      receiptId,
      order: await getOrder(orderId, trx),
      units: received.map((u) => ({
        id: u.id,
        label: u.label,
        partId: u.partId,
        skirt: u.skirt,
      })),
      holds,
      notHeld,
      stockReceipts,
    };
  });
}
