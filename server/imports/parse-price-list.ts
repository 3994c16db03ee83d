// Streams a supplier's price list from disk into validated rows and row errors: file stream → iconv-lite
// decoder (Windows-1252 only) → csv-parse (strict RFC 4180 quoting, one column count for every row) → row
// checks. Rows come out as they are read, so a caller writing them in batches never holds the whole file in
// memory.
import { createReadStream } from 'node:fs';
import { pipeline } from 'node:stream';
import iconv from 'iconv-lite';
import { Parser, type CsvError, type Options } from 'csv-parse';
import { BadRequest } from '../errors';
import type { DetectedFormat } from './detect-format';
import { resolveMapping } from './propose-mapping';
import { RowChecker, type PriceListRow, type RowIssue } from './validate-row';
import type { MappingJson } from '../../shared/api/suppliers';

export type { PriceListRow, RowIssue } from './validate-row';

export type PriceListItem =
  | { kind: 'row'; row: PriceListRow }
  /** `sku` is the row's SKU when it could be read: such a SKU is not missing from the list. */
  | { kind: 'error'; issue: RowIssue; sku?: string }
  | { kind: 'warning'; issue: RowIssue }
  /** A row given earlier must not be used after all: its SKU turned up again further down. */
  | { kind: 'retract'; line: number; sku: string };

export interface ReadOptions {
  format: DetectedFormat;
  mapping: MappingJson;
  /** Currency of prices that name none (the supplier's currency). */
  defaultCurrency: string;
  /** Longest row accepted, in bytes. */
  maxRecordBytes?: number;
}

export interface ParseCounts {
  /** Data rows read (blank lines not counted). */
  rows: number;
  /** Rows that are valid and will be used. */
  ok: number;
  /** Rows with at least one error; they are not used. */
  errors: number;
  warnings: number;
}

/** No real price-list row comes near this; a longer one is a file without line breaks or an open quote. */
export const MAX_RECORD_BYTES = 64 * 1024;

const FATAL_CODES = new Set(['CSV_MAX_RECORD_SIZE', 'CSV_QUOTE_NOT_CLOSED']);

interface ParsedRecord {
  fields: string[];
  /** 1-based line on which the record starts. */
  line: number;
}

/**
 * csv-parse, numbering each record by its line. The parser hands a record over (push) the moment it
 * has read it, when its own line count (`info.lines`) is the one an on_record callback would be
 * given; reading the count here spares the copy of the parser's whole info that it makes for every
 * record when on_record is set.
 */
class NumberedParser extends Parser {
  constructor(
    options: Options,
    private readonly numbered: (record: string[], lines: number) => ParsedRecord,
  ) {
    super(options);
  }

  override push(chunk: unknown, encoding?: BufferEncoding): boolean {
    if (chunk === null) return super.push(chunk, encoding);
    return super.push(this.numbered(chunk as string[], this.info.lines), encoding);
  }
}

/**
 * Reads the list row by row. Throws BadRequest when the file as a whole cannot be read (a quote never
 * closed, a row too long, a missing required column); everything wrong with single rows comes out as
 * 'error' items with the line number.
 */
export async function* readPriceList(
  path: string,
  options: ReadOptions,
  counts: ParseCounts = { rows: 0, ok: 0, errors: 0, warnings: 0 },
): AsyncGenerator<PriceListItem> {
  for await (const chunk of readPriceListChunks(path, options, counts)) yield* chunk;
}

/**
 * The items of the list in file order, in chunks of about `chunkSize` rows: the records the parser has
 * ready are handled in one synchronous pass, so a large list does not pay a promise per row.
 */
