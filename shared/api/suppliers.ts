// What the suppliers and price-list import API accepts and answers. The zod schemas serve the server
// routes and the Angular forms alike.
import * as z from '../zod';
import { currencyCode, idField, moneyText } from './common';
import type { LengthJson } from '../lengths';
import { emailAddress, singleLine } from '../text-rules';

// One address a purchase order can be sent to; a list or a name with brackets is refused here
// rather than failing (or reaching only part of it) at sending time.
const email = emailAddress(200);

export const supplierInput = z.strictObject({
  name: z.pipe(singleLine(120), z.string().check(z.minLength(1, 'enter a name'))),
  email: z.optional(
    z.union([
      email,
      z.pipe(
        z.literal(''),
        z.transform(() => null),
      ),
      z.null(),
    ]),
  ),
  currency: currencyCode,
  leadDays: z
    .number({ error: 'must be a whole number of days' })
    .check(z.int('must be whole days'), z.gte(0), z.lte(365)),
  contacts: z.optional(z.string().check(z.maxLength(2000, 'at most 2000 characters'))),
  minOrder: z.optional(moneyText),
  shippingCost: z.optional(moneyText),
  notes: z.optional(z.string().check(z.maxLength(4000, 'at most 4000 characters'))),
  active: z.optional(z.boolean()),
});
export type SupplierInput = z.input<typeof supplierInput>;
export type SupplierData = z.output<typeof supplierInput>;

export const supplierPatch = z.partial(supplierInput);
export type SupplierPatch = z.output<typeof supplierPatch>;

export const SUPPLIER_SORTS = ['name', 'currency', 'leadDays', 'items', 'lastImport'] as const;
export const ITEM_SORTS = ['sku', 'description', 'size', 'price', 'available', 'updated'] as const;

export interface SupplierJson {
  id: string;
  name: string;
  contacts: string;
  email: string | null;
  currency: string;
  leadDays: number;
  minOrder: string;
  shippingCost: string;
  notes: string;
  active: boolean;
  /** Items not dropped from the last full list. */
  items: number;
  unmapped: number;
  lastImportAt: string | null;
  createdAt: string;
  updatedAt: string;
}

export interface PartRefJson {
  id: string;
  sku: string;
  description: string;
  kind: string;
  familyCode: string | null;
  stepLabel: string | null;
}

export interface SupplierItemJson {
  id: string;
  supplierId: string;
  sku: string;
  description: string;
  size: LengthJson | null;
  oversize: LengthJson | null;
  part: PartRefJson | null;
  price: string;
  currency: string;
  available: number | null;
  leadDays: number | null;
  gtin: string | null;
  lastImportId: string | null;
  lastSeenAt: string | null;
  dropped: boolean;
  updatedAt: string;
}

export interface PriceHistoryJson {
  price: string;
  currency: string;
  effectiveFrom: string;
  importId: string | null;
  fileName: string | null;
}

export interface SuggestionJson extends PartRefJson {
  /** Why it is suggested: same size, family named in the description, same SKU or GTIN. */
  reasons: string[];
  score: number;
}

export interface UnmappedItemJson extends SupplierItemJson {
  supplierName: string;
  suggestions: SuggestionJson[];
}

/** An item waiting in the mapping queue whose suggestions include a given part: it might be that part. */
export interface WaitingItemJson {
  itemId: string;
  supplierId: string;
  supplierName: string;
  supplierSku: string;
  description: string;
  /** The part it might be, and why the mapping queue suggests it. */
  partId: string;
  reasons: string[];
}

export const itemMappingInput = z.strictObject({
  partId: z.nullable(idField),
});

// ---- Price-list imports ------------------------------------------------------------------------

export const IMPORT_STATUSES = ['previewed', 'committed', 'duplicate', 'failed'] as const;
export type ImportStatus = (typeof IMPORT_STATUSES)[number];

export interface DetectedJson {
  encoding: 'utf-8' | 'utf-8-bom' | 'windows-1252';
  delimiter: ',' | ';' | '\t';
  decimal: '.' | ',';
  headerLine: number;
}

