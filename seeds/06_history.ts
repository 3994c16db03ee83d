// The demo shop's past sixteen months: collected jobs, deliveries and sales, so the owner's
// insights pages are meaningful on first start (see seeds/demo/history.ts).
import type { Knex } from 'knex';
import { seedDemoHistory } from './demo/history';

export async function seed(knex: Knex): Promise<void> {
  await seedDemoHistory(knex);
}
