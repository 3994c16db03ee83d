// Suppliers for API tests, made by a buyer through the API with a unique name and, unless told
// otherwise, an address made from that name.
import { ok, uniq, type Client } from './api';

export interface Supplier {
  id: string;
  name: string;
  email: string | null;
}

/** A fresh supplier; `email: null` makes one with no address. */
export async function makeSupplier(
  buyer: Client,
  opts: { currency: string; leadDays: number; shippingCost: string; email?: string | null },
): Promise<Supplier> {
  const name = uniq('Supplier');
  const email = opts.email === undefined ? `${name.toLowerCase()}@example.test` : opts.email;
  const made = ok<{ id: string }>(
    await buyer.post('/api/suppliers', {
      name,
      email,
      currency: opts.currency,
      leadDays: opts.leadDays,
      shippingCost: opts.shippingCost,
    }),
    201,
    'supplier',
  );
  return { id: made.id, name, email };
}
