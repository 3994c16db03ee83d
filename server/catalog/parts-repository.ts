// Every Knex query of parts: the list with its levels, one part, its kit components and the
// checks a part's fields need; catalog-repository.ts re-exports these with the rest of the catalog.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { insertRow, lockRow, updateRow } from '../db/rows';
import { pageOf } from '../db/paging';
import type { PartKind } from '../../shared/api/catalog';
import { containsPattern } from '../db/like-pattern';

export interface ComponentRow {
  kit_part_id: string;
  component_part_id: string;
  quantity: number;
  sku: string;
  description: string;
  kind: PartKind;
  on_hand: number;
  held: number;
}

export type PartColumns = Pick<
  PartRow,
  | 'kind'
  | 'sku'
  | 'family_id'
  | 'step_id'
  | 'description'
  | 'material'
  | 'ring_count'
  | 'pin_diameter_nm'
  | 'gtin'
  | 'sale_price'
  | 'reorder_point'
  | 'order_up_to'
  | 'active'
>;

export interface PartRow {
  id: string;
  kind: PartKind;
  sku: string;
  family_id: string | null;
  step_id: string | null;
  description: string;
  material: 'cast' | 'forged' | null;
  ring_count: number | null;
  pin_diameter_nm: number | null;
  gtin: string | null;
  sale_price: string;
  average_cost: string;
  reorder_point: number | null;
  order_up_to: number | null;
  active: boolean;
  created_at: Date;
  updated_at: Date;
  family_code: string | null;
  family_name: string | null;
  standard_bore_nm: number | null;
  step_label: string | null;
  step_offset_nm: number | null;
  on_hand: number;
  held: number;
  bin_id: string | null;
  bin_code: string | null;
}

// ---- Parts ------------------------------------------------------------------------------------

function partBase(k: Knex) {
  return k('parts as p')
    .join('part_levels as pl', 'pl.part_id', 'p.id')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as ss', 'ss.id', 'p.step_id')
    .leftJoin('bins as b', 'b.id', 'pl.bin_id');
}

const PART_COLUMNS = [
  'p.*',
  'f.code as family_code',
  'f.name as family_name',
  'f.standard_bore_nm',
  'ss.label as step_label',
  'ss.offset_nm as step_offset_nm',
  'pl.on_hand',
  'pl.held',
  'pl.bin_id',
  'b.code as bin_code',
];

// A kit's free count follows its components; this SQL form only orders the list, the value shown
// is computed with kitFree from the same levels.
const FREE_SQL = `CASE WHEN p.kind = 'kit' THEN coalesce((
    SELECT min((cl.on_hand - cl.held) / kc.quantity)
      FROM kit_components kc JOIN part_levels cl ON cl.part_id = kc.component_part_id
     WHERE kc.kit_part_id = p.id), 0)
  ELSE pl.on_hand - pl.held END`;

const PART_SORTS: Record<string, string> = {
  sku: 'p.sku',
  description: 'p.description',
  kind: 'p.kind',
  family: 'f.code',
  step: 'ss.offset_nm',
  onHand: 'pl.on_hand',
  salePrice: 'p.sale_price',
};

export async function listParts(
  opts: {
    familyId?: string;
    stepId?: string;
    kind?: PartKind;
    active?: boolean;
    q?: string;
    gtin?: string | null;
    sort?: string;
    dir?: 'asc' | 'desc';
    page: number;
    pageSize: number;
  },
  k: Knex = db,
): Promise<{ rows: PartRow[]; total: number }> {
  const base = partBase(k);
  if (opts.familyId) base.where('p.family_id', opts.familyId);
  if (opts.stepId) base.where('p.step_id', opts.stepId);
  if (opts.kind) base.where('p.kind', opts.kind);
  if (opts.active !== undefined) base.where('p.active', opts.active);
  if (opts.q) {
    const q = opts.q.trim();
    const like = containsPattern(q);
    base.where((w) => {
      w.whereILike('p.sku', like)
        .orWhereILike('p.description', like)
        .orWhereILike('f.code', like)
        // A scanned piston label finds the part the piston belongs to.
        .orWhereIn('p.id', k('piston_units').select('part_id').where('label', q.toUpperCase()));
      if (opts.gtin) w.orWhere('p.gtin', opts.gtin);
    });
  }
  const order = opts.dir === 'desc' ? 'DESC' : 'ASC';
  return pageOf<PartRow>(base, opts, (list) => {
    list.select(PART_COLUMNS);
    if (opts.sort === 'free') return list.orderByRaw(`${FREE_SQL} ${order}, p.sku ASC`);
    if (opts.sort === 'family') {
      return list.orderByRaw(`f.code ${order} NULLS LAST, ss.offset_nm ASC NULLS FIRST, p.sku ASC`);
    }
    const column = PART_SORTS[opts.sort ?? 'sku'] ?? 'p.sku';
    return list.orderByRaw(`${column} ${order} NULLS LAST, p.sku ASC`);
  });
}

export async function findPart(id: string, k: Knex = db): Promise<PartRow | undefined> {
  return (await partBase(k).select(PART_COLUMNS).where('p.id', id).first()) as PartRow | undefined;
}

export function insertPart(k: Knex, columns: PartColumns): Promise<string> {
  return insertRow(k, 'parts', columns);
}

export function updatePart(k: Knex, id: string, columns: Partial<PartColumns>): Promise<void> {
  return updateRow(k, 'parts', id, columns);
}

export function lockPart(k: Knex, id: string): Promise<boolean> {
  return lockRow(k, 'parts', id);
}

export function componentsOf(kitIds: string[], k: Knex = db): Promise<ComponentRow[]> {
  if (kitIds.length === 0) return Promise.resolve([]);
  return k('kit_components as kc')
    .join('parts as c', 'c.id', 'kc.component_part_id')
    .join('part_levels as cl', 'cl.part_id', 'kc.component_part_id')
    .whereIn('kc.kit_part_id', kitIds)
    .select(
      'kc.kit_part_id',
      'kc.component_part_id',
      'kc.quantity',
      'c.sku',
      'c.description',
      'c.kind',
      'cl.on_hand',
      'cl.held',
    )
    .orderBy(['kc.kit_part_id', 'c.sku']) as unknown as Promise<ComponentRow[]>;
}

export async function replaceComponents(
  k: Knex,
  kitId: string,
  components: { partId: string; quantity: number }[],
): Promise<void> {
  await k('kit_components').where({ kit_part_id: kitId }).delete();
  if (components.length === 0) return;
  await k('kit_components').insert(
    components.map((c) => ({
      kit_part_id: kitId,
      component_part_id: c.partId,
      quantity: c.quantity,
    })),
  );
}

export function partsByIds(
  ids: string[],
  k: Knex = db,
): Promise<{ id: string; kind: PartKind; family_id: string | null }[]> {
  if (ids.length === 0) return Promise.resolve([]);
  return k('parts').select('id', 'kind', 'family_id').whereIn('id', ids);
}

/** Kits that contain the part: a kit may not become a component of another kit. */
export async function isComponent(k: Knex, partId: string): Promise<boolean> {
  const row = await k('kit_components')
    .select('kit_part_id')
    .where({ component_part_id: partId })
    .first();
  return Boolean(row);
}
