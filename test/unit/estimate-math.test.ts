// The estimate's sums against figures worked out by hand, written beside each case. The rounding
// rule is commercial rounding, half away from zero, per line to the currency's minor unit (ISO 4217
// minor units: EUR 2, JPY 0); tax once on the subtotal; a tax-inclusive price holds
// gross × rate / (100 + rate) of tax. These are common practice (no source) for shop invoices; the
// figures are hand arithmetic.
import { estimateTotals, lineTotal, percentOf } from '../../shared/estimate-math';
import { amountField, quantityField } from '../../shared/api/money';

const EUR = { ratePercent: '20', pricesIncludeTax: false, currency: 'EUR' };

describe('lineTotal', () => {
  it.each([
    // 1.5 × 10.15 = 15.225 exactly → 15.23 half-up (binary floats give 15.225000000000001 here, and
    // round-half-even would give 15.22).
    ['1.5', '10.15', 'EUR', '15.23'],
    // 3 × 0.125 cannot happen (2-decimal prices); 0.5 × 0.05 = 0.025 → 0.03.
    ['0.5', '0.05', 'EUR', '0.03'],
    // 1 × 2.675 would be 2.67 with Math.round on floats; here the price has 2 decimals: 2 × 1.3375
    // is not allowed either, so 1.001 × 2.67 = 2.67267 → 2.67.
    ['1.001', '2.67', 'EUR', '2.67'],
    // JPY has no minor unit: 1.5 × 125 = 187.5 → 188.
    ['1.5', '125', 'JPY', '188'],
    // A discount: 1 × −10.005 is not writable; 1 × −10.00 = −10.00.
    ['1', '-10.00', 'EUR', '-10.00'],
  ])('when %s × %s %s, then the line is %s', (quantity, unitPrice, currency, total) => {
    expect(lineTotal({ quantity, unitPrice }, currency)).toBe(total);
  });
});

describe('estimateTotals', () => {
  it('when three lines of 0.05 carry 10 % tax, then tax is on the subtotal (0.15 × 10 % = 0.015 → 0.02), not per line (3 × 0.01 = 0.03)', () => {
    const lines = [1, 2, 3].map(() => ({ quantity: '1', unitPrice: '0.05' }));
    expect(estimateTotals(lines, { ...EUR, ratePercent: '10' })).toEqual({
      lineTotals: ['0.05', '0.05', '0.05'],
      subtotal: '0.15',
      tax: '0.02',
      total: '0.17',
      net: '0.15',
    });
  });

  it('when labour, a piston and a discount are priced without tax at 20 %, then 2 × 45.00 + 89.00 − 10.00 = 169.00, tax 33.80, total 202.80', () => {
    const lines = [
      { quantity: '2', unitPrice: '45.00' },
      { quantity: '1', unitPrice: '89.00' },
      { quantity: '1', unitPrice: '-10.00' },
    ];
    expect(estimateTotals(lines, EUR)).toEqual({
      lineTotals: ['90.00', '89.00', '-10.00'],
      subtotal: '169.00',
      tax: '33.80',
      total: '202.80',
      net: '169.00',
    });
  });

  it('when prices include 20 % tax, then 120.00 holds 120 × 20 / 120 = 20.00 of tax and the total stays 120.00', () => {
    const lines = [{ quantity: '1', unitPrice: '120.00' }];
    expect(estimateTotals(lines, { ...EUR, pricesIncludeTax: true })).toEqual({
      lineTotals: ['120.00'],
      subtotal: '120.00',
      tax: '20.00',
      total: '120.00',
      net: '100.00',
    });
  });

  it('when prices include 19 % tax, then 100.00 holds 100 × 19 / 119 = 15.9664 → 15.97 of tax, net 84.03', () => {
    const lines = [
      { quantity: '2', unitPrice: '25.00' },
      { quantity: '1', unitPrice: '50.00' },
    ];
    expect(estimateTotals(lines, { ...EUR, ratePercent: '19', pricesIncludeTax: true })).toEqual({
      lineTotals: ['50.00', '50.00'],
      subtotal: '100.00',
      tax: '15.97',
      total: '100.00',
      net: '84.03',
    });
  });

  it('when a rate has decimals (7.7 %), then 1.5 × 10.15 = 15.23 carries 15.23 × 7.7 % = 1.17271 → 1.17 of tax', () => {
    expect(
      estimateTotals([{ quantity: '1.5', unitPrice: '10.15' }], { ...EUR, ratePercent: '7.7' }),
    ).toMatchObject({ subtotal: '15.23', tax: '1.17', total: '16.40' });
  });

  it('when the currency has no minor unit (JPY, 10 %), then 188 carries 18.8 → 19 of tax, total 207', () => {
    expect(
      estimateTotals([{ quantity: '1.5', unitPrice: '125' }], {
        ratePercent: '10',
        pricesIncludeTax: false,
        currency: 'JPY',
      }),
    ).toMatchObject({ subtotal: '188', tax: '19', total: '207' });
  });

  it('when there are no lines, then every sum is 0.00', () => {
    expect(estimateTotals([], EUR)).toMatchObject({ subtotal: '0.00', tax: '0.00', total: '0.00' });
  });

  it('when many lines of 0.10 are added, then the sum is exact (ten × 0.10 = 1.00, where floats give 0.9999999999999999)', () => {
    const lines = Array.from({ length: 10 }, () => ({ quantity: '1', unitPrice: '0.10' }));
    expect(estimateTotals(lines, { ...EUR, ratePercent: '0' }).total).toBe('1.00');
  });
});

describe('percentOf (the default deposit)', () => {
  it('when 30 % of 202.80 is asked for, then 60.84 (202.80 × 0.3 = 60.84)', () => {
    expect(percentOf('202.80', '30', 'EUR')).toBe('60.84');
  });
  it('when 33 % of 10.05 is asked for, then 3.3165 → 3.32', () => {
    expect(percentOf('10.05', '33', 'EUR')).toBe('3.32');
  });
});

describe('amount and quantity fields', () => {
  it.each([
    ['-1.00', /negative/],
    ['NaN', /number/],
    ['1.005', /at most 2 decimals/],
    ['1e3', /exponent/],
    ['12345678901.00', /too large/],
  ])('when the amount "%s" is sent, then it is refused (%s)', (text, message) => {
    const r = amountField.safeParse(text);
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].message).toMatch(message);
  });
  it('when an amount comes as a JSON number, then it is read by its writing (12.5 → "12.5")', () => {
    expect(amountField.parse(12.5)).toBe('12.5');
    expect(amountField.safeParse(-3).success).toBe(false);
  });
  it.each(['0', '-1', 'abc', '1.2345', '100000'])(
    'when the quantity "%s" is sent, then it is refused',
    (q) => {
      expect(quantityField.safeParse(q).success).toBe(false);
    },
  );
  it('when the quantity is 2 or "1.5", then it is kept as text', () => {
    expect(quantityField.parse(2)).toBe('2');
    expect(quantityField.parse('1.5')).toBe('1.5');
  });
});
