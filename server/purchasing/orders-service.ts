// Purchase orders: drafted by hand or from the reorder list, edited while drafting, sent to the
// supplier by e-mail (through the outbox, in the same transaction as the state change), called off.
// Also the jobs that wait on an order line for their piston.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import { displayGtin } from '../../shared/api/catalog';
import {
  ORDER_STATE_LABELS,
  type OrderInput,
  type OrderJson,
  type OrderLineJson,
  type OrderListItemJson,
  type OrderPatch,
  type OrdersQuery,
  type WaitCandidateJson,
  type WaitInput,
  type WaitJson,
} from '../../shared/api/purchasing';
import { D, moneyOut } from '../../shared/purchase-money';
import * as repo from './orders-repository';
import { isUniqueViolation } from '../db/pg-errors';
import type { Page } from '../../shared/api/common';

function fieldError(field: string, message: string): BadRequest {
  return new BadRequest(`${field}: ${message}`, [{ field, message }]);
}

export function waitJson(w: repo.WaitRow): WaitJson {
  return {
    id: w.id,
    jobId: w.job_id,
    jobNumber: w.job_number,
    customerName: w.customer_name,
    cylinder: w.cylinder,
    lineId: w.line_id,
    orderId: w.order_id,
    orderNumber: w.order_number,
    sku: w.sku,
    createdAt: w.created_at.toISOString(),
    fulfilledAt: w.fulfilled_at?.toISOString() ?? null,
    cancelledAt: w.cancelled_at?.toISOString() ?? null,
    unitLabel: w.unit_label,
  };
}

function lineJson(l: repo.LineRow, waits: repo.WaitRow[]): OrderLineJson {
  const gtins = [l.part_gtin, l.supplier_gtin]
    .filter((g): g is string => Boolean(g))
    .map(displayGtin)
    .filter((g, i, all) => all.indexOf(g) === i);
  return {
    id: l.id,
    lineNo: l.line_no,
    partId: l.part_id,
    sku: l.sku,
    description: l.description,
    partKind: l.part_kind,
    familyCode: l.family_code,
    stepLabel: l.step_label,
    supplierSku: l.supplier_sku,
    gtins,
    quantity: l.quantity,
    received: l.received_quantity,
    open: l.quantity - l.received_quantity,
    unitPrice: moneyOut(l.unit_price),
    lineTotal: moneyOut(new D(l.unit_price).times(l.quantity)),
    waits: waits.filter((w) => w.line_id === l.id).map(waitJson),
  };
}

function orderJson(o: repo.OrderRow, lines: repo.LineRow[], waits: repo.WaitRow[]): OrderJson {
  const total = lines.reduce((sum, l) => sum.plus(new D(l.unit_price).times(l.quantity)), new D(0));
  return {
    id: o.id,
    number: o.number,
    supplierId: o.supplier_id,
    supplierName: o.supplier_name,
    supplierEmail: o.supplier_email,
    currency: o.currency,
    state: o.state,
    stateLabel: ORDER_STATE_LABELS[o.state],
    expectedOn: o.expected_on,
    notes: o.notes,
    total: moneyOut(total),
    shipping: moneyOut(o.shipping_cost),
    lines: lines.map((l) => lineJson(l, waits)),
    createdAt: o.created_at.toISOString(),
    createdBy: o.created_by_name,
    sentAt: o.sent_at?.toISOString() ?? null,
    closedAt: o.closed_at?.toISOString() ?? null,
    sendError: o.send_error,
  };
}

export async function getOrder(id: string, k: Knex = db): Promise<OrderJson> {
  const order = await repo.findOrder(id, k);
  if (!order) throw new NotFound('That purchase order');
  const lines = await repo.orderLines([id], k);
  const waits = await repo.listWaits({ lineIds: lines.map((l) => l.id), active: false }, k);
  return orderJson(order, lines, waits);
}

export async function listOrders(q: OrdersQuery, k: Knex = db): Promise<Page<OrderListItemJson>> {
  const { rows, total } = await repo.listOrders(q, k);
  return {
    items: rows.map((r) => ({
      id: r.id,
      number: r.number,
      supplierId: r.supplier_id,
      supplierName: r.supplier_name,
      currency: r.currency,
      state: r.state,
      stateLabel: ORDER_STATE_LABELS[r.state],
      expectedOn: r.expected_on,
      lines: r.lines,
      quantity: r.quantity,
      received: r.received,
      total: moneyOut(r.total),
      createdAt: r.created_at.toISOString(),
      sentAt: r.sent_at?.toISOString() ?? null,
    })),
    total,
  };
}

