// Numbers as suppliers write them in their lists: "12.50", "1.234,50", "€ 12,50", "54,25 mm", "(3.00)",
// "2.5000\"". This file splits such a cell into the number and the text around it and turns the number
// into a canonical decimal string ("1234.50") for one decimal mark, refusing anything ambiguous or mixed
// rather than guessing.
import type { DecimalMark } from './detect-format';

export interface NumberCell {
  /** Canonical digits with '.' as the decimal point and no sign ("1234.50"). */
  value: string;
  negative: boolean;
  /** Text before and after the number, trimmed (currency codes, symbols, units). */
  before: string;
  after: string;
}

export type NumberResult = { ok: true; cell: NumberCell } | { ok: false; message: string };

const SPACES = /[\u00a0\u2007\u2009\u202f]/g;
const MINUS = /[-\u2212\u2013]/;
// The number itself: digits with separators inside, or a leading separator (".5").
const NUMBER_RUN = /\d[\d.,' ]*\d|\d|[.,]\d+/;
/** Affixes a numeric cell may carry: currency codes and symbols, length units, a percent sign. */
const AFFIX = /^(?:[A-Za-z]{3}|[€£$¥]|mm|in|in\.|inch|inches|"|\u2033|''|%)?$/;

/** Splits a cell into number and surrounding text, and reads the number for the given decimal mark. */
export function readNumberCell(raw: string, decimal: DecimalMark): NumberResult {
  let text = raw.replace(SPACES, ' ').trim();
  let negative = false;
  if (/^\(.*\)$/.test(text)) {
    // Accounting style: (12.50) is minus 12.50.
    negative = true;
    text = text.slice(1, -1).trim();
  }
  const match = NUMBER_RUN.exec(text);
  if (!match) return { ok: false, message: `"${raw.trim()}" is not a number` };
  let before = text.slice(0, match.index).trim();
  const after = text.slice(match.index + match[0].length).trim();
  if (MINUS.test(before.slice(-1)) || MINUS.test(before.slice(0, 1))) {
    negative = true;
    before = before.replace(MINUS, '').trim();
  }
  if (before.startsWith('+') || before.endsWith('+')) before = before.replace('+', '').trim();
  if (/^e[+-]?\d/i.test(after)) {
    return {
      ok: false,
      message: `"${raw.trim()}" is in exponent form; a spreadsheet probably reformatted it — format the column as text`,
    };
  }
  const value = canonical(match[0].trim(), decimal);
  if (typeof value !== 'string') return { ok: false, message: `"${raw.trim()}" ${value.problem}` };
  return { ok: true, cell: { value, negative, before, after } };
}

/** True for a cell that is a number, possibly with a currency or unit: "12,50 €", "54.25 mm", "7". */
export function looksLikeNumber(raw: string): boolean {
  const text = raw.replace(SPACES, ' ').trim().replace(/^\((.*)\)$/, '$1');
  const match = NUMBER_RUN.exec(text);
  if (!match) return false;
  const before = text.slice(0, match.index).replace(/[-+\u2212]/g, '').trim();
  const after = text.slice(match.index + match[0].length).trim();
  return AFFIX.test(before) && AFFIX.test(after);
}

export type Evidence = 'comma' | 'point' | 'comma?' | 'point?' | null;

/**
 * What a numeric cell says about the decimal mark. A separator followed by exactly three digits after a
 * group of one to three digits ("2,555", "1.250") could be a thousands separator, so it only hints.
 */
export function numberEvidence(raw: string): Evidence {
  if (!looksLikeNumber(raw)) return null;
  const run = NUMBER_RUN.exec(raw.replace(SPACES, ' '))?.[0].replace(/[ ']/g, '') ?? '';
  const commas = count(run, ',');
  const points = count(run, '.');
  if (commas > 0 && points > 0) return run.lastIndexOf(',') > run.lastIndexOf('.') ? 'comma' : 'point';
  if (commas > 1) return 'point';
  if (points > 1) return 'comma';
  const mark = commas === 1 ? ',' : points === 1 ? '.' : null;
  if (!mark) return null;
  const [whole, fraction] = run.split(mark);
  const couldBeThousands = /^[1-9]\d{0,2}$/.test(whole) && fraction.length === 3;
  if (mark === ',') return couldBeThousands ? 'comma?' : 'comma';
  return couldBeThousands ? 'point?' : 'point';
}

function count(text: string, ch: string): number {
  let n = 0;
  for (const c of text) if (c === ch) n++;
  return n;
}

/**
 * "1.234,50" → "1234.50" when the decimal mark is a comma; "1,234.50" → "1234.50" for a point. Thousands
 * separators (the other mark, a space or an apostrophe) must sit between groups of exactly three digits.
 */
function canonical(run: string, decimal: DecimalMark): string | { problem: string } {
  const thousands = decimal === ',' ? '.' : ',';
  const other = thousands;
  const decimalIndex = run.lastIndexOf(decimal);
  if (decimalIndex !== run.indexOf(decimal)) {
    return { problem: `has more than one decimal ${decimal === ',' ? 'comma' : 'point'}` };
  }
  const whole = decimalIndex >= 0 ? run.slice(0, decimalIndex) : run;
  const fraction = decimalIndex >= 0 ? run.slice(decimalIndex + 1) : '';
  if (/[^\d]/.test(fraction) || (decimalIndex >= 0 && fraction === '')) {
    return { problem: `is not a number written with a decimal ${decimal === ',' ? 'comma' : 'point'}` };
  }
  let digits = whole;
  if (/[^\d]/.test(whole)) {
    const groups = whole.split(/[ ']|\.|,/);
    const separators = whole.replace(/\d/g, '');
    const grouped =
      new Set(separators).size === 1 &&
      !separators.includes(decimal) &&
      /^\d{1,3}$/.test(groups[0]) &&
      groups.slice(1).every((g) => /^\d{3}$/.test(g));
    if (!grouped) {
      const usesOther = whole.includes(other) && decimalIndex < 0;
      return {
        problem: usesOther
          ? `uses a decimal ${other === ',' ? 'comma' : 'point'}, but this list writes decimals with a ${decimal === ',' ? 'comma' : 'point'}`
          : 'has separators in the wrong places',
      };
    }
    digits = groups.join('');
  }
  if (digits === '') digits = '0';
  return fraction ? `${digits}.${fraction}` : digits;
}
