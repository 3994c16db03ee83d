// Writes price-list bytes to a temporary file and runs them through detection, the proposed mapping and
// the streaming parser, as an upload would be.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { detectFileFormat, type DetectedFormat } from '../../server/imports/detect-format';
import { proposeMapping } from '../../server/imports/propose-mapping';
import {
  readPriceList,
  type ParseCounts,
  type PriceListRow,
  type RowIssue,
} from '../../server/imports/parse-price-list';
import type { MappingJson } from '../../shared/api/suppliers';

export interface ParsedList {
  format: DetectedFormat;
  mapping: MappingJson;
  rows: PriceListRow[];
  errors: RowIssue[];
  warnings: RowIssue[];
  counts: ParseCounts;
}

const dir = mkdtempSync(join(tmpdir(), 'stepstock-price-list-test-'));
let n = 0;
afterAll(() => rmSync(dir, { recursive: true, force: true }));

export function writeList(content: string | Buffer, name = `list-${++n}.csv`): string {
  const path = join(dir, name);
  writeFileSync(path, content);
  return path;
}

export async function parseFile(
  path: string,
  opts: { mapping?: Partial<MappingJson>; currency?: string } = {},
): Promise<ParsedList> {
  const sample = await detectFileFormat(path);
  const mapping = { ...proposeMapping(sample.format.headers, sample.rows), ...opts.mapping };
  const counts: ParseCounts = { rows: 0, ok: 0, errors: 0, warnings: 0 };
  const rows: PriceListRow[] = [];
  const errors: RowIssue[] = [];
  const warnings: RowIssue[] = [];
  const options = { format: sample.format, mapping, defaultCurrency: opts.currency ?? 'EUR' };
  for await (const item of readPriceList(path, options, counts)) {
    if (item.kind === 'row') rows.push(item.row);
    else if (item.kind === 'error') errors.push(item.issue);
    else if (item.kind === 'warning') warnings.push(item.issue);
    else
      rows.splice(
        rows.findIndex((r) => r.line === item.line),
        1,
      );
  }
  errors.sort((a, b) => a.line - b.line);
  return { format: sample.format, mapping, rows, errors, warnings, counts };
}

export function parseText(
  content: string | Buffer,
  opts: { mapping?: Partial<MappingJson>; currency?: string } = {},
): Promise<ParsedList> {
  return parseFile(writeList(content), opts);
}

/** The error a whole file is refused with: its HTTP status, code, message and details. */
export async function refusal(
  content: string | Buffer,
  opts: { mapping?: Partial<MappingJson> } = {},
): Promise<{ status: number; code: string; message: string; details: unknown[] }> {
  try {
    await parseText(content, opts);
  } catch (e) {
    const err = e as { status?: number; code?: string; message: string; details?: unknown[] };
    return {
      status: err.status ?? 0,
      code: err.code ?? '',
      message: err.message,
      details: err.details ?? [],
    };
  }
  throw new Error('Expected the file to be refused, but it was read.');
}
