// Works out how a supplier's price list is written before a single row is read: its text encoding, the
// delimiter, the decimal mark and which line holds the column names. Only a bounded head of the file is
// read, so a 50 MB list costs the same to inspect as a 5 kB one.
import { open } from 'node:fs/promises';
import iconv from 'iconv-lite';
import FileType from 'file-type';
import { BadRequest, UnsupportedMediaType } from '../errors';
import { splitRecords, type HeadRecord } from './head-records';
import { looksLikeNumber, numberEvidence, type DecimalMark } from './number-text';

export type TextEncoding = 'utf-8' | 'utf-8-bom' | 'windows-1252';
export type Delimiter = ',' | ';' | '\t';

export interface DetectedFormat {
  encoding: TextEncoding;
  delimiter: Delimiter;
  decimal: DecimalMark;
  /** 1-based line number of the line naming the columns. */
  headerLine: number;
  /** The column names as written on the header line (trimmed). */
  headers: string[];
}

/** What the detector looked at: the column names plus up to a few data rows, for the mapping proposal. */
export interface FormatSample {
  format: DetectedFormat;
  rows: string[][];
}

export const HEAD_BYTES = 64 * 1024;
const DELIMITERS: readonly Delimiter[] = [',', ';', '\t'];
const SAMPLE_ROWS = 50;

export const DELIMITER_NAMES: Record<Delimiter, string> = {
  ',': 'comma',
  ';': 'semicolon',
  '\t': 'tab',
};

/** Reads at most `maxBytes` from the start of a file; `complete` says whether that was the whole file. */
export async function readHead(
  path: string,
  maxBytes = HEAD_BYTES,
): Promise<{ bytes: Buffer; complete: boolean }> {
  const handle = await open(path, 'r');
  try {
    const buffer = Buffer.alloc(maxBytes + 1);
    let filled = 0;
    while (filled < buffer.length) {
      const { bytesRead } = await handle.read(buffer, filled, buffer.length - filled, filled);
      if (bytesRead === 0) break;
      filled += bytesRead;
    }
    const complete = filled <= maxBytes;
    return { bytes: buffer.subarray(0, Math.min(filled, maxBytes)), complete };
  } finally {
    await handle.close();
  }
}

export async function detectFileFormat(path: string): Promise<FormatSample> {
  const { bytes, complete } = await readHead(path);
  return detectFormat(bytes, complete);
}

/**
 * Detects the format from the head of a file. Throws UnsupportedMediaType (415) for anything that is not
 * delimited text and BadRequest (400) for text that cannot be read as a price list.
 */
export async function detectFormat(head: Buffer, complete: boolean): Promise<FormatSample> {
  if (head.length === 0) throw new BadRequest('The file is empty.', [], 'empty_file');
  refuseWideText(head);
  refuseTextDocuments(head);
  await refuseBinary(head);

  const encoding = detectEncoding(head, complete);
  let text = iconv.decode(head, encoding === 'windows-1252' ? 'win1252' : 'utf8');
  if (text.trim() === '') {
    throw new BadRequest('The file holds only blank lines.', [], 'empty_file');
  }
  if (!complete) {
    // The head ends somewhere inside a line: drop that partial line so it cannot skew the counts.
    const lastBreak = Math.max(text.lastIndexOf('\n'), text.lastIndexOf('\r'));
    if (lastBreak < 0) {
      throw new BadRequest(
        `Line 1 runs past ${HEAD_BYTES / 1024} kB without a line break: this is not a list of rows.`,
        [{ line: 1, message: 'No line break in the first 64 kB.' }],
        'unreadable',
      );
    }
    text = text.slice(0, lastBreak + 1);
  }

  const { delimiter, records, width } = chooseDelimiter(text);
  const headerIndex = records.findIndex((r) => r.fields.length === width && looksLikeLabels(r));
  if (headerIndex < 0) {
    throw new BadRequest(
      `No header line found: the first line with ${width} ${DELIMITER_NAMES[delimiter]}-separated ` +
        'columns should name them (for example SKU, Description, Price).',
      [],
      'no_header',
    );
  }
  const header = records[headerIndex];
  const body = records.slice(headerIndex + 1).filter((r) => !isBlank(r));
  if (body.length === 0) {
    throw new BadRequest(
      `The file has a header on line ${header.line} but no rows below it.`,
      [{ line: header.line, message: 'Header only.' }],
      'no_rows',
    );
  }
  const headers = header.fields.map((h) => h.trim());
  const duplicate = headers.find((h, i) => h !== '' && headers.indexOf(h) !== i);
  if (duplicate !== undefined) {
    throw new BadRequest(
      `Column "${duplicate}" appears twice on the header line (line ${header.line}); rename one.`,
      [{ line: header.line, message: `Duplicate column "${duplicate}".` }],
      'duplicate_column',
    );
  }

  const rows = body.filter((r) => r.fields.length === width).map((r) => r.fields);
  return {
    format: {
      encoding,
      delimiter,
      decimal: detectDecimal(rows, delimiter),
      headerLine: header.line,
      headers,
    },
    rows: rows.slice(0, SAMPLE_ROWS),
  };
}

