// Every Knex query of the catalog: step series, engine families, parts, kits, the ladder and the
// exposure list. Rows come out with database names; the service shapes them for the API.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { familyEmptyStepsSql } from '../stock/part-needs-repository';
import type { PartKind } from '../../shared/catalog-api';

export interface SeriesRow {
  id: string;
  code: string;
  name: string;
  unit: 'mm' | 'in';
  custom: boolean;
}

export interface StepRow {
  id: string;
  series_id: string;
  position: number;
  label: string;
  offset_nm: number;
}

export interface FamilyRow {
  id: string;
  code: string;
  name: string;
  stroke_type: 'two' | 'four';
  cylinders: number;
  cooling: 'air' | 'liquid';
  standard_bore_nm: number;
  stroke_nm: number;
  clearance_min_nm: number;
  clearance_max_nm: number;
  hone_allowance_nm: number;
  cleanup_nm: number;
  max_oversize_nm: number;
  step_series_id: string;
  max_taper_nm: number | null;
  max_out_of_round_nm: number | null;
  ring_gap_min_nm: number | null;
  ring_gap_max_nm: number | null;
  forged_clearance_min_nm: number | null;
  forged_clearance_max_nm: number | null;
  ring_gap_per_bore: string;
  hone_crosshatch_deg: string;
  hone_grits: string;
  notes: string;
  active: boolean;
  created_at: Date;
  updated_at: Date;
  series_code: string;
  series_name: string;
  pistons_on_hand: number;
  pistons_free: number;
  empty_steps: number;
}

export type FamilyColumns = Omit<
  FamilyRow,
  | 'id'
  | 'created_at'
  | 'updated_at'
  | 'series_code'
  | 'series_name'
  | 'pistons_on_hand'
  | 'pistons_free'
  | 'empty_steps'
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

