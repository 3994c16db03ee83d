import {
  normalizeHeader,
  proposeMapping,
  resolveMapping,
} from '../../server/imports/propose-mapping';

describe('proposed column mapping', () => {
  it('when headers are plain English, then every field finds its column', () => {
    const m = proposeMapping(
      [
        'Item No',
        'Description',
        'Piston Size',
        'O/S',
        'Unit Price',
        'Min Qty',
        'Qty',
        'Lead time (days)',
        'EAN',
        'Currency',
      ],
      [],
    );
    expect(m).toEqual({
      sku: 'Item No',
      description: 'Description',
      size: 'Piston Size',
      oversize: 'O/S',
      price: 'Unit Price',
      // "Min Qty" is the minimum order, not the quantity available.
      available: 'Qty',
      leadDays: 'Lead time (days)',
      gtin: 'EAN',
      currency: 'Currency',
      sizeUnit: 'mm',
    });
  });

  it('when headers are common German and French words, then they are understood', () => {
    expect(
      proposeMapping(
        [
          'Artikelnummer',
          'Beschreibung',
          'Durchmesser (mm)',
          'Übermaß',
          'Nettopreis',
          'Lagerbestand',
          'Lieferzeit',
          'Währung',
        ],
        [],
      ),
    ).toMatchObject({
      sku: 'Artikelnummer',
      description: 'Beschreibung',
      size: 'Durchmesser (mm)',
      oversize: 'Übermaß',
      price: 'Nettopreis',
      available: 'Lagerbestand',
      leadDays: 'Lieferzeit',
      currency: 'Währung',
      sizeUnit: 'mm',
    });
    expect(
      proposeMapping(['Référence', 'Désignation', 'Alésage', 'Prix net', 'Quantité'], []),
    ).toMatchObject({
      sku: 'Référence',
      description: 'Désignation',
      size: 'Alésage',
      price: 'Prix net',
      available: 'Quantité',
    });
  });

  it('when a header is unknown, then it is left unmapped rather than guessed', () => {
    const m = proposeMapping(['SKU', 'Colour', 'Price'], []);
    expect(Object.values(m)).not.toContain('Colour');
  });

  it('when the size header names its unit, then the unit follows it', () => {
    expect(proposeMapping(['SKU', 'Bore (in)', 'Price'], []).sizeUnit).toBe('in');
    expect(proposeMapping(['SKU', 'Ø mm', 'Price'], []).sizeUnit).toBe('mm');
    expect(proposeMapping(['SKU', 'Size"', 'Price'], []).sizeUnit).toBe('in');
  });

  it('when the values carry the unit, then the unit follows the values', () => {
    const rows = [
      ['A', '2.5100"', '1'],
      ['B', '2.5200 in', '1'],
    ];
    expect(proposeMapping(['SKU', 'Size', 'Price'], rows).sizeUnit).toBe('in');
    expect(proposeMapping(['SKU', 'Size', 'Price'], [['A', '54.25 mm', '1']]).sizeUnit).toBe('mm');
  });

  it('when sizes are bare numbers, then their magnitude decides: under 12 is inches, else millimetres', () => {
    // Common practice (no source): cylinder bores run about 40–110 mm, which is about 1.5–4.5 in.
    expect(
      proposeMapping(
        ['SKU', 'Size', 'Price'],
        [
          ['A', '2.5000', '1'],
          ['B', '3.1250', '1'],
        ],
      ).sizeUnit,
    ).toBe('in');
    expect(
      proposeMapping(
        ['SKU', 'Size', 'Price'],
        [
          ['A', '54.25', '1'],
          ['B', '66,50', '1'],
        ],
      ).sizeUnit,
    ).toBe('mm');
  });

  it('when headers are normalised, then accents, ß, ø and punctuation are folded', () => {
    expect(normalizeHeader('Art.-Nr.')).toBe('art nr');
    expect(normalizeHeader('Übermaß')).toBe('ubermass');
    expect(normalizeHeader('Ø mm')).toBe('dia mm');
    expect(normalizeHeader('  Désignation ')).toBe('designation');
  });
});

describe('confirming a mapping', () => {
  const headers = ['SKU', 'Description', 'Price'];
  const base = {
    sku: 'SKU',
    description: 'Description',
    size: null,
    oversize: null,
    price: 'Price',
    available: null,
    leadDays: null,
    gtin: null,
    currency: null,
    sizeUnit: 'mm' as const,
  };

  it('when every named column exists, then each field gets its column index', () => {
    expect(resolveMapping(base, headers)).toMatchObject({
      sku: 0,
      description: 1,
      price: 2,
      size: null,
    });
  });

  it('when one column is given two fields, then the mapping is refused', () => {
    expect(() => resolveMapping({ ...base, description: 'SKU' }, headers)).toThrow(
      'Column "SKU" is already used for the SKU.',
    );
  });

  it('when the price is not mapped, then the refusal names the missing column and lists the columns found', () => {
    expect(() => resolveMapping({ ...base, price: null }, headers)).toThrow(
      'Missing required column: price. No column holds the price; the list needs one (columns found: SKU, Description, Price).',
    );
  });
});
