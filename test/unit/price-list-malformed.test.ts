// Malformed price lists: every one gets a clear refusal (the whole file) or a clear row error (with its
// line), never a silent guess.
import iconv from 'iconv-lite';
import { parseText, refusal } from './price-list-files';

const HEADER = 'SKU,Description,Size,Price';
const ROW = 'A-1,Piston,54.25 mm,48.90';

describe('files refused as a whole', () => {
  it('when the file is empty, then it is refused as empty', async () => {
    expect(await refusal('')).toMatchObject({
      status: 400,
      code: 'empty_file',
      message: 'The file is empty.',
    });
  });

  it('when the file holds only blank lines, then it is refused as empty', async () => {
    expect(await refusal('\r\n\r\n  \n')).toMatchObject({ status: 400, code: 'empty_file' });
  });

  it('when the file has a header and no rows, then it is refused saying so', async () => {
    const r = await refusal(`${HEADER}\n`);
    expect(r).toMatchObject({ status: 400, code: 'no_rows' });
    expect(r.message).toBe('The file has a header on line 1 but no rows below it.');
  });

  it('when the file has a header followed by blank and padded lines only, then it is refused as header only', async () => {
    expect(await refusal(`${HEADER}\n\n,,,\n\n`)).toMatchObject({ status: 400, code: 'no_rows' });
  });

  it('when the file is binary with NUL bytes, then it is refused as not delimited text (415)', async () => {
    const bytes = Buffer.from([
      0x53, 0x4b, 0x55, 0x2c, 0x00, 0x01, 0x02, 0xff, 0x10, 0x0a, 0x41, 0x00,
    ]);
    const r = await refusal(bytes);
    expect(r.status).toBe(415);
    expect(r.message).toMatch(/binary data .*NUL byte/);
  });

  it('when the file is full of control characters but no NUL, then it is refused as binary (415)', async () => {
    const bytes = Buffer.alloc(400, 0x41);
    for (let i = 0; i < bytes.length; i += 7) bytes[i] = 0x07;
    const r = await refusal(bytes);
    expect(r.status).toBe(415);
    expect(r.message).toMatch(/control characters/);
  });

  it('when the file is a PNG image, then it is refused naming the format (415)', async () => {
    // PNG signature, PNG specification (ISO/IEC 15948) section 5.2: 89 50 4E 47 0D 0A 1A 0A.
    const png = Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      Buffer.from([0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0]),
    ]);
    const r = await refusal(png);
    expect(r.status).toBe(415);
    expect(r.message).toMatch(/This is a PNG file \(image\/png\)/);
  });

  it('when the file is a ZIP (as a spreadsheet workbook is), then it is refused with a hint to save as CSV (415)', async () => {
    // Local file header signature PK\3\4, APPNOTE.TXT (the .ZIP file format specification) section 4.3.7.
    const zip = Buffer.concat([
      Buffer.from('PK\u0003\u0004'),
      Buffer.alloc(26, 0),
      Buffer.from('data.bin'),
    ]);
    const r = await refusal(zip);
    expect(r.status).toBe(415);
    expect(r.message).toMatch(/save it as CSV/);
  });

  it('when the file is a PDF or a web page, then it is refused naming what it is (415)', async () => {
    expect(await refusal('%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\n')).toMatchObject({
      status: 415,
      message: 'This is a PDF document, not a delimited text list. Upload the CSV export.',
    });
    const html = await refusal(
      '<!DOCTYPE html>\n<html><body><table><tr><td>SKU</td></tr></table></body></html>\n',
    );
    expect(html).toMatchObject({
      status: 415,
      message: expect.stringMatching(/web page \(HTML\)/),
    });
  });

  it('when the file is UTF-16 with a byte-order mark, then it is refused naming UTF-16 (415)', async () => {
    const utf16 = Buffer.concat([
      Buffer.from([0xff, 0xfe]),
      iconv.encode(`${HEADER}\r\n${ROW}\r\n`, 'utf16le'),
    ]);
    const r = await refusal(utf16);
    expect(r.status).toBe(415);
    expect(r.message).toMatch(/UTF-16/);
  });

  it('when the file is UTF-16 without a byte-order mark, then the NUL pattern gives it away (415)', async () => {
    const r = await refusal(iconv.encode(`${HEADER}\n${ROW}\n`, 'utf16be'));
    expect(r.status).toBe(415);
    expect(r.message).toMatch(/UTF-16/);
  });

  it('when a quote is opened and never closed, then the file is refused naming the line', async () => {
    const r = await refusal(
      `${HEADER}\n${ROW}\nA-2,"Piston with rings,54.50 mm,49.90\nA-3,Rings,54.50 mm,19.80\n`,
    );
    expect(r.status).toBe(400);
    expect(r.message).toMatch(/row starting on line 3 is never closed.*RFC 4180/);
  });

  it('when the file is one 2 MB line, then it is refused without reading it all', async () => {
    const r = await refusal('SKU,Price,'.repeat(200_000));
    expect(r).toMatchObject({ status: 400, code: 'unreadable' });
    expect(r.message).toMatch(/Line 1 runs past 64 kB without a line break/);
  });

  it('when a 2 MB line follows good rows, then the file is refused at that row', async () => {
    const long = `A-9,${'x'.repeat(2 * 1024 * 1024)},54.25 mm,1.00`;
    const r = await refusal(`${HEADER}\n${ROW}\n${long}\n`);
    expect(r).toMatchObject({ status: 400, code: 'unreadable' });
    expect(r.message).toMatch(/row starting on line 3 is longer than 64 kB/);
  });

  it('when no column holds prices, then the file is refused naming the missing column', async () => {
    const r = await refusal('SKU,Description,Size\nA-1,Piston,54.25 mm\n');
    expect(r).toMatchObject({ status: 400, code: 'missing_column' });
    expect(r.message).toMatch(/^Missing required column: price\./);
    expect(r.details).toEqual([expect.objectContaining({ field: 'price' })]);
  });

  it('when no column holds SKUs, then the file is refused naming the missing column', async () => {
    const r = await refusal('Description,Size,Price\nPiston,54.25 mm,48.90\n');
    expect(r.message).toMatch(/^Missing required column: SKU\./);
  });

  it('when a confirmed mapping names a column that is not there, then the file is refused naming it', async () => {
    const r = await refusal(`${HEADER}\n${ROW}\n`, { mapping: { price: 'Net price' } });
    expect(r.message).toBe('There is no column named "Net price" on the header line.');
  });

  it('when the lines are not split by any delimiter, then the file is refused saying no columns were found', async () => {
    const r = await refusal('Just a list of part numbers\nA-1\nA-2\n');
    expect(r).toMatchObject({ status: 400, code: 'no_delimiter' });
  });

  it('when no line looks like a header, then the file is refused asking for one', async () => {
    const r = await refusal('1,2,3\n4,5,6\n7,8,9\n');
    expect(r).toMatchObject({ status: 400, code: 'no_header' });
    expect(r.message).toMatch(/should name them/);
  });

  it('when the header names a column twice, then the file is refused naming it', async () => {
    const r = await refusal(`SKU,Price,Price\nA-1,1.00,2.00\n`);
    expect(r).toMatchObject({ status: 400, code: 'duplicate_column' });
    expect(r.message).toMatch(/Column "Price" appears twice/);
  });
});

