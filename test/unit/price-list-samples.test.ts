import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseFile } from './price-list-files';

const sample = (name: string): string => join(__dirname, '..', '..', 'imports', name);

describe('the sample price lists in imports/', () => {
  it('when the comma list in inches is read, then its format, mapping and rows are detected', async () => {
    const list = await parseFile(sample('quillmark-pistons-2026-12.csv'), { currency: 'USD' });
    expect(list.format).toMatchObject({
      encoding: 'utf-8',
      delimiter: ',',
      decimal: '.',
      headerLine: 1,
    });
    expect(list.mapping).toEqual({
      sku: 'Part Number',
      description: 'Description',
      size: 'Bore (in)',
      oversize: 'Oversize',
      price: 'Price',
      available: 'Qty Available',
      leadDays: 'Lead Time (days)',
      gtin: 'UPC',
      currency: null,
      sizeUnit: 'in',
    });
    expect(list.counts).toEqual({ rows: 33, ok: 33, errors: 0, warnings: 0 });
    expect(list.rows[2]).toEqual({
      line: 4,
      sku: 'QP-2187-010',
      description: 'Piston, cast, 2.1975" bore, pin and clips',
      // 2.1975 in and 0.010 in at 25.4 mm per inch exactly (NIST SP 811, appendix B).
      sizeNm: 55_816_500,
      oversizeNm: 254_000,
      price: '44.60',
      currency: 'USD',
      available: 2,
      leadDays: 14,
      gtin: '00200000000035',
    });
    expect(list.rows.find((r) => r.sku === 'QK-3375-SET4')?.price).toBe('1089.00');
    // +0.060 in = 1 524 000 nm over 3.3750 in = 85 725 000 nm.
    expect(list.rows.find((r) => r.sku === 'QP-3375-060')).toMatchObject({
      sizeNm: 87_249_000,
      oversizeNm: 1_524_000,
    });
  });

  it('when the semicolon list in Windows-1252 is read, then accents, € and – come through and decimal commas are read', async () => {
    const path = sample('morvendt-motorteile-2026-12.csv');
    const bytes = readFileSync(path);
    // The file really is Windows-1252: it holds the bytes 0x80 (€) and 0x96 (–) and CRLF line ends.
    expect(bytes.includes(0x80)).toBe(true);
    expect(bytes.includes(0x96)).toBe(true);
    expect(bytes.includes(Buffer.from('\r\n'))).toBe(true);

    const list = await parseFile(path);
    expect(list.format).toEqual({
      encoding: 'windows-1252',
      delimiter: ';',
      decimal: ',',
      headerLine: 1,
      headers: [
        'Art.-Nr.',
        'Bezeichnung',
        'Ø mm',
        'Übermaß',
        'Preis €',
        'Bestand',
        'Lieferzeit',
        'EAN',
      ],
    });
    expect(list.mapping).toMatchObject({
      sku: 'Art.-Nr.',
      description: 'Bezeichnung',
      size: 'Ø mm',
      oversize: 'Übermaß',
      price: 'Preis €',
      available: 'Bestand',
      leadDays: 'Lieferzeit',
      gtin: 'EAN',
      sizeUnit: 'mm',
    });
    expect(list.counts).toEqual({ rows: 31, ok: 31, errors: 0, warnings: 0 });
    const descriptions = list.rows.map((r) => r.description).join('\n');
    for (const ch of ['µ', 'ø', 'Ø', 'é', '°', 'ß', '–', '€']) expect(descriptions).toContain(ch);
    expect(list.rows[0]).toMatchObject({
      sku: 'MV-K54-000',
      description: 'Kolben Ø 54,00 mm – Standard, Rautiefe Rz 2 µm',
      sizeNm: 54_000_000,
      oversizeNm: 0,
      price: '48.90',
      currency: 'EUR',
      leadDays: 5,
    });
    const set = list.rows.find((r) => r.sku === 'MV-Z72-SET');
    expect(set).toMatchObject({ price: '1234.50', sizeNm: 72_500_000, leadDays: 21 });
    expect(list.rows.find((r) => r.sku === 'MV-K54-050')?.description).toBe(
      'Kolben Ø 54,50 mm; qualité renforcée – Übermaß 0,50',
    );
  });

  it('when the tab list with two title lines is read, then the header is found on line 3', async () => {
    const list = await parseFile(sample('tessaway-spares-2026-12.txt'), { currency: 'GBP' });
    expect(list.format).toMatchObject({
      encoding: 'utf-8-bom',
      delimiter: '\t',
      decimal: '.',
      headerLine: 3,
    });
    expect(list.mapping).toMatchObject({
      sku: 'SKU',
      description: 'Item description',
      size: 'Piston size',
      oversize: 'Step',
      price: 'Unit price',
      available: 'In stock',
      leadDays: 'Lead time',
      gtin: 'EAN-13',
      sizeUnit: 'mm',
    });
    expect(list.counts).toEqual({ rows: 14, ok: 14, errors: 0, warnings: 0 });
    expect(list.rows[1]).toMatchObject({
      line: 5,
      sku: 'TW-6640-050',
      sizeNm: 66_900_000,
      oversizeNm: 500_000,
      price: '58.10',
      currency: 'GBP',
      leadDays: 14,
    });
  });

  it('when the list with broken rows is read, then each broken row is reported by line and the rest are kept', async () => {
    const list = await parseFile(sample('orrinpike-old-stock-2026-11.csv'));
    expect(list.format).toMatchObject({ delimiter: ',', decimal: '.', headerLine: 1 });
    expect(list.mapping).toMatchObject({
      size: 'size_mm',
      oversize: 'oversize_mm',
      currency: 'currency',
    });
    expect(list.errors.map((e) => [e.line, e.field])).toEqual([
      [2, 'sku'],
      [6, 'price'],
      [7, undefined],
      [8, 'gtin'],
      [10, 'currency'],
      [11, 'size'],
      [13, 'sku'],
      [14, 'price'],
    ]);
    expect(list.errors.find((e) => e.line === 7)?.message).toBe(
      'This row has 7 columns; the header has 8.',
    );
    expect(list.errors.find((e) => e.line === 8)?.message).toMatch(/Check digit does not match/);
    expect(list.errors.find((e) => e.line === 11)?.message).toMatch(
      /must be mm or in \(got "cm"\)/,
    );
    expect(list.counts).toEqual({ rows: 14, ok: 6, errors: 8, warnings: 0 });
    expect(list.rows.map((r) => r.sku)).toEqual([
      'OP-54-075',
      'OP-72-025',
      'OP-72-100',
      'OP-54-025',
      'OP-54-100',
      'OP-6640-000',
    ]);
  });
});
