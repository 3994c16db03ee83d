// The demo shop's purchasing: the exchange rates the owner keeps (invented demo values, not market
// rates), one order already sent out for a ring set that ran out, and one being drafted. Built through
// the purchasing services, so the sent order's e-mail sits in the outbox like any other. Nothing is
// received here: the stock the catalog seed put on the shelf stays as it is.
import type { Knex } from 'knex';
import { createOrder } from '../server/purchasing/orders-service';
import { sendOrder } from '../server/purchasing/order-send-service';
import { bestOffer, offersFor, setRate } from '../server/purchasing/sourcing-service';

/** One unit of each currency in euros, the demo's home currency (invented figures). */
const RATES: Record<string, string> = { USD: '0.9215', GBP: '1.1740' };

const ORDERS: { sku: string; quantity: number; send: boolean; notes: string }[] = [
  {
    sku: 'QV-54A-RS-025',
    quantity: 6,
    send: true,
    notes: 'Please pack the ring sets in their own boxes.',
  },
  { sku: 'GR-9W-RS-010', quantity: 5, send: false, notes: '' },
];

export async function seed(knex: Knex): Promise<void> {
  const owner = await knex('users').where({ role: 'owner' }).orderBy('email').first();
  const buyer = await knex('users').where({ role: 'buyer' }).orderBy('email').first();
  if (!owner || !buyer) throw new Error('The purchasing seed needs the demo owner and buyer.');

  for (const [currency, rate] of Object.entries(RATES)) {
    await setRate(owner.id, currency, rate, knex);
  }

  for (const spec of ORDERS) {
    const part = await knex('parts').where({ sku: spec.sku }).first('id');
    if (!part) throw new Error(`The purchasing seed needs the demo part ${spec.sku}.`);
    const offers = await offersFor([part.id], { quantity: spec.quantity }, knex);
    const { best } = bestOffer(offers, 1, null);
    if (!best) throw new Error(`The purchasing seed found no offer for ${spec.sku}.`);
    const quantity =
      best.available === null ? spec.quantity : Math.min(spec.quantity, best.available);
    const order = await createOrder(
      buyer.id,
      {
        supplierId: best.supplierId,
        lines: [{ partId: part.id, quantity, unitPrice: best.price }],
        notes: spec.notes,
      },
      knex,
    );
    if (spec.send) await sendOrder(buyer.id, order.id, knex);
  }
}
