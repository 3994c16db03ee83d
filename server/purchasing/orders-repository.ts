// Queries for purchase orders, their lines and receipts, and jobs waiting on order lines.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { lockRow, updateRow } from '../db/rows';
import type { OrderState, OrdersQuery } from '../../shared/api/purchasing';
export * from './waits-repository';

export interface OrderRow {
  id: string;
  number: string;
  supplier_id: string;
  supplier_name: string;
  supplier_email: string | null;
  supplier_lead_days: number;
  currency: string;
  state: OrderState;
  expected_on: string | null;
  notes: string;
  created_at: Date;
  created_by_name: string | null;
  sent_at: Date | null;
  closed_at: Date | null;
  send_error: string | null;
  shipping_cost: string;
}

export interface LineRow {
  id: string;
  order_id: string;
  line_no: number;
  part_id: string;
  sku: string;
  description: string;
  part_kind: string;
  family_id: string | null;
  step_id: string | null;
  family_code: string | null;
  step_label: string | null;
  part_gtin: string | null;
  supplier_sku: string | null;
  supplier_gtin: string | null;
  quantity: number;
  unit_price: string;
  received_quantity: number;
}

function ordersBase(k: Knex) {
  return k('purchase_orders as o')
    .join('suppliers as s', 's.id', 'o.supplier_id')
    .leftJoin('users as u', 'u.id', 'o.created_by')
    .select(
      'o.id',
      'o.number',
      'o.supplier_id',
      's.name as supplier_name',
      's.email as supplier_email',
      's.lead_days as supplier_lead_days',
      'o.currency',
      'o.state',
      k.raw(`to_char(o.expected_on, 'YYYY-MM-DD') AS expected_on`),
      'o.notes',
      'o.created_at',
      'u.name as created_by_name',
      'o.sent_at',
      'o.closed_at',
      'o.send_error',
      'o.shipping_cost',
    );
}

export async function findOrder(id: string, k: Knex = db): Promise<OrderRow | undefined> {
  return (await ordersBase(k).where('o.id', id).first()) as OrderRow | undefined;
}

export async function lockOrder(k: Knex, id: string): Promise<OrderRow | undefined> {
  if (!(await lockRow(k, 'purchase_orders', id))) return undefined;
  return findOrder(id, k);
}

export async function orderLines(orderIds: string[], k: Knex = db): Promise<LineRow[]> {
  if (orderIds.length === 0) return [];
  return k('purchase_order_lines as l')
    .join('purchase_orders as o', 'o.id', 'l.order_id')
    .join('parts as p', 'p.id', 'l.part_id')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as st', 'st.id', 'p.step_id')
    .leftJoin(
      k.raw(
        `LATERAL (SELECT i.sku, i.gtin FROM supplier_items i
                   WHERE i.supplier_id = o.supplier_id AND i.part_id = l.part_id
                   ORDER BY i.dropped, i.updated_at DESC LIMIT 1) AS si ON true`,
      ),
    )
    .whereIn('l.order_id', orderIds)
    .select(
      'l.id',
      'l.order_id',
      'l.line_no',
      'l.part_id',
      'p.sku',
      'p.description',
      'p.kind as part_kind',
      'p.family_id',
      'p.step_id',
      'f.code as family_code',
      'st.label as step_label',
      'p.gtin as part_gtin',
      'si.sku as supplier_sku',
      'si.gtin as supplier_gtin',
      'l.quantity',
      'l.unit_price',
      'l.received_quantity',
    )
    .orderBy([{ column: 'l.order_id' }, { column: 'l.line_no' }]);
}

export async function lockLines(k: Knex, orderId: string): Promise<void> {
  await k('purchase_order_lines').where({ order_id: orderId }).forUpdate().select('id');
}

const ORDER_SORTS: Record<string, string> = {
  number: 'o.number',
  createdAt: 'o.created_at',
  expectedOn: 'o.expected_on',
  supplier: 'lower(s.name)',
  state: 'o.state',
};

export interface OrderListRow extends OrderRow {
  lines: number;
  quantity: number;
  received: number;
  total: string;
}

export async function listOrders(
  q: OrdersQuery,
  k: Knex = db,
): Promise<{ rows: OrderListRow[]; total: number }> {
  const base = ordersBase(k).modify((qb) => {
    if (q.state === 'open') qb.whereIn('o.state', ['sent_out', 'partly_in']);
    else if (q.state) qb.where('o.state', q.state);
    if (q.supplierId) qb.where('o.supplier_id', q.supplierId);
    if (q.q) {
      const like = `%${q.q.replace(/[\\%_]/g, '\\$&')}%`;
      qb.where((w) => w.whereILike('o.number', like).orWhereILike('s.name', like));
    }
  });
  const [{ count }] = await k.from(base.clone().as('x')).count<{ count: number }[]>('* as count');
  const sort = ORDER_SORTS[q.sort ?? 'createdAt'];
  const rows = await base
    .clone()
    .select(
      k.raw(`(SELECT count(*)::int FROM purchase_order_lines l WHERE l.order_id = o.id) AS lines`),
      k.raw(
        `(SELECT coalesce(sum(l.quantity), 0)::int FROM purchase_order_lines l WHERE l.order_id = o.id) AS quantity`,
      ),
      k.raw(
        `(SELECT coalesce(sum(l.received_quantity), 0)::int FROM purchase_order_lines l WHERE l.order_id = o.id) AS received`,
      ),
      k.raw(
        `(SELECT coalesce(sum(l.quantity * l.unit_price), 0)::text FROM purchase_order_lines l WHERE l.order_id = o.id) AS total`,
      ),
    )
    .orderByRaw(`${sort} ${q.dir === 'asc' ? 'ASC' : 'DESC'} NULLS LAST, o.number DESC`)
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize);
  return { rows: rows as OrderListRow[], total: Number(count) };
}

