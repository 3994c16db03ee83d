// Reading one cell of a price-list row: a size or oversize in either unit, a price with its currency,
// stock, lead time and GTIN, each with the reason when it cannot be read. validate-row.ts puts a row
// together from them.
import { parseLength, NM_PER_MM, type LengthUnit, type Nm } from '../../shared/lengths';
import { isCurrencyCode, parseMoney } from '../../shared/money';
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

/**
 * What reading one cell gave: its value (null for an empty cell or one that cannot be read), and the
 * reason when it cannot be read, or a warning that goes with the value. A reading depends only on the
 * cell's text and the list's settings, so validate-row.ts keeps the readings of texts seen before.
 */
export interface CellReading<T> {
  value: T | null;
  error: string | null;
  warning: string | null;
}

const EMPTY: CellReading<never> = { value: null, error: null, warning: null };

function value<T>(v: T, warning: string | null = null): CellReading<T> {
  return { value: v, error: null, warning };
}

function refused(message: string): CellReading<never> {
  return { value: null, error: message, warning: null };
}

/** A length cell: nanometres and the unit it was read in, or why it is not a length. */
export function readLengthCell(
  raw: string,
  unit: LengthUnit,
  format: DetectedFormat,
  what: string,
  opts: { allowZero: boolean; max: Nm; min?: Nm },
): { nm: Nm; unit: LengthUnit } | string {
  const shown = raw.trim();
  const read = readNumberCell(raw);
  if (!read.ok) return `The ${what} ${read.message}.`;
  const { run, negative, before, after } = read.cell;
  if (negative) return `The ${what} "${shown}" is negative.`;
  if (before !== '' && !/^[Øø⌀]$/.test(before)) {
    return `The ${what} "${shown}" is not a length: unexpected "${before}" before the number.`;
  }
  const digits = lengthDigits(run, format.decimal);
  if (typeof digits !== 'string') return `The ${what} "${shown}" ${digits.problem}.`;
  const parsed = parseLength(`${digits} ${after}`.trim(), {
    defaultUnit: unit,
    allowZero: opts.allowZero,
    max: opts.max,
  });
  if (!parsed.ok) return `The ${what} "${shown}": ${parsed.message}`;
  if (opts.min !== undefined && parsed.nm < opts.min) {
    return (
      `The ${what} "${shown}" reads as ${digits} ${parsed.unit}, smaller than any piston: ` +
      `is the column in ${parsed.unit === 'mm' ? 'inches' : 'millimetres'}?`
    );
  }
  return { nm: parsed.nm, unit: parsed.unit };
}

export function readSize(raw: string, unit: LengthUnit, format: DetectedFormat): CellReading<Nm> {
  if (raw.trim() === '') return EMPTY;
  const length = readLengthCell(raw, unit, format, 'size', {
    allowZero: false,
    max: MAX_SIZE_NM,
    min: MIN_SIZE_NM,
  });
  if (typeof length === 'string') {
    return refused(
      length.includes('at most')
        ? `${length} A piston that large is not plausible: is the column in ${unit === 'in' ? 'millimetres' : 'inches'}?`
        : length,
    );
  }
  return value(
    length.nm,
    length.unit === unit
      ? null
      : `The size "${raw.trim()}" is in ${length.unit} while the column is set to ${unit}; the unit written in the cell is used.`,
  );
}

export function readOversize(
  raw: string,
  unit: LengthUnit,
  format: DetectedFormat,
): CellReading<Nm> {
  const text = raw.trim();
  if (text === '') return EMPTY;
  if (STANDARD_WORDS.has(text.toLowerCase())) return value(0);
  const length = readLengthCell(text, unit, format, 'oversize', {
    allowZero: true,
    max: MAX_OVERSIZE_NM,
  });
  if (typeof length !== 'string') return value(length.nm);
  return refused(
    length.includes('at most')
      ? `${length} No oversize step is that large: is this the size column, or the wrong unit?`
      : length,
  );
}

