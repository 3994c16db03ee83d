// PostgreSQL's error codes, in one place (the SQLSTATE table of PostgreSQL's documentation, appendix
// "PostgreSQL Error Codes"): which error a constraint, a bad value or a lost connection raises, so
// services test for a name instead of a five-character code.

/** SQLSTATE of the error, when it has one (pg sets `code`; other errors may set errno names). */
export function pgCode(e: unknown): string | undefined {
  if (typeof e !== 'object' || e === null) return undefined;
  const code = (e as { code?: unknown }).code;
  return typeof code === 'string' ? code : undefined;
}

/** The constraint a violation names, or '' when it names none. */
export function pgConstraint(e: unknown): string {
  if (typeof e !== 'object' || e === null) return '';
  const c = (e as { constraint?: unknown }).constraint;
  return typeof c === 'string' ? c : '';
}

/** 23505 unique_violation: a row with that key already exists. */
export function isUniqueViolation(e: unknown): boolean {
  return pgCode(e) === '23505';
}

/** 23514 check_violation: a CHECK constraint (or a trigger raising it) refused the row. */
export function isCheckViolation(e: unknown): boolean {
  return pgCode(e) === '23514';
}

/** 22021 character_not_in_repertoire, 22P05 untranslatable_character: text that cannot be stored. */
export function isUnstorableText(e: unknown): boolean {
  const code = pgCode(e);
  return code === '22021' || code === '22P05';
}

/**
 * 22007 invalid_datetime_format, 22008 datetime_field_overflow, 22003 numeric_value_out_of_range:
 * a value the column cannot hold.
 */
export function isOutOfRangeValue(e: unknown): boolean {
  const code = pgCode(e);
  return code === '22007' || code === '22008' || code === '22003';
}

/**
 * The database cannot be reached or went away: socket errors, class 08 (connection exception) and
 * 57P01–57P03 (the server shutting down or not yet accepting connections).
 */
const DB_DOWN_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  '57P01', // admin_shutdown
  '57P02', // crash_shutdown
  '57P03', // cannot_connect_now
  '08000',
  '08003',
  '08006',
  '08001',
  '08004',
]);

export function isConnectionLost(e: unknown): boolean {
  const code = pgCode(e);
  return code !== undefined && DB_DOWN_CODES.has(code);
}
