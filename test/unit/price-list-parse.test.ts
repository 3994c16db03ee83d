import iconv from 'iconv-lite';
import { parseText } from './price-list-files';

const HEADER = 'SKU,Description,Size,Price';

describe('price lists read as RFC 4180 says', () => {
  // RFC 4180 ("Common Format and MIME Type for CSV Files"), section 2, rules 5–7: fields may be enclosed in
  // double quotes; fields containing line breaks, double quotes or commas must be; a double quote inside
  // a quoted field is escaped by another double quote.
  it('when a quoted field holds the delimiter, then it stays one field (RFC 4180 rule 6)', async () => {
    const list = await parseText(`${HEADER}\nA-1,"Piston, cast, 3 rings",54.25 mm,48.90\n`);
    expect(list.errors).toEqual([]);
    expect(list.rows[0]).toMatchObject({
      sku: 'A-1',
      description: 'Piston, cast, 3 rings',
      price: '48.90',
    });
  });

  it('when a semicolon list quotes a field holding a semicolon, then it stays one field (RFC 4180 rule 6)', async () => {
    const list = await parseText(
      'SKU;Description;Size;Price\nA-1;"Kit; complete";54,25;48,90\nA-2;Kit;54,50;49,90\n',
    );
    expect(list.format.delimiter).toBe(';');
    expect(list.rows.map((r) => r.description)).toEqual(['Kit; complete', 'Kit']);
  });

  it('when a quoted field doubles a quote, then one quote is read (RFC 4180 rule 7)', async () => {
    // The example of RFC 4180 section 2 rule 7: "aaa","b""bb","ccc".
    const list = await parseText('SKU,Description,Size,Price\n"aaa","b""bb","2.5000 in","12.00"\n');
    expect(list.rows[0]).toMatchObject({ sku: 'aaa', description: 'b"bb', sizeNm: 63_500_000 });
  });

  it('when inch marks are written as doubled quotes, then the description keeps them', async () => {
    const list = await parseText(`${HEADER}\nQ-1,"Piston 2.5100"" bore, +.010",2.5100 in,48.75\n`);
    expect(list.rows[0].description).toBe('Piston 2.5100" bore, +.010');
  });

  it('when lines end in CRLF (RFC 4180 rule 1) or in LF, then the same rows are read', async () => {
    const body = [HEADER, 'A-1,Piston,54.25 mm,48.90', 'A-2,Rings,54.25 mm,19.80'];
    const crlf = await parseText(body.join('\r\n') + '\r\n');
    const lf = await parseText(body.join('\n') + '\n');
    const mixed = await parseText(`${body[0]}\r\n${body[1]}\n${body[2]}\r\n`);
    expect(crlf.rows).toEqual(lf.rows);
    expect(mixed.rows).toEqual(lf.rows);
    expect(lf.rows.map((r) => r.line)).toEqual([2, 3]);
  });

  it('when the last record has no line break after it (RFC 4180 rule 2), then it is still read', async () => {
    const list = await parseText(`${HEADER}\r\nA-1,Piston,54.25 mm,48.90`);
    expect(list.rows).toHaveLength(1);
  });

  it('when a quoted field holds a line break (RFC 4180 rule 6), then it is one row and later lines keep their numbers', async () => {
    const list = await parseText(
      `${HEADER}\r\nA-1,"Piston kit\r\nwith rings",54.25 mm,48.90\r\nA-2,Rings,54.25 mm,19.80\r\nA-3,-,54.25 mm,-1\r\n`,
    );
    expect(list.rows.map((r) => [r.line, r.sku, r.description])).toEqual([
      [2, 'A-1', 'Piston kit with rings'],
      [4, 'A-2', 'Rings'],
    ]);
    // The broken row is reported on the line it is really on, after the two-line record.
    expect(list.errors).toEqual([
      { line: 5, field: 'price', message: 'The price "-1" is negative.' },
    ]);
  });

  it('when unquoted fields have spaces around them, then the values are read without the spaces', async () => {
    const list = await parseText(`${HEADER}\n A-1 ,  Piston  , 54.25 mm , 48.90 \n`);
    expect(list.rows[0]).toMatchObject({ sku: 'A-1', description: 'Piston', price: '48.90' });
  });

  it('when an unquoted field holds a quote (an inch mark), then the quote is kept as text', async () => {
    // RFC 4180 rule 5 says such a field should have been quoted; a quote that cannot open a field is
    // unambiguous, so it is read as the character it is rather than refusing the row.
    const list = await parseText(`${HEADER}\nQ-1,Piston 2.5000" bore,2.5000",48.75\n`);
    expect(list.errors).toEqual([]);
    expect(list.rows[0]).toMatchObject({ description: 'Piston 2.5000" bore', sizeNm: 63_500_000 });
  });
});

