// Every Knex query of the catalog: step series, engine families, parts, kits, the ladder and the
// exposure list. Rows come out with database names; the service shapes them for the API.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { familyEmptyStepsSql } from '../stock/part-needs-repository';
import { containsPattern } from '../db/like-pattern';
export * from './parts-repository';

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

/**
 * The family's pistons on the shelf (free or held), at most `perStep` of each step: the measured
 * free ones nearest the step's nominal bore first, then those still to measure, then held ones;
 * with how many the step has in all. Shown smallest measured first, "to measure" last. A family
 * can hold thousands of pistons; the ladder shows a handful per step and pages the rest.
 */
export async function familyShelfUnits(
  familyId: string,
  perStep: number,
  k: Knex = db,
): Promise<(LadderUnitRow & { step_total: number })[]> {
  const result = await k.raw<{ rows: (LadderUnitRow & { step_total: number })[] }>(
    `SELECT id, part_id, step_id, label, skirt_nm, status, bin_id, bin_code, step_total
       FROM (SELECT u.id, u.part_id, p.step_id, u.label, u.skirt_nm, u.status, u.bin_id,
                    b.code AS bin_code,
                    count(*) OVER (PARTITION BY p.step_id)::int AS step_total,
                    row_number() OVER (
                      PARTITION BY p.step_id
                      ORDER BY u.status = 'held', u.skirt_nm IS NULL,
                               abs(u.skirt_nm::bigint - (f.standard_bore_nm + s.offset_nm)), u.label
                    ) AS nearness
               FROM piston_units u
               JOIN parts p ON p.id = u.part_id
               JOIN engine_families f ON f.id = p.family_id
               JOIN series_steps s ON s.id = p.step_id
               LEFT JOIN bins b ON b.id = u.bin_id
              WHERE p.family_id = :familyId AND u.status IN ('free', 'held')) shelf
      WHERE nearness <= :perStep
      ORDER BY skirt_nm ASC NULLS LAST, label ASC`,
    { familyId, perStep },
  );
  return result.rows;
}

/** One step's pistons on the shelf, a page at a time, in the ladder's order. */
export async function stepShelfUnits(
  familyId: string,
  stepId: string,
  page: { page: number; pageSize: number },
  k: Knex = db,
): Promise<{ rows: LadderUnitRow[]; total: number }> {
  const base = k('piston_units as u')
    .join('parts as p', 'p.id', 'u.part_id')
    .where({ 'p.family_id': familyId, 'p.step_id': stepId })
    .whereIn('u.status', ['free', 'held']);
  const [rows, count] = await Promise.all([
    base
      .clone()
      .leftJoin('bins as b', 'b.id', 'u.bin_id')
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
      .orderByRaw('u.skirt_nm ASC NULLS LAST, u.label ASC')
      .limit(page.pageSize)
      .offset((page.page - 1) * page.pageSize),
    base.clone().count<{ n: string }[]>('* as n'),
  ]);
  return { rows: rows as LadderUnitRow[], total: Number(count[0]?.n ?? 0) };
}

export interface KitRow {
  id: string;
  step_id: string | null;
}

export function familyKits(familyId: string, k: Knex = db): Promise<KitRow[]> {
  return k('parts').select('id', 'step_id').where({ family_id: familyId, kind: 'kit' });
}
