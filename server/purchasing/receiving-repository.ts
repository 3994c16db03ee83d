// The rows a receipt against a purchase order writes: the receipt, its lines, and the quantity
// received on each order line.
import type { Knex } from 'knex';

export async function addReceived(k: Knex, lineId: string, quantity: number): Promise<void> {
  await k('purchase_order_lines').where({ id: lineId }).increment('received_quantity', quantity);
}

export async function insertReceipt(
  k: Knex,
  r: { id: string; order_id: string; received_by: string; note: string },
): Promise<void> {
  await k('purchase_order_receipts').insert(r);
}

export async function insertReceiptLine(
  k: Knex,
  r: { receipt_id: string; line_id: string; quantity: number; stock_receipt_id: string },
): Promise<void> {
  await k('purchase_order_receipt_lines').insert(r);
}