export async function* readPriceListChunks(
  path: string,
  options: ReadOptions,
  counts: ParseCounts = { rows: 0, ok: 0, errors: 0, warnings: 0 },
  chunkSize = 2000,
): AsyncGenerator<PriceListItem[]> {
  const { format, mapping } = options;
  const columns = resolveMapping(mapping, format.headers);
  const width = format.headers.length;
  const maxRecordBytes = options.maxRecordBytes ?? MAX_RECORD_BYTES;
  const pending: PriceListItem[] = [];
  let lastCompleteLine = format.headerLine - 1;

  // csv-parse counts a CRLF inside a quoted field as two lines, so its line numbers drift by one after
  // each; `drift` undoes that. Both callbacks run in file order, inside the parser.
  let drift = 0;
  const linesOf = (reportedEnd: number, record: string[]): { start: number; end: number } => {
    const { breaks, crlf } = lineBreaksIn(record);
    drift += crlf;
    const end = reportedEnd - drift;
    return { start: end - breaks, end };
  };

  const parserOptions: Options = {
    delimiter: format.delimiter,
    // A UTF-8 byte-order mark before the header is not part of the first column's name.
    bom: format.encoding !== 'windows-1252',
    record_delimiter: ['\r\n', '\n', '\r'],
    from_line: format.headerLine,
    relax_column_count: false,
    // A quote that does not open a field is kept as text: lists write inch marks as 2.5000" unquoted.
    relax_quotes: true,
    skip_empty_lines: true,
    skip_records_with_error: true,
    max_record_size: maxRecordBytes,
    on_skip: (err: CsvError | undefined) => {
      if (!err) return undefined;
      if (FATAL_CODES.has(err.code)) throw fatalError(err, lastCompleteLine, maxRecordBytes);
      const record = Array.isArray(err.record) ? (err.record as string[]) : [];
      const { start, end } = linesOf(
        typeof err.lines === 'number' ? err.lines : lastCompleteLine + 1,
        record,
      );
      lastCompleteLine = end;
      const sku = columns.sku === null ? '' : (record[columns.sku] ?? '').trim();
      pending.push({
        kind: 'error',
        ...(sku ? { sku } : {}),
        issue: {
          line: start,
          message:
            err.code === 'CSV_RECORD_INCONSISTENT_FIELDS_LENGTH'
              ? `This row has ${record.length} column${record.length === 1 ? '' : 's'}; the header has ${width}.`
              : `This row cannot be read: ${err.message}`,
        },
      });
      return undefined;
    },
  };
  const parser = new NumberedParser(parserOptions, (record, lines) => {
    const { start, end } = linesOf(lines, record);
    lastCompleteLine = end;
    return { fields: record, line: start };
  });

  // pipeline() destroys every stream when one fails, so a read error surfaces in the loop below.
  if (format.encoding === 'windows-1252') {
    pipeline(createReadStream(path), iconv.decodeStream('win1252'), parser, () => undefined);
  } else {
    // csv-parse splits bytes and decodes each field as UTF-8 itself (a byte that is not UTF-8 becomes
    // U+FFFD, as a decoder in front would make it), so UTF-8 is not decoded twice.
    pipeline(createReadStream(path), parser, () => undefined);
  }

  const checker = new RowChecker({
    format,
    mapping,
    columns,
    defaultCurrency: options.defaultCurrency,
  });
  // SKU → its first line, negative when that row had errors: a plain number per SKU rather than
  // an object keeps a list of hundreds of thousands of SKUs small in memory.
  const seen = new Map<string, number>();
  const flaggedTwice = new Set<string>();
  let headerSeen = false;

  const drain = (out: PriceListItem[]): void => {
    while (pending.length > 0) {
      const item = pending.shift() as PriceListItem;
      if (item.kind === 'error') {
        counts.rows++;
        counts.errors++;
      }
      out.push(item);
    }
  };

  const handle = (record: string[], line: number, out: PriceListItem[]): void => {
    if (!headerSeen) {
      headerSeen = true; // the header line itself
      return;
    }
    if (isBlank(record)) return; // a spreadsheet's padded blank row

    counts.rows++;
    const result = checker.check(record, line);
    for (const warning of result.warnings) {
      counts.warnings++;
      out.push({ kind: 'warning', issue: warning });
    }
    const sku = result.sku;
    const first = sku ? seen.get(sku) : undefined;
    const earlier = first === undefined ? undefined : { line: Math.abs(first), ok: first > 0 };
    if (sku && earlier) {
      counts.errors++;
      out.push({
        kind: 'error',
        sku,
        issue: {
          line,
          field: 'sku',
          message: `SKU "${sku}" is also on line ${earlier.line}; neither row is imported.`,
        },
      });
      if (earlier.ok && !flaggedTwice.has(sku)) {
        counts.ok--;
        counts.errors++;
        out.push({ kind: 'retract', line: earlier.line, sku });
        out.push({
          kind: 'error',
          sku,
          issue: {
            line: earlier.line,
            field: 'sku',
            message: `SKU "${sku}" appears again on line ${line}; neither row is imported.`,
          },
        });
      }
      flaggedTwice.add(sku);
      return;
    }
    if (sku) seen.set(sku, result.row !== null ? line : -line);
    if (result.row) {
      counts.ok++;
      out.push({ kind: 'row', row: result.row });
    } else {
      counts.errors++;
      for (const error of result.errors) {
        out.push({ kind: 'error', issue: error, ...(sku ? { sku } : {}) });
      }
    }
  };

  let ended = false;
  let failure: Error | null = null;
  parser.on('end', () => (ended = true));
  parser.on('error', (e: Error) => (failure ??= e));
  const nextEvent = (): Promise<void> =>
    new Promise<void>((resolve) => {
      const done = (): void => {
        parser.off('readable', done);
        parser.off('end', done);
        parser.off('error', done);
        resolve();
      };
      parser.on('readable', done);
      parser.on('end', done);
      parser.on('error', done);
    });

  try {
    for (;;) {
      const out: PriceListItem[] = [];
      let rows = 0;
      let record: ParsedRecord | null;
      while (rows < chunkSize && (record = parser.read() as ParsedRecord | null) !== null) {
        drain(out);
        handle(record.fields, record.line, out);
        rows++;
      }
      if (failure) throw failure;
      if (ended) drain(out);
      if (out.length > 0) yield out;
      if (ended) break;
      if (rows < chunkSize) await nextEvent();
      if (failure) throw failure;
    }
  } finally {
    parser.destroy();
  }
  if (counts.rows === 0) {
    throw new BadRequest(
      `The file has a header on line ${format.headerLine} but no rows below it.`,
      [{ line: format.headerLine, message: 'Header only.' }],
      'no_rows',
    );
  }
}

