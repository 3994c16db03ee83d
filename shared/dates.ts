// One way of writing dates for the whole shop, from its locale setting: the day, month and year in
// the order and with the separator the locale uses (31/12/2026, 12/31/2026, 31.12.2026, 2026-12-31),
// the time in the locale's clock, and every time in the shop's time zone. The date inputs read and
// write the same pattern, so what is typed looks like what is shown.
import { DateTime } from 'luxon';

/** The locales the settings offer; any other valid BCP 47 tag the runtime knows is taken too. */
export const SHOP_LOCALES: readonly { tag: string; name: string }[] = [
  { tag: 'en-GB', name: 'English, day first' },
  { tag: 'en-US', name: 'English, month first' },
  { tag: 'en-CA', name: 'English, year first' },
  { tag: 'de-DE', name: 'German' },
  { tag: 'fr-FR', name: 'French' },
  { tag: 'it-IT', name: 'Italian' },
  { tag: 'es-ES', name: 'Spanish' },
  { tag: 'nl-NL', name: 'Dutch' },
  { tag: 'sv-SE', name: 'Swedish' },
  { tag: 'pl-PL', name: 'Polish' },
];

export const DEFAULT_LOCALE = 'en-GB';

/** A tag such as "en-GB" that the runtime can format dates for. */
export function isShopLocale(tag: unknown): tag is string {
  if (typeof tag !== 'string' || !/^[A-Za-z]{2,3}(-[A-Za-z0-9]{2,8})*$/.test(tag)) return false;
  try {
    return Intl.DateTimeFormat.supportedLocalesOf([tag]).length > 0;
  } catch {
    return false;
  }
}

/** The pieces of the locale's numeric date, in order (day, month, year and what sits between). */
function dateParts(locale: string): { type: string; value: string }[] {
  // 31 December 2026 shows every field with two or four digits, so no field is ambiguous.
  const sample = new Date(Date.UTC(2026, 11, 31, 12));
  return new Intl.DateTimeFormat(locale, {
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    timeZone: 'UTC',
  }).formatToParts(sample);
}

const TOKENS: Record<string, string> = { day: 'dd', month: 'MM', year: 'yyyy' };

function literal(text: string): string {
  // Letters in a literal would read as luxon tokens: quote them.
  return /[A-Za-z]/.test(text) ? `'${text.replace(/'/g, "''")}'` : text;
}

/** The locale's numeric date as a luxon pattern: "dd/MM/yyyy" for en-GB, "MM/dd/yyyy" for en-US. */
export function datePattern(locale: string): string {
  return dateParts(locale)
    .map((p) => TOKENS[p.type] ?? literal(p.value))
    .join('');
}

/** The same without the year (for a date this year where space is short): "dd/MM", "MM/dd". */
export function dayMonthPattern(locale: string): string {
  const fields = dateParts(locale);
  const yearAt = fields.findIndex((p) => p.type === 'year');
  // Drop the year and the separator that joins it to its neighbour.
  const joint = yearAt === 0 ? 1 : yearAt - 1;
  const kept = fields.filter((_, i) => i !== yearAt && i !== joint);
  return kept
    .map((p) => TOKENS[p.type] ?? literal(p.value))
    .join('')
    .replace(/[\s.,/-]+$/, '');
}

/** The locale's clock: "HH:mm" where the day has 24 hours, "h:mm a" where it has two halves. */
export function timePattern(locale: string): string {
  const cycle = new Intl.DateTimeFormat(locale, { hour: 'numeric' }).resolvedOptions().hourCycle;
  return cycle === 'h12' || cycle === 'h11' ? 'h:mm a' : 'HH:mm';
}

/**
 * - date: the numeric date ("31/12/2026")
 * - datetime: with the time ("31/12/2026 14:05")
 * - day: with the weekday ("Thu 31/12/2026")
 * - shortday: with the weekday, and the year only when it is not this year ("Thu 31/12")
 */
export type DateStyle = 'date' | 'datetime' | 'day' | 'shortday';

export interface DateContext {
  locale: string;
  timeZone: string;
  /** For "this year"; the current time unless a test fixes it. */
  now?: Date;
}

/** A calendar day ("2099-01-01") stays that day; a timestamp is shown in the shop's zone. */
export function toShopDateTime(value: string | Date, ctx: DateContext): DateTime | null {
  const zone = ctx.timeZone || 'UTC';
  let dt: DateTime;
  if (value instanceof Date) dt = DateTime.fromJSDate(value).setZone(zone);
  else if (/^\d{4}-\d{2}-\d{2}$/.test(value)) dt = DateTime.fromISO(value, { zone });
  else dt = DateTime.fromISO(value, { setZone: false }).setZone(zone);
  // Pages are in English: weekday names and am/pm follow the locale only for English locales.
  return dt.isValid ? dt.setLocale(/^en(-|$)/i.test(ctx.locale) ? ctx.locale : 'en-GB') : null;
}

/** A date or time as this shop writes it; '' for no value, the text itself when it is no date. */
export function formatShopDate(
  value: string | Date | null | undefined,
  style: DateStyle,
  ctx: DateContext,
): string {
  if (value === null || value === undefined || value === '') return '';
  const dt = toShopDateTime(value, ctx);
  if (!dt) return String(value);
  const date = datePattern(ctx.locale);
  switch (style) {
    case 'date':
      return dt.toFormat(date);
    case 'datetime':
      return dt.toFormat(`${date} ${timePattern(ctx.locale)}`);
    case 'day':
      return dt.toFormat(`ccc ${date}`);
    case 'shortday': {
      const now = DateTime.fromJSDate(ctx.now ?? new Date()).setZone(ctx.timeZone || 'UTC');
      const pattern = dt.year === now.year ? dayMonthPattern(ctx.locale) : date;
      return dt.toFormat(`ccc ${pattern}`);
    }
  }
}

/**
 * What a date field accepts: the shop's pattern, with or without leading zeros, and the ISO 8601
 * day (2026-12-31), which no locale reads another way.
 */
export function parsePatterns(locale: string): string[] {
  const full = datePattern(locale);
  return [...new Set([full, full.replace('dd', 'd').replace('MM', 'M'), 'yyyy-MM-dd'])];
}

/** The pattern as a person reads it in a hint: "DD/MM/YYYY", "MM/DD/YYYY". */
export function patternHint(locale: string): string {
  return datePattern(locale).replace('dd', 'DD').replace('yyyy', 'YYYY').replace(/'/g, '');
}

/** A calendar day typed in the shop's pattern, as the API takes it ("2099-01-01"), or null. */
export function parseShopDay(text: string, locale: string): string | null {
  for (const pattern of parsePatterns(locale)) {
    const dt = DateTime.fromFormat(text.trim(), pattern, { zone: 'UTC' });
    if (dt.isValid) return dt.toISODate();
  }
  return null;
}

/**
 * A caution for a job's due date that is usually a slip (2099 for 2026, last month for next):
 * already past, or more than a year ahead. Null for a usual date; the date is still accepted.
 */
export function dueDateWarning(
  day: string,
  timeZone: string,
  now: Date = new Date(),
): string | null {
  const due = DateTime.fromISO(day, { zone: timeZone || 'UTC' });
  if (!due.isValid) return null;
  const today = DateTime.fromJSDate(now)
    .setZone(timeZone || 'UTC')
    .startOf('day');
  if (due < today) return 'That day has already passed: check the date.';
  if (due > today.plus({ years: 1 })) return 'That is more than a year ahead: check the year.';
  return null;
}