describe('text encodings', () => {
  it('when a list is in Windows-1252, then µ ø é ° and the bytes 0x80 (€) and 0x96 (–) decode correctly', async () => {
    // Byte values from the Unicode Consortium's Windows-1252 mapping table (MAPPINGS/VENDORS/MICSFT/WINDOWS/
    // CP1252.TXT): 0x80 → U+20AC €, 0x96 → U+2013 –, 0xB0 → U+00B0 °, 0xB5 → U+00B5 µ, 0xE9 → U+00E9 é,
    // 0xF8 → U+00F8 ø, 0xD8 → U+00D8 Ø. Written byte by byte so no encoder sits between the test and the bytes.
    const text = (s: string): number[] => [...s].map((c) => c.charCodeAt(0));
    const bytes = Buffer.from([
      ...text('SKU;Bezeichnung;Gr'),
      0xf6,
      ...text('sse mm;Preis '),
      0x80,
      0x0d,
      0x0a,
      ...text('K-1;Kolben '),
      0xd8,
      ...text(' 54,25 '),
      0x96,
      ...text(' Rz 2 '),
      0xb5,
      ...text('m, 120'),
      0xb0,
      ...text(', qualit'),
      0xe9,
      ...text(', '),
      0xf8,
      ...text(' 15;54,25;48,90'),
      0x0d,
      0x0a,
    ]);
    const list = await parseText(bytes);
    expect(list.format.encoding).toBe('windows-1252');
    expect(list.format.headers).toEqual(['SKU', 'Bezeichnung', 'Grösse mm', 'Preis €']);
    expect(list.rows[0].description).toBe('Kolben Ø 54,25 – Rz 2 µm, 120°, qualité, ø 15');
    expect(list.rows[0].description).toContain('\u2013');
    expect(list.rows[0].price).toBe('48.90');
  });

  it('when the same text is UTF-8, then it is read as UTF-8, not as Windows-1252', async () => {
    const list = await parseText(
      'SKU;Bezeichnung;Größe mm;Preis €\nK-1;Kolben Ø 54,25 – 2 µm, 120°, qualité;54,25;48,90\n',
    );
    expect(list.format.encoding).toBe('utf-8');
    expect(list.rows[0].description).toBe('Kolben Ø 54,25 – 2 µm, 120°, qualité');
  });

  it('when a UTF-8 list starts with a byte-order mark, then the mark is stripped from the first header', async () => {
    const list = await parseText(
      Buffer.concat([
        Buffer.from([0xef, 0xbb, 0xbf]),
        Buffer.from(`${HEADER}\nA-1,Piston,54.25 mm,48.90\n`),
      ]),
    );
    expect(list.format.encoding).toBe('utf-8-bom');
    expect(list.format.headers[0]).toBe('SKU');
    expect(list.mapping.sku).toBe('SKU');
    expect(list.rows[0].sku).toBe('A-1');
  });

  it('when iconv-lite encodes a list to Windows-1252, then reading it gives back the same text', async () => {
    const original = 'Kolbenringsatz ø 72,50 mm – 3 Ringe, Stoßspiel geprüft, 5 € Pfand';
    const list = await parseText(
      iconv.encode(`Art.-Nr.;Bezeichnung;Preis\nR-1;${original};19,80\n`, 'win1252'),
    );
    expect(list.rows[0].description).toBe(original);
  });
});

