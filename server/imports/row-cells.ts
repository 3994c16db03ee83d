// Reading one cell of a price-list row: a size or oversize in either unit, a price with its currency,
// stock, lead time and GTIN, each with the reason when it cannot be read. validate-row.ts puts a row
// together from them.
import {
  parseLength,
  NM_PER_MM,
  type LengthUnit,
  type Nm,
  type ParseLengthOptions,
  type ParsedLength,
} from '../../shared/lengths';
import {
  isCurrencyCode,
  parseMoney,
  type ParseMoneyOptions,
  type ParsedMoney,
} from '../../shared/money';
import { gtinProblem, normalizeGtin } from '../../shared/gtin';
import type { DetectedFormat } from './detect-format';
import { lengthDigits, readNumberCell } from './number-text';

// Plausible piston sizes and oversize steps (common practice, no source): the smallest bores this trade
// meets are about 30 mm and the largest under 150 mm; oversize steps go up in 0.25 mm or 0.010 in and
// rarely pass 2 mm. The limits are set wide of that and exist to catch a column read in the wrong unit:
// 2.5000 read as millimetres, or 54.00 read as inches.
export const MIN_SIZE_NM = 5 * NM_PER_MM;
export const MAX_SIZE_NM = 500 * NM_PER_MM;
export const MAX_OVERSIZE_NM = 5 * NM_PER_MM;
export const MAX_AVAILABLE = 1_000_000;
export const MAX_LEAD_DAYS = 365;

const MAX_PRICE_DIGITS = 10;

const STANDARD_WORDS = new Set(['std', 'std.', 'standard', 'stdd', 'norm', 'nominal', 'std bore']);
const CURRENCY_SYMBOLS: Record<string, string> = { '€': 'EUR', '£': 'GBP' };
const DAY_WORDS = new Set([
  '',
  'd',
  'day',
  'days',
  'tag',
  'tage',
  't',
  'j',
  'jours',
  'jour',
  'gg',
  'giorni',
  'dias',
  'días',
]);
const WEEK_WORDS = new Set([
  'w',
  'wk',
  'wks',
  'week',
  'weeks',
  'woche',
  'wochen',
  'sem',
  'semaines',
  'semaine',
]);

// A list repeats the same few sizes and prices thousands of times; both readers are pure, so their
// answers are kept for the texts seen most recently (cleared when full, to bound the memory).
const CACHE_LIMIT = 5000;
const lengthCache = new Map<string, ParsedLength>();
const moneyCache = new Map<string, ParsedMoney>();

function cachedLength(text: string, opts: ParseLengthOptions): ParsedLength {
  const key = `${text}|${opts.defaultUnit}|${opts.allowZero}|${opts.max}`;
  let hit = lengthCache.get(key);
  if (!hit) {
    if (lengthCache.size >= CACHE_LIMIT) lengthCache.clear();
    hit = parseLength(text, opts);
    lengthCache.set(key, hit);
  }
  return hit;
}

function cachedMoney(text: string, opts: ParseMoneyOptions): ParsedMoney {
  const key = `${text}|${opts.decimalComma}|${opts.maxDecimals}`;
  let hit = moneyCache.get(key);
  if (!hit) {
    if (moneyCache.size >= CACHE_LIMIT) moneyCache.clear();
    hit = parseMoney(text, opts);
    moneyCache.set(key, hit);
  }
  return hit;
}

