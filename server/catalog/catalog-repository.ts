// Every Knex query of the catalog: step series, engine families, parts, kits, the ladder and the
// exposure list. Rows come out with database names; the service shapes them for the API.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { insertRow, lockRow, updateRow } from '../db/rows';
import { pageOf } from '../db/paging';
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

/** A row of engine_families as stored. */
export interface EngineFamilyRow {
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
  /** Ring end gap per unit of bore, exact decimal text ("0.00400"). */
  ring_gap_per_bore: string;
  hone_crosshatch_deg: string;
  hone_grits: string;
  notes: string;
  active: boolean;
  created_at: Date;
  updated_at: Date;
}

/** A family as the catalog lists it: with its step series and how its steps stand in stock. */
export interface FamilyRow extends EngineFamilyRow {
  series_code: string;
  series_name: string;
  pistons_on_hand: number;
  pistons_free: number;
  empty_steps: number;
}

export type FamilyColumns = Omit<EngineFamilyRow, 'id' | 'created_at' | 'updated_at'>;

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
  const seriesId = await insertRow(k, 'step_series', series);
  await k('series_steps').insert(
    steps.map((s, position) => ({
      series_id: seriesId,
      position,
      label: s.label,
      offset_nm: s.offset_nm,
    })),
  );
  return seriesId;
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

export interface FamilyListQuery {
  q?: string;
  active?: boolean;
  sort?: string;
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

/** A family's own columns, its series' code and name, and how its steps stand in stock. */
function familyListed(query: Knex.QueryBuilder) {
  return query
    .select(
      'f.*',
      's.code as series_code',
      's.name as series_name',
      'st.pistons_on_hand',
      'st.pistons_free',
      'st.empty_steps',
    )
    .joinRaw(FAMILY_STOCK);
}

export async function listFamilies(
  opts: FamilyListQuery,
  k: Knex = db,
): Promise<{ rows: FamilyRow[]; total: number }> {
  const base = familyBase(k);
  if (opts.q) {
    const like = containsPattern(opts.q);
    base.where((w) => w.whereILike('f.code', like).orWhereILike('f.name', like));
  }
  if (opts.active !== undefined) base.where('f.active', opts.active);
  const sortColumn = FAMILY_SORT_COLUMNS[opts.sort ?? 'code'] ?? 'f.code';
  return pageOf<FamilyRow>(base, opts, (list) =>
    familyListed(list).orderBy([
      { column: sortColumn, order: opts.dir ?? 'asc' },
      { column: 'f.code', order: 'asc' },
    ]),
  );
}

export async function findFamily(id: string, k: Knex = db): Promise<FamilyRow | undefined> {
  const row = await familyListed(familyBase(k)).where('f.id', id).first();
  return row as FamilyRow | undefined;
}

export function insertFamily(k: Knex, columns: FamilyColumns): Promise<string> {
  return insertRow(k, 'engine_families', columns);
}

export function updateFamily(k: Knex, id: string, columns: Partial<FamilyColumns>): Promise<void> {
  return updateRow(k, 'engine_families', id, columns);
}

export function lockFamily(k: Knex, id: string): Promise<boolean> {
  return lockRow(k, 'engine_families', id);
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

/** The columns of a ladder unit, from piston_units `u`. */
const UNIT_COLUMNS = 'u.id, u.part_id, u.label, u.skirt_nm, u.status, u.bin_id';

/**
 * The family's pistons on the shelf (free or held), at most `perStep` of each step: the measured
 * free ones nearest the step's nominal bore first, then those still to measure, then held ones.
 * Shown smallest measured first, "to measure" last. A family can hold thousands of pistons; the
 * ladder shows a handful per step (the step's count of them all is its pistons' on hand) and pages
 * the rest.
 *
 * Each part's candidates are read from its indexes, never its whole shelf: the `perStep` nearest
 * at or above the nominal bore (skirt, then label, ascending) and the `perStep` nearest below it
 * (skirt descending, label ascending), which between them hold every free measured piston that can
 * rank among the nearest `perStep` (any piston ranked before one of them on its side is nearer, or
 * as near with a smaller label); then the first `perStep` to measure and the first `perStep` held.
 */
export async function familyShelfUnits(
  familyId: string,
  perStep: number,
  k: Knex = db,
): Promise<LadderUnitRow[]> {
  const result = await k.raw<{ rows: LadderUnitRow[] }>(
    `WITH family_parts AS (
       SELECT p.id, p.step_id, (f.standard_bore_nm + s.offset_nm)::bigint AS nominal
         FROM parts p
         JOIN engine_families f ON f.id = p.family_id
         JOIN series_steps s ON s.id = p.step_id
        WHERE p.family_id = :familyId
     ), candidates AS (
       SELECT fp.step_id, fp.nominal, c.*
         FROM family_parts fp
        CROSS JOIN LATERAL (
          (SELECT ${UNIT_COLUMNS} FROM piston_units u
            WHERE u.part_id = fp.id AND u.status = 'free' AND u.skirt_nm >= fp.nominal
            ORDER BY u.skirt_nm, u.label LIMIT :perStep)
          UNION ALL
          (SELECT ${UNIT_COLUMNS} FROM piston_units u
            WHERE u.part_id = fp.id AND u.status = 'free' AND u.skirt_nm < fp.nominal
            ORDER BY u.skirt_nm DESC, u.label LIMIT :perStep)
          UNION ALL
          (SELECT ${UNIT_COLUMNS} FROM piston_units u
            WHERE u.part_id = fp.id AND u.status = 'free' AND u.skirt_nm IS NULL
            ORDER BY u.label LIMIT :perStep)
          UNION ALL
          (SELECT ${UNIT_COLUMNS} FROM piston_units u
            WHERE u.part_id = fp.id AND u.status = 'held'
            ORDER BY u.skirt_nm IS NULL, abs(u.skirt_nm::bigint - fp.nominal), u.label
            LIMIT :perStep)) c
     ), shelf AS (
       SELECT c.*, row_number() OVER (
                PARTITION BY c.step_id
                ORDER BY c.status = 'held', c.skirt_nm IS NULL, abs(c.skirt_nm::bigint - c.nominal),
                         c.label
              ) AS nearness
         FROM candidates c
     )
     SELECT shelf.id, shelf.part_id, shelf.step_id, shelf.label, shelf.skirt_nm, shelf.status,
            shelf.bin_id, b.code AS bin_code
       FROM shelf LEFT JOIN bins b ON b.id = shelf.bin_id
      WHERE nearness <= :perStep
      ORDER BY shelf.skirt_nm ASC NULLS LAST, shelf.label ASC`,
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
