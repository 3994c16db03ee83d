// Turns one row of a supplier's list into a supplier item, or into errors that name the line, the field
// and what is wrong. Nothing is guessed: a value that could be read two ways is refused with the reason.
import { type Nm } from '../../shared/lengths';
import type { DetectedFormat } from './detect-format';
import {
  readAvailable,
  readCurrency,
  readGtin,
  readLeadDays,
  readOversize,
  readPrice,
  readSize,
  type CellReading,
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

// A list repeats the same few sizes, prices and quantities thousands of times, and a cell's reading
// depends only on its text and the list's settings: the readings of the texts seen most recently are
// kept, per list (cleared when full, to bound the memory).
const MEMO_LIMIT = 5000;

class CellMemo<T> {
  private readonly seen = new Map<string, CellReading<T>>();
  constructor(private readonly read: (raw: string) => CellReading<T>) {}

  get(raw: string): CellReading<T> {
    let reading = this.seen.get(raw);
    if (reading === undefined) {
      if (this.seen.size >= MEMO_LIMIT) this.seen.clear();
      reading = this.read(raw);
      this.seen.set(raw, reading);
    }
    return reading;
  }
}

/** Checks the rows of one list: its settings, and the readings of the cell texts met so far. */
export class RowChecker {
  readonly size: CellMemo<Nm>;
  readonly oversize: CellMemo<Nm>;
  readonly price: CellMemo<{ value: string; currency: string | null }>;
  readonly currency = new CellMemo(readCurrency);
  readonly available: CellMemo<number>;
  readonly leadDays = new CellMemo(readLeadDays);

  constructor(readonly ctx: RowContext) {
    const { format } = ctx;
    const unit = ctx.mapping.sizeUnit;
    const dollarIsDefault = ctx.defaultCurrency === 'USD';
    this.size = new CellMemo((raw) => readSize(raw, unit, format));
    this.oversize = new CellMemo((raw) => readOversize(raw, unit, format));
    this.price = new CellMemo((raw) => readPrice(raw, format, dollarIsDefault));
    this.available = new CellMemo((raw) => readAvailable(raw, format));
  }

  /** One row: the supplier item it gives, or its errors naming line and field. */
  check(record: string[], line: number): RowResult {
    return checkRow(record, line, this.ctx, this);
  }
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

function cellOf(record: string[], index: number | null): string {
  return index === null ? '' : (record[index] ?? '');
}

/** Adds an issue of the row, when the cell gave one. */
function note(list: RowIssue[], line: number, field: string, message: string | null): void {
  if (message !== null) list.push({ line, field, message });
}

function brokenColumn(record: string[]): number {
  for (let i = 0; i < record.length; i++) if (record[i].includes('\ufffd')) return i;
  return -1;
}

function checkRow(
  record: string[],
  line: number,
  { columns, format, defaultCurrency }: RowContext,
  checker: RowChecker,
): RowResult {
  const errors: RowIssue[] = [];
  const warnings: RowIssue[] = [];

  const broken = brokenColumn(record);
  if (broken >= 0) {
    note(
      errors,
      line,
      format.headers[broken] || `column ${broken + 1}`,
      format.encoding === 'windows-1252'
        ? `Column "${format.headers[broken]}" holds a byte that has no character in Windows-1252.`
        : `Column "${format.headers[broken]}" holds bytes that are not valid UTF-8; the file mixes encodings.`,
    );
  }

  const sku = cellOf(record, columns.sku).trim();
  if (sku === '') note(errors, line, 'sku', 'The SKU is empty.');
  else if (sku.length > MAX_SKU_LENGTH)
    note(errors, line, 'sku', `The SKU is longer than ${MAX_SKU_LENGTH} characters.`);
  else if (/\p{Cc}/u.test(sku))
    note(errors, line, 'sku', 'The SKU holds a control character or a line break.');

  const description = cellOf(record, columns.description).replace(/\s+/g, ' ').trim();
  if (description.length > MAX_DESCRIPTION_LENGTH) {
    note(
      errors,
      line,
      'description',
      `The description is longer than ${MAX_DESCRIPTION_LENGTH} characters.`,
    );
  }

  const size = checker.size.get(cellOf(record, columns.size));
  note(errors, line, 'size', size.error);
  note(warnings, line, 'size', size.warning);
  const oversize = checker.oversize.get(cellOf(record, columns.oversize));
  note(errors, line, 'oversize', oversize.error);
  const priced = checker.price.get(cellOf(record, columns.price));
  note(errors, line, 'price', priced.error);

  const currencyCell = checker.currency.get(cellOf(record, columns.currency));
  note(errors, line, 'currency', currencyCell.error);
  let currency = currencyCell.value ?? defaultCurrency;
  const priceCurrency = priced.value?.currency;
  if (priceCurrency) {
    if (currencyCell.value !== null && priceCurrency !== currencyCell.value) {
      note(
        errors,
        line,
        'price',
        `The price is in ${priceCurrency} but the currency column says ${currencyCell.value}.`,
      );
    }
    currency = priceCurrency;
  }

  const available = checker.available.get(cellOf(record, columns.available));
  note(errors, line, 'available', available.error);
  note(warnings, line, 'available', available.warning);
  const leadDays = checker.leadDays.get(cellOf(record, columns.leadDays));
  note(errors, line, 'leadDays', leadDays.error);
  const gtin = readGtin(cellOf(record, columns.gtin));
  note(errors, line, 'gtin', gtin.error);

  if (errors.length > 0 || priced.value === null) {
    return { row: null, sku: sku || null, errors, warnings };
  }
  return {
    row: {
      line,
      sku,
      description,
      sizeNm: size.value,
      oversizeNm: oversize.value,
      price: priced.value.value,
      currency,
      available: available.value,
      leadDays: leadDays.value,
      gtin: gtin.value,
    },
    sku,
    errors,
    warnings,
  };
}
