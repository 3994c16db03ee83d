// Smaller findings of the hardening review about input: search text is text (the ledger's q is
// used, % and _ in a search match only themselves), single-line fields refuse line breaks, and the
// pool's database sessions cannot hold a lock long after their process died. Named after the OWASP
// Application Security Verification Standard 4.0.3, level 2.
import { db } from '../../server/db/knex';
import { closeTestApp, makeUser, signedInClients, uniq } from '../support/api';
import { makeBin, makeFamily, makePart, receiveCounted } from '../support/jobs-fixtures';

const { owner, buyer, staff } = signedInClients({ owner: 'mm', buyer: 'mm', staff: 'mm' });

afterAll(async () => {
  await closeTestApp();
});

describe('V5.1.3 search text filters what it says', () => {
  it('when the ledger is searched by a part number, then only that part’s movements come back', async () => {
    const family = await makeFamily(owner);
    const bin = await makeBin(owner);
    const wanted = await makePart(owner, family, '+0.010 in', 'rings');
    const other = await makePart(owner, family, '+0.020 in', 'rings');
    await receiveCounted(owner, wanted, bin, 2);
    await receiveCounted(owner, other, bin, 3);
    const sku = (await owner.get(`/api/parts/${wanted}`)).body.sku as string;
    const res = await owner.get(`/api/stock/ledger?q=${encodeURIComponent(sku.toLowerCase())}`);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(1);
    expect(res.body.items.map((l: { sku: string }) => l.sku)).toEqual([sku]);
    const none = await owner.get(`/api/stock/ledger?q=${encodeURIComponent(uniq('nothing'))}`);
    expect(none.body).toEqual({ items: [], total: 0 });
  });

  it('V5.3.4 when the users are searched for % or _, then they match only names holding that character, not everyone', async () => {
    const percent = await makeUser('staff');
    await db('users')
      .where({ id: percent.id })
      .update({ name: `Rings 100% ${uniq('')}` });
    const byPercent = await owner.get('/api/users?q=%25&pageSize=500');
    expect(byPercent.status).toBe(200);
    expect(byPercent.body.items.length).toBeGreaterThanOrEqual(1);
    for (const u of byPercent.body.items as { name: string; email: string }[]) {
      expect(`${u.name} ${u.email}`).toContain('%');
    }
    const everyone = await owner.get('/api/users?pageSize=1');
    expect(byPercent.body.total).toBeLessThan(everyone.body.total);
    const byUnderscore = await owner.get('/api/users?q=_&pageSize=500');
    for (const u of byUnderscore.body.items as { name: string; email: string }[]) {
      expect(`${u.name} ${u.email}`).toContain('_');
    }
  });
});

describe('V5.1.4 single-line fields refuse line breaks (they end up in mail headers, CSV rows, labels)', () => {
  const BREAKS = ['Two\r\nlines', 'Two\nlines', 'Two\rlines', 'Two\u2028lines'];

  it.each(BREAKS.map((b) => [JSON.stringify(b), b]))(
    'when a name, a description or a phone carries %s, then 400 names the field and nothing is written',
    async (_label, text) => {
      const cases: Array<{
        send: () => Promise<{ status: number; body: { error: { details: { field: string }[] } } }>;
        field: string;
      }> = [
        {
          send: () => buyer.post('/api/suppliers', { name: text, currency: 'EUR', leadDays: 3 }),
          field: 'name',
        },
        { send: () => owner.post('/api/bins', { code: uniq('B'), name: text }), field: 'name' },
        { send: () => owner.patch('/api/settings', { shopName: text }), field: 'shopName' },
        {
          send: () => staff.post('/api/customers', { name: text }),
          field: 'name',
        },
        {
          send: () => staff.post('/api/customers', { name: 'Plain Name', phone: '555\n0142' }),
          field: 'phone',
        },
        {
          send: () =>
            owner.post('/api/labour-operations', {
              name: text,
              per: 'job',
              price: '10.00',
              proposeFor: 'every_job',
            }),
          field: 'name',
        },
        {
          send: () =>
            owner.post('/api/parts', {
              kind: 'rings',
              sku: uniq('RS').toUpperCase(),
              description: text,
              salePrice: '1.00',
            }),
          field: 'description',
        },
      ];
      for (const c of cases) {
        const res = await c.send();
        expect({ field: c.field, status: res.status }).toEqual({ field: c.field, status: 400 });
        expect(res.body.error.details.map((d: { field: string }) => d.field)).toContain(c.field);
      }
      const written = await db('suppliers').where('name', 'like', 'Two%lines').first();
      expect(written).toBeUndefined();
    },
  );
});

describe('V11.1.6 a killed process cannot keep its locks for long', () => {
  it("when a pool connection is opened, then the database ends an idle transaction after 60 s and checks the client's socket every 2 s", async () => {
    const settings = await db.transaction(async (trx) => {
      const read = async (name: string) =>
        ((await trx.raw(`SELECT current_setting(?) AS v`, [name])) as { rows: { v: string }[] })
          .rows[0].v;
      return {
        idle: await read('idle_in_transaction_session_timeout'),
        check: await read('client_connection_check_interval'),
        keepIdle: await read('tcp_keepalives_idle'),
        keepInterval: await read('tcp_keepalives_interval'),
        keepCount: await read('tcp_keepalives_count'),
      };
    });
    expect(settings).toEqual({
      idle: '1min',
      check: '2s',
      keepIdle: '10',
      keepInterval: '5',
      keepCount: '3',
    });
  });
});
