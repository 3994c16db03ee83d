// Price-list import API: upload → preview → commit against the real app and database. Checks the
// contract, duplicates by SHA-256, an injected failure in the middle of a commit, malformed uploads
// (400, 413, 415, nothing written) and CSV exports neutralised against formula injection.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import iconv from 'iconv-lite';
import { db } from '../../server/db/knex';
import { armFault, disarmFaults } from '../../server/testing-faults';
import { type Client, closeTestApp, everyRoleSignedIn, uniq } from '../support/api';
import { makeFamily, makePart } from '../support/catalog-fixtures';

const { owner, buyer, staff, machinist } = everyRoleSignedIn();

afterEach(disarmFaults);
afterAll(closeTestApp);

const sample = (name: string): Buffer => readFileSync(join(__dirname, '..', '..', 'imports', name));

async function makeSupplier(currency = 'EUR'): Promise<{ id: string; name: string }> {
  const res = await buyer.post('/api/suppliers', {
    name: uniq('Supplier'),
    email: `${uniq('orders')}@supplier.test`,
    currency,
    leadDays: 14,
  });
  expect(res.status).toBe(201);
  return res.body;
}

function upload(
  client: Client,
  supplierId: string,
  content: Buffer | string,
  name = 'list.csv',
  mapping?: unknown,
) {
  const req = client
    .call('post', `/api/suppliers/${supplierId}/price-lists`)
    .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), name);
  if (mapping !== undefined) req.field('mapping', JSON.stringify(mapping));
  return req;
}

async function written(supplierId: string) {
  const [imports, items, prices, staged] = await Promise.all([
    db('price_list_imports')
      .where({ supplier_id: supplierId })
      .count<{ count: number }[]>('* as count'),
    db('supplier_items')
      .where({ supplier_id: supplierId })
      .count<{ count: number }[]>('* as count'),
    db('supplier_item_prices as h')
      .join('supplier_items as i', 'i.id', 'h.item_id')
      .where('i.supplier_id', supplierId)
      .count<{ count: number }[]>('* as count'),
    db('price_list_import_rows as r')
      .join('price_list_imports as m', 'm.id', 'r.import_id')
      .where('m.supplier_id', supplierId)
      .count<{ count: number }[]>('* as count'),
  ]);
  return {
    imports: Number(imports[0].count),
    items: Number(items[0].count),
    prices: Number(prices[0].count),
    staged: Number(staged[0].count),
  };
}

const NOTHING = { imports: 0, items: 0, prices: 0, staged: 0 };

/** Staff upload the semicolon Windows-1252 sample to `supplierId`. */
const uploadMorvendt = (supplierId: string) =>
  upload(staff, supplierId, sample('morvendt-motorteile-2026-12.csv'), 'morvendt.csv');

/** That sample's counts at a supplier that offers nothing yet: its 31 lines, each new and unmapped. */
const MORVENDT_FIRST_COUNTS = {
  rows: 31,
  ok: 31,
  errors: 0,
  new: 31,
  up: 0,
  down: 0,
  unchanged: 0,
  missing: 0,
  unmapped: 31,
};

