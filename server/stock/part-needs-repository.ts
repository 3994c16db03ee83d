// The one place the server asks what is free at a step, which steps are empty and which jobs wait
// for parts. Every page that counts them (the job bench and its filter, a job's card, the step
// ladder, a family's empty steps, Empty steps, Ran short) reads the two views the part-needs
// migration defines through the fragments and queries here, so the counts cannot disagree.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { orderedParts, type NeededPart } from '../../shared/part-needs';

/**
 * SQL: true when some cylinder of the job `alias` waits for a piston or a ring set. Closed jobs
 * and cut cylinders never wait (the view leaves them out).
 */
export function waitingSql(alias: string): string {
  return `EXISTS (SELECT 1 FROM cylinder_part_needs cpn
                   WHERE cpn.job_id = ${alias}.id AND (cpn.waiting_piston OR cpn.waiting_rings))`;
}

/** SQL: the parts the job `alias` waits for, as a text array ('piston', 'rings'); empty if none. */
export function waitingForSql(alias: string): string {
  return `ARRAY(SELECT p FROM (
            SELECT 'piston' AS p, 1 AS o WHERE EXISTS (SELECT 1 FROM cylinder_part_needs cpn
              WHERE cpn.job_id = ${alias}.id AND cpn.waiting_piston)
            UNION ALL
            SELECT 'rings', 2 WHERE EXISTS (SELECT 1 FROM cylinder_part_needs cpn
              WHERE cpn.job_id = ${alias}.id AND cpn.waiting_rings)) w ORDER BY o)`;
}

/** SQL: a step row of step_free_parts `alias` is empty (no free piston or no free ring set). */
export function emptyStepSql(alias: string): string {
  return `(${alias}.within_oversize AND (${alias}.pistons_free = 0 OR ${alias}.rings_free = 0))`;
}

/** What a step lacks, from a step_free_parts row. */
export function missingAtStep(row: { pistons_free: number; rings_free: number }): NeededPart[] {
  return orderedParts([
    ...(row.pistons_free === 0 ? ['piston'] : []),
    ...(row.rings_free === 0 ? ['rings'] : []),
  ]);
}

export interface StepFreeRow {
  family_id: string;
  step_id: string;
  position: number;
  label: string;
  offset_nm: number;
  within_oversize: boolean;
  pistons_free: number;
  pistons_to_measure: number;
  rings_free: number;
}

/** Free pistons and ring sets at each step of a family, within its largest oversize. */
export function familyStepFree(familyId: string, k: Knex = db): Promise<StepFreeRow[]> {
  return k<StepFreeRow>('step_free_parts')
    .where({ family_id: familyId, within_oversize: true })
    .orderBy('position')
    .select('*');
}

export interface EmptyStepRow extends StepFreeRow {
  family_code: string;
  family_name: string;
  standard_bore_nm: number;
  piston_parts: number;
  pistons_on_hand: number;
  pistons_held: number;
  issued: number;
}

/**
 * Every step within an active family's largest oversize that lacks a free piston or a free ring
 * set, the steps issued most often first (inactive families are left out: the shop no longer
 * works on them).
 */
export async function emptySteps(
  /** like: an ILIKE pattern on the family code or name (catalog-repository's containsPattern). */
  opts: { like?: string; familyId?: string; page: number; pageSize: number },
  k: Knex = db,
): Promise<{ rows: EmptyStepRow[]; total: number }> {
  const params: unknown[] = [];
  let where = `f.active AND ${emptyStepSql('s')}`;
  if (opts.like) {
    where += ' AND (f.code ILIKE ? OR f.name ILIKE ?)';
    params.push(opts.like, opts.like);
  }
  if (opts.familyId) {
    where += ' AND f.id = ?';
    params.push(opts.familyId);
  }
  const sql = `
    SELECT s.*, f.code AS family_code, f.name AS family_name, f.standard_bore_nm,
           pp.piston_parts, pp.pistons_on_hand, pp.pistons_held,
           coalesce(a.issued, 0)::int AS issued, count(*) OVER () AS total
      FROM step_free_parts s
      JOIN engine_families f ON f.id = s.family_id
      LEFT JOIN LATERAL (
        SELECT count(p.id)::int AS piston_parts,
               coalesce(sum(pl.on_hand), 0)::int AS pistons_on_hand,
               coalesce(sum(pl.held), 0)::int AS pistons_held
          FROM parts p JOIN part_levels pl ON pl.part_id = p.id
         WHERE p.family_id = s.family_id AND p.step_id = s.step_id AND p.kind = 'piston') pp ON true
      LEFT JOIN LATERAL (
        SELECT count(*)::int AS issued
          FROM stock_ledger l JOIN parts p ON p.id = l.part_id AND p.kind = 'piston'
         WHERE l.kind = 'issue' AND p.family_id = s.family_id AND p.step_id = s.step_id) a ON true
     WHERE ${where}
     ORDER BY coalesce(a.issued, 0) DESC, f.code ASC, s.position ASC
     LIMIT ? OFFSET ?`;
  params.push(opts.pageSize, (opts.page - 1) * opts.pageSize);
  const result = await k.raw<{ rows: (EmptyStepRow & { total: number })[] }>(sql, params as never);
  let total = result.rows[0]?.total ?? 0;
  if (result.rows.length === 0 && opts.page > 1) {
    // Past the last page: count on its own so the paginator still shows the right total.
    total = (await emptySteps({ ...opts, page: 1, pageSize: 1 }, k)).total;
  }
  return { rows: result.rows, total: Number(total) };
}

/** SQL: per family `alias`, how many steps within its largest oversize are empty. */
export function familyEmptyStepsSql(alias: string): string {
  return `(SELECT count(*) FROM step_free_parts s
            WHERE s.family_id = ${alias}.id AND ${emptyStepSql('s')})::int`;
}

/** Jobs waiting now at each (family, step), and for which parts: Ran short's "still waiting". */
export async function waitingByStep(
  k: Knex = db,
): Promise<{ family_id: string; step_id: string; jobs: number; parts: NeededPart[] }[]> {
  const result = await k.raw<{
    rows: { family_id: string; step_id: string; jobs: number; parts: string[] }[];
  }>(`
    SELECT family_id, step_id, count(DISTINCT job_id)::int AS jobs,
           array_remove(ARRAY[CASE WHEN bool_or(waiting_piston) THEN 'piston' END,
                              CASE WHEN bool_or(waiting_rings) THEN 'rings' END], NULL) AS parts
      FROM cylinder_part_needs
     WHERE waiting_piston OR waiting_rings
     GROUP BY family_id, step_id`);
  return result.rows.map((r) => ({ ...r, parts: orderedParts(r.parts) }));
}
