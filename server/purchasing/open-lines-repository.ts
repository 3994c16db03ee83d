// Open order lines a delivery may belong to: found by a scanned GTIN (the part's or the supplier
// item's) or by the part itself, oldest expected first, and the order a given line is on.
import type { Knex } from 'knex';
import { db } from '../db/knex';

function openLines(k: Knex) {
  return k('purchase_order_lines as l')
    .join('purchase_orders as o', 'o.id', 'l.order_id')
    .whereIn('o.state', ['sent_out', 'partly_in'])
    .andWhereRaw('l.received_quantity < l.quantity')
    .select('o.id as order_id', 'l.id as line_id')
    .orderBy([
      { column: 'o.expected_on', nulls: 'last' },
      { column: 'o.number' },
      { column: 'l.line_no' },
    ]);
}

export async function openLinesByGtin(
  gtin14: string,
  k: Knex = db,
): Promise<{ order_id: string; line_id: string }[]> {
  return openLines(k)
    .join('parts as p', 'p.id', 'l.part_id')
    .andWhere((w) =>
      w
        .where('p.gtin', gtin14)
        .orWhereExists(
          k('supplier_items as i')
            .whereRaw('i.supplier_id = o.supplier_id AND i.part_id = l.part_id')
            .andWhere('i.gtin', gtin14),
        ),
    );
}

export async function openLinesByPart(
  partId: string,
  k: Knex = db,
): Promise<{ order_id: string; line_id: string }[]> {
  return openLines(k).andWhere('l.part_id', partId);
}

/** The order and part of one line, whatever state the order is in. */
export async function lineOwner(
  lineId: string,
  k: Knex = db,
): Promise<{ order_id: string; part_id: string; line_no: number } | undefined> {
  return k('purchase_order_lines').where({ id: lineId }).first('order_id', 'part_id', 'line_no');
}
