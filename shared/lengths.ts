// Exact lengths. Every length in Stepstock is a whole number of nanometres: 1 in = 25.4 mm exactly, so
// 0.00001 in (254 nm) and 0.000001 mm (1 nm) are both whole, and nothing is ever added or compared as a
// binary float. Text is turned into nanometres with decimal arithmetic only.
import Decimal from 'decimal.js';

/** A length in nanometres. Always a safe integer. */
export type Nm = number;
export type LengthUnit = 'mm' | 'in';
export interface LengthJson {
  mm: string;
  in: string;
}

export const NM_PER_MM = 1_000_000;
export const NM_PER_IN = 25_400_000;
/** Largest length accepted unless the caller says otherwise: 2000 mm, far past any cylinder bore. */
export const DEFAULT_MAX_NM: Nm = 2000 * NM_PER_MM;

/** Decimal places each unit can hold exactly in whole nanometres (0.00001 in = 254 nm; 0.000001 mm = 1 nm). */
const MAX_DECIMALS: Record<LengthUnit, number> = { in: 5, mm: 6 };

// Our own Decimal constructor, so changing the global configuration elsewhere cannot change our results.
const D = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_UP });

export class LengthError extends Error {
  constructor(
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = 'LengthError';
  }
}

export interface ParseLengthOptions {
  /** Unit to use when the text has none ("64.91"). Without it a bare number is refused. */
  defaultUnit?: LengthUnit;
  /** Accept 0 (a clearance or an offset may be zero; a bore may not). */
  allowZero?: boolean;
  /** Largest accepted length in nm (default 2000 mm). */
  max?: Nm;
}

export type ParsedLength = { ok: true; nm: Nm; unit: LengthUnit } | { ok: false; message: string };

const UNIT_WORDS: Record<string, LengthUnit> = {
  mm: 'mm',
  'mm.': 'mm',
  millimetre: 'mm',
  millimetres: 'mm',
  millimeter: 'mm',
  millimeters: 'mm',
  in: 'in',
  'in.': 'in',
  inch: 'in',
  inches: 'in',
  '"': 'in',
  '\u2033': 'in', // ″ double prime
  "''": 'in',
};

const EXAMPLE = 'for example "2.5555 in" or "64.91 mm"';

/** Reads a length typed by a person or sent by the API, e.g. "2.5555 in", "64,91 mm", "2.5555\"". */
export function parseLength(input: string, opts: ParseLengthOptions = {}): ParsedLength {
  if (typeof input !== 'string') {
    return fail(`Length must be text with its unit, ${EXAMPLE}.`);
  }
  // Non-breaking and thin spaces arrive from spreadsheets and copied web pages.
  const text = input.replace(/[\u00a0\u2009\u202f]/g, ' ').trim();
  if (text === '') return fail(`Enter a length, ${EXAMPLE}.`);
  if (/^[-\u2212\u2013]/.test(text)) return fail('Length must not be negative.');
  if (/^[+]?(nan|[+-]?infinity|inf)\b/i.test(text)) return fail('Length must be a number.');

  const match = /^\+?\s*([0-9]*[.,]?[0-9]*)\s*(.*)$/.exec(text);
  const numberPart = match?.[1] ?? '';
  const rest = (match?.[2] ?? '').trim();
  if (!/[0-9]/.test(numberPart)) return fail(`"${input.trim()}" is not a length; ${EXAMPLE}.`);
  if (/^e[+-]?[0-9]/i.test(rest)) {
    return fail('Write the length out in digits; exponent notation (like 1e3) is not accepted.');
  }
  if (/^[.,0-9]/.test(rest)) {
    return fail('Use one decimal separator and no thousands separators, e.g. "1234.5 mm".');
  }

  // "2,000 mm" may be two metres written with a thousands separator or two millimetres with a decimal
  // comma; guessing either way can be a thousandfold wrong, so ask.
  if (/^[0-9]+,[0-9]{3}$/.test(numberPart)) {
    const [whole, part] = numberPart.split(',');
    return fail(
      `"${input.trim()}" is ambiguous: the comma could separate thousands or decimals. Write it with a decimal point ("${whole}.${part}" or "${whole}${part}"), or with a decimal comma and fewer digits ("${whole},${part.replace(/0+$/, '') || '0'}").`,
    );
  }

  let unit: LengthUnit;
  if (rest === '') {
    if (!opts.defaultUnit) return fail(`Give the unit, mm or in, ${EXAMPLE}.`);
    unit = opts.defaultUnit;
  } else {
    const word = UNIT_WORDS[rest.toLowerCase()];
    if (!word) return fail(`The unit must be mm or in (got "${rest}").`);
    unit = word;
  }

  const digits = numberPart.replace(',', '.');
  const decimals = digits.includes('.') ? digits.length - digits.indexOf('.') - 1 : 0;
  if (decimals > MAX_DECIMALS[unit]) {
    return fail(
      `Too many decimals for ${unit}: at most ${MAX_DECIMALS[unit]} (${unit === 'in' ? '0.00001 in' : '0.000001 mm'}).`,
    );
  }

  const nmDecimal = new D(digits).times(unit === 'in' ? NM_PER_IN : NM_PER_MM);
  // Guaranteed whole by the decimal-places limit above; checked anyway because everything relies on it.
  if (!nmDecimal.isInteger()) return fail('Length cannot be held exactly; use fewer decimals.');

  const max = opts.max ?? DEFAULT_MAX_NM;
  if (nmDecimal.greaterThan(max)) {
    return fail(`Length must be at most ${formatLength(max, unit)}.`);
  }
  const nm = nmDecimal.toNumber();
  if (nm === 0 && !opts.allowZero) return fail('Length must be greater than zero.');
  return { ok: true, nm, unit };
}

