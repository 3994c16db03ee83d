import { detectFormat } from '../../server/imports/detect-format';
import { numberEvidence, readNumberCell } from '../../server/imports/number-text';

const detect = async (text: string) => (await detectFormat(Buffer.from(text), true)).format;

describe('delimiter detection', () => {
  it('when a semicolon list has decimal commas in every row, then the semicolon still wins', async () => {
    // Each row splits into 3 fields on commas as consistently as into 4 on semicolons; only the header
    // line (no decimal commas) tells them apart.
    const f = await detect(
      'SKU;Size;Price;Stock\nA;54,25;48,90;3\nB;54,50;49,90;1\nC;54,75;50,90;0\n',
    );
    expect(f).toMatchObject({ delimiter: ';', decimal: ',', headerLine: 1 });
  });

  it('when a comma list quotes descriptions full of semicolons, then the comma wins', async () => {
    const f = await detect(
      'SKU,Description,Price\nA,"a; b; c",1.00\nB,"d; e",2.00\nC,"f; g; h; i",3.00\n',
    );
    expect(f.delimiter).toBe(',');
  });

  it('when a tab list has commas in its descriptions, then the tab wins', async () => {
    const f = await detect(
      'SKU\tDescription\tPrice\nA\tPiston, cast\t1.00\nB\tRings, set of 3, chrome\t2.00\n',
    );
    expect(f.delimiter).toBe('\t');
  });

  it('when ragged rows outnumber good ones, then the header line still sets the number of columns', async () => {
    const f = await detect('SKU,Description,Price\nA,1.00\nB,2.00\nC,Piston,3.00\n');
    expect(f).toMatchObject({
      delimiter: ',',
      headerLine: 1,
      headers: ['SKU', 'Description', 'Price'],
    });
  });

  it('when title lines padded with delimiters sit above the header, then the header is the first labelled line', async () => {
    // Spreadsheets pad every exported line to the same number of columns.
    const f = await detect(
      'Price list December;;;;\n;;;;\nValid from 01.12.2026;;;;\nArt.-Nr.;Bezeichnung;Preis;Bestand;EAN\nA;Kolben;48,90;3;\n',
    );
    expect(f.headerLine).toBe(4);
    expect(f.headers).toEqual(['Art.-Nr.', 'Bezeichnung', 'Preis', 'Bestand', 'EAN']);
  });

  it('when a header is preceded by blank lines, then its line number counts them', async () => {
    const f = await detect('\r\n\r\nSKU,Price\r\nA,1.00\r\n');
    expect(f.headerLine).toBe(3);
  });

  it('when the head of a long file ends inside a line, then the partial line is ignored', async () => {
    const rows = Array.from({ length: 4000 }, (_, i) => `A-${i};Kolben ${i};48,90`).join('\n');
    const bytes = Buffer.from(`SKU;Bezeichnung;Preis\n${rows}\n`).subarray(0, 64 * 1024);
    const { format } = await detectFormat(bytes, false);
    expect(format).toMatchObject({ delimiter: ';', decimal: ',', headerLine: 1 });
  });

  it('when the head ends inside a UTF-8 character, then the file is still read as UTF-8', async () => {
    const text = Buffer.from('SKU;Bezeichnung;Preis\nA;Kolben Ø 54;48,90\nB;Kolben Ø');
    const cut = text.subarray(0, text.length - 1); // half of the two-byte Ø
    const { format } = await detectFormat(cut, false);
    expect(format.encoding).toBe('utf-8');
  });
});

describe('decimal mark detection', () => {
  it('when nothing but whole numbers appear, then a semicolon list is taken to use a decimal comma', async () => {
    // Common practice (no source): semicolon-separated exports come from locales that write decimal commas.
    expect((await detect('SKU;Price\nA;12\nB;13\n')).decimal).toBe(',');
    expect((await detect('SKU,Price\nA,12\nB,13\n')).decimal).toBe('.');
  });

  it('when only three-decimal sizes like "2.555" appear, then they count as a decimal point', async () => {
    expect((await detect('SKU,Size,Price\nA,2.555,12\nB,2.565,12\n')).decimal).toBe('.');
  });

  it('when "0,010" appears, then it is a decimal comma, since a thousands group never starts with 0', async () => {
    expect((await detect('SKU\tOversize\tPrice\nA\t0,010\t12\n')).decimal).toBe(',');
  });
});

describe('number cells', () => {
  it.each([
    ['1.234,50', 'comma'],
    ['1,234.50', 'point'],
    ['12,5', 'comma'],
    ['12.5', 'point'],
    ['2,555', 'comma?'],
    ['1.250', 'point?'],
    ['1.234.567', 'comma'],
    ['1,234,567', 'point'],
    ['€ 48,90', 'comma'],
    ['54.25 mm', 'point'],
    ['PS-54.25', null],
    ['12', null],
  ])('when the cell is "%s", then it says %s', (cell, evidence) => {
    expect(numberEvidence(cell)).toBe(evidence);
  });

  it('when a cell carries a sign, a currency or a unit, then they are split from the number', () => {
    expect(readNumberCell('EUR -12,50')).toEqual({
      ok: true,
      cell: { run: '12,50', negative: true, before: 'EUR', after: '' },
    });
    expect(readNumberCell('(3.00)')).toMatchObject({
      ok: true,
      cell: { run: '3.00', negative: true },
    });
    expect(readNumberCell('+.010"')).toEqual({
      ok: true,
      cell: { run: '.010', negative: false, before: '', after: '"' },
    });
    expect(readNumberCell('1 234,50 €')).toMatchObject({
      ok: true,
      cell: { run: '1 234,50', after: '€' },
    });
    expect(readNumberCell('n/a')).toEqual({ ok: false, message: '"n/a" is not a number' });
  });
});
