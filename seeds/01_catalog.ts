// The demo shop's catalog and stock: engine families, step series, parts, bins and measured pistons
// on the shelf (see seeds/demo/catalog.ts for the generator and the ids later seeds read back).
import type { Knex } from 'knex';
import { seedDemoCatalog } from './demo/catalog';

export async function seed(knex: Knex): Promise<void> {
  await seedDemoCatalog(knex);
}
