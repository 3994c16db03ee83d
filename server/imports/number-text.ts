// Numbers as suppliers write them in their lists: "12.50", "1.234,50", "€ 12,50", "54,25 mm", "(3.00)",
// "2.5000\"". This file splits such a cell into the number and the text around it, and tells from the
// numbers of a list whether it writes a decimal comma or a decimal point. Amounts themselves are read by
// shared/money; lengths by shared/lengths.
/** The mark a list writes between whole units and decimals. */
export type DecimalMark = '.' | ',';

export interface NumberCell {
  /** The number as written, without sign or surrounding text ("1.234,50"). */
  run: string;
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

/** Splits a cell into its number, its sign and the text around it ("€ -12,50" → "12,50", "-", "€"). */
export function readNumberCell(raw: string): NumberResult {
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
      message: `"${raw.trim()}" is in exponent form (a spreadsheet probably reformatted it; format the column as text)`,
    };
  }
  return { ok: true, cell: { run: match[0].trim(), negative, before, after } };
}

/**
 * A length's number for the list's decimal mark: "54,25" → "54.25" in a decimal-comma list. Lengths never
 * carry thousands separators, so the other mark is refused rather than guessed at.
 */
export function lengthDigits(run: string, decimal: DecimalMark): string | { problem: string } {
  const other = decimal === ',' ? '.' : ',';
  if (run.includes(other) || /[ ']/.test(run)) {
    return {
      problem: `uses a decimal ${markName(other)}, but this list writes decimals with a ${markName(decimal)}`,
    };
  }
  if (run.indexOf(decimal) !== run.lastIndexOf(decimal)) {
    return { problem: `has more than one decimal ${markName(decimal)}` };
  }
  return run.replace(decimal, '.');
}

export function markName(mark: DecimalMark): string {
  return mark === ',' ? 'comma' : 'point';
}

/** True for a cell that is a number, possibly with a currency or unit: "12,50 €", "54.25 mm", "7". */
export function looksLikeNumber(raw: string): boolean {
  const text = raw
    .replace(SPACES, ' ')
    .trim()
    .replace(/^\((.*)\)$/, '$1');
  const match = NUMBER_RUN.exec(text);
  if (!match) return false;
  const before = text
    .slice(0, match.index)
    .replace(/[-+\u2212]/g, '')
    .trim();
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
  if (commas > 0 && points > 0)
    return run.lastIndexOf(',') > run.lastIndexOf('.') ? 'comma' : 'point';
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