describe('suppliers', () => {
  it('when a buyer creates a supplier, then 201 and it is listed with its currency and lead time', async () => {
    const name = uniq('Kestrel Parts');
    const res = await buyer.post('/api/suppliers', {
      name,
      email: 'Orders@Kestrel.test',
      currency: 'eur',
      leadDays: 21,
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      name,
      email: 'orders@kestrel.test',
      currency: 'EUR',
      leadDays: 21,
      items: 0,
    });
    const list = await staff.get(`/api/suppliers?q=${encodeURIComponent(name)}`);
    expect(list.status).toBe(200);
    expect(list.body).toEqual({ items: [expect.objectContaining({ id: res.body.id })], total: 1 });
  });

  it('when the currency is not an ISO 4217 code, then 400 naming the field and nothing is written', async () => {
    const name = uniq('Nowhere');
    const res = await buyer.post('/api/suppliers', {
      name,
      email: 'a@b.test',
      currency: 'EUX',
      leadDays: 5,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('currency');
    expect(await db('suppliers').where({ name }).first()).toBeUndefined();
  });

  it('when two suppliers get the same name, then 409', async () => {
    const first = await makeSupplier();
    const res = await buyer.post('/api/suppliers', {
      name: first.name.toUpperCase(),
      currency: 'EUR',
      leadDays: 5,
    });
    expect(res.status).toBe(409);
  });

  it('when staff or a machinist try to create a supplier, then 403; staff may read', async () => {
    const body = { name: uniq('X'), currency: 'EUR', leadDays: 5 };
    expect((await staff.post('/api/suppliers', body)).status).toBe(403);
    expect((await machinist.post('/api/suppliers', body)).status).toBe(403);
    expect((await machinist.get('/api/suppliers')).status).toBe(403);
    expect((await staff.get('/api/suppliers')).status).toBe(200);
  });
});

describe('uploading and committing a price list', () => {
  it('when staff upload the semicolon Windows-1252 sample, then the preview shows the detected format, counts and sample', async () => {
    const supplier = await makeSupplier();
    const res = await uploadMorvendt(supplier.id);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      importId: expect.any(String),
      status: 'previewed',
      detected: { encoding: 'windows-1252', delimiter: ';', decimal: ',', headerLine: 1 },
      mapping: { sku: 'Art.-Nr.', price: 'Preis €', size: 'Ø mm', sizeUnit: 'mm' },
      counts: MORVENDT_FIRST_COUNTS,
      errors: [],
    });
    expect(res.body.sample).toHaveLength(20);
    expect(res.body.sample[0]).toEqual({
      line: 2,
      sku: 'MV-K54-000',
      description: 'Kolben Ø 54,00 mm – Standard, Rautiefe Rz 2 µm',
      size: { mm: '54.000', in: '2.1260' },
      oversize: { mm: '0.000', in: '0.0000' },
      price: '48.9000',
      currency: 'EUR',
      available: 0,
      leadDays: 5,
      gtin: expect.stringMatching(/^\d{14}$/),
    });
    // A preview changes nothing the supplier offers.
    expect(await written(supplier.id)).toEqual({ imports: 1, items: 0, prices: 0, staged: 31 });
  });

  it('when the preview is committed, then every item and its first price are written in one go', async () => {
    const supplier = await makeSupplier();
    const preview = await uploadMorvendt(supplier.id);
    const commit = await staff.post(`/api/price-list-imports/${preview.body.importId}/commit`);
    expect(commit.status).toBe(200);
    expect(commit.body).toEqual({
      status: 'committed',
      importId: preview.body.importId,
      counts: MORVENDT_FIRST_COUNTS,
    });
    expect(await written(supplier.id)).toEqual({ imports: 1, items: 31, prices: 31, staged: 0 });

    const items = await staff.get(`/api/suppliers/${supplier.id}/items?q=MV-Z72-SET`);
    expect(items.body.total).toBe(1);
    expect(items.body.items[0]).toMatchObject({
      sku: 'MV-Z72-SET',
      price: '1234.5000',
      currency: 'EUR',
      size: { mm: '72.500', in: '2.8543' },
      leadDays: 21,
      part: null,
      dropped: false,
      lastImportId: preview.body.importId,
    });
    const unmapped = await staff.get(`/api/suppliers/${supplier.id}/items?mapped=false&page=1`);
    expect(unmapped.body.total).toBe(31);

    const log = await staff.get(`/api/price-list-imports?supplierId=${supplier.id}`);
    expect(log.body).toEqual({
      items: [
        expect.objectContaining({
          importId: preview.body.importId,
          status: 'committed',
          fileName: 'morvendt.csv',
          uploadedBy: expect.objectContaining({ name: 'Test staff' }),
          committedAt: expect.any(String),
        }),
      ],
      total: 1,
    });
    const one = await staff.get(`/api/price-list-imports/${preview.body.importId}`);
    expect(one.body).toMatchObject({
      status: 'committed',
      supplierName: supplier.name,
      detected: { delimiter: ';' },
    });
  });

  it('when the same file is uploaded or committed again, then 200 duplicate and nothing is written', async () => {
    const supplier = await makeSupplier('USD');
    const bytes = sample('quillmark-pistons-2026-12.csv');
    const preview = await upload(buyer, supplier.id, bytes, 'quillmark.csv');
    await buyer.post(`/api/price-list-imports/${preview.body.importId}/commit`).expect(200);
    const before = await written(supplier.id);

    const again = await upload(buyer, supplier.id, bytes, 'quillmark-again.csv');
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ status: 'duplicate', importId: preview.body.importId });
    const recommit = await buyer.post(`/api/price-list-imports/${preview.body.importId}/commit`);
    expect(recommit.status).toBe(200);
    expect(recommit.body).toMatchObject({ status: 'duplicate' });
    expect(await written(supplier.id)).toEqual(before);
  });

  it('when a second list changes prices, drops an item and adds one, then counts, history and dropped flags follow', async () => {
    const supplier = await makeSupplier();
    const header = 'SKU;Bezeichnung;Ø mm;Preis';
    const first = [
      header,
      'A-1;Kolben;54,25;40,00',
      'A-2;Kolben;54,50;50,00',
      'A-3;Kolben;54,75;60,00',
      'A-4;Ringe;54,25;10,00',
    ];
    const p1 = await upload(buyer, supplier.id, first.join('\r\n'));
    await buyer.post(`/api/price-list-imports/${p1.body.importId}/commit`).expect(200);

    const second = [
      header,
      'A-1;Kolben;54,25;44,00',
      'A-2;Kolben;54,50;45,00',
      'A-3;Kolben;54,75;60,00',
      'A-5;Kolben;55,00;70,00',
    ];
    const p2 = await upload(buyer, supplier.id, second.join('\r\n'));
    expect(p2.status).toBe(201);
    expect(p2.body.counts).toEqual({
      rows: 4,
      ok: 4,
      errors: 0,
      new: 1,
      up: 1,
      down: 1,
      unchanged: 1,
      missing: 1,
      unmapped: 4,
    });
    // 40.00 → 44.00 is +10.0 %, 50.00 → 45.00 is −10.0 %.
    expect(p2.body.priceChanges).toEqual({
      upAveragePercent: '10.0',
      downAveragePercent: '-10.0',
      largest: [
        expect.objectContaining({
          sku: 'A-1',
          oldPrice: '40.0000',
          newPrice: '44.0000',
          percent: '10.0',
        }),
        expect.objectContaining({
          sku: 'A-2',
          oldPrice: '50.0000',
          newPrice: '45.0000',
          percent: '-10.0',
        }),
      ],
    });
    const commit = await buyer.post(`/api/price-list-imports/${p2.body.importId}/commit`);
    expect(commit.body.counts).toMatchObject({ new: 1, up: 1, down: 1, unchanged: 1, missing: 1 });

    const items = await buyer.get(`/api/suppliers/${supplier.id}/items?pageSize=10`);
    const bySku = Object.fromEntries(items.body.items.map((i: { sku: string }) => [i.sku, i]));
    expect(bySku['A-4'].dropped).toBe(true);
    expect(bySku['A-1']).toMatchObject({
      price: '44.0000',
      dropped: false,
      lastImportId: p2.body.importId,
    });

    const history = await buyer.get(
      `/api/suppliers/${supplier.id}/items/${bySku['A-1'].id}/prices`,
    );
    expect(history.status).toBe(200);
    expect(history.body.total).toBe(2);
    expect(history.body.items.map((h: { price: string }) => h.price)).toEqual([
      '44.0000',
      '40.0000',
    ]);
    const unchanged = await buyer.get(
      `/api/suppliers/${supplier.id}/items/${bySku['A-3'].id}/prices`,
    );
    expect(unchanged.body.total).toBe(1);
    const dropped = await buyer.get(`/api/suppliers/${supplier.id}/items?dropped=true`);
    expect(dropped.body.items.map((i: { sku: string }) => i.sku)).toEqual(['A-4']);
  });

  it('when a partial list is committed with dropMissing false, then items it does not hold stay', async () => {
    const supplier = await makeSupplier();
    const p1 = await upload(buyer, supplier.id, 'SKU,Price\nB-1,10.00\nB-2,20.00\n');
    await buyer.post(`/api/price-list-imports/${p1.body.importId}/commit`).expect(200);
    const p2 = await upload(buyer, supplier.id, 'SKU,Price\nB-1,11.00\n');
    await buyer
      .post(`/api/price-list-imports/${p2.body.importId}/commit`)
      .send({ dropMissing: false })
      .expect(200);
    const items = await buyer.get(`/api/suppliers/${supplier.id}/items?dropped=true`);
    expect(items.body.total).toBe(0);
  });

  it('when a failure is injected in the middle of a commit, then nothing is left of it and the import can be committed again', async () => {
    const supplier = await makeSupplier('GBP');
    const preview = await upload(
      staff,
      supplier.id,
      sample('tessaway-spares-2026-12.txt'),
      'tessaway.txt',
    );
    expect(preview.status).toBe(201);
    expect(preview.body.detected).toEqual({
      encoding: 'utf-8-bom',
      delimiter: '\t',
      decimal: '.',
      headerLine: 3,
    });
    const before = await written(supplier.id);
    const audits = await db('audit_events').where({
      entity: 'price_list_import',
      entity_id: preview.body.importId,
    });

    armFault('imports.commit.midway');
    const failed = await staff.post(`/api/price-list-imports/${preview.body.importId}/commit`);
    expect(failed.status).toBe(500);
    expect(failed.body.error.message).not.toMatch(/injected|insert|select/i);
    expect(await written(supplier.id)).toEqual(before);
    expect(
      await db('audit_events').where({
        entity: 'price_list_import',
        entity_id: preview.body.importId,
      }),
    ).toEqual(audits);
    const logged = await staff.get(`/api/price-list-imports/${preview.body.importId}`);
    expect(logged.body).toMatchObject({
      status: 'failed',
      failure: expect.stringMatching(/nothing was changed/),
    });

    const retry = await staff.post(`/api/price-list-imports/${preview.body.importId}/commit`);
    expect(retry.status).toBe(200);
    expect(retry.body).toMatchObject({ status: 'committed', counts: { ok: 14, new: 14 } });
    expect(await written(supplier.id)).toEqual({ imports: 1, items: 14, prices: 14, staged: 0 });
  });

  it('when the staged rows are gone (the unlogged staging table is emptied by a crash), then the commit asks for the file again and writes nothing', async () => {
    const supplier = await makeSupplier();
    const preview = await upload(buyer, supplier.id, 'SKU,Price\nS-1,10.00\nS-2,20.00\n');
    expect(preview.status).toBe(201);
    await db('price_list_import_rows').where({ import_id: preview.body.importId }).delete();
    const commit = await buyer.post(`/api/price-list-imports/${preview.body.importId}/commit`);
    expect(commit.status).toBe(409);
    expect(commit.body.error.message).toMatch(/incomplete \(0 of 2\); upload the file again/);
    expect(await written(supplier.id)).toEqual({ imports: 1, items: 0, prices: 0, staged: 0 });
    const table = await db.raw(
      `SELECT relpersistence FROM pg_class WHERE relname = 'price_list_import_rows'`,
    );
    expect(table.rows[0].relpersistence).toBe('u');
  });

  it('when a list has broken rows, then they are listed by line and only the good rows are committed', async () => {
    const supplier = await makeSupplier();
    const preview = await upload(
      staff,
      supplier.id,
      sample('orrinpike-old-stock-2026-11.csv'),
      'orrinpike.csv',
    );
    expect(preview.status).toBe(201);
    expect(preview.body.counts).toMatchObject({ rows: 14, ok: 6, errors: 8, new: 6 });
    expect(preview.body.errors.map((e: { line: number }) => e.line)).toEqual([
      2, 6, 7, 8, 10, 11, 13, 14,
    ]);
    expect(preview.body.errors[2]).toEqual({
      line: 7,
      message: 'This row has 7 columns; the header has 8.',
    });
    await staff.post(`/api/price-list-imports/${preview.body.importId}/commit`).expect(200);
    expect((await written(supplier.id)).items).toBe(6);

    // The next list still has the broken rows: their SKUs are not counted as missing.
    const next = await upload(
      staff,
      supplier.id,
      'sku,price\nOP-54-075,39.00\nOP-72-025,41.50\nOP-72-100,45.00\nOP-54-025,52.00\nOP-54-100,55.00\nOP-6640-000,41.50\nOP-72-050,-1\n',
    );
    expect(next.body.counts).toMatchObject({ ok: 6, errors: 1, missing: 0, up: 1, unchanged: 5 });
  });

  it('when a SKU and a description hold backslashes, then the staged rows keep them as written', async () => {
    // The staging COPY uses PostgreSQL's text format, where a backslash starts an escape (PostgreSQL
    // documentation, COPY, "Text Format"): unescaped, "\N" would stage NULL and "\t" a tab.
    const supplier = await makeSupplier();
    const preview = await upload(
      staff,
      supplier.id,
      'sku,description,price\nBK\\1,Ring set \\N 54 mm,12.50\nBK-2,Liner \\t \\\\ end\\,13.00\n',
    );
    expect(preview.status).toBe(201);
    expect(
      preview.body.sample.map((r: { sku: string; description: string }) => [r.sku, r.description]),
    ).toEqual([
      ['BK\\1', 'Ring set \\N 54 mm'],
      ['BK-2', 'Liner \\t \\\\ end\\'],
    ]);
  });

  it('when a mapping is sent with the upload, then it is used and remembered for the next list', async () => {
    const supplier = await makeSupplier();
    const list = 'Code,Text,Amount,Bore\nC-1,Piston,12.50,54.25\n';
    const proposed = await upload(buyer, supplier.id, list);
    // "Code" is recognised as the SKU, "Amount" is not a price word.
    expect(proposed.status).toBe(400);
    expect(proposed.body.error).toMatchObject({
      code: 'missing_column',
      message: expect.stringMatching(/^Missing required column: price\./),
      // The header line and the proposal come with the refusal, so the page can ask which is which.
      headers: ['Code', 'Text', 'Amount', 'Bore'],
      mapping: { sku: 'Code', price: null },
      detected: { delimiter: ',', headerLine: 1 },
    });

    const mapping = {
      sku: 'Code',
      description: 'Text',
      price: 'Amount',
      size: 'Bore',
      sizeUnit: 'mm',
    };
    const confirmed = await upload(buyer, supplier.id, list, 'list.csv', mapping);
    expect(confirmed.status).toBe(201);
    expect(confirmed.body.mapping).toMatchObject({
      sku: 'Code',
      price: 'Amount',
      size: 'Bore',
      oversize: null,
    });
    await buyer.post(`/api/price-list-imports/${confirmed.body.importId}/commit`).expect(200);

    const next = await upload(
      buyer,
      supplier.id,
      'Code,Text,Amount,Bore\nC-1,Piston,13.00,54.25\nC-2,Piston,14.00,54.50\n',
    );
    expect(next.status).toBe(201);
    expect(next.body.mapping).toMatchObject({ price: 'Amount' });
    expect(next.body.counts).toMatchObject({ new: 1, up: 1 });
  });

  it('when the mapping field is not valid, then 400 naming it and nothing is written', async () => {
    const supplier = await makeSupplier();
    const bad = await upload(buyer, supplier.id, 'SKU,Price\nA,1.00\n', 'a.csv', {
      sku: 'SKU',
      price: 'Price',
      sizeUnit: 'cm',
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('mapping.sizeUnit');
    const missing = await upload(buyer, supplier.id, 'SKU,Price\nA,1.00\n', 'a.csv', {
      sku: 'SKU',
      price: 'Cost',
      sizeUnit: 'mm',
    });
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toBe('There is no column named "Cost" on the header line.');
    expect(await written(supplier.id)).toEqual(NOTHING);
  });

  it('when a machinist uploads, then 403', async () => {
    const supplier = await makeSupplier();
    const res = await upload(machinist, supplier.id, 'SKU,Price\nA,1.00\n');
    expect(res.status).toBe(403);
    expect(await written(supplier.id)).toEqual(NOTHING);
  });
});

