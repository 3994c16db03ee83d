// Exact money: amounts are decimal strings (never floats) with an ISO 4217 currency code. Supplier lists
// write amounts as "1,234.50" or, with a decimal comma, "1.234,50"; both are read here.
import { code as currencyByCode } from 'currency-codes';
import Decimal from 'decimal.js';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });

export interface ParseMoneyOptions {
  /** The list writes "1.234,50": comma for decimals, point (or space) for thousands. */
  decimalComma?: boolean;
  /** Most decimals accepted (default 4, enough for unit prices of small parts). */
  maxDecimals?: number;
}

export type ParsedMoney = { ok: true; value: string } | { ok: false; message: string };

/** "1,234.50" → "1234.50"; keeps the decimals written. Refuses negatives, NaN and exponent notation. */
export function parseMoney(input: string, opts: ParseMoneyOptions = {}): ParsedMoney {
  if (typeof input !== 'string')
    return { ok: false, message: 'An amount must be text, e.g. "12.50".' };
  const text = input.replace(/[\u00a0\u202f\u2009]/g, ' ').trim();
  if (text === '') return { ok: false, message: 'Enter an amount, e.g. "12.50".' };
  if (/^[-\u2212(]/.test(text)) return { ok: false, message: 'An amount must not be negative.' };
  if (/nan|inf/i.test(text)) return { ok: false, message: 'An amount must be a number.' };
  if (/^[0-9.,]+e[+-]?\d/i.test(text)) {
    return {
      ok: false,
      message: 'Write the amount out in digits; exponent notation is not accepted.',
    };
  }
  const [group, point] = opts.decimalComma ? ['.', ','] : [',', '.'];
  const g = `[${escape(group)} ]`;
  const pattern = new RegExp(`^(\\d{1,3}(?:${g}\\d{3})+|\\d+)(?:${escape(point)}(\\d+))?$`);
  const match = pattern.exec(text);
  if (!match) {
    return {
      ok: false,
      message: opts.decimalComma
        ? `"${text}" is not an amount; write it like "1.234,50".`
        : `"${text}" is not an amount; write it like "1,234.50".`,
    };
  }
  const whole = match[1].replace(/[., ]/g, '');
  const fraction = match[2];
  const maxDecimals = opts.maxDecimals ?? 4;
  if (fraction !== undefined && fraction.length > maxDecimals) {
    return { ok: false, message: `An amount has at most ${maxDecimals} decimals.` };
  }
  const value = fraction === undefined ? stripZeros(whole) : `${stripZeros(whole)}.${fraction}`;
  return { ok: true, value };
}

/** True for a current ISO 4217 code, upper case ("EUR", "USD", "JPY"). */
export function isCurrencyCode(code: string): boolean {
  return typeof code === 'string' && /^[A-Z]{3}$/.test(code) && currencyByCode(code) !== undefined;
}

/** Decimals the currency uses (ISO 4217 minor unit): 2 for EUR, 0 for JPY. */
export function currencyDecimals(currency: string): number {
  if (!isCurrencyCode(currency)) throw new Error(`Unknown currency code "${currency}".`);
  return currencyByCode(currency)?.digits ?? 2;
}

/** "1234.5", "EUR" → "1,234.50 EUR": rounded half-up to the currency's decimals, thousands grouped. */
export function formatMoney(value: string, currency: string): string {
  if (typeof value !== 'string' || !/^-?\d+(\.\d+)?$/.test(value.trim())) {
    throw new Error(`Not an amount: "${String(value)}".`);
  }
  const decimals = currencyDecimals(currency);
  const rounded = new D(value.trim()).toDecimalPlaces(decimals);
  // Never show "-0.00" for a tiny negative amount rounded away.
  const fixed = (rounded.isZero() ? rounded.abs() : rounded).toFixed(decimals);
  const [whole, fraction] = fixed.split('.');
  const sign = whole.startsWith('-') ? '-' : '';
  const grouped = whole.replace('-', '').replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  return `${sign}${grouped}${fraction ? `.${fraction}` : ''} ${currency}`;
}

/** Exact sum of decimal strings. */
export function addMoney(...values: string[]): string {
  for (const v of values) {
    if (typeof v !== 'string' || !/^-?\d+(\.\d+)?$/.test(v))
      throw new Error(`Not an amount: "${String(v)}".`);
  }
  return values.reduce((sum, v) => sum.plus(new D(v)), new D(0)).toFixed();
}

function stripZeros(whole: string): string {
  return whole.replace(/^0+(?=\d)/, '');
}

function escape(char: string): string {
  return char.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
