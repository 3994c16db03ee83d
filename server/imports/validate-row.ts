// Turns one row of a supplier's list into a supplier item, or into errors that name the line, the field
// and what is wrong. Nothing is guessed: a value that could be read two ways is refused with the reason.
import { type Nm } from '../../shared/lengths';
import { isCurrencyCode } from '../../shared/money';
import type { DetectedFormat } from './detect-format';
import {
  readAvailable,
  readGtin,
  readLeadDays,
  readOversize,
  readPrice,
  readSize,
} from './row-cells';
import type { MappingFieldName, MappingJson } from '../../shared/api/suppliers';

export interface PriceListRow {
  line: number;
  sku: string;
  description: string;
  sizeNm: Nm | null;
  oversizeNm: Nm | null;
  /** Exact decimal string, e.g. "1234.50". */
  price: string;
  currency: string;
  available: number | null;
  leadDays: number | null;
  /** The GTIN in its 14-digit form (zeros on the left), check digit verified; or null. */
  gtin: string | null;
}

export interface RowIssue {
  line: number;
  field?: string;
  message: string;
}

export interface RowContext {
  format: DetectedFormat;
  mapping: MappingJson;
  columns: Record<MappingFieldName, number | null>;
  defaultCurrency: string;
}

export interface RowResult {
  row: PriceListRow | null;
  /** The SKU as read, even when other fields are wrong (for duplicate detection). */
  sku: string | null;
  errors: RowIssue[];
  warnings: RowIssue[];
}

export const MAX_SKU_LENGTH = 64;
export const MAX_DESCRIPTION_LENGTH = 300;
/** NUMERIC(14,4): ten digits before the point, four after. */
export function validateRow(record: string[], line: number, ctx: RowContext): RowResult {
  const errors: RowIssue[] = [];
  const warnings: RowIssue[] = [];
  const { columns, format } = ctx;
  const cell = (field: MappingFieldName): string => {
    const index = columns[field];
    return index === null ? '' : (record[index] ?? '');
  };
  const fail = (field: string, message: string): void => {
    errors.push({ line, field, message });
  };

  const broken = record.findIndex((c) => c.includes('\ufffd'));
  if (broken >= 0) {
    fail(
      format.headers[broken] || `column ${broken + 1}`,
      format.encoding === 'windows-1252'
        ? `Column "${format.headers[broken]}" holds a byte that has no character in Windows-1252.`
        : `Column "${format.headers[broken]}" holds bytes that are not valid UTF-8; the file mixes encodings.`,
    );
  }

  const sku = cell('sku').trim();
  if (sku === '') fail('sku', 'The SKU is empty.');
  else if (sku.length > MAX_SKU_LENGTH)
    fail('sku', `The SKU is longer than ${MAX_SKU_LENGTH} characters.`);
  else if (/\p{Cc}/u.test(sku)) fail('sku', 'The SKU holds a control character or a line break.');

  const description = cell('description').replace(/\s+/g, ' ').trim();
  if (description.length > MAX_DESCRIPTION_LENGTH) {
    fail('description', `The description is longer than ${MAX_DESCRIPTION_LENGTH} characters.`);
  }

  const sizeNm = readSize(
    cell('size'),
    ctx.mapping.sizeUnit,
    format,
    (m) => fail('size', m),
    (m) => warnings.push({ line, field: 'size', message: m }),
  );
  const oversizeNm = readOversize(cell('oversize'), ctx.mapping.sizeUnit, format, (m) =>
    fail('oversize', m),
  );
  const priced = readPrice(cell('price'), format, ctx.defaultCurrency === 'USD', (m) =>
    fail('price', m),
  );

  let currency = ctx.defaultCurrency;
  const currencyCell = cell('currency').trim().toUpperCase();
  if (currencyCell !== '') {
    if (!isCurrencyCode(currencyCell)) {
      fail('currency', `"${cell('currency').trim()}" is not an ISO 4217 currency code.`);
    } else {
      currency = currencyCell;
    }
  }
  if (priced?.currency) {
    if (currencyCell !== '' && isCurrencyCode(currencyCell) && priced.currency !== currencyCell) {
      fail(
        'price',
        `The price is in ${priced.currency} but the currency column says ${currencyCell}.`,
      );
    }
    currency = priced.currency;
  }

  const available = readAvailable(
    cell('available'),
    format,
    (m) => fail('available', m),
    (m) => warnings.push({ line, field: 'available', message: m }),
  );
  const leadDays = readLeadDays(cell('leadDays'), format, (m) => fail('leadDays', m));
  const gtin = readGtin(cell('gtin'), (m) => fail('gtin', m));

  if (errors.length > 0 || priced === null) {
    return { row: null, sku: sku || null, errors, warnings };
  }
  return {
    row: {
      line,
      sku,
      description,
      sizeNm,
      oversizeNm,
      price: priced.value,
      currency,
      available,
      leadDays,
      gtin,
    },
    sku,
    errors,
    warnings,
  };
}