export function readLengthCell(
  raw: string,
  unit: LengthUnit,
  format: DetectedFormat,
  what: string,
  opts: { allowZero: boolean; max: Nm; min?: Nm },
  fail: (m: string) => void,
): { nm: Nm; unit: LengthUnit } | null {
  const shown = raw.trim();
  const read = readNumberCell(raw);
  if (!read.ok) {
    fail(`The ${what} ${read.message}.`);
    return null;
  }
  const { run, negative, before, after } = read.cell;
  if (negative) {
    fail(`The ${what} "${shown}" is negative.`);
    return null;
  }
  if (before !== '' && !/^[Øø⌀]$/.test(before)) {
    fail(`The ${what} "${shown}" is not a length: unexpected "${before}" before the number.`);
    return null;
  }
  const digits = lengthDigits(run, format.decimal);
  if (typeof digits !== 'string') {
    fail(`The ${what} "${shown}" ${digits.problem}.`);
    return null;
  }
  const parsed = cachedLength(`${digits} ${after}`.trim(), {
    defaultUnit: unit,
    allowZero: opts.allowZero,
    max: opts.max,
  });
  if (!parsed.ok) {
    fail(`The ${what} "${shown}": ${parsed.message}`);
    return null;
  }
  if (opts.min !== undefined && parsed.nm < opts.min) {
    fail(
      `The ${what} "${shown}" reads as ${digits} ${parsed.unit}, smaller than any piston: ` +
        `is the column in ${parsed.unit === 'mm' ? 'inches' : 'millimetres'}?`,
    );
    return null;
  }
  return { nm: parsed.nm, unit: parsed.unit };
}

export function readSize(
  raw: string,
  unit: LengthUnit,
  format: DetectedFormat,
  fail: (m: string) => void,
  warn: (m: string) => void,
): Nm | null {
  if (raw.trim() === '') return null;
  let tooLarge = false;
  const length = readLengthCell(
    raw,
    unit,
    format,
    'size',
    { allowZero: false, max: MAX_SIZE_NM, min: MIN_SIZE_NM },
    (m) => {
      tooLarge = m.includes('at most');
      fail(
        tooLarge
          ? `${m} A piston that large is not plausible: is the column in ${unit === 'in' ? 'millimetres' : 'inches'}?`
          : m,
      );
    },
  );
  if (length && length.unit !== unit) {
    warn(
      `The size "${raw.trim()}" is in ${length.unit} while the column is set to ${unit}; the unit written in the cell is used.`,
    );
  }
  return length?.nm ?? null;
}

export function readOversize(
  raw: string,
  unit: LengthUnit,
  format: DetectedFormat,
  fail: (m: string) => void,
): Nm | null {
  const text = raw.trim();
  if (text === '') return null;
  if (STANDARD_WORDS.has(text.toLowerCase())) return 0;
  const length = readLengthCell(
    text,
    unit,
    format,
    'oversize',
    { allowZero: true, max: MAX_OVERSIZE_NM },
    (m) =>
      fail(
        m.includes('at most')
          ? `${m} No oversize step is that large: is this the size column, or the wrong unit?`
          : m,
      ),
  );
  return length?.nm ?? null;
}

export function readPrice(
  raw: string,
  format: DetectedFormat,
  dollarIsDefault: boolean,
  fail: (m: string) => void,
): { value: string; currency: string | null } | null {
  const shown = raw.trim();
  if (shown === '') {
    fail('The price is empty.');
    return null;
  }
  const read = readNumberCell(raw);
  if (!read.ok) {
    fail(`The price ${read.message}.`);
    return null;
  }
  const { run, negative, before, after } = read.cell;
  if (negative) {
    fail(`The price "${shown}" is negative.`);
    return null;
  }
  if (before !== '' && after !== '') {
    fail(`The price "${shown}" has text on both sides of the number.`);
    return null;
  }
  const affix = before || after;
  let currency: string | null = null;
  if (affix !== '') {
    if (CURRENCY_SYMBOLS[affix]) currency = CURRENCY_SYMBOLS[affix];
    else if (affix === '$') {
      if (!dollarIsDefault) {
        fail(
          `The price "${shown}" uses "$", which several currencies share; write the code (USD, CAD…).`,
        );
        return null;
      }
      currency = 'USD';
    } else if (/^[A-Za-z]{3}$/.test(affix)) {
      if (!isCurrencyCode(affix.toUpperCase())) {
        fail(`The price "${shown}" names "${affix}", which is not an ISO 4217 currency code.`);
        return null;
      }
      currency = affix.toUpperCase();
    } else {
      fail(`The price "${shown}" is not a number: unexpected "${affix}".`);
      return null;
    }
  }
  const money = cachedMoney(run, { decimalComma: format.decimal === ',', maxDecimals: 4 });
  if (!money.ok) {
    fail(`The price "${shown}": ${money.message}`);
    return null;
  }
  // parseMoney answers plain digits with an optional fraction ("1234.5"), so text is enough here.
  const [whole, fraction = ''] = money.value.split('.');
  if (/^0*$/.test(whole) && /^0*$/.test(fraction)) {
    fail('The price is zero; leave the row out or give its price.');
    return null;
  }
  if (whole.replace(/^0+(?=\d)/, '').length > MAX_PRICE_DIGITS) {
    fail(
      `The price "${shown}" is too large (at most ${MAX_PRICE_DIGITS} digits before the decimals).`,
    );
    return null;
  }
  return { value: `${whole}.${fraction.padEnd(2, '0')}`, currency };
}