/** A LIKE pattern that matches `text` anywhere, with the user's % and _ taken literally. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

// ---- Step series ------------------------------------------------------------------------------

export function listSeries(k: Knex = db): Promise<SeriesRow[]> {
  return k<SeriesRow>('step_series').select('id', 'code', 'name', 'unit', 'custom').orderBy('code');
}

export function findSeries(id: string, k: Knex = db): Promise<SeriesRow | undefined> {
  return k<SeriesRow>('step_series')
    .select('id', 'code', 'name', 'unit', 'custom')
    .where({ id })
    .first();
}

export function stepsOfSeries(seriesIds: string[], k: Knex = db): Promise<StepRow[]> {
  return k<StepRow>('series_steps')
    .select('id', 'series_id', 'position', 'label', 'offset_nm')
    .whereIn('series_id', seriesIds)
    .orderBy(['series_id', 'position']);
}

export function findStep(id: string, k: Knex = db): Promise<StepRow | undefined> {
  return k<StepRow>('series_steps')
    .select('id', 'series_id', 'position', 'label', 'offset_nm')
    .where({ id })
    .first();
}

export async function insertSeries(
  k: Knex,
  series: { code: string; name: string; unit: 'mm' | 'in'; custom: boolean },
  steps: { label: string; offset_nm: number }[],
): Promise<string> {
  const [row] = await k('step_series').insert(series).returning<{ id: string }[]>('id');
  await k('series_steps').insert(
    steps.map((s, position) => ({
      series_id: row.id,
      position,
      label: s.label,
      offset_nm: s.offset_nm,
    })),
  );
  return row.id;
}

// ---- Engine families --------------------------------------------------------------------------

// Per family: pistons on the shelf, free, and steps within the largest oversize that are empty
// (by the one rule every page counts: stock/part-needs).
const FAMILY_STOCK = `LEFT JOIN LATERAL (
    SELECT coalesce(sum(x.on_hand), 0)::int AS pistons_on_hand,
           coalesce(sum(x.free), 0)::int AS pistons_free,
           ${familyEmptyStepsSql('f')} AS empty_steps
      FROM (SELECT ss.id,
                   coalesce(sum(pl.on_hand), 0) AS on_hand,
                   coalesce(sum(pl.on_hand - pl.held), 0) AS free
              FROM series_steps ss
              LEFT JOIN parts p ON p.step_id = ss.id AND p.family_id = f.id AND p.kind = 'piston'
              LEFT JOIN part_levels pl ON pl.part_id = p.id
             WHERE ss.series_id = f.step_series_id AND ss.offset_nm <= f.max_oversize_nm
             GROUP BY ss.id) x
  ) st ON true`;

function familyBase(k: Knex) {
  return k('engine_families as f').join('step_series as s', 's.id', 'f.step_series_id');
}

const FAMILY_SORT_COLUMNS: Record<string, string> = {
  code: 'f.code',
  name: 'f.name',
  standardBore: 'f.standard_bore_nm',
  strokeType: 'f.stroke_type',
};

export async function listFamilies(
  opts: {
    q?: string;
    active?: boolean;
    sort?: string;
    dir?: 'asc' | 'desc';
    page: number;
    pageSize: number;
  },
  k: Knex = db,
): Promise<{ rows: FamilyRow[]; total: number }> {
  const base = familyBase(k);
  if (opts.q) {
    const like = containsPattern(opts.q);
    base.where((w) => w.whereILike('f.code', like).orWhereILike('f.name', like));
  }
  if (opts.active !== undefined) base.where('f.active', opts.active);
  const [{ count }] = await base.clone().count<{ count: number }[]>('* as count');
  const sortColumn = FAMILY_SORT_COLUMNS[opts.sort ?? 'code'] ?? 'f.code';
  const rows = await base
    .clone()
    .select(
      'f.*',
      's.code as series_code',
      's.name as series_name',
      'st.pistons_on_hand',
      'st.pistons_free',
      'st.empty_steps',
    )
    .joinRaw(FAMILY_STOCK)
    .orderBy([
      { column: sortColumn, order: opts.dir ?? 'asc' },
      { column: 'f.code', order: 'asc' },
    ])
    .limit(opts.pageSize)
    .offset((opts.page - 1) * opts.pageSize);
  return { rows: rows as FamilyRow[], total: Number(count) };
}

export async function findFamily(id: string, k: Knex = db): Promise<FamilyRow | undefined> {
  const row = await familyBase(k)
    .select(
      'f.*',
      's.code as series_code',
      's.name as series_name',
      'st.pistons_on_hand',
      'st.pistons_free',
      'st.empty_steps',
    )
    .joinRaw(FAMILY_STOCK)
    .where('f.id', id)
    .first();
  return row as FamilyRow | undefined;
}

export async function insertFamily(k: Knex, columns: FamilyColumns): Promise<string> {
  const [row] = await k('engine_families').insert(columns).returning<{ id: string }[]>('id');
  return row.id;
}

export async function updateFamily(
  k: Knex,
  id: string,
  columns: Partial<FamilyColumns>,
): Promise<void> {
  await k('engine_families')
    .update({ ...columns, updated_at: k.fn.now() })
    .where({ id });
}

export async function lockFamily(k: Knex, id: string): Promise<boolean> {
  const row = await k('engine_families').select('id').where({ id }).forUpdate().first();
  return Boolean(row);
}

/** Parts of the family sized to a step: they tie the family to its step series. */
export async function countSizedParts(k: Knex, familyId: string): Promise<number> {
  const [{ count }] = await k('parts')
    .where({ family_id: familyId })
    .whereNotNull('step_id')
    .count<{ count: number }[]>('* as count');
  return Number(count);
}

// ---- Ladder and exposure ----------------------------------------------------------------------

export function stepsWithin(
  seriesId: string,
  maxOffsetNm: number,
  k: Knex = db,
): Promise<StepRow[]> {
  return k<StepRow>('series_steps')
    .select('id', 'series_id', 'position', 'label', 'offset_nm')
    .where({ series_id: seriesId })
    .andWhere('offset_nm', '<=', maxOffsetNm)
    .orderBy('position');
}

export interface StepLevelsRow {
  step_id: string;
  kind: 'piston' | 'rings';
  on_hand: number;
  held: number;
}