export async function insertOrder(
  k: Knex,
  o: {
    supplier_id: string;
    currency: string;
    expected_on: string | null;
    notes: string;
    created_by: string;
    shipping_cost: string;
  },
): Promise<string> {
  const [row] = await k('purchase_orders').insert(o).returning('id');
  return (row as { id: string }).id;
}

export async function replaceLines(
  k: Knex,
  orderId: string,
  lines: { part_id: string; quantity: number; unit_price: string }[],
): Promise<void> {
  await k('purchase_order_lines').where({ order_id: orderId }).delete();
  await k('purchase_order_lines').insert(
    lines.map((l, i) => ({ ...l, order_id: orderId, line_no: i + 1 })),
  );
}

export function updateOrder(
  k: Knex,
  id: string,
  patch: Partial<{
    state: OrderState;
    expected_on: string | null;
    notes: string;
    sent_at: Date | Knex.Raw;
    sent_by: string;
    closed_at: Date | Knex.Raw | null;
    send_outbox_id: string | null;
    send_error: string | null;
    shipping_cost: string;
  }>,
): Promise<void> {
  return updateRow(k, 'purchase_orders', id, patch);
}

export async function lineTotals(
  k: Knex,
  orderId: string,
): Promise<{ quantity: number; received: number }> {
  const row = await k('purchase_order_lines')
    .where({ order_id: orderId })
    .first(
      k.raw('coalesce(sum(quantity), 0)::int AS quantity'),
      k.raw('coalesce(sum(received_quantity), 0)::int AS received'),
    );
  return row as { quantity: number; received: number };
}

export interface SupplierRef {
  id: string;
  name: string;
  email: string | null;
  currency: string;
  lead_days: number;
  shipping_cost: string;
  active: boolean;
}

export async function findSupplier(id: string, k: Knex = db): Promise<SupplierRef | undefined> {
  return k('suppliers')
    .where({ id })
    .first('id', 'name', 'email', 'currency', 'lead_days', 'shipping_cost', 'active');
}

export interface PartRef {
  id: string;
  sku: string;
  kind: string;
  active: boolean;
}

export async function partsByIds(ids: string[], k: Knex = db): Promise<PartRef[]> {
  if (ids.length === 0) return [];
  return k('parts').whereIn('id', ids).select('id', 'sku', 'kind', 'active');
}

/** Parts already on an order being drafted: drafting them again would order them twice. */
export async function partsOnDrafts(partIds: string[], k: Knex = db): Promise<Set<string>> {
  if (partIds.length === 0) return new Set();
  const rows = await k('purchase_order_lines as l')
    .join('purchase_orders as o', 'o.id', 'l.order_id')
    .where('o.state', 'drafting')
    .whereIn('l.part_id', partIds)
    .distinct('l.part_id');
  return new Set(rows.map((r: { part_id: string }) => r.part_id));
}

/** Open lines (on orders sent out or partly in) whose part or supplier item has the GTIN. */
/** What is on order per part (open lines of orders sent out), for the step ladder. */
export async function onOrderByPart(partIds: string[], k: Knex = db): Promise<Map<string, number>> {
  if (partIds.length === 0) return new Map();
  const rows = await k
    .from(k.raw('parts_on_order() AS oo'))
    .whereIn('oo.part_id', partIds)
    .groupBy('oo.part_id')
    .select('oo.part_id', k.raw('sum(oo.quantity)::int AS quantity'));
  return new Map(rows.map((r: { part_id: string; quantity: number }) => [r.part_id, r.quantity]));
}

// ---- Receiving helpers --------------------------------------------------------------------------

export async function rateFor(currency: string, k: Knex = db): Promise<string | null> {
  const row = await k('exchange_rates').where({ currency }).first('rate');
  return (row?.rate as string | undefined) ?? null;
}

/** Where a received part goes when the receiver names no bin: where it already lives. */
export async function usualBin(partId: string, k: Knex = db): Promise<string | null> {
  const level = await k('part_levels').where({ part_id: partId }).first('bin_id');
  if (level?.bin_id) return level.bin_id as string;
  const unit = await k('piston_units')
    .where({ part_id: partId })
    .whereNotNull('bin_id')
    .orderBy('received_at', 'desc')
    .first('bin_id');
  return (unit?.bin_id as string | undefined) ?? null;
}

export async function binByCode(code: string, k: Knex = db): Promise<string | null> {
  const row = await k('bins').whereRaw('upper(code) = upper(?)', [code]).first('id');
  return (row?.id as string | undefined) ?? null;
}

export async function lineWithOrder(
  lineId: string,
  k: Knex = db,
): Promise<(LineRow & { order_state: OrderState; order_number: string }) | undefined> {
  const line = (await orderLines(
    (await k('purchase_order_lines').where({ id: lineId }).pluck('order_id')) as string[],
    k,
  ).then((rows) => rows.find((r) => r.id === lineId))) as LineRow | undefined;
  if (!line) return undefined;
  const order = await k('purchase_orders').where({ id: line.order_id }).first('state', 'number');
  return { ...line, order_state: order.state as OrderState, order_number: order.number as string };
}
