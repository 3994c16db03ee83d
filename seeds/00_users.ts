// The demo shop's people and settings. Everyone signs in with the same demo password, which the
// README tells a shop to change.
import type { Knex } from 'knex';
import bcrypt from 'bcryptjs';

export const DEMO_PASSWORD = 'stepstock-demo';

export const DEMO_USERS = [
  { email: 'owner@demo.test', name: 'Ines Marlowe', role: 'owner', unit: 'mm' },
  { email: 'buyer@demo.test', name: 'Teodor Vance', role: 'buyer', unit: 'mm' },
  { email: 'machinist@demo.test', name: 'Rafe Okonkwo-Lind', role: 'machinist', unit: 'mm' },
  { email: 'staff@demo.test', name: 'Perrin Adeyemi', role: 'staff', unit: 'in' },
] as const;

export async function seed(knex: Knex): Promise<void> {
  const hash = bcrypt.hashSync(DEMO_PASSWORD, 10);
  await knex('users').insert(DEMO_USERS.map((u) => ({ ...u, password_hash: hash })));
  await knex('settings').insert({
    key: 'shop',
    value: JSON.stringify({
      shopName: 'Tallowmere Bore & Hone',
      shopHours: 'Mon–Fri 7:30–16:30, Sat 8:00–12:00',
      timeZone: 'UTC',
      holdExpiryDays: 14,
      clearancePolicy: 'mid',
      maxCutPerPass: '0.020 in',
      finishPass: '',
      skipMarginalStep: false,
      marginalCleanup: '0.05 mm',
      orderCost: '25.00',
      holdingCostRate: '0.25',
      serviceLevel: 0.95,
      homeCurrency: 'EUR',
    }),
  });
}
