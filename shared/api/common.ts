// What every feature's contract is built from: ids, paged lists, lengths, money, calendar days,
// currencies and the error body. One copy each, so a list pages, a length reads and an error looks
// the same whichever route it comes from, and the client reads errors in the shape the server sends.
import * as z from '../zod';
import { parseLength, type Nm, type ParseLengthOptions } from '../lengths';
import { isCurrencyCode } from '../money';
import { atMost } from '../text-rules';

// ---- Ids ---------------------------------------------------------------------------------------

/** A record's id (a UUID), in a path, a query or a body. */
export const idField = z.string().check(z.uuid('must be a valid id'));

// ---- Paged lists -------------------------------------------------------------------------------

/** One page of a list and how many rows the whole list has. */
export interface Page<T> {
  items: T[];
  total: number;
}

export const pageNumber = z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(100000)), 1);
/** Rows per page, 50 unless asked; `max` is what one answer may carry. */
export const pageSizeField = (max = 500) =>
  z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(max)), 50);
export const sortDir = z.enum(['asc', 'desc'], { error: 'must be asc or desc' });

/** The query string of a paged list: ?q&sort&dir&page&pageSize. */
export const pageQuery = z.object({
  q: z.optional(z.string().check(z.maxLength(200))),
  sort: z.optional(z.string().check(z.maxLength(40))),
  dir: z.optional(sortDir),
  page: pageNumber,
  pageSize: pageSizeField(),
});
export type PageQuery = z.infer<typeof pageQuery>;

// ---- Lengths -----------------------------------------------------------------------------------

/** A typed length is short ("2.5555 in"); anything longer is refused before it is read. */
const MAX_LENGTH_TEXT = 40;
const LENGTH_HINT = 'must be text with its unit, for example "64.91 mm" or "2.5555 in"';

/** A length typed with its unit ("2.5555 in"), read into exact nanometres or refused with a reason. */
export function lengthField(opts: ParseLengthOptions = {}) {
  return z.pipe(
    z.string({ error: LENGTH_HINT }).check(z.maxLength(MAX_LENGTH_TEXT, atMost(MAX_LENGTH_TEXT))),
    z.transform((text, ctx): Nm => {
      const parsed = parseLength(text, opts);
      if (!parsed.ok) {
        return z.refuse(ctx, parsed.message);
      }
      return parsed.nm;
    }),
  );
}

/** A length that may be left out or cleared (null or ""): null means "not recorded". */
export function optionalLengthField(opts: ParseLengthOptions = {}) {
  return z.pipe(
    z.nullable(
      z.string({ error: LENGTH_HINT }).check(z.maxLength(MAX_LENGTH_TEXT, atMost(MAX_LENGTH_TEXT))),
    ),
    z.transform((text, ctx): Nm | null => {
      if (text === null || text.trim() === '') return null;
      const parsed = parseLength(text, opts);
      if (!parsed.ok) {
        return z.refuse(ctx, parsed.message);
      }
      return parsed.nm;
    }),
  );
}

// ---- Counts of pieces ----------------------------------------------------------------------------

/** How many pieces (ordered, received): a whole number from 1 to `max`; `tooMany` says why not more. */
export function pieceCount(max: number, tooMany?: string) {
  return z
    .number({ error: 'must be a whole number' })
    .check(z.int('must be a whole number'), z.gte(1, 'must be at least 1'), z.lte(max, tooMany));
}

// ---- Parts in reports ---------------------------------------------------------------------------

/** The part a report line is about: its SKU and words, its kind, and its family and step if any. */
export interface PartLineJson {
  partId: string;
  sku: string;
  description: string;
  kind: string;
  familyId: string | null;
  familyCode: string | null;
  stepId: string | null;
  stepLabel: string | null;
}

// ---- Money and currencies ----------------------------------------------------------------------

/** Money as exact decimal text, 0 or more, at most 4 decimals ("12.50"). */
export const moneyText = z
  .string({ error: 'must be an amount written as text, e.g. "12.50"' })
  .check(
    z.trim(),
    z.maxLength(20, atMost(20)),
    z.regex(
      /^\d{1,10}(\.\d{1,4})?$/,
      'must be an amount, 0 or more, like "12.50" (at most 4 decimals)',
    ),
  );

/** An ISO 4217 code, any case in, upper case out. */
export const currencyCode = z
  .pipe(
    z
      .string({ error: 'must be a three-letter ISO 4217 code, e.g. "EUR"' })
      .check(
        z.trim(),
        z.maxLength(3, atMost(3, 'must be a three-letter ISO 4217 code, e.g. "EUR"')),
      ),
    z.transform((v) => v.toUpperCase()),
  )
  .check(
    z.refine((v) => isCurrencyCode(v), {
      message: 'is not an ISO 4217 currency code (e.g. EUR, USD, GBP)',
    }),
  );

// ---- Calendar days -----------------------------------------------------------------------------

const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** True for a real calendar day written YYYY-MM-DD (no 2026-02-30). */
export function isCalendarDay(text: string): boolean {
  const m = ISO_DAY.exec(text);
  if (!m) return false;
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const date = new Date(Date.UTC(year, month - 1, day));
  return (
    year >= 1900 &&
    year <= 9999 &&
    date.getUTCFullYear() === year &&
    date.getUTCMonth() === month - 1 &&
    date.getUTCDate() === day
  );
}

/** Whole days from one calendar day to another (both YYYY-MM-DD); negative when `to` is earlier. */
export function daysBetween(from: string, to: string): number {
  const ms = Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`);
  return Math.round(ms / 86_400_000);
}

/**
 * A calendar day written YYYY-MM-DD. Date.parse would roll 2027-02-30 over to 2 March; the
 * calendar check refuses it.
 */
export const calendarDay = z
  .string({ error: 'must be a date written YYYY-MM-DD' })
  .check(
    z.trim(),
    z.maxLength(10, atMost(10, 'must be a date written YYYY-MM-DD')),
    z.refine(isCalendarDay, 'must be a real date written YYYY-MM-DD, e.g. "2026-03-31"'),
  );

// ---- The error body ----------------------------------------------------------------------------

/** One problem found in a request: a form field or a line of an uploaded file. */
export interface ErrorDetail {
  field?: string;
  line?: number;
  message: string;
}

/** What every /api route answers when it refuses or fails (a stable code, words, the details). */
export interface ErrorBody {
  error: { code: string; message: string; details?: ErrorDetail[] };
}