describe('decimal comma and decimal point', () => {
  it('when a list writes "1.234,50", then the price is 1234.50 and the decimal mark is a comma', async () => {
    const list = await parseText(
      'SKU;Beschreibung;Preis\nZ-1;Satz;1.234,50\nZ-2;Kolben;48,90\nZ-3;Teuer;12.345.678,9\n',
    );
    expect(list.format.decimal).toBe(',');
    expect(list.rows.map((r) => r.price)).toEqual(['1234.50', '48.90', '12345678.90']);
  });

  it('when sizes are written "2,555" with a decimal comma, then they read as 2.555 in', async () => {
    const list = await parseText('SKU;Size in;Price\nP-1;2,555;10,00\nP-2;2,565;10,00\n');
    expect(list.format.decimal).toBe(',');
    expect(list.mapping.sizeUnit).toBe('in');
    // 2.555 in × 25 400 000 nm/in (1 in = 25.4 mm exactly, NIST SP 811 appendix B) = 64 897 000 nm.
    expect(list.rows.map((r) => r.sizeNm)).toEqual([64_897_000, 65_151_000]);
  });

  it('when a list writes "1,234.50", then the price is 1234.50 and the decimal mark is a point', async () => {
    const list = await parseText('SKU,Description,Price\nZ-1,Set,"1,234.50"\nZ-2,Piston,48.90\n');
    expect(list.format.decimal).toBe('.');
    expect(list.rows.map((r) => r.price)).toEqual(['1234.50', '48.90']);
  });

  it('when a decimal-comma list has a price with a decimal point, then that row is refused, not guessed', async () => {
    const list = await parseText(
      'SKU;Beschreibung;Preis\nA;Satz;48,90\nB;Satz;12.50\nC;Satz;19,80\n',
    );
    expect(list.rows.map((r) => r.sku)).toEqual(['A', 'C']);
    expect(list.errors).toEqual([
      { line: 3, field: 'price', message: expect.stringContaining('"12.50"') },
    ]);
  });
});

describe('values as suppliers write them', () => {
  const header = 'SKU,Size,Oversize,Price,Available,Lead time,GTIN';

  it('when sizes carry their unit, oversizes say STD or +.010 and prices a currency, then each is read exactly', async () => {
    const list = await parseText(
      `${header}\nA,2.5100",+.010",USD 48.75,>20,2 wk,\nB,64.91 mm,STD,48.75 USD,5,10 days,\nC,Ø 54.25,+0.25 mm,48.75,,,\n`,
      { currency: 'USD', mapping: { sizeUnit: 'mm' } },
    );
    expect(list.errors).toEqual([]);
    expect(
      list.rows.map((r) => [
        r.sku,
        r.sizeNm,
        r.oversizeNm,
        r.price,
        r.currency,
        r.available,
        r.leadDays,
      ]),
    ).toEqual([
      // 2.5100 in = 63 754 000 nm; 0.010 in = 254 000 nm (1 in = 25.4 mm exactly).
      ['A', 63_754_000, 254_000, '48.75', 'USD', 20, 14],
      ['B', 64_910_000, 0, '48.75', 'USD', 5, 10],
      ['C', 54_250_000, 250_000, '48.75', 'USD', null, null],
    ]);
    expect(list.warnings.map((w) => w.field)).toEqual(['size', 'available']);
  });

  it('when a price carries € or £, then the currency comes from the symbol', async () => {
    const list = await parseText('SKU,Price\nA,€12.50\nB,£9.00\nC,7.25\n', { currency: 'USD' });
    expect(list.rows.map((r) => [r.price, r.currency])).toEqual([
      ['12.50', 'EUR'],
      ['9.00', 'GBP'],
      ['7.25', 'USD'],
    ]);
  });

  it('when a GTIN is valid, then it is kept in its 14-digit form', async () => {
    // 4006381333931 is the EAN-13 worked example on the GS1 check digit calculator page (from memory);
    // shared/gtin checks the digit per GS1 General Specifications section 7.9.
    const list = await parseText(`${header}\nA,54.25 mm,,12.00,,,400-6381-333931\n`);
    expect(list.rows[0].gtin).toBe('04006381333931');
  });
});
