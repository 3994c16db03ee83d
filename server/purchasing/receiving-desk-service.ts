// The one receiving page's receipt. A delivery of a part that is on order is taken in against the
// order line (the line's count and the order's state move on, arriving pistons go to the jobs
// waiting on it, the cost is the order's price); one nobody ordered goes into stock at the cost
// typed. Either way the page gets the stock receipt back, for the labels.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { BadRequest } from '../errors';
import { ORDER_STATE_LABELS } from '../../shared/api/purchasing';
import type { DeskReceiptInput, DeskReceiptJson } from '../../shared/api/stock';
import { receive } from '../stock/stock-service';
import { lineOwner } from './open-lines-repository';
import { receiveWithStock } from './receiving-service';

function fieldError(field: string, message: string): BadRequest {
  return new BadRequest(`${field}: ${message}`, [{ field, message }]);
}

/** An order receipt's "lines.0.quantity" is this page's "quantity"; "lines.0.lineId" its line. */
function asDeskError(e: unknown): unknown {
  if (!(e instanceof BadRequest)) return e;
  const details = e.details.map((d) => ({
    ...d,
    field: d.field
      ?.replace(/^lines\.0\.lineId$/, 'orderLineId')
      .replace(/^lines\.0\./, '')
      .replace(/^lines\.0$/, 'orderLineId'),
  }));
  const first = details[0];
  return new BadRequest(first?.field ? `${first.field}: ${first.message}` : e.message, details);
}

export async function receiveAtDesk(
  actorId: string,
  input: DeskReceiptInput,
  k: Knex = db,
): Promise<DeskReceiptJson> {
  const { orderLineId, unitCost, ...rest } = input;
  if (!orderLineId) {
    if (unitCost === undefined) throw fieldError('unitCost', 'give the unit cost paid');
    const stock = await receive(actorId, { ...rest, unitCost }, k);
    return { ...stock, order: null, holds: [] };
  }
  const owner = await lineOwner(orderLineId, k);
  if (!owner) throw fieldError('orderLineId', 'no order line has this id');
  if (owner.part_id !== input.partId) {
    throw fieldError('orderLineId', `line ${owner.line_no} of that order is for another part`);
  }
  let answer;
  try {
    answer = await receiveWithStock(
      actorId,
      owner.order_id,
      {
        lines: [
          { lineId: orderLineId, quantity: input.quantity, units: input.units, binId: input.binId },
        ],
        note: input.note,
      },
      k,
    );
  } catch (e) {
    throw asDeskError(e);
  }
  const line = answer.order.lines.find((l) => l.id === orderLineId);
  const stock = answer.stockReceipts[0];
  return {
    ...stock,
    order: {
      id: answer.order.id,
      number: answer.order.number,
      state: answer.order.state,
      stateLabel: ORDER_STATE_LABELS[answer.order.state],
      lineNo: owner.line_no,
      received: line?.received ?? 0,
      quantity: line?.quantity ?? 0,
    },
    holds: answer.holds.map((h) => ({
      jobNumber: h.jobNumber,
      cylinder: h.cylinder,
      unitLabel: h.unitLabel,
    })),
  };
}