function refuseWideText(head: Buffer): void {
  const b = head;
  if (
    (b.length >= 4 && b[0] === 0xff && b[1] === 0xfe && b[2] === 0 && b[3] === 0) ||
    (b.length >= 4 && b[0] === 0 && b[1] === 0 && b[2] === 0xfe && b[3] === 0xff)
  ) {
    throw new UnsupportedMediaType(
      'The file is saved as UTF-32 text. Save it as CSV in UTF-8 (or Windows-1252) and upload again.',
    );
  }
  const bom16 =
    b.length >= 2 && ((b[0] === 0xff && b[1] === 0xfe) || (b[0] === 0xfe && b[1] === 0xff));
  // UTF-16 text of Latin letters has a NUL in every other byte; look at one side only.
  let evenNuls = 0;
  let oddNuls = 0;
  const n = Math.min(b.length, 4096);
  for (let i = 0; i < n; i++) {
    if (b[i] === 0) {
      if (i % 2 === 0) evenNuls++;
      else oddNuls++;
    }
  }
  const pairs = Math.floor(n / 2);
  const wide =
    pairs >= 2 &&
    Math.max(evenNuls, oddNuls) >= pairs * 0.3 &&
    Math.min(evenNuls, oddNuls) <= pairs * 0.05;
  if (bom16 || wide) {
    throw new UnsupportedMediaType(
      'The file is saved as UTF-16 ("Unicode text"). Save it as CSV in UTF-8 (or Windows-1252) and ' +
        'upload again.',
    );
  }
}

/** Text files that are documents, not lists: a PDF, an RTF file, a web page or an XML file. */
function refuseTextDocuments(head: Buffer): void {
  const start = head
    .subarray(0, 64)
    .toString('latin1')
    .replace(/^\ufeff|^\xef\xbb\xbf/, '')
    .trimStart();
  const kinds: [RegExp, string][] = [
    [/^%PDF-/, 'a PDF document'],
    [/^\{\\rtf/, 'an RTF document'],
    [/^<!doctype html|^<html/i, 'a web page (HTML)'],
    [/^<\?xml/, 'an XML file'],
  ];
  for (const [pattern, name] of kinds) {
    if (pattern.test(start)) {
      throw new UnsupportedMediaType(
        `This is ${name}, not a delimited text list. Upload the CSV export.`,
      );
    }
  }
}

/**
 * Refuses bytes that are not text: any NUL, or more than a few control characters. A recognisable file
 * (a spreadsheet workbook, an image) is named. The magic-number check runs only on such bytes, since a
 * text list may start with letters that happen to match a binary signature.
 */
async function refuseBinary(head: Buffer): Promise<void> {
  let controls = 0;
  let firstNul = -1;
  for (let i = 0; i < head.length; i++) {
    const byte = head[i];
    if (byte === 0 && firstNul < 0) firstNul = i;
    // Tab, line feed, carriage return are text; a DOS end-of-file mark (0x1A) is tolerated.
    if (
      (byte < 0x20 && byte !== 0x09 && byte !== 0x0a && byte !== 0x0d && byte !== 0x1a) ||
      byte === 0x7f
    ) {
      controls++;
    }
  }
  if (firstNul < 0 && controls <= Math.max(2, head.length / 1000)) return;
  const kind = await FileType.fromBuffer(head);
  if (kind) {
    const spreadsheet = ['xlsx', 'cfb', 'zip', 'ods'].includes(kind.ext);
    throw new UnsupportedMediaType(
      `This is a ${kind.ext.toUpperCase()} file (${kind.mime}), not a delimited text list.` +
        (spreadsheet ? ' Open it in the spreadsheet program and save it as CSV.' : ''),
    );
  }
  throw new UnsupportedMediaType(
    firstNul >= 0
      ? `The file holds binary data (a NUL byte at byte ${firstNul + 1}), not delimited text.`
      : `The file holds ${controls} control characters in its first ${head.length} bytes: it is binary, ` +
          'not delimited text.',
  );
}

function detectEncoding(head: Buffer, complete: boolean): TextEncoding {
  const bom = head.length >= 3 && head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf;
  let bytes = bom ? head.subarray(3) : head;
  if (!complete) bytes = bytes.subarray(0, bytes.length - incompleteUtf8Tail(bytes));
  if (isValidUtf8(bytes)) return bom ? 'utf-8-bom' : 'utf-8';
  // A BOM followed by invalid bytes is still meant as UTF-8; the bad bytes become row errors later.
  return bom ? 'utf-8-bom' : 'windows-1252';
}

function isValidUtf8(bytes: Buffer): boolean {
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return true;
  } catch {
    return false;
  }
}