describe('malformed uploads: a clear error and nothing written', () => {
  const cases: [string, number, () => Buffer | string, string, RegExp][] = [
    ['an empty file', 400, () => '', 'a.csv', /The file is empty/],
    [
      'a header only',
      400,
      () => 'SKU,Description,Price\r\n',
      'a.csv',
      /header on line 1 but no rows/,
    ],
    [
      'binary bytes',
      415,
      () => Buffer.from([0x53, 0x4b, 0x55, 0x00, 0x01, 0x02, 0x0a, 0xff, 0x00]),
      'a.csv',
      /binary data/,
    ],
    [
      'a UTF-16 file',
      415,
      () =>
        Buffer.concat([
          Buffer.from([0xff, 0xfe]),
          iconv.encode('SKU,Price\r\nA,1.00\r\n', 'utf16le'),
        ]),
      'a.csv',
      /UTF-16/,
    ],
    [
      'a spreadsheet workbook name',
      415,
      () => 'SKU,Price\nA,1.00\n',
      'list.xlsx',
      /\.csv, \.tsv or \.txt/,
    ],
    [
      'a ZIP file named .csv',
      415,
      () => Buffer.concat([Buffer.from('PK\u0003\u0004'), Buffer.alloc(40, 0)]),
      'a.csv',
      /save it as CSV/,
    ],
    [
      'ragged rows only',
      400,
      () => 'SKU,Description,Price\nA,1.00\nB,2.00\n',
      'a.csv',
      /No row can be imported: all 2 rows have errors. Line 2: This row has 2 columns; the header has 3/,
    ],
    [
      'an unbalanced quote',
      400,
      () => 'SKU,Description,Price\nA,"Piston,1.00\nB,Rings,2.00\n',
      'a.csv',
      /never closed/,
    ],
    [
      'a 2 MB single line',
      400,
      () => 'SKU;Price;'.repeat(210_000),
      'a.csv',
      /without a line break/,
    ],
    [
      'negative prices',
      400,
      () => 'SKU,Price\nA,-1.00\n',
      'a.csv',
      /Line 2: The price "-1.00" is negative/,
    ],
    [
      'non-numeric prices',
      400,
      () => 'SKU,Price\nA,ask us\n',
      'a.csv',
      /Line 2: The price "ask us" is not a number/,
    ],
    [
      'an unknown currency',
      400,
      () => 'SKU,Price,Currency\nA,1.00,EUX\n',
      'a.csv',
      /"EUX" is not an ISO 4217 currency code/,
    ],
    [
      'an impossible length unit',
      400,
      () => 'SKU,Size,Price\nA,54.25 cm,1.00\n',
      'a.csv',
      /The unit must be mm or in \(got "cm"\)/,
    ],
    [
      'duplicate SKUs in one file',
      400,
      () => 'SKU,Price\nA,1.00\nA,2.00\n',
      'a.csv',
      /SKU "A" appears again on line 3/,
    ],
    [
      'a missing price column',
      400,
      () => 'SKU,Description\nA,Piston\n',
      'a.csv',
      /^Missing required column: price/,
    ],
    ['no delimiter', 400, () => 'just words\nmore words\n', 'a.csv', /No columns found/],
  ];

  it.each(cases)(
    'when the upload is %s, then %i and nothing is written',
    async (_what, status, content, name, message) => {
      const supplier = await makeSupplier();
      const res = await upload(staff, supplier.id, content(), name);
      expect({ status: res.status, message: res.body.error?.message }).toEqual({
        status,
        message: expect.stringMatching(message),
      });
      expect(await written(supplier.id)).toEqual(NOTHING);
    },
  );

  it('when the request is not multipart, then 415 saying how to send the file', async () => {
    const supplier = await makeSupplier();
    const res = await staff.post(`/api/suppliers/${supplier.id}/price-lists`, {
      file: 'SKU,Price',
    });
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/multipart\/form-data/);
  });

  it('when no file is attached, then 400 naming the field', async () => {
    const supplier = await makeSupplier();
    const res = await staff
      .call('post', `/api/suppliers/${supplier.id}/price-lists`)
      .field('mapping', '');
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ field: 'file', message: 'missing' }]);
  });

  it('when the file is larger than 50 MB, then 413 and nothing is written', async () => {
    const supplier = await makeSupplier();
    const big = Buffer.alloc(50 * 1024 * 1024 + 10, 'a');
    const res = await upload(staff, supplier.id, big, 'big.csv');
    expect(res.status).toBe(413);
    expect(await written(supplier.id)).toEqual(NOTHING);
  });

  it('when the supplier does not exist, then 404', async () => {
    const res = await upload(staff, '00000000-0000-4000-8000-000000000000', 'SKU,Price\nA,1.00\n');
    expect(res.status).toBe(404);
  });
});

