// The queries of placing a hold, a round trip each: the job locked, then what the hold rules and
// the answer need read in one statement, then every write in one statement (the stock half from
// stock-movements.ts, the job's half here). The read comes after the lock, as a statement of its
// own, so it sees whatever an earlier holder of the job's lock committed. Each is a named
// (prepared) statement: PostgreSQL parses and plans it once per connection instead of on every
// hold, which for these joins and CTEs costs more than running them. The job's other cylinders are
// read by the job's key alone and their steps counted in the FILTER: with a step test in the WHERE
// the planner may walk the index of every cylinder with a step instead (it did at the bench, on
// statistics taken before most cylinders had one), more of them with each hold.
import type { Knex } from 'knex';
import type { JobState } from '../../shared/api/jobs';
import type { PartKind } from '../../shared/api/catalog';
import type { SqlPart } from '../stock/stock-movements';

/** The job columns placing a hold needs. */
export interface HoldJobRow {
  id: string;
  number: string;
  family_id: string;
  cylinders: number;
  state: JobState;
}

/**
 * Locks the job row: 'change' (FOR NO KEY UPDATE) to hold for it and move its state, 'share'
 * (FOR SHARE) to add to it while nobody closes it.
 */
export async function lockJobForHolds(
  trx: Knex,
  id: string,
  mode: 'change' | 'share',
): Promise<HoldJobRow | undefined> {
  const lock = mode === 'change' ? 'FOR NO KEY UPDATE' : 'FOR SHARE';
  const { rows } = await trx
    .raw<{ rows: HoldJobRow[] }>(
      `SELECT id, number, family_id, cylinders, state FROM jobs WHERE id = ? ${lock}`,
      [id],
    )
    .options({ name: `holds.lock-job.${mode}` });
  return rows[0];
}

/** The cylinder a hold is for, the job's other cylinders, the shop's settings and the part asked for. */
export interface HoldPlaceRow {
  n: number;
  cut: boolean;
  chosen_step_id: string | null;
  chosen_step_label: string | null;
  /** The shop's stored settings (defaults fill the rest). */
  settings: Record<string, unknown> | null;
  /** The piston this cylinder already has held, if any. */
  piston_hold_unit_id: string | null;
  /** The job's other cylinders that have a step to bore to, and of those, how many lack a held piston. */
  others_to_bore: number;
  others_without_piston: number;
  /** The piston unit asked for (null when none was, or it does not exist). */
  unit_id: string | null;
  unit_label: string | null;
  unit_status: 'free' | 'held' | 'issued' | 'returned' | 'scrapped' | null;
  skirt_nm: number | null;
  /** The unit's part, or the counted part asked for (null when it does not exist). */
  part_id: string | null;
  kind: PartKind | null;
  sku: string | null;
  description: string | null;
  family_id: string | null;
  step_id: string | null;
  step_label: string | null;
  material: string | null;
  /** A piston's own bin; counted parts sit in the part's bin. */
  bin_code: string | null;
}

/** Everything placing a hold reads, in one statement; undefined when the job has no such cylinder. */
export async function readHoldPlace(
  trx: Knex,
  q: { jobId: string; cylinder: number; unitId: string | null; partId: string | null },
): Promise<HoldPlaceRow | undefined> {
  const { rows } = await trx
    .raw<{ rows: HoldPlaceRow[] }>(
      `SELECT c.n, c.cut_at IS NOT NULL AS cut, c.chosen_step_id, cs.label AS chosen_step_label,
            (SELECT value FROM settings WHERE key = 'shop') AS settings,
            ph.unit_id AS piston_hold_unit_id,
            o.to_bore::int AS others_to_bore, o.without_piston::int AS others_without_piston,
            u.id AS unit_id, u.label AS unit_label, u.status AS unit_status, u.skirt_nm,
            p.id AS part_id, p.kind, p.sku, p.description, p.family_id, p.step_id,
            s.label AS step_label, p.material, b.code AS bin_code
       FROM job_cylinders c
       LEFT JOIN series_steps cs ON cs.id = c.chosen_step_id
       LEFT JOIN LATERAL (
         SELECT h.unit_id FROM holds h
          WHERE h.job_id = c.job_id AND h.cylinder = c.n
            AND h.unit_id IS NOT NULL AND h.released_at IS NULL
          LIMIT 1) ph ON true
       CROSS JOIN LATERAL (
         SELECT count(*) FILTER (WHERE oc.chosen_step_id IS NOT NULL) AS to_bore,
                count(*) FILTER (WHERE oc.chosen_step_id IS NOT NULL AND NOT EXISTS (
                  SELECT 1 FROM holds h
                   WHERE h.job_id = oc.job_id AND h.cylinder = oc.n
                     AND h.unit_id IS NOT NULL AND h.released_at IS NULL)) AS without_piston
           FROM job_cylinders oc
          WHERE oc.job_id = c.job_id AND oc.n <> c.n) o
       LEFT JOIN piston_units u ON u.id = :unitId
       LEFT JOIN parts p ON p.id = coalesce(u.part_id, :partId)
       LEFT JOIN series_steps s ON s.id = p.step_id
       LEFT JOIN part_levels pl ON pl.part_id = p.id AND u.id IS NULL
       LEFT JOIN bins b ON b.id = CASE WHEN u.id IS NULL THEN pl.bin_id ELSE u.bin_id END
      WHERE c.job_id = :jobId AND c.n = :cylinder`,
      q,
    )
    .options({ name: 'holds.read-place' });
  return rows[0];
}

