// The bad-input catalogue: requests a careless client or an attacker might send, across the API and
// the CSV price-list import. Each must get a clear 4xx in the error model (code, message, details;
// no SQL, no stack), write nothing at all (every table's row count is compared), and leave the
// server healthy (GET /api/health 200 after each one).
import request from 'supertest';
import { existsSync } from 'node:fs';
import { db } from '../../server/db/knex';
import { type Client, closeTestApp, makeUser, signedIn, testApp, uniq } from '../support/api';
import { makeFamily, makePart, type Fixture } from '../support/catalog-fixtures';
import type { Role } from '../../shared/session-types';

afterAll(closeTestApp);

// Tables that change on any request by design: the session store and the rate-limit counters
// (every sign-in attempt is counted before its password is checked).
const VOLATILE = new Set(['sessions', 'rate_limit_buckets']);

/** Every table's row count in one round trip. */
async function rowCounts(): Promise<Record<string, number>> {
  const { rows } = await db.raw<{ rows: { t: string; n: string }[] }>(`
    select table_name as t,
           (xpath('/row/c/text()', query_to_xml(format('select count(*) as c from %I', table_name),
             false, true, '')))[1]::text as n
      from information_schema.tables
     where table_schema = 'public' and table_type = 'BASE TABLE'`);
  const counts: Record<string, number> = {};
  for (const r of rows) if (!VOLATILE.has(r.t)) counts[r.t] = Number(r.n);
  return counts;
}

// What an answer must never show: SQL, driver or constraint text, file paths, stack frames.
const LEAK =
  /\bselect\b[^"]*\bfrom\b|\binsert into\b|\bupdate\b \w+ \bset\b|syntax error|violates|duplicate key|node_modules|\/work\/|\bat [\w.<>]+ \(|\bstack\b|ECONN|knex|pg_/i;

interface Fixtures {
  fixture: Fixture;
  pistonId: string;
  ringsId: string;
  jobId: string;
  supplierId: string;
  targetUserId: string;
}

type Sender = (c: Record<Role, Client>, f: Fixtures) => request.Test;

interface HostileCase {
  name: string;
  send: Sender;
  status: number;
  code?: string;
  /** The field the details must name, when the fault is in one field. */
  field?: string;
}

const MB = 1024 * 1024;
const oneMegabyte = 'x'.repeat(MB);
// A PNG's first bytes: a real image signature, so only the name is hostile.
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
  'base64',
);

function raw(
  c: Client,
  method: 'post' | 'patch' | 'put',
  url: string,
  body: string,
  type = 'application/json',
) {
  return c.call(method, url).set('Content-Type', type).send(body);
}

function family(f: Fixtures, patch: Record<string, unknown>) {
  return {
    code: uniq('H').toUpperCase(),
    name: 'Hostile family',
    strokeType: 'two',
    cylinders: 1,
    cooling: 'air',
    standardBore: '54.00 mm',
    stroke: '54.00 mm',
    clearanceMin: '0.040 mm',
    clearanceMax: '0.060 mm',
    honeAllowance: '0.02 mm',
    cleanup: '0.05 mm',
    maxOversize: '1.00 mm',
    stepSeriesId: f.fixture.seriesId,
    ...patch,
  };
}

function receipt(f: Fixtures, patch: Record<string, unknown>) {
  return {
    partId: f.pistonId,
    quantity: 1,
    binId: f.fixture.binId,
    unitCost: '20.00',
    units: [{ skirt: '54.20 mm' }],
    ...patch,
  };
}

function order(f: Fixtures, patch: Record<string, unknown>) {
  return {
    supplierId: f.supplierId,
    lines: [{ partId: f.ringsId, quantity: 2, unitPrice: '4.00' }],
    ...patch,
  };
}

function readings(diameter: unknown, extra: Record<string, unknown> = {}) {
  return { readings: [{ depth: 'top', axis: 'pin', diameter, ...extra }] };
}