/** How many bytes at the end start a UTF-8 sequence the head cut short (0–3). */
function incompleteUtf8Tail(bytes: Buffer): number {
  for (let back = 1; back <= Math.min(3, bytes.length); back++) {
    const byte = bytes[bytes.length - back];
    if ((byte & 0xc0) === 0x80) continue; // continuation byte: keep looking for the lead byte
    const needed = byte >= 0xf0 ? 4 : byte >= 0xe0 ? 3 : byte >= 0xc0 ? 2 : 1;
    return needed > back ? back : 0;
  }
  return 0;
}

interface DelimiterChoice {
  delimiter: Delimiter;
  records: HeadRecord[];
  width: number;
}

/**
 * The delimiter and the column count are the pair that has a header line (a line of labels) and splits
 * the most lines into that many columns (more than one). A decimal comma in a semicolon list splits
 * lines too, but no line of labels comes out of it; ragged rows may outnumber the good ones, but the
 * header tells the real width. Ties go to the wider split.
 */
function chooseDelimiter(text: string): DelimiterChoice {
  let best: (DelimiterChoice & { key: number[] }) | null = null;
  for (const delimiter of DELIMITERS) {
    const records = splitRecords(text, delimiter);
    const counts = new Map<number, number>();
    for (const r of records) {
      if (r.fields.length > 1 && !isBlank(r)) {
        counts.set(r.fields.length, (counts.get(r.fields.length) ?? 0) + 1);
      }
    }
    for (const [width, lines] of counts) {
      const labelled = records.some((r) => r.fields.length === width && looksLikeLabels(r));
      const key = [labelled ? 1 : 0, lines, width];
      if (!best || compareKeys(key, best.key) > 0) best = { delimiter, records, width, key };
    }
  }
  if (!best) {
    throw new BadRequest(
      'No columns found: no line is split by commas, semicolons or tabs. A price list needs at least ' +
        'a SKU column and a price column.',
      [],
      'no_delimiter',
    );
  }
  return best;
}

function compareKeys(a: number[], b: number[]): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i] - b[i];
  return 0;
}

function isBlank(r: HeadRecord): boolean {
  return r.fields.every((f) => f.trim() === '');
}

/**
 * A header line names columns: most of its cells are filled and hold words, not numbers. Title lines
 * padded out with delimiters by a spreadsheet ("Price list;;;;;") fail the "most cells filled" test.
 */
function looksLikeLabels(r: HeadRecord): boolean {
  const filled = r.fields.map((f) => f.trim()).filter((f) => f !== '');
  if (filled.length < Math.max(2, Math.ceil(r.fields.length / 2))) return false;
  const words = filled.filter((f) => /\p{L}/u.test(f) && !looksLikeNumber(f));
  return words.length >= Math.ceil((filled.length * 2) / 3);
}

/**
 * Decimal comma or point, from the numbers in the rows. "1.234,50" and "12,5" say comma; "1,234.50" and
 * "12.5" say point; "2,555" or "1.250" could be either and only count when nothing clearer is found.
 */
function detectDecimal(rows: string[][], delimiter: Delimiter): DecimalMark {
  let comma = 0;
  let point = 0;
  let maybeComma = 0;
  let maybePoint = 0;
  for (const row of rows) {
    for (const cell of row) {
      switch (numberEvidence(cell)) {
        case 'comma':
          comma++;
          break;
        case 'point':
          point++;
          break;
        case 'comma?':
          maybeComma++;
          break;
        case 'point?':
          maybePoint++;
          break;
        default:
          break;
      }
    }
  }
  if (comma !== point) return comma > point ? ',' : '.';
  if (maybeComma !== maybePoint) return maybeComma > maybePoint ? ',' : '.';
  // Nothing to go by: lists separated by semicolons come from locales that write a decimal comma.
  return delimiter === ';' ? ',' : '.';
}
