// The demo shop's labour price list (invented prices) and its tax and deposit policy. Boring and
// honing follow every bored cylinder, port chamfering only two-strokes, cleaning every job; the
// rest are added by hand when a job needs them.
import type { Knex } from 'knex';
import { saveSettings } from '../server/settings/settings-service';

const OPERATIONS = [
  { name: 'Bore one cylinder', per: 'cylinder', price: '58.00', propose_for: 'bored' },
  { name: 'Hone one cylinder', per: 'cylinder', price: '24.50', propose_for: 'bored' },
  {
    name: 'Chamfer the port edges',
    per: 'cylinder',
    price: '19.00',
    propose_for: 'bored_two_stroke',
  },
  { name: 'Clean and inspect', per: 'job', price: '15.00', propose_for: 'every_job' },
  { name: 'Deglaze one cylinder', per: 'cylinder', price: '14.00', propose_for: 'never' },
  { name: 'Fit a sleeve', per: 'cylinder', price: '145.00', propose_for: 'never' },
  { name: 'Skim the head face', per: 'job', price: '65.00', propose_for: 'never' },
];

export async function seed(knex: Knex): Promise<void> {
  await knex('labour_operations').insert(OPERATIONS);
  await saveSettings(
    null,
    { taxRate: '20', pricesIncludeTax: false, depositPercent: '30', cutOnlyAfterApproval: true },
    knex,
  );
}