/** Lines must name active, countable parts, each once. */
async function checkLines(lines: OrderInput['lines'], k: Knex): Promise<void> {
  const parts = await repo.partsByIds(
    lines.map((l) => l.partId),
    k,
  );
  const seen = new Set<string>();
  lines.forEach((l, i) => {
    const part = parts.find((p) => p.id === l.partId);
    if (!part) throw fieldError(`lines.${i}.partId`, 'no part has this id');
    if (part.kind === 'kit') {
      throw fieldError(`lines.${i}.partId`, `${part.sku} is a kit: order its parts`);
    }
    if (!part.active) throw fieldError(`lines.${i}.partId`, `${part.sku} is no longer stocked`);
    if (seen.has(l.partId)) {
      throw fieldError(
        `lines.${i}.partId`,
        `${part.sku} is already on line ${[...seen].indexOf(l.partId) + 1}; change its quantity instead`,
      );
    }
    seen.add(l.partId);
  });
}

async function requireSupplier(id: string, k: Knex): Promise<repo.SupplierRef> {
  const supplier = await repo.findSupplier(id, k);
  if (!supplier) throw fieldError('supplierId', 'no supplier has this id');
  if (!supplier.active) throw fieldError('supplierId', `${supplier.name} is marked inactive`);
  return supplier;
}

export async function insertOrderWithLines(
  trx: Knex,
  actorId: string,
  supplier: repo.SupplierRef,
  input: {
    lines: OrderInput['lines'];
    expectedOn?: string | null;
    notes?: string;
    currency?: string;
    shipping?: string;
  },
  action: string,
): Promise<string> {
  const id = await repo.insertOrder(trx, {
    supplier_id: supplier.id,
    currency: input.currency ?? supplier.currency,
    expected_on: input.expectedOn ?? null,
    notes: input.notes ?? '',
    created_by: actorId,
    // In the supplier's currency, as its usual shipping is; an order in another one starts at 0.
    shipping_cost:
      input.shipping ??
      ((input.currency ?? supplier.currency) === supplier.currency ? supplier.shipping_cost : '0'),
  });
  await repo.replaceLines(
    trx,
    id,
    input.lines.map((l) => ({ part_id: l.partId, quantity: l.quantity, unit_price: l.unitPrice })),
  );
  await recordAudit(trx, {
    userId: actorId,
    action,
    entity: 'purchase_order',
    entityId: id,
    after: { supplierId: supplier.id, lines: input.lines, expectedOn: input.expectedOn ?? null },
  });
  return id;
}

export async function createOrder(
  actorId: string,
  input: OrderInput,
  k: Knex = db,
): Promise<OrderJson> {
  const supplier = await requireSupplier(input.supplierId, k);
  await checkLines(input.lines, k);
  const id = await k.transaction((trx) =>
    insertOrderWithLines(trx, actorId, supplier, input, 'purchase_order.create'),
  );
  return getOrder(id, k);
}

export async function lockDrafting(trx: Knex, id: string, doing: string): Promise<repo.OrderRow> {
  const order = await repo.lockOrder(trx, id);
  if (!order) throw new NotFound('That purchase order');
  if (order.state !== 'drafting') {
    throw new Conflict(
      `${order.number} is ${ORDER_STATE_LABELS[order.state].toLowerCase()}: only an order being drafted can be ${doing}.`,
      'order_not_drafting',
    );
  }
  return order;
}

export async function patchOrder(
  actorId: string,
  id: string,
  patch: OrderPatch,
  k: Knex = db,
): Promise<OrderJson> {
  if (patch.lines) await checkLines(patch.lines, k);
  await k.transaction(async (trx) => {
    const order = await lockDrafting(trx, id, 'changed');
    if (patch.lines)
      await repo.replaceLines(
        trx,
        id,
        patch.lines.map((l) => ({
          part_id: l.partId,
          quantity: l.quantity,
          unit_price: l.unitPrice,
        })),
      );
    await repo.updateOrder(trx, id, {
      ...(patch.expectedOn !== undefined ? { expected_on: patch.expectedOn } : {}),
      ...(patch.notes !== undefined ? { notes: patch.notes } : {}),
      ...(patch.shipping !== undefined ? { shipping_cost: patch.shipping } : {}),
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'purchase_order.update',
      entity: 'purchase_order',
      entityId: id,
      before: { number: order.number, expectedOn: order.expected_on, notes: order.notes },
      after: patch,
    });
  });
  return getOrder(id, k);
}

export async function cancelOrder(actorId: string, id: string, k: Knex = db): Promise<OrderJson> {
  await k.transaction(async (trx) => {
    const order = await repo.lockOrder(trx, id);
    if (!order) throw new NotFound('That purchase order');
    if (order.state === 'all_in' || order.state === 'called_off') {
      throw new Conflict(
        `${order.number} is ${ORDER_STATE_LABELS[order.state].toLowerCase()}: there is nothing left to call off.`,
        'order_closed',
      );
    }
    const waits = await repo.cancelWaitsOfOrder(trx, id);
    await repo.updateOrder(trx, id, { state: 'called_off', closed_at: trx.fn.now() });
    await recordAudit(trx, {
      userId: actorId,
      action: 'purchase_order.cancel',
      entity: 'purchase_order',
      entityId: id,
      before: { state: order.state },
      after: { state: 'called_off', waitsCalledOff: waits },
    });
  });
  return getOrder(id, k);
}