export const MAPPING_FIELD_NAMES = [
  'sku',
  'description',
  'size',
  'oversize',
  'price',
  'available',
  'leadDays',
  'gtin',
  'currency',
] as const;
export type MappingFieldName = (typeof MAPPING_FIELD_NAMES)[number];
/** A price list cannot be read without these two columns. */
export const REQUIRED_MAPPING_FIELDS: readonly MappingFieldName[] = ['sku', 'price'];

export type MappingJson = Record<MappingFieldName, string | null> & { sizeUnit: 'mm' | 'in' };

/** A column mapping as the client sends it: field → column name (or null), and the size unit. */
export const mappingInput = z.strictObject({
  sku: z.nullable(z.string().check(z.maxLength(200))),
  description: z._default(z.nullable(z.string().check(z.maxLength(200))), null),
  size: z._default(z.nullable(z.string().check(z.maxLength(200))), null),
  oversize: z._default(z.nullable(z.string().check(z.maxLength(200))), null),
  price: z.nullable(z.string().check(z.maxLength(200))),
  available: z._default(z.nullable(z.string().check(z.maxLength(200))), null),
  leadDays: z._default(z.nullable(z.string().check(z.maxLength(200))), null),
  gtin: z._default(z.nullable(z.string().check(z.maxLength(200))), null),
  currency: z._default(z.nullable(z.string().check(z.maxLength(200))), null),
  sizeUnit: z.enum(['mm', 'in'], { error: 'must be mm or in' }),
});

export interface ImportCountsJson {
  rows: number;
  ok: number;
  errors: number;
  new: number;
  up: number;
  down: number;
  unchanged: number;
  missing: number;
  unmapped: number;
}

export interface RowIssueJson {
  line: number;
  field?: string;
  message: string;
}

export interface SampleRowJson {
  line: number;
  sku: string;
  description: string;
  size: LengthJson | null;
  oversize: LengthJson | null;
  price: string;
  currency: string;
  available: number | null;
  leadDays: number | null;
  gtin: string | null;
}

export interface PriceChangeJson {
  line: number;
  sku: string;
  description: string;
  oldPrice: string;
  newPrice: string;
  currency: string;
  /** Change in percent of the old price, one decimal ("-4.5"). */
  percent: string;
}

export interface PriceChangesJson {
  /** Average change of the rows going up and going down, in percent (null when none). */
  upAveragePercent: string | null;
  downAveragePercent: string | null;
  /** The largest changes first. */
  largest: PriceChangeJson[];
}

export interface ImportJson {
  importId: string;
  status: ImportStatus;
  supplierId: string;
  supplierName: string;
  fileName: string;
  fileBytes: number;
  sha256: string;
  detected: DetectedJson;
  headers: string[];
  mapping: MappingJson;
  counts: ImportCountsJson;
  errors: RowIssueJson[];
  warnings: RowIssueJson[];
  sample: SampleRowJson[];
  priceChanges: PriceChangesJson;
  uploadedBy: { id: string; name: string } | null;
  uploadedAt: string;
  committedBy: { id: string; name: string } | null;
  committedAt: string | null;
  failure: string | null;
  duplicateOf: string | null;
}

export interface ImportLogEntryJson {
  importId: string;
  status: ImportStatus;
  supplierId: string;
  supplierName: string;
  fileName: string;
  counts: ImportCountsJson;
  uploadedBy: { id: string; name: string } | null;
  uploadedAt: string;
  committedBy: { id: string; name: string } | null;
  committedAt: string | null;
}

export interface DuplicateJson {
  status: 'duplicate';
  importId: string;
  message: string;
}

export interface CommitJson {
  status: 'committed';
  importId: string;
  counts: ImportCountsJson;
}

/** What the server is doing with an upload or a commit, read while it runs. */
export interface ImportProgressJson {
  phase: 'waiting' | 'reading' | 'comparing' | 'committing' | 'done';
  rows: number;
  bytes: number;
}

export const commitInput = z.strictObject({
  /** A full list marks items it no longer holds as dropped; a partial list (false) leaves them. */
  dropMissing: z._default(z.boolean(), true),
});
