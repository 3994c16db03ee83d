// Bringing a supplier's price list in: the upload checks and stages the whole file and shows what would
// change (the preview); the commit applies it in one transaction or not at all. The same bytes already
// committed for the supplier are recognised by their SHA-256 and change nothing.
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import type { Knex } from 'knex';
import { config } from '../config';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { logger } from '../logger';
import { AppError, BadRequest, Conflict, NotFound } from '../errors';
import { faultPoint } from '../testing-faults';
import { toLengthJson } from '../../shared/lengths';
import type { SessionUser } from '../../shared/session-types';
import type {
  CommitJson,
  DuplicateJson,
  ImportCountsJson,
  ImportJson,
  ImportLogEntryJson,
  ImportProgressJson,
  MappingJson,
  PriceChangesJson,
  RowIssueJson,
  SampleRowJson,
} from '../../shared/api/suppliers';
import * as suppliers from '../suppliers/suppliers-service';
import { detectFileFormat } from './detect-format';
import { readPriceListBatches, type ParseCounts } from './parse-price-list';
import { proposeMapping, resolveMapping } from './propose-mapping';
import * as repo from './imports-repository';
import * as previews from './previews-repository';
import type { Page } from '../../shared/api/common';

/** Row errors and warnings kept with an import (the counts say how many there were in all). */
export const MAX_ISSUES = 500;
export const SAMPLE_ROWS = 20;
export const LARGEST_CHANGES = 100;
/** What a commit of a preview that is no longer there is told. */
const GONE = `That price-list preview (a preview expires after ${config.PRICE_LIST_PREVIEW_HOURS} hours, and a newer upload of the same file replaces it)`;

export interface UploadedFile {
  path: string;
  originalName: string;
  size: number;
}

