// What the invoice charges: the agreed estimate brought in line with the parts actually issued.
// Every expected figure is worked by hand in the comment beside it; the reconciliation rule itself
// (agreed price for what was agreed, sale price for the rest, nothing for parts never issued) is
// common practice (no source).
import { invoiceLines, type EstimatedLine } from '../../shared/invoice-lines';

const labour: EstimatedLine = {
  kind: 'labour',
  description: 'Bore one cylinder',
  quantity: '2.000',
  unitPrice: '55',
  partId: null,
};
const piston = (price = '89.00'): EstimatedLine => ({
  kind: 'part',
  description: 'Cast piston +0.040 in',
  quantity: '1',
  unitPrice: price,
  partId: 'P',
});
const discount: EstimatedLine = {
  kind: 'other',
  description: 'Discount: regular customer',
  quantity: '1',
  unitPrice: '-10.00',
  partId: null,
};

describe('invoiceLines', () => {
  it('when everything agreed was issued, then the invoice is the estimate (quantities written plainly)', () => {
    const lines = invoiceLines(
      [labour, piston(), piston(), discount],
      [{ partId: 'P', description: 'Cast piston (PST-1)', quantity: 2, salePrice: '92.0000' }],
      'EUR',
    );
    // 2 × 55.00 = 110.00; two pistons at the agreed 89.00 (not today's 92.00); discount −10.00.
    expect(lines.map((l) => [l.kind, l.quantity, l.unitPrice, l.total, l.sinceEstimate])).toEqual([
      ['labour', '2', '55.00', '110.00', false],
      ['part', '1', '89.00', '89.00', false],
      ['part', '1', '89.00', '89.00', false],
      ['other', '1', '-10.00', '-10.00', false],
    ]);
  });

  it('when more was issued than agreed, then the rest is one added line at the sale price on issue', () => {
    const lines = invoiceLines(
      [piston()],
      [
        { partId: 'P', description: 'Cast piston (PST-1)', quantity: 1, salePrice: '92.0000' },
        { partId: 'P', description: 'Cast piston (PST-1)', quantity: 2, salePrice: '92.0000' },
        { partId: 'R', description: 'Ring set (RNG-1)', quantity: 1, salePrice: '34.505' },
      ],
      'EUR',
    );
    // Three pistons issued, one agreed: 2 × 92.00 = 184.00 added. The ring set at 34.505 rounds
    // half-up to 34.51.
    expect(
      lines.map((l) => [l.description, l.quantity, l.unitPrice, l.total, l.sinceEstimate]),
    ).toEqual([
      ['Cast piston +0.040 in', '1', '89.00', '89.00', false],
      ['Cast piston (PST-1)', '2', '92.00', '184.00', true],
      ['Ring set (RNG-1)', '1', '34.51', '34.51', true],
    ]);
  });

  it('when an agreed part was never issued, then it is not charged; labour stays', () => {
    const lines = invoiceLines(
      [labour, piston(), piston()],
      [{ partId: 'P', description: 'Cast piston (PST-1)', quantity: 1, salePrice: '89' }],
      'EUR',
    );
    expect(lines.map((l) => l.total)).toEqual(['110.00', '89.00']);
  });

  it('when the currency has no minor unit, then prices round to whole units (JPY, ISO 4217 minor unit 0)', () => {
    const lines = invoiceLines([{ ...labour, unitPrice: '5500.5', quantity: '1' }], [], 'JPY');
    // 5500.5 rounds half-up to 5501.
    expect(lines[0]).toEqual(expect.objectContaining({ unitPrice: '5501', total: '5501' }));
  });

  it('when an issued quantity is not a whole number above 0, then it throws', () => {
    expect(() =>
      invoiceLines([], [{ partId: 'P', description: 'x', quantity: 0, salePrice: '1' }], 'EUR'),
    ).toThrow(/whole number/);
  });
});
