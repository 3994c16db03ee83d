// Exact money arithmetic for purchasing: landed costs, currency conversion and line totals, with
// decimal.js (never binary floats).
import Decimal from 'decimal.js';

export const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });
export type Dec = Decimal;

/** Money as the API writes it: at most 4 decimals, at least 2 ("12.50", "0.1234"). */
export function moneyOut(value: Dec | string): string {
  const fixed = new D(value).toDecimalPlaces(4).toFixed(4);
  const [whole, fraction] = fixed.split('.');
  return `${whole}.${fraction.replace(/0+$/, '').padEnd(2, '0')}`;
}

/** Converter into the home currency from the rates kept: null for a currency without a rate. */
export function converter(
  home: string,
  rates: ReadonlyArray<{ currency: string; rate: string }>,
): (amount: Dec | string, currency: string) => Dec | null {
  const byCurrency = new Map(rates.map((r) => [r.currency, new D(r.rate)]));
  return (amount, currency) => {
    if (currency === home) return new D(amount);
    const rate = byCurrency.get(currency);
    return rate ? new D(amount).times(rate) : null;
  };
}
