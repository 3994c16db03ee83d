// The migration that turns each job's typed customer into a customer record, run on a database
// of its own: jobs written the old way before it, customers after it, plain text again after down.
import { migrationConfig } from '../../server/db/migrate';
import { scratchDatabase } from '../support/scratch-database';

const MIGRATION = '20261202151500_customers.ts';
const scratch = scratchDatabase('mig');

beforeAll(async () => {
  // Up to the migration just before this one.
  for (;;) {
    const [, pending] = (await scratch.db.migrate.list(migrationConfig)) as [
      unknown,
      { file: string }[],
    ];
    if (pending.length === 0 || pending[0].file === MIGRATION) break;
    await scratch.db.migrate.up(migrationConfig);
  }
});

it('when existing jobs carry typed customers, then up makes one customer per person and links every job; down gives the text back', async () => {
  const [series] = await scratch
    .db('step_series')
    .insert({ code: 'MIG', name: 'Migration test', unit: 'mm', custom: true })
    .returning('id');
  const [family] = await scratch
    .db('engine_families')
    .insert({
      code: 'MIG-1',
      name: 'Invented migration single',
      stroke_type: 'four',
      cylinders: 1,
      cooling: 'air',
      standard_bore_nm: 64_000_000,
      stroke_nm: 54_000_000,
      clearance_min_nm: 30_000,
      clearance_max_nm: 50_000,
      hone_allowance_nm: 50_000,
      cleanup_nm: 80_000,
      max_oversize_nm: 1_000_000,
      step_series_id: series.id,
    })
    .returning('id');
  const typed = [
    { customer_name: 'Perpetua Vane', customer_phone: '555 0161', customer_email: null },
    // The same person typed again with different case and spaces: one customer.
    { customer_name: '  perpetua vane ', customer_phone: '555 0161', customer_email: null },
    // Same name, other phone: another person as far as the record can tell.
    { customer_name: 'Perpetua Vane', customer_phone: '555 0162', customer_email: null },
    { customer_name: 'Lorcan Abbey', customer_phone: null, customer_email: 'Lorcan@Example.test' },
  ];
  const jobs = await scratch
    .db('jobs')
    .insert(typed.map((t) => ({ ...t, family_id: family.id, cylinders: 1 })))
    .returning(['id', 'customer_name']);

  await scratch.db.migrate.up({ ...migrationConfig, name: MIGRATION });

  const customers = await scratch.db('customers').orderBy(['name', 'phone']);
  expect(customers.map((c) => [c.name, c.phone, c.email])).toEqual([
    ['Lorcan Abbey', null, 'lorcan@example.test'],
    ['Perpetua Vane', '555 0161', null],
    ['Perpetua Vane', '555 0162', null],
  ]);
  const linked = await scratch
    .db('jobs')
    .whereIn(
      'id',
      jobs.map((j) => j.id),
    )
    .orderBy('created_at');
  expect(linked.every((j) => j.customer_id !== null)).toBe(true);
  const byJob = new Map(linked.map((j) => [j.id, j.customer_id]));
  expect(byJob.get(jobs[0].id)).toBe(byJob.get(jobs[1].id));
  expect(byJob.get(jobs[0].id)).not.toBe(byJob.get(jobs[2].id));
  // From here a job's customer fields are the customer's.
  await scratch
    .db('customers')
    .where({ id: byJob.get(jobs[3].id) })
    .update({ phone: '555 0163' });
  expect((await scratch.db('jobs').where({ id: jobs[3].id }).first()).customer_phone).toBe(
    '555 0163',
  );

  await scratch.db.migrate.down({ ...migrationConfig, name: MIGRATION });
  expect(await scratch.db.schema.hasTable('customers')).toBe(false);
  expect(await scratch.db.schema.hasColumn('jobs', 'customer_id')).toBe(false);
  const back = await scratch.db('jobs').where({ id: jobs[3].id }).first();
  expect([back.customer_name, back.customer_phone]).toEqual(['Lorcan Abbey', '555 0163']);
});