export function readPrice(
  raw: string,
  format: DetectedFormat,
  dollarIsDefault: boolean,
): CellReading<{ value: string; currency: string | null }> {
  const shown = raw.trim();
  if (shown === '') return refused('The price is empty.');
  const read = readNumberCell(raw);
  if (!read.ok) return refused(`The price ${read.message}.`);
  const { run, negative, before, after } = read.cell;
  if (negative) return refused(`The price "${shown}" is negative.`);
  if (before !== '' && after !== '') {
    return refused(`The price "${shown}" has text on both sides of the number.`);
  }
  const affix = before || after;
  let currency: string | null = null;
  if (affix !== '') {
    if (CURRENCY_SYMBOLS[affix]) currency = CURRENCY_SYMBOLS[affix];
    else if (affix === '$') {
      if (!dollarIsDefault) {
        return refused(
          `The price "${shown}" uses "$", which several currencies share; write the code (USD, CAD…).`,
        );
      }
      currency = 'USD';
    } else if (/^[A-Za-z]{3}$/.test(affix)) {
      if (!isCurrencyCode(affix.toUpperCase())) {
        return refused(
          `The price "${shown}" names "${affix}", which is not an ISO 4217 currency code.`,
        );
      }
      currency = affix.toUpperCase();
    } else {
      return refused(`The price "${shown}" is not a number: unexpected "${affix}".`);
    }
  }
  const money = parseMoney(run, { decimalComma: format.decimal === ',', maxDecimals: 4 });
  if (!money.ok) return refused(`The price "${shown}": ${money.message}`);
  // parseMoney answers plain digits with an optional fraction ("1234.5"), so text is enough here.
  const [whole, fraction = ''] = money.value.split('.');
  if (/^0*$/.test(whole) && /^0*$/.test(fraction)) {
    return refused('The price is zero; leave the row out or give its price.');
  }
  if (whole.replace(/^0+(?=\d)/, '').length > MAX_PRICE_DIGITS) {
    return refused(
      `The price "${shown}" is too large (at most ${MAX_PRICE_DIGITS} digits before the decimals).`,
    );
  }
  return value({ value: `${whole}.${fraction.padEnd(2, '0')}`, currency });
}

export function readAvailable(raw: string, format: DetectedFormat): CellReading<number> {
  const shown = raw.trim();
  if (shown === '') return EMPTY;
  const read = readNumberCell(raw);
  if (!read.ok) return refused(`The available quantity ${read.message}.`);
  const { run, negative, before, after } = read.cell;
  // Suppliers write "> 50" or "50+" for "plenty": read it as the number given, which is a lower bound.
  const atLeast = before === '>' || before === '>=' || after === '+';
  if (negative) return refused(`The available quantity "${shown}" is negative.`);
  if ((before !== '' || after !== '') && !atLeast && !/^(pcs|pc|stk|st|x)\.?$/i.test(after)) {
    return refused(`The available quantity "${shown}" is not a whole number.`);
  }
  const money = parseMoney(run, { decimalComma: format.decimal === ',', maxDecimals: 0 });
  if (!money.ok) return refused(`The available quantity "${shown}" is not a whole number.`);
  const n = Number(money.value);
  if (n > MAX_AVAILABLE) {
    return refused(
      `The available quantity "${shown}" is more than ${MAX_AVAILABLE.toLocaleString('en')}.`,
    );
  }
  return value(
    n,
    atLeast ? `"${shown}" is read as ${n} available (the least the supplier promises).` : null,
  );
}

export function readLeadDays(raw: string): CellReading<number> {
  const shown = raw.trim();
  if (shown === '') return EMPTY;
  const read = readNumberCell(raw);
  if (!read.ok || read.cell.before !== '') {
    return refused(`The lead time "${shown}" is not a number of days.`);
  }
  const { run, negative, after } = read.cell;
  const word = after.toLowerCase().replace(/\.$/, '');
  const factor = DAY_WORDS.has(word) ? 1 : WEEK_WORDS.has(word) ? 7 : 0;
  if (negative || factor === 0 || !/^\d+$/.test(run)) {
    return refused(`The lead time "${shown}" is not a whole number of days (or weeks, "3 wk").`);
  }
  const days = Number(run) * factor;
  if (days > MAX_LEAD_DAYS)
    return refused(`The lead time "${shown}" is more than ${MAX_LEAD_DAYS} days.`);
  return value(days);
}

export function readGtin(raw: string): CellReading<string> {
  const shown = raw.trim();
  if (shown === '') return EMPTY;
  if (/^\d[.,]?\d*e\+?\d+$/i.test(shown)) {
    return refused(
      `The GTIN "${shown}" was turned into a number in exponent form by a spreadsheet; format the ` +
        'column as text and export again.',
    );
  }
  const problem = gtinProblem(shown);
  if (problem) return refused(`The GTIN "${shown}": ${problem}`);
  // The 14-digit form, as the catalog stores GTINs, so an EAN-13 and a UPC-A of one box compare equal.
  return { value: normalizeGtin(shown), error: null, warning: null };
}

/** The currency column: the code in capitals, or why it is not one (an empty cell gives null). */
export function readCurrency(raw: string): CellReading<string> {
  const code = raw.trim().toUpperCase();
  if (code === '') return EMPTY;
  if (!isCurrencyCode(code)) return refused(`"${raw.trim()}" is not an ISO 4217 currency code.`);
  return value(code);
}