/** The job's half of a hold: the notes, the audit row, and what the hold settles on the job. */
export interface HoldNotes {
  jobId: string;
  cylinder: number;
  holdId: string;
  userId: string | null;
  /** The step a piston settles for a cylinder that had none. */
  settleStepId: string | null;
  /** The note on the job. */
  text: string;
  /** The audit row's `after`. */
  audit: Record<string, unknown>;
  /** The job's move forward when this hold gives it every piston it needs, with its note. */
  advance: { state: JobState; text: string } | null;
}

/**
 * Every write of a hold as one statement: the stock half (which defines `hold` and `levels`) and,
 * only when `hold` wrote its row, the cylinder's step, the notes, the audit row and the job's
 * state. Null when nothing was written (the unit was no longer free, or too few were free).
 */
export async function writeHold(
  trx: Knex,
  stock: SqlPart,
  notes: HoldNotes,
): Promise<{ createdAt: Date; levelRows: number } | null> {
  const ctes = [stock.sql];
  if (notes.settleStepId) {
    ctes.push(`step AS (
       UPDATE job_cylinders SET chosen_step_id = :settleStepId
        WHERE job_id = :jobId AND n = :cylinder AND EXISTS (SELECT 1 FROM hold)
     )`);
  }
  if (notes.advance) {
    ctes.push(`state AS (
       UPDATE jobs SET state = :toState, state_changed_at = now(), updated_at = now(), closed_at = NULL
        WHERE id = :jobId AND EXISTS (SELECT 1 FROM hold)
     )`);
  }
  // The hold's note, then the state's, in that order (the job's notes read newest first).
  ctes.push(`notes AS (
       INSERT INTO job_events (job_id, user_id, kind, text)
       SELECT :jobId, :userId, e.kind, e.text
         FROM (VALUES (1, 'hold', :text)${notes.advance ? `, (2, 'state', :stateText)` : ''}) AS e (ord, kind, text)
        WHERE EXISTS (SELECT 1 FROM hold)
        ORDER BY e.ord
     ), audit AS (
       INSERT INTO audit_events (user_id, action, entity, entity_id, after)
       SELECT :userId, 'hold.create', 'hold', :holdId, :audit FROM hold
     )`);
  // One name per shape of the statement (its text must not change under a name).
  const name = `holds.write.${stock.name}${notes.settleStepId ? '.step' : ''}${notes.advance ? '.state' : ''}`;
  const { rows } = await trx
    .raw<{ rows: { created_at: Date | null; level_rows: number }[] }>(
      `WITH ${ctes.join(', ')}
     SELECT (SELECT created_at FROM hold) AS created_at, (SELECT count(*) FROM levels)::int AS level_rows`,
      {
        ...stock.bindings,
        jobId: notes.jobId,
        cylinder: notes.cylinder,
        holdId: notes.holdId,
        userId: notes.userId,
        text: notes.text.slice(0, 2000),
        audit: JSON.stringify(notes.audit),
        ...(notes.settleStepId ? { settleStepId: notes.settleStepId } : {}),
        ...(notes.advance
          ? { toState: notes.advance.state, stateText: notes.advance.text.slice(0, 2000) }
          : {}),
      },
    )
    .options({ name });
  const row = rows[0];
  if (!row?.created_at) return null;
  return { createdAt: row.created_at, levelRows: row.level_rows };
}
