// Which open order lines a delivery may be: by a scanned GTIN, or by the part being received (the
// one receiving page offers these first, so an ordered box is taken in against its order).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { BadRequest } from '../errors';
import { normalizeGtin } from '../../shared/gtin';
import type { OpenLineJson } from '../../shared/api/purchasing';
import { getOrder } from './orders-service';
import * as repo from './open-lines-repository';

async function describe(
  found: { order_id: string; line_id: string }[],
  k: Knex,
): Promise<{ items: OpenLineJson[]; total: number }> {
  const items: OpenLineJson[] = [];
  for (const f of found) {
    const order = await getOrder(f.order_id, k);
    const line = order.lines.find((l) => l.id === f.line_id);
    if (line) {
      items.push({
        orderId: order.id,
        orderNumber: order.number,
        supplierName: order.supplierName,
        expectedOn: order.expectedOn,
        line,
      });
    }
  }
  return { items, total: items.length };
}

export async function openLinesForGtin(code: string, k: Knex = db) {
  const gtin = normalizeGtin(code);
  if (!gtin) {
    const message = 'not a valid GTIN (check the digits under the barcode)';
    throw new BadRequest(`gtin: ${message}`, [{ field: 'gtin', message }]);
  }
  return describe(await repo.openLinesByGtin(gtin, k), k);
}

export async function openLinesForPart(partId: string, k: Knex = db) {
  return describe(await repo.openLinesByPart(partId, k), k);
}