describe('mapping supplier items to catalog parts', () => {
  it("when an item has the size of a family step, then the queue suggests that step's part and the buyer maps it", async () => {
    const fx = await makeFamily(owner, { unit: 'mm' });
    const piston = await makePart(owner, fx, 'piston', 1);
    await makePart(owner, fx, 'rings', 1);
    const supplier = await makeSupplier();
    const preview = await upload(
      buyer,
      supplier.id,
      `SKU,Description,Size mm,Price\nQ-1,Piston for ${fx.familyCode},64.25,30.00\nQ-2,Unknown thing,12.00,5.00\n`,
    );
    await buyer.post(`/api/price-list-imports/${preview.body.importId}/commit`).expect(200);

    const queue = await staff.get(`/api/supplier-items/unmapped?supplierId=${supplier.id}`);
    expect(queue.status).toBe(200);
    expect(queue.body.total).toBe(2);
    const q1 = queue.body.items.find((i: { sku: string }) => i.sku === 'Q-1');
    // 64.00 mm standard bore + 0.25 mm step = 64.25 mm.
    expect(q1.suggestions[0]).toMatchObject({
      id: piston.id,
      kind: 'piston',
      reasons: expect.arrayContaining(['same size']),
    });
    const q2 = queue.body.items.find((i: { sku: string }) => i.sku === 'Q-2');
    expect(q2.suggestions).toEqual([]);

    expect((await staff.patch(`/api/supplier-items/${q1.id}`, { partId: piston.id })).status).toBe(
      403,
    );
    const mapped = await buyer.patch(`/api/supplier-items/${q1.id}`, { partId: piston.id });
    expect(mapped.status).toBe(200);
    expect(mapped.body.part).toMatchObject({ id: piston.id, sku: piston.sku });
    const after = await staff.get(`/api/supplier-items/unmapped?supplierId=${supplier.id}`);
    expect(after.body.items.map((i: { sku: string }) => i.sku)).toEqual(['Q-2']);
  });

  it('when a new item carries the GTIN of a catalog part, then the commit maps it', async () => {
    const fx = await makeFamily(owner, { unit: 'mm' });
    // 4006381333931: a valid EAN-13 (GS1 General Specifications 7.9 check digit, worked by hand: 1).
    const gtin = `20${String(Date.now()).slice(-10)}`;
    const body =
      gtin +
      String(
        (10 -
          ([...gtin].reverse().reduce((s, d, i) => s + Number(d) * (i % 2 === 0 ? 3 : 1), 0) %
            10)) %
          10,
      );
    const part = await makePart(owner, fx, 'piston', 0, { gtin: body });
    const supplier = await makeSupplier();
    const preview = await upload(buyer, supplier.id, `SKU,Price,EAN\nG-1,30.00,${body}\n`);
    expect(preview.body.counts).toMatchObject({ new: 1, unmapped: 0 });
    await buyer.post(`/api/price-list-imports/${preview.body.importId}/commit`).expect(200);
    const items = await buyer.get(`/api/suppliers/${supplier.id}/items`);
    expect(items.body.items[0].part).toMatchObject({ id: part.id });
  });
});

