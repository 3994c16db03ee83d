// The estimate's and the invoice's sums, exact (decimal.js, never binary floats). The rule, said the
// same way on the page: each line is quantity × unit price rounded half-up to the currency's minor
// unit; the subtotal is the sum of the rounded lines; tax is worked out once, on the subtotal, and
// rounded half-up. When the shop's prices include tax, the total is the subtotal and the tax is the
// part of it that is tax: subtotal × rate / (100 + rate).
import Decimal from 'decimal.js';
import { currencyDecimals } from './money';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });

export interface PricedLine {
  /** Decimal text, more than 0 ("2", "1.5"). */
  quantity: string;
  /** Decimal text; a discount line is negative. */
  unitPrice: string;
}

export interface TaxRule {
  /** Percent as decimal text, e.g. "20" or "7.7". */
  ratePercent: string;
  pricesIncludeTax: boolean;
  /** ISO 4217 code; its minor unit says where lines and tax are rounded. */
  currency: string;
}

export interface EstimateTotals {
  lineTotals: string[];
  subtotal: string;
  tax: string;
  total: string;
  /** The total without tax (equal to the subtotal when prices exclude tax). */
  net: string;
}

/** Where a currency's amounts are rounded, and how an amount is written in the API. */
export function fixedMoney(value: Decimal.Value, currency: string): string {
  const places = currencyDecimals(currency);
  const rounded = new D(value).toDecimalPlaces(places, Decimal.ROUND_HALF_UP);
  return (rounded.isZero() ? rounded.abs() : rounded).toFixed(places);
}

export function lineTotal(line: PricedLine, currency: string): string {
  return fixedMoney(new D(line.quantity).times(new D(line.unitPrice)), currency);
}

export function estimateTotals(lines: readonly PricedLine[], rule: TaxRule): EstimateTotals {
  const lineTotals = lines.map((l) => lineTotal(l, rule.currency));
  const subtotal = lineTotals.reduce((s, t) => s.plus(t), new D(0));
  const rate = new D(rule.ratePercent);
  if (rate.isNegative()) throw new Error('A tax rate cannot be negative.');
  if (rule.pricesIncludeTax) {
    const tax = new D(fixedMoney(subtotal.times(rate).dividedBy(rate.plus(100)), rule.currency));
    return {
      lineTotals,
      subtotal: fixedMoney(subtotal, rule.currency),
      tax: fixedMoney(tax, rule.currency),
      total: fixedMoney(subtotal, rule.currency),
      net: fixedMoney(subtotal.minus(tax), rule.currency),
    };
  }
  const tax = new D(fixedMoney(subtotal.times(rate).dividedBy(100), rule.currency));
  return {
    lineTotals,
    subtotal: fixedMoney(subtotal, rule.currency),
    tax: fixedMoney(tax, rule.currency),
    total: fixedMoney(subtotal.plus(tax), rule.currency),
    net: fixedMoney(subtotal, rule.currency),
  };
}

/** A share of a total, rounded half-up to the currency: the deposit asked for by default. */
export function percentOf(total: string, percent: string, currency: string): string {
  return fixedMoney(new D(total).times(new D(percent)).dividedBy(100), currency);
}

/** a − b, exact, written in the currency's decimals. */
export function minusMoney(a: string, b: string, currency: string): string {
  return fixedMoney(new D(a).minus(new D(b)), currency);
}

/** Σ amounts, exact, written in the currency's decimals. */
export function sumMoney(values: readonly string[], currency: string): string {
  return fixedMoney(
    values.reduce((s, v) => s.plus(new D(v)), new D(0)),
    currency,
  );
}

/** −1, 0 or 1 as a compares with b, exactly. */
export function compareMoney(a: string, b: string): number {
  return new D(a).comparedTo(new D(b));
}