export async function sha256File(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** A confirmed mapping names columns; it fits a file when every column it names is on the header. */
function fits(mapping: MappingJson, headers: string[]): boolean {
  return Object.entries(mapping).every(
    ([field, column]) =>
      field === 'sizeUnit' || column === null || headers.includes(column as string),
  );
}

function duplicateAnswer(importId: string, committedAt: Date | null): DuplicateJson {
  const when = committedAt ? ` on ${committedAt.toISOString().slice(0, 10)}` : '';
  return {
    status: 'duplicate',
    importId,
    message: `This file was already imported for this supplier${when}; nothing was changed.`,
  };
}

/** Keeps the issues with the lowest line numbers, at most `max` of them. */
export function keepFirst(list: RowIssueJson[], incoming: RowIssueJson[], max: number): void {
  // One at a time: a batch where every row has a warning is too long to spread into push().
  for (const issue of incoming) {
    list.push(issue);
    if (list.length > max * 4) {
      list.sort((a, b) => a.line - b.line);
      list.length = max;
    }
  }
}

function finalIssues(list: RowIssueJson[]): RowIssueJson[] {
  return list.sort((a, b) => a.line - b.line).slice(0, MAX_ISSUES);
}

export interface PreviewInput {
  user: SessionUser;
  supplierId: string;
  file: UploadedFile;
  mapping?: MappingJson;
  progressToken?: string;
}

/**
 * Reads, checks and stages a price list. Answers the preview, or a duplicate answer when the same file
 * is already committed for the supplier. A file that cannot be read at all is refused (400/415) and
 * leaves nothing behind.
 */
export async function previewPriceList(
  input: PreviewInput,
  k: Knex = db,
): Promise<ImportJson | DuplicateJson> {
  const { user, supplierId, file, progressToken } = input;
  const supplier = await suppliers.getSupplier(supplierId, k);

  const sha256 = await sha256File(file.path);
  const earlier = await repo.findCommittedBySha(supplierId, sha256, k);
  if (earlier) return duplicateAnswer(earlier.id, earlier.committed_at);

  const { format, rows: sampleRows } = await detectFileFormat(file.path);
  const remembered = await repo.rememberedMapping(supplierId, k);
  const rememberedMapping = remembered?.mapping as MappingJson | undefined;
  const mapping: MappingJson =
    input.mapping ??
    (rememberedMapping && fits(rememberedMapping, format.headers)
      ? rememberedMapping
      : proposeMapping(format.headers, sampleRows));
  const detected = {
    encoding: format.encoding,
    delimiter: format.delimiter,
    decimal: format.decimal,
    headerLine: format.headerLine,
  };
  try {
    resolveMapping(mapping, format.headers);
  } catch (e) {
    // 400 naming the missing column, before anything is written; the header line and the proposal
    // go with it so the page can ask which column is which.
    if (e instanceof BadRequest) {
      throw new AppError(400, e.code, e.message, e.details, {
        headers: format.headers,
        mapping,
        detected,
      });
    }
    throw e;
  }

  const staged = await k.transaction(async (trx) => {
    await repo.allowLongStatements(trx);
    // One live preview per supplier and file: concurrent uploads of the same bytes wait here for
    // each other. The same file read the same way keeps the preview already made (so every
    // caller gets an id that exists); another reading of it replaces that preview.
    await previews.lockPreviewSlot(trx, supplierId, sha256);
    const committed = await repo.findCommittedBySha(supplierId, sha256, trx);
    if (committed) return { id: null, duplicate: committed };
    const live = await previews.livePreview(trx, supplierId, sha256);
    if (live && sameMapping(live.mapping, mapping)) return { id: live.id, duplicate: null };
    await repo.markProgress(trx, progressToken, 'reading');
    await previews.deleteStalePreviews(trx, supplierId, sha256);
    const id = await repo.insertImport(trx, {
      supplier_id: supplierId,
      user_id: user.id,
      file_name: file.originalName,
      file_bytes: file.size,
      sha256,
      status: 'previewed',
      detected,
      headers: format.headers,
      mapping,
      counts: {},
    });

    const counts: ParseCounts = { rows: 0, ok: 0, errors: 0, warnings: 0 };
    const errors: RowIssueJson[] = [];
    const warnings: RowIssueJson[] = [];
    const retracted: string[] = [];
    const skipped = new Set<string>();
    const writer = await repo.openStagingWriter(trx, id);
    try {
      const options = { format, mapping, defaultCurrency: supplier.currency };
      for await (const batch of readPriceListBatches(file.path, options, counts)) {
        await writer.write(batch.rows);
        keepFirst(errors, batch.errors, MAX_ISSUES);
        keepFirst(warnings, batch.warnings, MAX_ISSUES);
        for (const r of batch.retracted) retracted.push(r.sku);
        for (const sku of batch.skippedSkus) skipped.add(sku);
      }
      await writer.end();
    } catch (e) {
      await writer.abort(e as Error);
      throw e;
    }
    await repo.deleteStaged(trx, id, retracted);
    await repo.stageSkipped(trx, id, [...skipped]);

    if (counts.ok === 0) {
      const first = finalIssues(errors);
      throw new BadRequest(
        `No row can be imported: all ${counts.rows} rows have errors. ` +
          (first[0] ? `Line ${first[0].line}: ${first[0].message}` : ''),
        first.slice(0, 50),
        'no_valid_rows',
      );
    }

    await repo.markProgress(trx, progressToken, 'comparing');
    await repo.analyzeStaging(trx);
    const { comparison, changes } = await repo.compare(trx, id, supplierId, LARGEST_CHANGES);
    const sample = await repo.firstStaged(trx, id, SAMPLE_ROWS);
    await repo.updateImport(trx, id, {
      counts: { rows: counts.rows, ok: counts.ok, errors: counts.errors, ...comparison },
      errors: finalIssues(errors),
      warnings: finalIssues(warnings),
      sample: sample.map(sampleJson),
      price_changes: changesJson(changes) as unknown as Record<string, unknown>,
    });
    return { id, duplicate: null };
  });
  if (staged.duplicate) {
    return duplicateAnswer(staged.duplicate.id, staged.duplicate.committed_at);
  }
  logger.info({ importId: staged.id, supplierId, file: file.originalName }, 'price list previewed');
  return getImport(staged.id as string, k);
}

/** Two mappings say the same when they name the same columns (key order aside). */
function sameMapping(a: Record<string, unknown>, b: MappingJson): boolean {
  const canonical = (m: Record<string, unknown>) =>
    JSON.stringify(
      Object.keys(m)
        .sort()
        .map((key) => [key, m[key] ?? null]),
    );
  return canonical(a) === canonical(b as Record<string, unknown>);
}

function sampleJson(r: repo.StagedRow): SampleRowJson {
  return {
    line: r.line,
    sku: r.sku,
    description: r.description,
    size: r.size_nm === null ? null : toLengthJson(r.size_nm),
    oversize: r.oversize_nm === null ? null : toLengthJson(r.oversize_nm),
    price: r.price,
    currency: r.currency,
    available: r.available,
    leadDays: r.lead_days,
    gtin: r.gtin,
  };
}

function changesJson(c: repo.PriceChanges): PriceChangesJson {
  return {
    upAveragePercent: c.upAverage,
    downAveragePercent: c.downAverage,
    largest: c.largest.map((r) => ({
      line: r.line,
      sku: r.sku,
      description: r.description,
      oldPrice: r.old_price,
      newPrice: r.new_price,
      currency: r.currency,
      percent: r.percent,
    })),
  };
}

function countsJson(c: Record<string, number>): ImportCountsJson {
  const keys = ['rows', 'ok', 'errors', 'new', 'up', 'down', 'unchanged', 'missing', 'unmapped'];
  return Object.fromEntries(keys.map((k) => [k, Number(c[k] ?? 0)])) as unknown as ImportCountsJson;
}

function person(id: string | null, name: string | null): { id: string; name: string } | null {
  return id ? { id, name: name ?? '' } : null;
}

function importJson(r: repo.ImportRow): ImportJson {
  return {
    importId: r.id,
    status: r.status,
    supplierId: r.supplier_id,
    supplierName: r.supplier_name,
    fileName: r.file_name,
    fileBytes: Number(r.file_bytes),
    sha256: r.sha256,
    detected: r.detected as unknown as ImportJson['detected'],
    headers: r.headers,
    mapping: r.mapping as unknown as MappingJson,
    counts: countsJson(r.counts),
    errors: r.errors as RowIssueJson[],
    warnings: r.warnings as RowIssueJson[],
    sample: r.sample as SampleRowJson[],
    priceChanges: r.price_changes as unknown as PriceChangesJson,
    uploadedBy: person(r.user_id, r.user_name),
    uploadedAt: r.created_at.toISOString(),
    committedBy: person(r.committed_by, r.committed_by_name),
    committedAt: r.committed_at ? r.committed_at.toISOString() : null,
    failure: r.failure,
    duplicateOf: r.duplicate_of,
  };
}

/** The supplier of an import, to queue its commit behind that supplier's other import. */
export async function supplierOfImport(id: string, k: Knex = db): Promise<string> {
  const row = await repo.findImport(id, k);
  if (!row) throw new NotFound(GONE);
  return row.supplier_id;
}

export async function getImport(id: string, k: Knex = db): Promise<ImportJson> {
  const row = await repo.findImport(id, k);
  if (!row) throw new NotFound('That price-list import');
  return importJson(row);
}

export async function listImports(
  query: { supplierId?: string; status?: string; page: number; pageSize: number },
  k: Knex = db,
): Promise<Page<ImportLogEntryJson>> {
  const { rows, total } = await repo.listImports(query, k);
  return {
    items: rows.map((r) => ({
      importId: r.id,
      status: r.status,
      supplierId: r.supplier_id,
      supplierName: r.supplier_name,
      fileName: r.file_name,
      counts: countsJson(r.counts),
      uploadedBy: person(r.user_id, r.user_name),
      uploadedAt: r.created_at.toISOString(),
      committedBy: person(r.committed_by, r.committed_by_name),
      committedAt: r.committed_at ? r.committed_at.toISOString() : null,
    })),
    total,
  };
}

/**
 * Applies a previewed list in one transaction: prices and their history, new items, dropped items
 * (for a full list), the remembered mapping, the import's status. Any failure leaves nothing of it;
 * the import then shows the failure and can be committed again.
 */
export async function commitImport(
  user: SessionUser,
  importId: string,
  opts: { dropMissing: boolean },
  progressToken?: string,
  k: Knex = db,
): Promise<CommitJson | DuplicateJson> {
  try {
    const answer = await k.transaction(async (trx): Promise<CommitJson | DuplicateJson> => {
      await repo.allowLongStatements(trx);
      await repo.markProgress(trx, progressToken, 'committing');
      const found = await repo.lockImport(trx, importId);
      if (!found) throw new NotFound(GONE);
      await suppliers.lockSupplier(trx, found.supplier_id);
      // Read again under the supplier lock: a commit of another list may have finished meanwhile.
      const imp = (await repo.lockImport(trx, importId)) as repo.ImportRow;
      if (imp.status === 'committed') return duplicateAnswer(imp.id, imp.committed_at);
      if (imp.status === 'duplicate') {
        const original = await repo.findCommittedBySha(imp.supplier_id, imp.sha256, trx);
        return duplicateAnswer(
          original?.id ?? imp.duplicate_of ?? imp.id,
          original?.committed_at ?? null,
        );
      }
      const original = await repo.findCommittedBySha(imp.supplier_id, imp.sha256, trx);
      if (original) {
        await repo.clearStaging(trx, imp.id);
        await repo.updateImport(trx, imp.id, { status: 'duplicate', duplicate_of: original.id });
        return duplicateAnswer(original.id, original.committed_at);
      }
      const { staged, ...comparison } = await repo.applyStaged(
        trx,
        imp.id,
        imp.supplier_id,
        opts.dropMissing,
      );
      // Rolled back with everything the statement wrote: a list the database lost (unlogged staging
      // rows are emptied by a crash) is asked for again rather than applied in part.
      if (staged !== Number(imp.counts.ok)) {
        throw new Conflict(
          `The staged rows of this import are incomplete (${staged} of ${imp.counts.ok}); upload the file again.`,
        );
      }
      const counts = countsJson({ ...imp.counts, ...comparison });
      faultPoint('imports.commit.midway');
      await repo.rememberMapping(trx, imp.supplier_id, imp.mapping, imp.headers, user.id);
      await repo.clearStaging(trx, imp.id);
      await repo.updateImport(trx, imp.id, {
        status: 'committed',
        committed_by: user.id,
        committed_at: trx.fn.now() as unknown as Knex.Raw,
        counts: counts as unknown as Record<string, number>,
        failure: null,
      });
      await recordAudit(trx, {
        userId: user.id,
        action: 'price_list.commit',
        entity: 'price_list_import',
        entityId: imp.id,
        after: {
          supplierId: imp.supplier_id,
          fileName: imp.file_name,
          counts,
          dropMissing: opts.dropMissing,
        },
      });
      return { status: 'committed', importId: imp.id, counts };
    });
    if (answer.status === 'committed') {
      logger.info({ importId, counts: answer.counts }, 'price list committed');
    }
    return answer;
  } catch (e) {
    if (!(e instanceof AppError)) await recordFailure(importId, e, k);
    throw e;
  }
}

/** After a failed commit (rolled back), the import log says so; the import stays committable. */
async function recordFailure(importId: string, error: unknown, k: Knex): Promise<void> {
  logger.error({ err: error, importId }, 'price list commit failed');
  try {
    // The cause stays in the server log: database messages are not for the import log.
    await repo.updateImport(k, importId, {
      status: 'failed',
      failure: 'The commit failed and nothing was changed. It can be committed again.',
    });
  } catch (inner) {
    logger.error({ err: inner, importId }, 'could not record the failed commit');
  }
}

/** Where an upload or commit with this progress token is, from the database's own activity views. */
export async function progress(token: string): Promise<ImportProgressJson> {
  const row = await repo.progress(token);
  if (!row) return { phase: 'waiting', rows: 0, bytes: 0 };
  const phase = row.application_name.split(':')[2] as ImportProgressJson['phase'];
  // Between the end of the staging COPY and the mark of the next phase, the database has no copy
  // progress left to show: the reading is over, so say so rather than "reading, 0 rows".
  if (phase === 'reading' && row.copy_done) return { phase: 'comparing', rows: 0, bytes: 0 };
  return { phase, rows: Number(row.rows), bytes: Number(row.bytes) };
}