function priceList(
  c: Client,
  f: Fixtures,
  content: string | Buffer,
  filename: string,
  contentType = 'text/csv',
) {
  return c
    .call('post', `/api/suppliers/${f.supplierId}/price-lists`)
    .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), {
      filename,
      contentType,
    });
}

/**
 * A multipart body written by hand, for what a form library will not produce: an RFC 8187 encoded
 * file name (filename*=UTF-8''…), which may carry any character once decoded.
 */
function multipart(
  c: Client,
  url: string,
  field: string,
  content: Buffer,
  encodedName: string,
  type: string,
) {
  const boundary = `----hostile${Date.now()}`;
  const body = Buffer.concat([
    Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename*=${encodedName}\r\n` +
        `Content-Type: ${type}\r\n\r\n`,
    ),
    content,
    Buffer.from(`\r\n--${boundary}--\r\n`),
  ]);
  return c
    .call('post', url)
    .set('Content-Type', `multipart/form-data; boundary=${boundary}`)
    .send(body);
}

/** Changes to the shop's settings by the owner, each refused with 400 at the field named. */
function refusedSettings(rows: [name: string, patch: object, field: string][]): HostileCase[] {
  return rows.map(([name, patch, field]) => ({
    name,
    send: (c) => c.owner.patch('/api/settings', patch),
    status: 400,
    field,
  }));
}

/** New engine families (`family` with the patch over it), each refused with 400 at the field named. */
function refusedFamilies(
  rows: [name: string, patch: Record<string, unknown>, field: string][],
): HostileCase[] {
  return rows.map(([name, patch, field]) => ({
    name,
    send: (c, f) => c.owner.post('/api/engine-families', family(f, patch)),
    status: 400,
    field,
  }));
}

const CASES: HostileCase[] = [
  // ---- Sign-in ---------------------------------------------------------------------------------
  {
    name: 'sign-in with SQL metacharacters in e-mail and password',
    send: () =>
      request(testApp())
        .post('/api/session')
        .send({ email: "' OR '1'='1' --", password: "' OR ''='" }),
    status: 401,
    code: 'unauthorized',
  },
  {
    name: 'sign-in with wrong JSON types (number e-mail, array password)',
    send: () =>
      request(testApp())
        .post('/api/session')
        .send({ email: 12345, password: ['a', 'b'] }),
    status: 400,
    field: 'email',
  },
  {
    name: 'sign-in with a 1 MB password (body over the 1 MB limit)',
    send: () =>
      request(testApp()).post('/api/session').send({ email: 'a@b.test', password: oneMegabyte }),
    status: 413,
    code: 'too_large',
  },
  {
    name: 'sign-in with a 100 kB e-mail',
    send: () =>
      request(testApp())
        .post('/api/session')
        .send({ email: `${'a'.repeat(100_000)}@b.test`, password: 'x' }),
    status: 400,
    field: 'email',
  },
  {
    name: 'sign-in with JSON nested 50,000 levels deep',
    send: () =>
      request(testApp())
        .post('/api/session')
        .set('Content-Type', 'application/json')
        .send(`{"email":${'['.repeat(50_000)}${']'.repeat(50_000)},"password":"x"}`),
    status: 400,
  },
  {
    name: 'sign-in sent as text/plain',
    send: () =>
      request(testApp())
        .post('/api/session')
        .set('Content-Type', 'text/plain')
        .send('email=a@b.test&password=x'),
    status: 400,
  },
  {
    name: 'sign-in sent as a form (urlencoded)',
    send: () =>
      request(testApp())
        .post('/api/session')
        .type('form')
        .send({ email: 'a@b.test', password: 'x' }),
    status: 400,
  },
  {
    name: 'sign-in with broken JSON',
    send: () =>
      request(testApp())
        .post('/api/session')
        .set('Content-Type', 'application/json')
        .send('{"email": "a@b.test", '),
    status: 400,
    code: 'invalid_json',
  },
  {
    name: 'sign-in in a charset the server does not read (ISO-8859-1)',
    send: () =>
      request(testApp())
        .post('/api/session')
        .set('Content-Type', 'application/json; charset=iso-8859-1')
        .send('{"email":"a@b.test","password":"x"}'),
    status: 415,
  },
  {
    name: 'sign-in whose JSON carries a __proto__ key',
    send: () =>
      request(testApp())
        .post('/api/session')
        .set('Content-Type', 'application/json')
        .send(
          '{"email":"nobody@b.test","password":"x","__proto__":{"isAdmin":true,"polluted":"yes"}}',
        ),
    status: 401,
  },

  // ---- Users, account, settings (owner) -----------------------------------------------------------
  {
    name: 'new user whose e-mail is an SQL injection',
    send: (c) =>
      c.owner.post('/api/users', {
        email: "x'); DROP TABLE users;--@example.test",
        name: 'X',
        role: 'staff',
        password: 'long-enough-pass',
      }),
    status: 400,
    field: 'email',
  },
  {
    name: 'new user with an unknown field (isAdmin)',
    send: (c) =>
      c.owner.post('/api/users', {
        email: `${uniq('u')}@example.test`,
        name: 'X',
        role: 'staff',
        password: 'long-enough-pass',
        isAdmin: true,
      }),
    status: 400,
  },
  {
    name: 'new user with a role that does not exist',
    send: (c) =>
      c.owner.post('/api/users', {
        email: `${uniq('u')}@example.test`,
        name: 'X',
        role: 'superuser',
        password: 'long-enough-pass',
      }),
    status: 400,
    field: 'role',
  },
  {
    name: 'new user whose JSON carries constructor.prototype',
    send: (c) =>
      raw(
        c.owner,
        'post',
        '/api/users',
        `{"email":"${uniq('u')}@example.test","name":"X","role":"staff","password":"long-enough-pass","constructor":{"prototype":{"polluted":"yes"}}}`,
      ),
    status: 400,
  },
  {
    name: 'user change whose JSON carries a __proto__ role',
    send: (c, f) =>
      raw(c.owner, 'patch', `/api/users/${f.targetUserId}`, '{"__proto__":{"role":"owner"}}'),
    status: 400,
  },
  {
    name: 'user change with a path-traversal id',
    send: (c) => c.owner.patch('/api/users/..%2F..%2Fetc%2Fpasswd', { name: 'X' }),
    status: 400,
    field: 'id',
  },
  {
    name: 'user change with "false" as text for a boolean',
    send: (c, f) => c.owner.patch(`/api/users/${f.targetUserId}`, { active: 'false' }),
    status: 400,
    field: 'active',
  },
  {
    name: 'new user with a 1 MB name (body over the limit)',
    send: (c) =>
      c.owner.post('/api/users', {
        email: `${uniq('u')}@example.test`,
        name: oneMegabyte,
        role: 'staff',
        password: 'long-enough-pass',
      }),
    status: 413,
  },
  {
    name: 'a 2 MB JSON body',
    send: (c) => c.owner.patch('/api/account', { unit: 'mm', padding: 'y'.repeat(2 * MB) }),
    status: 413,
    code: 'too_large',
  },
  {
    name: 'account unit in furlongs',
    send: (c) => c.staff.patch('/api/account', { unit: 'furlongs' }),
    status: 400,
    field: 'unit',
  },
  {
    name: 'settings with hold expiry of minus one day',
    send: (c) => c.owner.patch('/api/settings', { holdExpiryDays: -1 }),
    status: 400,
    field: 'holdExpiryDays',
  },
  {
    name: 'settings with hold expiry 1e999 (Infinity once parsed)',
    send: (c) => raw(c.owner, 'patch', '/api/settings', '{"holdExpiryDays":1e999}'),
    status: 400,
    field: 'holdExpiryDays',
  },
  ...refusedSettings([
    ['settings with hold expiry "NaN" as text', { holdExpiryDays: 'NaN' }, 'holdExpiryDays'],
    ['settings with a time zone on another planet', { timeZone: 'Mars/Olympus' }, 'timeZone'],
    ['settings with a home currency that is not ISO 4217', { homeCurrency: '$$$' }, 'homeCurrency'],
    [
      'settings with a cut per pass that is not a length',
      { maxCutPerPass: 'banana' },
      'maxCutPerPass',
    ],
    ['settings with a negative ordering cost', { orderCost: '-5' }, 'orderCost'],
  ]),
  {
    name: 'settings with an unknown key',
    send: (c) => c.owner.patch('/api/settings', { adminMode: true }),
    status: 400,
  },

  // ---- Lengths (engine families) -------------------------------------------------------------------
  ...refusedFamilies([
    ['family with a negative bore', { standardBore: '-54.00 mm' }, 'standardBore'],
    ['family with NaN as its bore', { standardBore: 'NaN mm' }, 'standardBore'],
    ['family with Infinity as its stroke', { stroke: 'Infinity mm' }, 'stroke'],
    ['family with a bore in exponent notation', { standardBore: '5.4e1 mm' }, 'standardBore'],
    ['family with a bore in furlongs', { standardBore: '0.0003 furlongs' }, 'standardBore'],
    ['family with a clearance in centimetres', { clearanceMin: '0.004 cm' }, 'clearanceMin'],
    [
      'family with a bore as a bare number (no unit, wrong type)',
      { standardBore: 54 },
      'standardBore',
    ],
    ['family with a bore of a kilometre', { standardBore: '1000000 mm' }, 'standardBore'],
    [
      'family with a bore finer than a nanometre',
      { standardBore: '54.0000001 mm' },
      'standardBore',
    ],
    ['family with a 1 MB-less-a-bit name', { name: 'n'.repeat(MB - 2000) }, 'name'],
  ]),

  // ---- Parts and queries -------------------------------------------------------------------------------
  {
    name: 'part whose number is an SQL injection',
    send: (c) =>
      c.buyer.post('/api/parts', {
        kind: 'other',
        sku: "X'; DROP TABLE parts;--",
        description: 'x',
      }),
    status: 400,
    field: 'sku',
  },
  {
    name: 'part price in exponent notation',
    send: (c) =>
      c.buyer.post('/api/parts', {
        kind: 'other',
        sku: uniq('P'),
        description: 'x',
        salePrice: '1e5',
      }),
    status: 400,
    field: 'salePrice',
  },
  {
    name: 'part price negative',
    send: (c) =>
      c.buyer.post('/api/parts', {
        kind: 'other',
        sku: uniq('P'),
        description: 'x',
        salePrice: '-3.00',
      }),
    status: 400,
    field: 'salePrice',
  },
  {
    name: 'part price as a JSON number (float)',
    send: (c) =>
      c.buyer.post('/api/parts', {
        kind: 'other',
        sku: uniq('P'),
        description: 'x',
        salePrice: 12.5,
      }),
    status: 400,
    field: 'salePrice',
  },
  {
    name: 'part GTIN with a wrong check digit',
    send: (c) =>
      c.buyer.post('/api/parts', {
        kind: 'other',
        sku: uniq('P'),
        description: 'x',
        gtin: '4006381333932',
      }),
    status: 400,
    field: 'gtin',
  },
  {
    name: 'parts list sorted by an SQL fragment',
    send: (c) => c.staff.get('/api/parts?sort=sku;drop%20table%20parts'),
    status: 400,
    field: 'sort',
  },
  {
    name: 'parts list with a page size of 1e9',
    send: (c) => c.staff.get('/api/parts?pageSize=1e9'),
    status: 400,
    field: 'pageSize',
  },
  {
    name: 'parts list with page NaN',
    send: (c) => c.staff.get('/api/parts?page=NaN'),
    status: 400,
    field: 'page',
  },
  {
    name: 'parts list with the query parameter repeated (an array)',
    send: (c) => c.staff.get('/api/parts?q=a&q=b'),
    status: 400,
    field: 'q',
  },
  {
    name: 'part read with a quote in its id',
    send: (c) => c.staff.get("/api/parts/1'%20OR%20'1'%3D'1"),
    status: 400,
    field: 'id',
  },

  // ---- Receipts -------------------------------------------------------------------------------------------
  {
    name: 'receipt of 1.5 pistons',
    send: (c, f) => c.staff.post('/api/stock/receipts', receipt(f, { quantity: 1.5 })),
    status: 400,
    field: 'quantity',
  },
  {
    name: 'receipt of minus three',
    send: (c, f) => c.staff.post('/api/stock/receipts', receipt(f, { quantity: -3 })),
    status: 400,
    field: 'quantity',
  },
  {
    name: 'receipt quantity as text',
    send: (c, f) => c.staff.post('/api/stock/receipts', receipt(f, { quantity: '1' })),
    status: 400,
    field: 'quantity',
  },
  {
    name: 'receipt of a million',
    send: (c, f) => c.staff.post('/api/stock/receipts', receipt(f, { quantity: 1_000_000 })),
    status: 400,
    field: 'quantity',
  },
  {
    name: 'receipt with a skirt carrying SQL',
    send: (c, f) =>
      c.staff.post(
        '/api/stock/receipts',
        receipt(f, { units: [{ skirt: "54.2 mm'; DELETE FROM stock_ledger;--" }] }),
      ),
    status: 400,
  },
  {
    name: 'receipt with a skirt in inches written with exponent',
    send: (c, f) =>
      c.staff.post('/api/stock/receipts', receipt(f, { units: [{ skirt: '2.1e0 in' }] })),
    status: 400,
  },
  {
    name: 'receipt with an unknown field (ledger kind)',
    send: (c, f) => c.staff.post('/api/stock/receipts', receipt(f, { kind: 'adjustment' })),
    status: 400,
  },

  // ---- Jobs, readings, holds --------------------------------------------------------------------------------
  {
    name: 'job with 25 cylinders',
    send: (c, f) =>
      c.staff.post('/api/jobs', { customerName: 'X', familyId: f.fixture.familyId, cylinders: 25 }),
    status: 400,
    field: 'cylinders',
  },
  {
    name: 'job whose customer e-mail smuggles a mail header',
    send: (c, f) =>
      c.staff.post('/api/jobs', {
        customerName: 'X',
        customerEmail: 'a@b.test\r\nBcc: victim@c.test',
        familyId: f.fixture.familyId,
        cylinders: 1,
      }),
    status: 400,
    field: 'customerEmail',
  },
  {
    name: 'bore reading negative',
    send: (c, f) =>
      c.machinist.put(`/api/jobs/${f.jobId}/cylinders/1/readings`, readings('-54.05 mm')),
    status: 400,
  },
  {
    name: 'bore reading in exponent notation',
    send: (c, f) =>
      c.machinist.put(`/api/jobs/${f.jobId}/cylinders/1/readings`, readings('5.405e1 mm')),
    status: 400,
  },
  {
    name: 'bore reading in yards',
    send: (c, f) =>
      c.machinist.put(`/api/jobs/${f.jobId}/cylinders/1/readings`, readings('0.06 yd')),
    status: 400,
  },
  {
    name: 'bore reading as a number',
    send: (c, f) => c.machinist.put(`/api/jobs/${f.jobId}/cylinders/1/readings`, readings(54.05)),
    status: 400,
  },
  {
    name: 'bore readings, seven of them',
    send: (c, f) =>
      c.machinist.put(`/api/jobs/${f.jobId}/cylinders/1/readings`, {
        readings: Array.from({ length: 7 }, () => ({
          depth: 'top',
          axis: 'pin',
          diameter: '54.05 mm',
        })),
      }),
    status: 400,
    field: 'readings',
  },
  {
    name: 'readings for cylinder 0',
    send: (c, f) =>
      c.machinist.put(`/api/jobs/${f.jobId}/cylinders/0/readings`, readings('54.05 mm')),
    status: 400,
    field: 'n',
  },
  {
    name: 'hold naming both a unit and a part',
    send: (c, f) =>
      c.machinist.post(`/api/jobs/${f.jobId}/holds`, {
        cylinder: 1,
        unitId: f.jobId,
        partId: f.pistonId,
      }),
    status: 400,
  },
  {
    name: 'hold expiring in 1e999 days',
    send: (c, f) =>
      raw(
        c.machinist,
        'post',
        `/api/jobs/${f.jobId}/holds`,
        `{"cylinder":1,"partId":"${f.pistonId}","expiresInDays":1e999}`,
      ),
    status: 400,
    field: 'expiresInDays',
  },
  {
    name: 'hold for cylinder "one"',
    send: (c, f) =>
      c.machinist.post(`/api/jobs/${f.jobId}/holds`, { cylinder: 'one', partId: f.pistonId }),
    status: 400,
    field: 'cylinder',
  },

  // ---- Reorder rules and exchange rates --------------------------------------------------------------------
  {
    name: 'reorder point of minus five',
    send: (c, f) =>
      c.buyer.put(`/api/parts/${f.pistonId}/reorder-rule`, { reorderPoint: -5, orderUpTo: 10 }),
    status: 400,
    field: 'reorderPoint',
  },
  {
    name: 'order-up-to level of 1e999',
    send: (c, f) =>
      raw(
        c.buyer,
        'put',
        `/api/parts/${f.pistonId}/reorder-rule`,
        '{"reorderPoint":2,"orderUpTo":1e999}',
      ),
    status: 400,
    field: 'orderUpTo',
  },
  {
    name: 'exchange rate for a currency code carrying SQL',
    send: (c) => c.owner.put("/api/exchange-rates/USD'%3B--", { rate: '0.92' }),
    status: 400,
    field: 'currency',
  },
  {
    name: 'exchange rate in exponent notation',
    send: (c) => c.owner.put('/api/exchange-rates/USD', { rate: '9.2e-1' }),
    status: 400,
    field: 'rate',
  },

  // ---- Purchase orders -------------------------------------------------------------------------------
  {
    name: 'purchase order expected on 30 February',
    send: (c, f) => c.buyer.post('/api/purchase-orders', order(f, { expectedOn: '2027-02-30' })),
    status: 400,
  },
  {
    name: 'purchase order line priced NaN',
    send: (c, f) =>
      c.buyer.post(
        '/api/purchase-orders',
        order(f, { lines: [{ partId: f.ringsId, quantity: 2, unitPrice: 'NaN' }] }),
      ),
    status: 400,
    field: 'lines.0.unitPrice',
  },
  {
    name: 'purchase order of a billion ring sets',
    send: (c, f) =>
      c.buyer.post(
        '/api/purchase-orders',
        order(f, { lines: [{ partId: f.ringsId, quantity: 1e9, unitPrice: '4.00' }] }),
      ),
    status: 400,
    field: 'lines.0.quantity',
  },
  {
    name: 'purchase order with five thousand lines',
    send: (c, f) =>
      c.buyer.post(
        '/api/purchase-orders',
        order(f, {
          lines: Array.from({ length: 5000 }, () => ({
            partId: f.ringsId,
            quantity: 1,
            unitPrice: '1.00',
          })),
        }),
      ),
    status: 400,
    field: 'lines',
  },

  // ---- Uploads -----------------------------------------------------------------------------------------------
  {
    name: 'photo that is text with an image name',
    send: (c, f) =>
      c.staff
        .call('post', `/api/jobs/${f.jobId}/photos`)
        .attach('photo', Buffer.from('not an image at all\n'), {
          filename: 'bore.jpg',
          contentType: 'image/jpeg',
        }),
    status: 415,
  },
  {
    name: 'photo upload sent as JSON',
    send: (c, f) => c.staff.post(`/api/jobs/${f.jobId}/photos`, { photo: PNG.toString('base64') }),
    status: 400,
  },
  {
    name: 'price list named .exe',
    send: (c, f) =>
      priceList(c.staff, f, 'sku,price\nA-1,2.00\n', 'list.exe', 'application/octet-stream'),
    status: 415,
  },
  {
    name: 'price list with a path-traversal name and a program extension',
    send: (c, f) => priceList(c.staff, f, 'sku,price\nA-1,2.00\n', '../../../etc/cron.d/evil.sh'),
    status: 415,
  },
  {
    name: 'price list sent as JSON instead of a file',
    send: (c, f) =>
      c.staff.post(`/api/suppliers/${f.supplierId}/price-lists`, { file: 'sku,price' }),
    status: 415,
  },
  {
    name: 'price list that is empty',
    send: (c, f) => priceList(c.staff, f, '', 'empty.csv'),
    status: 400,
  },
  {
    name: 'price list that is a PNG named .csv',
    send: (c, f) => priceList(c.staff, f, PNG, 'prices.csv'),
    status: 415,
  },
  {
    name: 'price list whose every price is hostile (NaN, Infinity, exponent, negative, SQL, formula)',
    send: (c, f) =>
      priceList(
        c.staff,
        f,
        [
          'sku,description,price',
          'A-1,x,NaN',
          'A-2,x,Infinity',
          'A-3,x,1e5',
          'A-4,x,-3.00',
          "A-5,x,1'; DROP TABLE parts;--",
          'A-6,x,=1+1',
        ].join('\n'),
        'hostile.csv',
      ),
    status: 400,
  },
  {
    name: 'price list with a column mapping that is not JSON',
    send: (c, f) =>
      c.staff
        .call('post', `/api/suppliers/${f.supplierId}/price-lists`)
        .field('mapping', '{"sku": "sku", ')
        .attach('file', Buffer.from('sku,price\nA-1,2.00\n'), {
          filename: 'ok.csv',
          contentType: 'text/csv',
        }),
    status: 400,
    field: 'mapping',
  },
  {
    name: 'price list with a mapping naming an unknown field',
    send: (c, f) =>
      c.staff
        .call('post', `/api/suppliers/${f.supplierId}/price-lists`)
        .field(
          'mapping',
          JSON.stringify({ sku: 'sku', price: 'price', sizeUnit: 'mm', __proto__x: 'y' }),
        )
        .attach('file', Buffer.from('sku,price\nA-1,2.00\n'), {
          filename: 'ok.csv',
          contentType: 'text/csv',
        }),
    status: 400,
  },
  {
    name: 'price list whose file name carries raw control characters (a malformed part header)',
    send: (c, f) => priceList(c.staff, f, 'sku,price\nA-1,2.00\n', 'prices\u0007\u001b[31m.csv'),
    status: 400,
    code: 'invalid_upload',
  },
  {
    name: 'photo whose encoded file name hides a NUL character',
    send: (c, f) =>
      multipart(
        c.staff,
        `/api/jobs/${f.jobId}/photos`,
        'photo',
        PNG,
        "UTF-8''bore%00.png",
        'image/png',
      ),
    status: 400,
  },
  {
    name: 'new user whose name hides a NUL character',
    send: (c) =>
      c.owner.post('/api/users', {
        email: `${uniq('u')}@example.test`,
        name: 'Ro\u0000b',
        role: 'staff',
        password: 'long-enough-pass',
      }),
    status: 400,
  },
  {
    name: 'parts search for a NUL character',
    send: (c) => c.staff.get('/api/parts?q=%00'),
    status: 400,
  },
  {
    name: 'job note made of a NUL character and spaces',
    send: (c, f) => c.staff.post(`/api/jobs/${f.jobId}/notes`, { text: ' \u0000 ' }),
    status: 400,
  },
  {
    name: 'price list over the 50 MB upload limit',
    send: (c, f) => priceList(c.staff, f, Buffer.alloc(51 * MB, 0x41), 'huge.csv'),
    status: 413,
  },
];

let clients: Record<Role, Client>;
let fixtures: Fixtures;

beforeAll(async () => {
  const [owner, buyer, machinist, staff] = await Promise.all([
    signedIn('owner'),
    signedIn('buyer'),
    signedIn('machinist'),
    signedIn('staff'),
  ]);
  clients = { owner, buyer, machinist, staff };
  const fixture = await makeFamily(owner, { unit: 'mm' });
  const piston = await makePart(owner, fixture, 'piston', 1);
  const rings = await makePart(owner, fixture, 'rings', 1);
  const job = await staff.post('/api/jobs', {
    customerName: 'Hostile test',
    familyId: fixture.familyId,
    cylinders: 1,
  });
  if (job.status !== 201) throw new Error(`job: ${job.status} ${JSON.stringify(job.body)}`);
  const supplier = await buyer.post('/api/suppliers', {
    name: uniq('Supplier'),
    currency: 'EUR',
    leadDays: 5,
  });
  if (supplier.status !== 201)
    throw new Error(`supplier: ${supplier.status} ${JSON.stringify(supplier.body)}`);
  const target = await makeUser('staff');
  fixtures = {
    fixture,
    pistonId: piston.id,
    ringsId: rings.id,
    jobId: job.body.id,
    supplierId: supplier.body.id,
    targetUserId: target.id,
  };
});

describe('hostile input catalogue', () => {
  it('has at least forty cases', () => {
    expect(CASES.length).toBeGreaterThanOrEqual(40);
  });

  it.each(CASES.map((c) => [c.name, c] as const))(
    'when %s, then a clear 4xx and nothing is written',
    async (_name, hostile) => {
      const before = await rowCounts();
      const res = await hostile.send(clients, fixtures);
      expect({ status: res.status, body: res.body }).toMatchObject({ status: hostile.status });
      // The error model: a stable code, a message a person can act on, details (possibly empty).
      expect(res.body).toEqual({
        error: expect.objectContaining({
          code: expect.any(String),
          message: expect.any(String),
          details: expect.any(Array),
        }),
      });
      expect(res.body.error.message.length).toBeGreaterThan(5);
      if (hostile.code) expect(res.body.error.code).toBe(hostile.code);
      if (hostile.field) {
        const fields = (res.body.error.details as { field?: string }[]).map((d) => d.field ?? '');
        expect(fields.some((f) => f === hostile.field || f.startsWith(`${hostile.field}.`))).toBe(
          true,
        );
      }
      expect(JSON.stringify(res.body)).not.toMatch(LEAK);
      expect(await rowCounts()).toEqual(before);
      expect((await request(testApp()).get('/api/health')).status).toBe(200);
    },
  );

  it('when every hostile request has been answered, then no object prototype was polluted', () => {
    const probe = {} as Record<string, unknown>;
    expect(probe.polluted).toBeUndefined();
    expect(probe.isAdmin).toBeUndefined();
    expect(probe.role).toBeUndefined();
    expect(Object.prototype.hasOwnProperty.call(Object.prototype, 'polluted')).toBe(false);
  });

  it('when a price list arrives with a path-traversal name, then only its base name is kept and no file lands outside', async () => {
    const name = `../../../../tmp/${uniq('escape')}.csv`;
    const res = await priceList(
      clients.staff,
      fixtures,
      'sku,description,price\nTRV-1,Piston,12.00\n',
      name,
    );
    expect(res.status).toBe(201);
    expect(res.body.fileName).toBe(name.split('/').pop());
    expect(existsSync(`/tmp/${name.split('/').pop()}`)).toBe(false);
  });

  it('when a price list name carries encoded control characters, then they are stripped from the import log', async () => {
    const res = await multipart(
      clients.staff,
      `/api/suppliers/${fixtures.supplierId}/price-lists`,
      'file',
      Buffer.from('sku,description,price\nCTL-1,Piston,12.00\n'),
      "UTF-8''prices%07%1B%5B31m-dec.csv",
      'text/csv',
    );
    expect(res.status).toBe(201);
    expect(res.body.fileName).toBe('prices[31m-dec.csv');
  });
});
