// Uncommitted price-list previews cannot fill the disk or race each other (ASVS 4.0.3 V11.1.4:
// limits on what one person can leave behind; V11.1.6: concurrency, no race between uploads of the
// same file). One live preview per supplier and file, whatever arrives at once; every answer names
// a preview that exists; previews older than PRICE_LIST_PREVIEW_HOURS are swept.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { db } from '../../server/db/knex';
import { sweepExpiredPreviews } from '../../server/imports/preview-sweep';
import { deleteExpiredPreviews } from '../../server/imports/previews-repository';
import { closeTestApp, signedInClients, uniq } from '../support/api';

const { staff, buyer } = signedInClients({ staff: 'mm', buyer: 'mm' });

afterAll(async () => {
  await closeTestApp();
});

const LIST = readFileSync(
  join(__dirname, '..', '..', 'imports', 'orrinpike-old-stock-2026-11.csv'),
);

async function makeSupplier(): Promise<string> {
  const res = await buyer.post('/api/suppliers', {
    name: uniq('Preview supplier'),
    email: `${uniq('orders')}@supplier.test`,
    currency: 'EUR',
    leadDays: 7,
  });
  expect(res.status).toBe(201);
  return res.body.id as string;
}

function upload(supplierId: string, content: Buffer = LIST) {
  return staff
    .call('post', `/api/suppliers/${supplierId}/price-lists`)
    .attach('file', content, 'list.csv');
}

async function livePreviews(supplierId: string) {
  return db('price_list_imports')
    .where({ supplier_id: supplierId })
    .whereIn('status', ['previewed', 'failed'])
    .select('id');
}

describe('one live preview per supplier and file', () => {
  it('when eight uploads of one file arrive at once, then one preview is kept, and every answer names it', async () => {
    const supplierId = await makeSupplier();
    const answers = await Promise.all(Array.from({ length: 8 }, () => upload(supplierId)));
    // Uploads over the concurrent-import cap may be told to come back (503 with Retry-After).
    const made = answers.filter((a) => a.status === 201);
    for (const refused of answers.filter((a) => a.status !== 201)) {
      expect(refused.status).toBe(503);
      expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    }
    expect(made.length).toBeGreaterThanOrEqual(1);
    const live = await livePreviews(supplierId);
    expect(live).toHaveLength(1);
    for (const a of made) {
      expect(a.body.importId).toBe(live[0].id);
      const again = await staff.get(`/api/price-list-imports/${a.body.importId}`);
      expect(again.status).toBe(200);
    }
    // Staged rows of this supplier: exactly those of one upload of the file (made for another
    // supplier as the reference), none left over from the uploads that lost.
    const reference = await upload(await makeSupplier());
    const stagedFor = async (importId: string) =>
      Number(
        (
          await db('price_list_import_rows')
            .where({ import_id: importId })
            .count<{ n: string }[]>('* as n')
        )[0].n,
      );
    const everyStaged = await db('price_list_import_rows as r')
      .join('price_list_imports as m', 'm.id', 'r.import_id')
      .where('m.supplier_id', supplierId)
      .count<{ n: string }[]>('* as n');
    expect(Number(everyStaged[0].n)).toBe(await stagedFor(reference.body.importId));
    expect(await stagedFor(live[0].id)).toBe(await stagedFor(reference.body.importId));
  });

  it('when three uploads of one file for each of two suppliers arrive at once, then each supplier keeps exactly one preview', async () => {
    const [a, b] = [await makeSupplier(), await makeSupplier()];
    const answers = await Promise.all([a, b, a, b, a, b].map((s) => upload(s)));
    expect(answers.filter((r) => r.status === 201).length).toBeGreaterThanOrEqual(2);
    expect(await livePreviews(a)).toHaveLength(1);
    expect(await livePreviews(b)).toHaveLength(1);
  });

  it('when a second live preview of the same file is written behind the API, then the database refuses it', async () => {
    const supplierId = await makeSupplier();
    const first = await upload(supplierId);
    expect(first.status).toBe(201);
    await expect(
      db.raw(
        `INSERT INTO price_list_imports
           (supplier_id, user_id, file_name, file_bytes, sha256, status, detected, headers, mapping, counts)
         SELECT supplier_id, user_id, file_name, file_bytes, sha256, 'previewed', detected, headers,
                mapping, counts
           FROM price_list_imports WHERE id = ?`,
        [first.body.importId],
      ),
    ).rejects.toThrow(/price_list_imports_live_preview_unique/);
  });
});

describe('previews expire', () => {
  it('when a preview is older than the limit, then the sweep deletes it and its staged rows; a fresh one stays; committing the old id is a clear 404', async () => {
    const oldSupplier = await makeSupplier();
    const freshSupplier = await makeSupplier();
    const old = await upload(oldSupplier);
    const fresh = await upload(freshSupplier);
    expect(old.status).toBe(201);
    expect(fresh.status).toBe(201);
    await db('price_list_imports')
      .where({ id: old.body.importId })
      .update({ created_at: db.raw(`now() - interval '25 hours'`) });

    const deleted = await sweepExpiredPreviews(24);
    expect(deleted).toBeGreaterThanOrEqual(1);
    expect(await db('price_list_imports').where({ id: old.body.importId }).first()).toBeUndefined();
    const rows = await db('price_list_import_rows')
      .where({ import_id: old.body.importId })
      .count<{ n: string }[]>('* as n');
    expect(Number(rows[0].n)).toBe(0);
    expect(await livePreviews(freshSupplier)).toHaveLength(1);

    const commit = await staff.post(`/api/price-list-imports/${old.body.importId}/commit`);
    expect(commit.status).toBe(404);
    expect(commit.body.error.message).toMatch(/expires after 24 hours/);
  });

  it('when another process is sweeping, then this one steps aside (advisory lock) and sweeps next time', async () => {
    const other = await db.transaction();
    try {
      await other.raw(`SELECT pg_advisory_xact_lock(hashtext('stepstock:preview-sweep'))`);
      expect(await deleteExpiredPreviews(24)).toBeNull();
    } finally {
      await other.rollback();
    }
    expect(typeof (await deleteExpiredPreviews(24))).toBe('number');
  });
});