/** Server-side form of parseLength: returns nanometres or throws a LengthError naming the field. */
export function lengthOrThrow(
  input: string,
  opts: ParseLengthOptions & { field?: string } = {},
): Nm {
  const parsed = parseLength(input, opts);
  if (!parsed.ok) {
    throw new LengthError(
      opts.field ? `${opts.field}: ${parsed.message}` : parsed.message,
      opts.field,
    );
  }
  return parsed.nm;
}

/** Exact millimetres: at least 3 decimals, more only when the value needs them (64 909 700 nm → "64.9097"). */
export function formatMm(nm: Nm): string {
  assertNm(nm);
  const exact = new D(nm).dividedBy(NM_PER_MM).toFixed(6);
  return exact.replace(/(\.\d{3}\d*?)0+$/, '$1');
}

/**
 * Inches at 4 decimals, or 5 when the value is exactly a 5-decimal inch value, so a length typed in inches
 * reads back digit for digit; any other value (one typed in mm) is rounded half-up to 4 decimals.
 */
export function formatIn(nm: Nm): string {
  assertNm(nm);
  const inches = new D(nm).dividedBy(NM_PER_IN);
  if (nm % 254 === 0 && nm % 2540 !== 0) return inches.toFixed(5);
  return inches.toFixed(4, Decimal.ROUND_HALF_UP);
}

/** The API's form of a length: both units as exact-as-possible strings. */
export function toLengthJson(nm: Nm): LengthJson {
  return { mm: formatMm(nm), in: formatIn(nm) };
}

/**
 * For display at the trade's resolution: 0.001 mm or 0.0001 in, rounded half-up ("64.910 mm").
 * A difference may be negative (a step whose finished bore falls short of the wear): it reads with a
 * minus sign ("−0.120 mm"), and one too small to show at this resolution reads as zero, never "−0.000".
 */
export function formatLength(nm: Nm, unit: LengthUnit, withUnit = true): string {
  assertNm(nm);
  const size = new D(Math.abs(nm)).dividedBy(unit === 'mm' ? NM_PER_MM : NM_PER_IN);
  const digits = size.toFixed(unit === 'mm' ? 3 : 4, Decimal.ROUND_HALF_UP);
  const value = nm < 0 && /[1-9]/.test(digits) ? `\u2212${digits}` : digits;
  return withUnit ? `${value} ${unit}` : value;
}

/** Most decimals a length can need: mm to the nanometre, inches to 0.0000001 in (2.54 nm). */
const MOST_DECIMALS: Record<LengthUnit, number> = { mm: 6, in: 7 };