/** A scanned GTIN → the open order lines it can be received against. */
// ---- Waits ------------------------------------------------------------------------------------

export async function listWaits(
  f: { jobId?: string; lineId?: string; active: boolean },
  k: Knex = db,
): Promise<{ items: WaitJson[]; total: number }> {
  const rows = await repo.listWaits(f, k);
  return { items: rows.map(waitJson), total: rows.length };
}

/** A job's cylinder starts waiting for the piston on an order line. */
export async function addWait(actorId: string, input: WaitInput, k: Knex = db): Promise<WaitJson> {
  const line = await repo.lineWithOrder(input.lineId, k);
  if (!line) throw fieldError('lineId', 'no order line has this id');
  if (line.order_state === 'all_in' || line.order_state === 'called_off') {
    throw new Conflict(`${line.order_number} is closed: wait on an open order.`, 'order_closed');
  }
  if (line.part_kind !== 'piston') {
    throw fieldError(
      'lineId',
      `${line.sku} is not a piston: only a piston can be held for a cylinder`,
    );
  }
  if (line.received_quantity >= line.quantity) {
    throw new Conflict(
      `Line ${line.line_no} of ${line.order_number} is received in full.`,
      'line_received',
    );
  }
  const job = await repo.jobForWait(input.jobId, k);
  if (!job) throw fieldError('jobId', 'no job has this id');
  if (job.state === 'handed_back' || job.state === 'called_off') {
    throw new Conflict(`Job ${job.number} is closed.`, 'job_closed');
  }
  if (input.cylinder > job.cylinders) {
    throw fieldError(
      'cylinder',
      `job ${job.number} has ${job.cylinders} cylinder${job.cylinders === 1 ? '' : 's'}`,
    );
  }
  if (job.family_id !== line.family_id) {
    throw fieldError('lineId', `${line.sku} is for another engine family than job ${job.number}`);
  }
  const cylinder = await repo.cylinderState(job.id, input.cylinder, k);
  if (!cylinder)
    throw fieldError('cylinder', `cylinder ${input.cylinder} of job ${job.number} is not recorded`);
  if (cylinder.cut_at)
    throw new Conflict(`Cylinder ${input.cylinder} of job ${job.number} is already cut.`);
  if (cylinder.piston_held) {
    throw new Conflict(
      `Cylinder ${input.cylinder} of job ${job.number} already has a piston held.`,
      'already_held',
    );
  }
  if (cylinder.chosen_step_id && cylinder.chosen_step_id !== line.step_id) {
    throw fieldError('lineId', `${line.sku} is not the step chosen for cylinder ${input.cylinder}`);
  }
  let id: string;
  try {
    id = await k.transaction(async (trx) => {
      const newId = await repo.insertWait(trx, {
        line_id: line.id,
        job_id: job.id,
        cylinder: input.cylinder,
        created_by: actorId,
      });
      await recordAudit(trx, {
        userId: actorId,
        action: 'order_wait.create',
        entity: 'order_line_wait',
        entityId: newId,
        after: { jobId: job.id, cylinder: input.cylinder, lineId: line.id },
      });
      return newId;
    });
  } catch (e) {
    if (isUniqueViolation(e)) {
      throw new Conflict(
        `Cylinder ${input.cylinder} of job ${job.number} is already waiting on an order line.`,
        'already_waiting',
      );
    }
    throw e;
  }
  const row = await repo.findWait(id, k);
  if (!row) throw new NotFound('The wait');
  return waitJson(row);
}

export async function cancelWait(actorId: string, id: string, k: Knex = db): Promise<void> {
  await k.transaction(async (trx) => {
    const wait = await repo.findWait(id, trx);
    if (!wait) throw new NotFound('That wait');
    if (!(await repo.cancelWait(trx, id))) {
      throw new Conflict(
        'This wait is already over (its piston came in, or it was called off).',
        'wait_over',
      );
    }
    await recordAudit(trx, {
      userId: actorId,
      action: 'order_wait.cancel',
      entity: 'order_line_wait',
      entityId: id,
      before: waitJson(wait),
    });
  });
}

export async function waitCandidates(
  lineId: string,
  k: Knex = db,
): Promise<{ items: WaitCandidateJson[]; total: number }> {
  const line = await repo.lineWithOrder(lineId, k);
  if (!line) throw new NotFound('That order line');
  if (line.part_kind !== 'piston' || !line.family_id || !line.step_id)
    return { items: [], total: 0 };
  const rows = await repo.waitCandidates(line.family_id, line.step_id, k);
  return {
    items: rows.map((r) => ({
      jobId: r.job_id,
      jobNumber: r.job_number,
      customerName: r.customer_name,
      cylinder: r.cylinder,
      createdAt: r.created_at.toISOString(),
    })),
    total: rows.length,
  };
}