export function readAvailable(
  raw: string,
  format: DetectedFormat,
  fail: (m: string) => void,
  warn: (m: string) => void,
): number | null {
  const shown = raw.trim();
  if (shown === '') return null;
  const read = readNumberCell(raw);
  if (!read.ok) {
    fail(`The available quantity ${read.message}.`);
    return null;
  }
  const { run, negative, before, after } = read.cell;
  // Suppliers write "> 50" or "50+" for "plenty": read it as the number given, which is a lower bound.
  const atLeast = before === '>' || before === '>=' || after === '+';
  if (negative) {
    fail(`The available quantity "${shown}" is negative.`);
    return null;
  }
  if ((before !== '' || after !== '') && !atLeast && !/^(pcs|pc|stk|st|x)\.?$/i.test(after)) {
    fail(`The available quantity "${shown}" is not a whole number.`);
    return null;
  }
  const money = cachedMoney(run, { decimalComma: format.decimal === ',', maxDecimals: 0 });
  if (!money.ok) {
    fail(`The available quantity "${shown}" is not a whole number.`);
    return null;
  }
  const n = Number(money.value);
  if (n > MAX_AVAILABLE) {
    fail(`The available quantity "${shown}" is more than ${MAX_AVAILABLE.toLocaleString('en')}.`);
    return null;
  }
  if (atLeast) warn(`"${shown}" is read as ${n} available (the least the supplier promises).`);
  return n;
}

export function readLeadDays(
  raw: string,
  format: DetectedFormat,
  fail: (m: string) => void,
): number | null {
  const shown = raw.trim();
  if (shown === '') return null;
  const read = readNumberCell(raw);
  if (!read.ok || read.cell.before !== '') {
    fail(`The lead time "${shown}" is not a number of days.`);
    return null;
  }
  const { run, negative, after } = read.cell;
  const word = after.toLowerCase().replace(/\.$/, '');
  const factor = DAY_WORDS.has(word) ? 1 : WEEK_WORDS.has(word) ? 7 : 0;
  if (negative || factor === 0 || !/^\d+$/.test(run)) {
    fail(`The lead time "${shown}" is not a whole number of days (or weeks, "3 wk").`);
    return null;
  }
  const days = Number(run) * factor;
  if (days > MAX_LEAD_DAYS) {
    fail(`The lead time "${shown}" is more than ${MAX_LEAD_DAYS} days.`);
    return null;
  }
  return days;
}

export function readGtin(raw: string, fail: (m: string) => void): string | null {
  const shown = raw.trim();
  if (shown === '') return null;
  if (/^\d[.,]?\d*e\+?\d+$/i.test(shown)) {
    fail(
      `The GTIN "${shown}" was turned into a number in exponent form by a spreadsheet; format the ` +
        'column as text and export again.',
    );
    return null;
  }
  const problem = gtinProblem(shown);
  if (problem) {
    fail(`The GTIN "${shown}": ${problem}`);
    return null;
  }
  // The 14-digit form, as the catalog stores GTINs, so an EAN-13 and a UPC-A of one box compare equal.
  return normalizeGtin(shown);
}