/**
 * Two lengths for one sentence that compares them ("0.0508 mm is over the limit of 0.050 mm"): at
 * the trade's resolution, or with as many more decimals as it takes for two different lengths not
 * to read the same. A message may never say "0.0020 in is over the limit of 0.0020 in".
 */
export function formatLengthsApart(a: Nm, b: Nm, unit: LengthUnit): [string, string] {
  assertNm(a);
  assertNm(b);
  const per = unit === 'mm' ? NM_PER_MM : NM_PER_IN;
  const at = (nm: Nm, decimals: number) => {
    const digits = new D(Math.abs(nm)).dividedBy(per).toFixed(decimals, Decimal.ROUND_HALF_UP);
    return `${nm < 0 && /[1-9]/.test(digits) ? '\u2212' : ''}${digits} ${unit}`;
  };
  let decimals = unit === 'mm' ? 3 : 4;
  while (a !== b && at(a, decimals) === at(b, decimals) && decimals < MOST_DECIMALS[unit]) {
    decimals += 1;
  }
  return [at(a, decimals), at(b, decimals)];
}

/**
 * Like formatLength, with one trailing zero dropped for amounts in sentences: mm at 2–3 decimals
 * ("0.08 mm", "0.035 mm"), inches at 3–4 ("0.003 in", "0.0015 in").
 */
export function formatLengthCompact(nm: Nm, unit: LengthUnit): string {
  const value = formatLength(nm, unit, false);
  return `${value.endsWith('0') ? value.slice(0, -1) : value} ${unit}`;
}

/** "0.0015" (inches) → 38 100 nm. Zero allowed; throws LengthError on anything else than a plain number. */
export function inToNm(inches: string): Nm {
  return convenience(inches, 'in');
}

/** "64.91" (millimetres) → 64 910 000 nm. Zero allowed; throws LengthError on bad input. */
export function mmToNm(mm: string): Nm {
  return convenience(mm, 'mm');
}

/**
 * A length in the API's form (`{ mm, in }`) as nanometres, read from the string of the given unit.
 * Unlike a typed length this may be negative, because the API also sends differences (finished bore
 * minus the worn bore is negative for a step too small to clean up); it still throws on anything that
 * is not a plain number.
 */
export function lengthJsonToNm(value: LengthJson, unit: LengthUnit): Nm {
  const text = (unit === 'in' ? value.in : value.mm).trim();
  const negative = /^[-\u2212]/.test(text);
  const nm = convenience(negative ? text.slice(1) : text, unit);
  return negative && nm !== 0 ? -nm : nm;
}

/** True for a value usable as a length in nm (a safe integer). */
export function isNm(value: unknown): value is Nm {
  return typeof value === 'number' && Number.isSafeInteger(value);
}

function convenience(text: string, unit: LengthUnit): Nm {
  const parsed = parseLength(text, { defaultUnit: unit, allowZero: true });
  if (!parsed.ok) throw new LengthError(parsed.message);
  if (parsed.unit !== unit) throw new LengthError(`Expected a length in ${unit}, got "${text}".`);
  return parsed.nm;
}

function assertNm(nm: Nm): void {
  if (!isNm(nm)) throw new LengthError(`Not a whole number of nanometres: ${String(nm)}.`);
}

function fail(message: string): ParsedLength {
  return { ok: false, message };
}

/**
 * A size in the unit its list or series is defined in, with the reader's unit beside it when that
 * differs: "+0.50 mm (0.0197 in)" for a metric step read by an inch shop. Each unit is read from
 * its own exact string, so neither drifts.
 */
export function formatInSeriesUnit(
  value: LengthJson,
  seriesUnit: LengthUnit,
  readerUnit: LengthUnit,
  opts: { signed?: boolean } = {},
): string {
  const own = lengthJsonToNm(value, seriesUnit);
  const sign = opts.signed && own > 0 ? '+' : own < 0 ? '−' : '';
  const first = `${sign}${formatLengthCompact(Math.abs(own), seriesUnit)}`;
  if (readerUnit === seriesUnit) return first;
  const theirs = lengthJsonToNm(value, readerUnit);
  return `${first} (${theirs < 0 ? '−' : ''}${formatLength(Math.abs(theirs), readerUnit)})`;
}
