// Proposes which column of a supplier's list holds which of our fields, from the words on the header
// line (English plus a few common European header words) and the units written in the values. The user
// confirms or corrects the proposal once; it is then remembered per supplier.
import { BadRequest } from '../errors';
import type { LengthUnit } from '../../shared/lengths';
import {
  MAPPING_FIELD_NAMES,
  REQUIRED_MAPPING_FIELDS,
  type MappingFieldName,
  type MappingJson,
} from '../../shared/api/suppliers';
import { EXCLUDE, PHRASES } from './header-words';

export const FIELD_LABELS: Record<MappingFieldName, string> = {
  sku: 'SKU',
  description: 'description',
  size: 'size',
  oversize: 'oversize',
  price: 'price',
  available: 'available quantity',
  leadDays: 'lead time',
  gtin: 'GTIN',
  currency: 'currency',
};

export function normalizeHeader(header: string): string {
  return header
    .toLowerCase()
    .replace(/ø/g, ' dia ')
    .replace(/ß/g, 'ss')
    .normalize('NFD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();
}

function matchScore(header: string, field: MappingFieldName): number {
  const norm = normalizeHeader(header);
  if (norm === '') return 0;
  const words = ` ${norm} `;
  if ((EXCLUDE[field] ?? []).some((w) => words.includes(` ${w} `))) return 0;
  let best = 0;
  for (const phrase of PHRASES[field]) {
    if (norm === phrase) return 3;
    // Drop unit and currency words before comparing: "Price EUR", "Bore (mm)", "Ø in".
    const stripped = norm
      .replace(/\b(mm|in|inch|inches|eur|usd|gbp|chf|sek|dkk|nok|pln|czk|jpy)\b/g, '')
      .trim();
    if (stripped === phrase) best = Math.max(best, 3);
    else if (words.includes(` ${phrase} `)) best = Math.max(best, 2);
  }
  return best;
}

/**
 * Proposes a mapping for the given header line. Each field takes at most one column and each column at
 * most one field; the strongest matches are placed first. `sample` rows help to find the size unit.
 */
export function proposeMapping(headers: string[], sample: string[][]): MappingJson {
  const candidates: { field: MappingFieldName; column: number; score: number }[] = [];
  headers.forEach((header, column) => {
    for (const field of MAPPING_FIELD_NAMES) {
      const score = matchScore(header, field);
      if (score > 0) candidates.push({ field, column, score });
    }
  });
  // Stronger first; among equals, the field listed first in MAPPING_FIELD_NAMES and the leftmost column.
  candidates.sort(
    (a, b) =>
      b.score - a.score ||
      MAPPING_FIELD_NAMES.indexOf(a.field) - MAPPING_FIELD_NAMES.indexOf(b.field) ||
      a.column - b.column,
  );
  const mapping = Object.fromEntries(MAPPING_FIELD_NAMES.map((f) => [f, null])) as Record<
    MappingFieldName,
    string | null
  >;
  const usedColumns = new Set<number>();
  for (const c of candidates) {
    if (mapping[c.field] !== null || usedColumns.has(c.column)) continue;
    mapping[c.field] = headers[c.column];
    usedColumns.add(c.column);
  }
  return { ...mapping, sizeUnit: proposeSizeUnit(headers, sample, mapping) };
}

/**
 * The unit of the size and oversize columns: from the header ("Bore mm", "Size (in)"), then from units
 * written in the values, then from the magnitude of the sizes — a cylinder bore under 12 written as a
 * plain number is in inches (about 1.5 to 4.5 in), one of 12 or more is in millimetres (common practice,
 * no source: bores of the engines this trade serves run from about 40 to 110 mm).
 */
function proposeSizeUnit(
  headers: string[],
  sample: string[][],
  mapping: Record<MappingFieldName, string | null>,
): LengthUnit {
  const columns = (['size', 'oversize'] as const)
    .map((f) => (mapping[f] === null ? -1 : headers.indexOf(mapping[f] as string)))
    .filter((i) => i >= 0);
  for (const i of columns) {
    const words = ` ${normalizeHeader(headers[i])} `;
    if (words.includes(' mm ')) return 'mm';
    if (/ (in|inch|inches) /.test(words) || /["\u2033]/.test(headers[i])) return 'in';
  }
  let mm = 0;
  let inches = 0;
  for (const row of sample) {
    for (const i of columns) {
      const cell = (row[i] ?? '').trim().toLowerCase();
      if (/\d\s*mm\.?$/.test(cell)) mm++;
      else if (/\d\s*(in\.?|inch|inches|"|\u2033)$/.test(cell)) inches++;
    }
  }
  if (mm !== inches) return mm > inches ? 'mm' : 'in';
  const sizeColumn = mapping.size === null ? -1 : headers.indexOf(mapping.size);
  if (sizeColumn >= 0) {
    const values = sample
      .map((row) => Number.parseFloat((row[sizeColumn] ?? '').replace(',', '.')))
      .filter((v) => Number.isFinite(v) && v > 0);
    if (values.length > 0) {
      const small = values.filter((v) => v < 12).length;
      return small * 2 > values.length ? 'in' : 'mm';
    }
  }
  return 'mm';
}

/** Column indexes of a confirmed mapping; refuses missing required fields and unknown column names. */
export function resolveMapping(
  mapping: MappingJson,
  headers: string[],
): Record<MappingFieldName, number | null> {
  const details: { field: string; message: string }[] = [];
  const resolved = {} as Record<MappingFieldName, number | null>;
  const used = new Map<number, MappingFieldName>();
  for (const field of MAPPING_FIELD_NAMES) {
    const name = mapping[field];
    if (name === null || name === undefined) {
      resolved[field] = null;
      if (REQUIRED_MAPPING_FIELDS.includes(field)) {
        details.push({
          field,
          message: `No column holds the ${FIELD_LABELS[field]}; the list needs one (columns found: ${headers.filter((h) => h).join(', ')}).`,
        });
      }
      continue;
    }
    const index = headers.indexOf(name);
    if (index < 0) {
      details.push({ field, message: `There is no column named "${name}" on the header line.` });
      resolved[field] = null;
      continue;
    }
    const other = used.get(index);
    if (other) {
      details.push({
        field,
        message: `Column "${name}" is already used for the ${FIELD_LABELS[other]}.`,
      });
    }
    used.set(index, field);
    resolved[field] = index;
  }
  if (details.length > 0) {
    const missing = details
      .filter((d) => d.message.startsWith('No column'))
      .map((d) => FIELD_LABELS[d.field as MappingFieldName]);
    throw new BadRequest(
      missing.length > 0
        ? `Missing required column: ${missing.join(' and ')}. ${details[0].message}`
        : details[0].message,
      details,
      'missing_column',
    );
  }
  return resolved;
}
