// The demo shop's suppliers and their price lists: the sample lists in imports/ brought in through the
// same preview-and-commit code as an upload, so the demo has offers from several suppliers in three
// currencies. Morvendt's list comes in twice — an older one first, then the current sample — so price
// history and price changes show; most items are then mapped to catalog parts with the mapping queue's
// own suggestions, leaving the old-stock finds in the queue for the buyer.
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import type { Knex } from 'knex';
import iconv from 'iconv-lite';
import Decimal from 'decimal.js';
import type { SessionUser } from '../shared/session-types';
import type { SupplierData } from '../shared/api/suppliers';
import { createSupplier, listUnmapped, mapItem } from '../server/suppliers/suppliers-service';
import { commitImport, previewPriceList } from '../server/imports/imports-service';
import { seededRandom } from './demo/catalog';

const IMPORTS = join(__dirname, '..', 'imports');

const SUPPLIERS: (SupplierData & { file: string; mapItems: boolean })[] = [
  {
    name: 'Quillmark Piston Supply',
    email: 'orders@quillmark.test',
    contacts: 'Dana Pruett (counter), +1 555 0142',
    currency: 'USD',
    leadDays: 14,
    minOrder: '100.00',
    shippingCost: '38.00',
    notes: 'Imperial pistons and ring sets; ships twice a week.',
    file: 'quillmark-pistons-2026-12.csv',
    mapItems: true,
  },
  {
    name: 'Morvendt Motorteile',
    email: 'bestellung@morvendt.test',
    contacts: 'Frau Kessler, Innendienst',
    currency: 'EUR',
    leadDays: 10,
    minOrder: '150.00',
    shippingCost: '24.50',
    notes: 'Sends its list monthly as a semicolon CSV from an old system (Windows-1252).',
    file: 'morvendt-motorteile-2026-12.csv',
    mapItems: true,
  },
  {
    name: 'Tessaway Engine Spares',
    email: 'trade@tessaway.test',
    contacts: 'Owen Marsh',
    currency: 'GBP',
    leadDays: 21,
    minOrder: '0',
    shippingCost: '31.00',
    notes: 'Forged pistons; tab-separated list with two title lines.',
    file: 'tessaway-spares-2026-12.txt',
    mapItems: true,
  },
  {
    name: 'Orrinpike Old Stock',
    email: 'finds@orrinpike.test',
    contacts: 'Mags Orrin',
    currency: 'EUR',
    leadDays: 7,
    minOrder: '0',
    shippingCost: '12.00',
    notes: 'New old stock, one box at a time; the list always has a few broken rows.',
    file: 'orrinpike-old-stock-2026-11.csv',
    mapItems: false,
  },
];

async function sessionUser(knex: Knex, role: 'buyer' | 'staff'): Promise<SessionUser> {
  const row = await knex('users').where({ role, active: true }).orderBy('email').first();
  if (!row) throw new Error(`The price-list seed needs a ${role} user (seeds/00_users.ts).`);
  return { id: row.id, email: row.email, name: row.name, role, unit: row.unit };
}

async function importFile(
  knex: Knex,
  user: SessionUser,
  supplierId: string,
  path: string,
  name: string,
) {
  const preview = await previewPriceList(
    { user, supplierId, file: { path, originalName: name, size: statSync(path).size } },
    knex,
  );
  if (preview.status === 'duplicate') throw new Error(`${name} was already imported.`);
  const commit = await commitImport(user, preview.importId, { dropMissing: true }, undefined, knex);
  if (commit.status !== 'committed') throw new Error(`${name} was not committed.`);
  return commit;
}

/**
 * Last month's Morvendt list: the same layout and encoding, a few percent cheaper on most lines and
 * without the items the current list added.
 */
function olderMorvendtList(dir: string): string {
  const random = seededRandom(4_000_001);
  const text = iconv.decode(
    readFileSync(join(IMPORTS, 'morvendt-motorteile-2026-12.csv')),
    'win1252',
  );
  const lines = text.split('\r\n').filter((l) => l !== '');
  const older = lines
    .filter((l) => !l.startsWith('MV-Z72-SET') && !l.startsWith('MV-R77-100'))
    .map((line, i) => {
      if (i === 0) return line;
      const cells = line.split(';');
      // The price is the fifth column; the quoted description of some lines holds a semicolon.
      const priceIndex = cells.length - 4;
      const price = new Decimal(cells[priceIndex].replace('.', '').replace(',', '.'));
      const factor = random() < 0.2 ? 1.04 : 0.93 + random() * 0.05;
      cells[priceIndex] = price.times(factor).toDecimalPlaces(2).toFixed(2).replace('.', ',');
      return cells.join(';');
    });
  const path = join(dir, 'morvendt-motorteile-2026-11.csv');
  writeFileSync(path, iconv.encode(older.join('\r\n') + '\r\n', 'win1252'));
  return path;
}

export async function seed(knex: Knex): Promise<void> {
  const buyer = await sessionUser(knex, 'buyer');
  const staff = await sessionUser(knex, 'staff');
  const dir = mkdtempSync(join(tmpdir(), 'stepstock-seed-lists-'));
  try {
    for (const spec of SUPPLIERS) {
      const { file, mapItems, ...data } = spec;
      const supplier = await createSupplier(buyer.id, data, knex);
      if (spec.name === 'Morvendt Motorteile') {
        const older = await importFile(
          knex,
          staff,
          supplier.id,
          olderMorvendtList(dir),
          'morvendt-motorteile-2026-11.csv',
        );
        // That list came in five weeks before the seeding day.
        await knex('price_list_imports')
          .where({ id: older.importId })
          .update({
            created_at: knex.raw(`now() - interval '35 days'`),
            committed_at: knex.raw(`now() - interval '35 days'`),
          });
        await knex('supplier_item_prices')
          .where({ import_id: older.importId })
          .update({ effective_from: knex.raw(`now() - interval '35 days'`) });
      }
      const path = join(IMPORTS, file);
      await importFile(knex, staff, supplier.id, path, basename(path));
      if (mapItems) await mapBySuggestion(knex, buyer, supplier.id);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Maps the items whose best suggestion is the same size at the kind of part the description names. */
async function mapBySuggestion(knex: Knex, buyer: SessionUser, supplierId: string): Promise<void> {
  const queue = await listUnmapped({ supplierId, page: 1, pageSize: 500 }, knex);
  for (const item of queue.items) {
    const best = item.suggestions[0];
    if (best && best.reasons.includes('same size') && best.score >= 5) {
      await mapItem(buyer.id, item.id, best.id, knex);
    }
  }
}
