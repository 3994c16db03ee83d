// How insight figures read on screen. Amounts arrive as exact decimal text; Intl formats text
// without turning it into a binary float first (Intl.NumberFormat v3), so "0.125" rounds as the
// decimal it is.

const moneyFormats = new Map<string, Intl.NumberFormat>();

function moneyFormat(currency: string, compact: boolean): Intl.NumberFormat {
  const key = `${currency}:${compact}`;
  let format = moneyFormats.get(key);
  if (!format) {
    format = new Intl.NumberFormat('en', {
      style: 'currency',
      currency,
      ...(compact ? { notation: 'compact', maximumFractionDigits: 1 } : {}),
    });
    moneyFormats.set(key, format);
  }
  return format;
}

/** "12345.5" → "€12,345.50"; an unknown currency code shows the plain number and the code. */
export function formatAmount(text: string, currency: string): string {
  if (!/^-?\d+(\.\d+)?$/.test(text)) return text;
  try {
    // Text in, not a number: the runtime formats the exact decimal (typed as number for ES2022 lib).
    return moneyFormat(currency, false).format(text as unknown as number);
  } catch {
    return `${text} ${currency}`;
  }
}

/** Short amounts for chart axes: "€12K". */
export function formatAmountShort(value: number, currency: string): string {
  try {
    return moneyFormat(currency, true).format(value);
  } catch {
    return `${value} ${currency}`;
  }
}

/** A fraction as text ("0.8125") → "81.3 %". */
export function formatShare(text: string | null): string {
  if (text === null) return '—';
  const value = Number(text);
  if (!Number.isFinite(value)) return text;
  return `${(value * 100).toFixed(1)} %`;
}

const countFormat = new Intl.NumberFormat('en');

export function formatCount(value: number): string {
  return countFormat.format(value);
}

/** Ordinal name of a step position: 0 → "STD", 1 → "1st oversize", 2 → "2nd oversize" … */
export function stepPositionName(position: number | null): string {
  if (position === null) return 'Not sized (small parts)';
  if (position === 0) return 'STD';
  const suffix =
    position % 100 >= 11 && position % 100 <= 13
      ? 'th'
      : (({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[position % 10] ?? 'th');
  return `${position}${suffix} oversize`;
}