describe('CSV exports', () => {
  it('when supplier text begins with =, +, - or @, then the price comparison neutralises it (OWASP CSV injection)', async () => {
    // OWASP "CSV Injection": prefix cells beginning with =, +, -, @, tab or carriage return with a single
    // quote so a spreadsheet shows them as text instead of running them as formulas.
    const fx = await makeFamily(owner, { unit: 'mm' });
    const part = await makePart(owner, fx, 'piston', 2);
    const supplier = await makeSupplier();
    const list = [
      'SKU,Description,Price',
      '"=HYPERLINK(""http://x.test"")",=1+2,10.00',
      '+SUM(A1),-2+3,11.00',
      '@cmd,@SUM(1),12.00',
    ].join('\n');
    const preview = await upload(buyer, supplier.id, list);
    expect(preview.status).toBe(201);
    await buyer.post(`/api/price-list-imports/${preview.body.importId}/commit`).expect(200);
    const items = await buyer.get(`/api/suppliers/${supplier.id}/items`);
    for (const item of items.body.items)
      await buyer.patch(`/api/supplier-items/${item.id}`, { partId: part.id }).expect(200);

    const csv = await buyer.get(`/api/exports/price-comparison.csv?familyId=${fx.familyId}`);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    const text = csv.text;
    expect(text).toContain(`'=HYPERLINK(""http://x.test"")`);
    expect(text).toContain("'=1+2");
    expect(text).toContain("'+SUM(A1)");
    expect(text).toContain("'-2+3");
    expect(text).toContain("'@cmd");
    expect(text).toContain("'@SUM(1)");
    expect(text).not.toMatch(/(^|,)[=+@]/m);
    // Our own figures go out as plain numbers.
    expect(text).toMatch(/,10\.0000,EUR,1,/);
  });

  it('when the stock list and a ladder are exported, then each is a CSV with both units', async () => {
    const fx = await makeFamily(owner, { unit: 'in' });
    await makePart(owner, fx, 'piston', 1, { description: '=Piston with formula-like text' });
    const stock = await staff.get('/api/exports/stock.csv');
    expect(stock.status).toBe(200);
    expect(stock.text).toContain("'=Piston with formula-like text");
    const ladder = await machinist.get(`/api/exports/families/${fx.familyId}/ladder.csv`);
    expect(ladder.status).toBe(200);
    // 2.5000 in + 0.010 in = 2.5100 in = 63.754 mm (1 in = 25.4 mm exactly, NIST SP 811 appendix B).
    expect(ladder.text).toContain(',0.254,0.0100,63.754,2.5100,');
    expect((await machinist.get('/api/exports/stock.csv')).status).toBe(403);
  });
});

