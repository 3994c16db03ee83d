import {
  addMoney,
  currencyDecimals,
  formatMoney,
  isCurrencyCode,
  parseMoney,
} from '../../shared/money';

describe('parseMoney', () => {
  it.each([
    ['12.50', {}, '12.50'],
    ['1,234.50', {}, '1234.50'],
    ['1 234.50', {}, '1234.50'],
    ['1234', {}, '1234'],
    ['0.0425', {}, '0.0425'],
    ['007.10', {}, '7.10'],
    ['1.234,50', { decimalComma: true }, '1234.50'],
    ['12,5', { decimalComma: true }, '12.5'],
    ['1 234,50', { decimalComma: true }, '1234.50'],
    ['0', {}, '0'],
  ])('when "%s" is read (%j), then it is the exact decimal %s', (text, opts, value) => {
    expect(parseMoney(text, opts)).toEqual({ ok: true, value });
  });

  it.each([
    ['', {}, /enter an amount/i],
    ['-12.50', {}, /must not be negative/],
    ['(12.50)', {}, /must not be negative/],
    ['NaN', {}, /must be a number/],
    ['Infinity', {}, /must be a number/],
    ['1e3', {}, /exponent/],
    ['12,50', {}, /write it like "1,234.50"/],
    ['1,23.50', {}, /not an amount/],
    ['1.234,50', {}, /not an amount/],
    ['1,234.50', { decimalComma: true }, /write it like "1.234,50"/],
    ['12.50 EUR', {}, /not an amount/],
    ['1.23456', {}, /at most 4 decimals/],
  ])('when "%s" is read (%j), then it is refused with a message', (text, opts, message) => {
    const parsed = parseMoney(text, opts);
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.message).toMatch(message);
  });
});

describe('currency codes (ISO 4217, via the npm library currency-codes)', () => {
  it('when common ISO 4217 codes are checked, then they are accepted; made-up or lower-case ones not', () => {
    expect(isCurrencyCode('EUR')).toBe(true);
    expect(isCurrencyCode('USD')).toBe(true);
    expect(isCurrencyCode('JPY')).toBe(true);
    expect(isCurrencyCode('usd')).toBe(false);
    expect(isCurrencyCode('ABC')).toBe(false);
    expect(isCurrencyCode('EURO')).toBe(false);
  });

  it('when minor units are asked, then they follow ISO 4217: EUR 2, JPY 0, BHD 3', () => {
    expect(currencyDecimals('EUR')).toBe(2);
    expect(currencyDecimals('JPY')).toBe(0);
    expect(currencyDecimals('BHD')).toBe(3);
    expect(() => currencyDecimals('ABC')).toThrow(/Unknown currency/);
  });
});

describe('formatMoney and addMoney', () => {
  it('when amounts are shown, then they are rounded half-up to the currency decimals and grouped', () => {
    expect(formatMoney('1234.5', 'EUR')).toBe('1,234.50 EUR');
    expect(formatMoney('1234567.125', 'USD')).toBe('1,234,567.13 USD');
    expect(formatMoney('1234.5', 'JPY')).toBe('1,235 JPY');
    expect(formatMoney('0.0004', 'BHD')).toBe('0.000 BHD');
    expect(formatMoney('-0.001', 'EUR')).toBe('0.00 EUR');
    expect(formatMoney('-12.5', 'EUR')).toBe('-12.50 EUR');
  });

  it('when an amount or code is bad, then formatting throws', () => {
    expect(() => formatMoney('abc', 'EUR')).toThrow(/Not an amount/);
    expect(() => formatMoney('1', 'XYZ')).toThrow(/Unknown currency/);
  });

  it('when amounts are added, then the sum is exact (0.1 + 0.2 = 0.3)', () => {
    expect(addMoney('0.1', '0.2')).toBe('0.3');
    expect(addMoney('12.50', '7.125', '-0.625')).toBe('19');
    expect(() => addMoney('1', '1e3')).toThrow(/Not an amount/);
  });
});