export interface PriceListBatch {
  rows: PriceListRow[];
  errors: RowIssue[];
  warnings: RowIssue[];
  retracted: { line: number; sku: string }[];
  /** SKUs of rows with errors (repeated when a row has several errors). */
  skippedSkus: string[];
}

/** The same stream in batches, for callers that write rows to the database a batch at a time. */
export async function* readPriceListBatches(
  path: string,
  options: ReadOptions,
  counts: ParseCounts,
  batchSize = 2000,
): AsyncGenerator<PriceListBatch> {
  for await (const chunk of readPriceListChunks(path, options, counts, batchSize)) {
    const batch = emptyBatch();
    for (const item of chunk) {
      if (item.kind === 'row') batch.rows.push(item.row);
      else if (item.kind === 'error') {
        batch.errors.push(item.issue);
        if (item.sku) batch.skippedSkus.push(item.sku);
      } else if (item.kind === 'warning') batch.warnings.push(item.issue);
      else batch.retracted.push({ line: item.line, sku: item.sku });
    }
    yield batch;
  }
}

function emptyBatch(): PriceListBatch {
  return { rows: [], errors: [], warnings: [], retracted: [], skippedSkus: [] };
}

function isBlank(record: string[]): boolean {
  for (const cell of record) if (cell.trim() !== '') return false;
  return true;
}

const NO_BREAKS = { breaks: 0, crlf: 0 };

/** Line breaks inside a record's quoted fields (CRLF counted once, and apart as `crlf`). */
function lineBreaksIn(record: string[]): { breaks: number; crlf: number } {
  let breaks = 0;
  let crlf = 0;
  for (const cell of record) {
    // Almost no cell holds a line break: the native search skips those without a loop per character.
    if (cell.indexOf('\n') < 0 && cell.indexOf('\r') < 0) continue;
    for (let i = 0; i < cell.length; i++) {
      const ch = cell.charCodeAt(i);
      if (ch === 10) breaks++;
      else if (ch === 13) {
        if (cell.charCodeAt(i + 1) === 10) crlf++;
        else breaks++;
      }
    }
  }
  return breaks === 0 && crlf === 0 ? NO_BREAKS : { breaks, crlf };
}

/** A fault that leaves the rest of the file unreadable: the whole list is refused. */
function fatalError(err: CsvError, lastComplete: number, maxBytes: number): BadRequest {
  const start = lastComplete + 1;
  if (err.code === 'CSV_MAX_RECORD_SIZE') {
    return new BadRequest(
      `The row starting on line ${start} is longer than ${maxBytes / 1024} kB: either the file has no ` +
        'line breaks there or a quote is opened and never closed.',
      [{ line: start, message: `Row longer than ${maxBytes / 1024} kB.` }],
      'unreadable',
    );
  }
  return new BadRequest(
    `A quote opened in the row starting on line ${start} is never closed, so the rest of the file ` +
      'cannot be split into rows. Every quoted field needs its closing quote (RFC 4180).',
    [{ line: start, message: 'Quote never closed.' }],
    'unreadable',
  );
}