describe('progress', () => {
  it('when nothing runs under a progress token, then its phase is waiting', async () => {
    const res = await staff.get(
      '/api/price-list-imports/progress/11111111-1111-4111-8111-111111111111',
    );
    expect(res.body).toEqual({ phase: 'waiting', rows: 0, bytes: 0 });
  });

  it('when a large list is being read, then its progress token shows the rows read so far', async () => {
    const supplier = await makeSupplier();
    const rows = Array.from(
      { length: 150_000 },
      (_, i) => `P-${i},Piston number ${i},54.25 mm,${(i % 900) + 10}.50`,
    );
    const token = '22222222-2222-4222-8222-222222222222';
    let status = 0;
    const uploading = upload(staff, supplier.id, ['SKU,Description,Size,Price', ...rows].join('\n'))
      .query({ progress: token })
      .then((res) => {
        status = res.status;
      });
    const seen: { phase: string; rows: number }[] = [];
    while (status === 0) {
      const res = await buyer.get(`/api/price-list-imports/progress/${token}`);
      seen.push(res.body);
      await new Promise((r) => setTimeout(r, 20));
    }
    await uploading;
    expect(status).toBe(201);
    expect(seen.some((p) => p.phase === 'reading' || p.phase === 'comparing')).toBe(true);
    const rowsSeen = seen.filter((p) => p.phase === 'reading').map((p) => p.rows);
    // Rows only ever go up while reading.
    expect(rowsSeen).toEqual([...rowsSeen].sort((a, b) => a - b));
  }, 60_000);
});
