import type { DetectedJson, ImportStatus, MappingFieldName } from '../../../shared/api/suppliers';

/** The detected format in words a person recognises from their spreadsheet program. */
export function describeDetected(d: DetectedJson): {
  encoding: string;
  delimiter: string;
  decimal: string;
  headerLine: string;
} {
  return {
    encoding:
      d.encoding === 'windows-1252'
        ? 'Windows-1252 (Western European)'
        : d.encoding === 'utf-8-bom'
          ? 'UTF-8 with byte-order mark'
          : 'UTF-8',
    delimiter: d.delimiter === ';' ? 'semicolon (;)' : d.delimiter === ',' ? 'comma (,)' : 'tab',
    decimal: d.decimal === ',' ? 'decimal comma (2,555)' : 'decimal point (2.555)',
    headerLine:
      d.headerLine === 1 ? 'line 1' : `line ${d.headerLine} (${d.headerLine - 1} above it skipped)`,
  };
}

export const FIELD_NAMES: Record<MappingFieldName, string> = {
  sku: 'Their SKU',
  description: 'Description',
  size: 'Size (piston diameter)',
  oversize: 'Oversize step',
  price: 'Price',
  available: 'Quantity they have',
  leadDays: 'Lead time',
  gtin: 'GTIN / EAN / UPC',
  currency: 'Currency',
};

export const STATUS_WORDS: Record<ImportStatus, string> = {
  previewed: 'read, not applied yet',
  committed: 'applied',
  duplicate: 'same file as an earlier list',
  failed: 'applying failed; nothing changed',
};