describe('rows refused with their line number', () => {
  async function errorsOf(body: string[], header = HEADER, currency?: string) {
    const list = await parseText([header, ...body].join('\n') + '\n', { currency });
    return list.errors;
  }

  it('when rows are ragged, then each is an error naming its column count, and good rows are kept', async () => {
    const list = await parseText(
      `${HEADER}\n${ROW}\nA-2,Piston,54.50 mm\nA-3,Piston,54.75 mm,50.90,extra\n`,
    );
    expect(list.rows.map((r) => r.sku)).toEqual(['A-1']);
    expect(list.errors).toEqual([
      { line: 3, message: 'This row has 3 columns; the header has 4.' },
      { line: 4, message: 'This row has 5 columns; the header has 4.' },
    ]);
  });

  it('when a price is negative, then the row is refused', async () => {
    expect(await errorsOf(['A-1,Piston,54.25 mm,-48.90', 'A-2,Piston,54.25 mm,(12.00)'])).toEqual([
      { line: 2, field: 'price', message: 'The price "-48.90" is negative.' },
      { line: 3, field: 'price', message: 'The price "(12.00)" is negative.' },
    ]);
  });

  it('when a price is not a number, then the row is refused', async () => {
    const errors = await errorsOf([
      'A-1,Piston,54.25 mm,on request',
      'A-2,Piston,54.25 mm,',
      'A-3,Piston,54.25 mm,0.00',
    ]);
    expect(errors).toEqual([
      { line: 2, field: 'price', message: 'The price "on request" is not a number.' },
      { line: 3, field: 'price', message: 'The price is empty.' },
      {
        line: 4,
        field: 'price',
        message: 'The price is zero; leave the row out or give its price.',
      },
    ]);
  });

  it('when a price is in exponent form, then the row is refused saying a spreadsheet changed it', async () => {
    const [error] = await errorsOf(['A-1,Piston,54.25 mm,1.2E+03']);
    expect(error.message).toMatch(/exponent form/);
  });

  it('when a currency is unknown, then the row is refused naming ISO 4217', async () => {
    const errors = await errorsOf(
      ['A-1,54.25 mm,48.90,XYZ', 'A-2,54.25 mm,48.90 ABC,EUR', 'A-3,54.25 mm,$48.90,'],
      'SKU,Size,Price,Currency',
    );
    expect(errors).toEqual([
      { line: 2, field: 'currency', message: '"XYZ" is not an ISO 4217 currency code.' },
      {
        line: 3,
        field: 'price',
        message: 'The price "48.90 ABC" names "ABC", which is not an ISO 4217 currency code.',
      },
      {
        line: 4,
        field: 'price',
        message: expect.stringMatching(/"\$", which several currencies share/),
      },
    ]);
  });

  it('when a price names one currency and the currency column another, then the row is refused', async () => {
    const [error] = await errorsOf(['A-1,54.25 mm,€48.90,GBP'], 'SKU,Size,Price,Currency');
    expect(error.message).toBe('The price is in EUR but the currency column says GBP.');
  });

  it('when a length has an impossible unit, then the row is refused naming the unit', async () => {
    const errors = await errorsOf([
      'A-1,Piston,5.425 cm,48.90',
      'A-2,Piston,2.5 ft,48.90',
      'A-3,Piston,54.25 kg,48.90',
    ]);
    expect(errors.map((e) => [e.line, e.field, e.message])).toEqual([
      [2, 'size', 'The size "5.425 cm": The unit must be mm or in (got "cm").'],
      [3, 'size', 'The size "2.5 ft": The unit must be mm or in (got "ft").'],
      [4, 'size', 'The size "54.25 kg": The unit must be mm or in (got "kg").'],
    ]);
  });

  it('when a size read in the column unit cannot be a piston, then the row is refused asking about the unit', async () => {
    const errors = await errorsOf(
      ['A-1,Piston,2.5000,48.90', 'A-2,Piston,2540,48.90'],
      'SKU,Description,Bore mm,Price',
    );
    expect(errors[0].message).toMatch(/smaller than any piston: is the column in inches\?/);
    expect(errors[1].message).toMatch(/at most 500.000 mm.*is the column in inches\?/);
  });

  it('when an oversize is larger than any step, then the row is refused asking whether it is the size', async () => {
    const [error] = await errorsOf(['A-1,54.25,54.25,48.90'], 'SKU,Size mm,Oversize,Price');
    expect(error).toMatchObject({ line: 2, field: 'oversize' });
    expect(error.message).toMatch(/is this the size column/);
  });

  it('when a SKU appears twice, then both rows are refused and each names the other line', async () => {
    const list = await parseText(
      `${HEADER}\n${ROW}\nA-2,Rings,54.25 mm,19.80\nA-1,Piston again,54.25 mm,47.00\n`,
    );
    expect(list.rows.map((r) => r.sku)).toEqual(['A-2']);
    expect(list.errors).toEqual([
      {
        line: 2,
        field: 'sku',
        message: 'SKU "A-1" appears again on line 4; neither row is imported.',
      },
      { line: 4, field: 'sku', message: 'SKU "A-1" is also on line 2; neither row is imported.' },
    ]);
    expect(list.counts).toEqual({ rows: 3, ok: 1, errors: 2, warnings: 0 });
  });

  it('when a SKU is empty, then the row is refused', async () => {
    expect(await errorsOf([',Piston,54.25 mm,48.90'])).toEqual([
      { line: 2, field: 'sku', message: 'The SKU is empty.' },
    ]);
  });

  it('when a GTIN has a wrong check digit or was turned into exponent form, then the row is refused', async () => {
    // 4006381333931 is valid (GS1 General Specifications 7.9 check digit, worked by hand: sum 89 → 1); the
    // last digit changed to 2 breaks it.
    const errors = await errorsOf(
      ['A-1,48.90,4006381333932', 'A-2,48.90,4.00638E+12'],
      'SKU,Price,EAN',
    );
    expect(errors[0].message).toBe(
      'The GTIN "4006381333932": Check digit does not match: the last digit should be 1. Check for a mistyped digit.',
    );
    expect(errors[1].message).toMatch(/exponent form by a spreadsheet/);
  });

  it('when a quantity or lead time is not a whole number, then the row is refused', async () => {
    const errors = await errorsOf(
      ['A-1,48.90,2.5,3 days', 'A-2,48.90,-1,soon'],
      'SKU,Price,Available,Lead time',
    );
    expect(errors.map((e) => [e.line, e.field])).toEqual([
      [2, 'available'],
      [3, 'available'],
      [3, 'leadDays'],
    ]);
  });

  it('when bytes are not valid UTF-8 past the part used for detection, then that row is refused', async () => {
    const good = Array.from(
      { length: 1500 },
      (_, i) => `A-${i},Piston number ${i} with rings,54.25 mm,48.90`,
    );
    const content = Buffer.concat([
      Buffer.from([HEADER, ...good].join('\n') + '\nB-1,Kolben '),
      Buffer.from([0xff, 0xfe]),
      Buffer.from(',54.25 mm,48.90\n'),
    ]);
    expect(content.length).toBeGreaterThan(64 * 1024);
    const list = await parseText(content);
    expect(list.format.encoding).toBe('utf-8');
    expect(list.errors).toEqual([
      {
        line: 1502,
        field: 'Description',
        message:
          'Column "Description" holds bytes that are not valid UTF-8; the file mixes encodings.',
      },
    ]);
    expect(list.counts.ok).toBe(1500);
  });
});