export function familyStepLevels(familyId: string, k: Knex = db): Promise<StepLevelsRow[]> {
  return k('parts as p')
    .join('part_levels as pl', 'pl.part_id', 'p.id')
    .where('p.family_id', familyId)
    .whereIn('p.kind', ['piston', 'rings'])
    .whereNotNull('p.step_id')
    .groupBy('p.step_id', 'p.kind')
    .select(
      'p.step_id',
      'p.kind',
      k.raw('sum(pl.on_hand)::int as on_hand'),
      k.raw('sum(pl.held)::int as held'),
    ) as unknown as Promise<StepLevelsRow[]>;
}

/** What is on order per step, from the purchasing seam parts_on_order(). */
export function familyStepOnOrder(
  familyId: string,
  k: Knex = db,
): Promise<{ step_id: string; kind: 'piston' | 'rings'; quantity: number }[]> {
  return k
    .select('p.step_id', 'p.kind', k.raw('sum(o.quantity)::int as quantity'))
    .from(k.raw('parts_on_order() as o'))
    .join('parts as p', 'p.id', 'o.part_id')
    .where('p.family_id', familyId)
    .whereIn('p.kind', ['piston', 'rings'])
    .groupBy('p.step_id', 'p.kind') as unknown as Promise<
    { step_id: string; kind: 'piston' | 'rings'; quantity: number }[]
  >;
}

export interface LadderUnitRow {
  id: string;
  part_id: string;
  step_id: string;
  label: string;
  skirt_nm: number | null;
  status: 'free' | 'held';
  bin_id: string | null;
  bin_code: string | null;
}

/** The family's pistons on the shelf (free or held), smallest measured first, "to measure" last. */
export function familyShelfUnits(familyId: string, k: Knex = db): Promise<LadderUnitRow[]> {
  return k('piston_units as u')
    .join('parts as p', 'p.id', 'u.part_id')
    .leftJoin('bins as b', 'b.id', 'u.bin_id')
    .where('p.family_id', familyId)
    .whereIn('u.status', ['free', 'held'])
    .select(
      'u.id',
      'u.part_id',
      'p.step_id',
      'u.label',
      'u.skirt_nm',
      'u.status',
      'u.bin_id',
      'b.code as bin_code',
    )
    .orderByRaw('u.skirt_nm ASC NULLS LAST, u.label ASC') as unknown as Promise<LadderUnitRow[]>;
}

export interface KitRow {
  id: string;
  step_id: string | null;
}

export function familyKits(familyId: string, k: Knex = db): Promise<KitRow[]> {
  return k('parts').select('id', 'step_id').where({ family_id: familyId, kind: 'kit' });
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
  const [{ count }] = await base.clone().count<{ count: number }[]>('* as count');
  const order = opts.dir === 'desc' ? 'DESC' : 'ASC';
  const query = base
    .clone()
    .select(PART_COLUMNS)
    .limit(opts.pageSize)
    .offset((opts.page - 1) * opts.pageSize);
  if (opts.sort === 'free') {
    query.orderByRaw(`${FREE_SQL} ${order}, p.sku ASC`);
  } else if (opts.sort === 'family') {
    query.orderByRaw(`f.code ${order} NULLS LAST, ss.offset_nm ASC NULLS FIRST, p.sku ASC`);
  } else {
    const column = PART_SORTS[opts.sort ?? 'sku'] ?? 'p.sku';
    query.orderByRaw(`${column} ${order} NULLS LAST, p.sku ASC`);
  }
  const rows = (await query) as PartRow[];
  return { rows, total: Number(count) };
}

export async function findPart(id: string, k: Knex = db): Promise<PartRow | undefined> {
  return (await partBase(k).select(PART_COLUMNS).where('p.id', id).first()) as PartRow | undefined;
}

export async function insertPart(k: Knex, columns: PartColumns): Promise<string> {
  const [row] = await k('parts').insert(columns).returning<{ id: string }[]>('id');
  return row.id;
}

export async function updatePart(
  k: Knex,
  id: string,
  columns: Partial<PartColumns>,
): Promise<void> {
  await k('parts')
    .update({ ...columns, updated_at: k.fn.now() })
    .where({ id });
}

export async function lockPart(k: Knex, id: string): Promise<boolean> {
  const row = await k('parts').select('id').where({ id }).forUpdate().first();
  return Boolean(row);
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
