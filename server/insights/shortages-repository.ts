// Ran short: the record of steps asked for when a piston or a ring set was not free, and the jobs
// waiting now. "Waiting now" is the one rule every page counts (stock/part-needs), so Ran short
// and the job bench's "waiting for parts" filter name the same jobs.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { orderedParts, type NeededPart } from '../../shared/part-needs';

export interface ExposureDb {
  family_id: string;
  step_id: string;
  times_short: number;
  jobs_waited: number;
  days_waited: string;
  still_waiting: number;
  /** Parts that ran short at this step in the period, piston first. */
  parts_short: NeededPart[];
  /** Parts the jobs still waiting at this step wait for now. */
  waiting_for: NeededPart[];
  last_short_at: Date | null;
  family_code: string;
  family_name: string;
  step_label: string;
  step_position: number;
}

/**
 * Steps asked for when a part was not free over the last :months months, and the waiting it
 * caused. A job's wait at a shortage ends at the first hold of that part (piston or ring set) for
 * that cylinder afterwards (at any step: the shop may have gone one step up), or when the job
 * closed; otherwise it goes on now. Jobs waiting now are those the part-needs view says wait; a
 * step where a job waits without a recorded shortage (its piston was taken by another job after
 * the step was chosen) is listed too, so no waiting job is missing here.
 */
export async function exposure(months: number, k: Knex = db): Promise<ExposureDb[]> {
  const result = await k.raw<{ rows: (ExposureDb & { parts_short: string[] })[] }>(
    `
    WITH s AS (
      SELECT sh.id, sh.at, sh.family_id, sh.step_id, sh.job_id, sh.cylinder, sh.part, j.closed_at
        FROM step_shortages sh
        LEFT JOIN jobs j ON j.id = sh.job_id
       WHERE sh.at >= now() - make_interval(months => :months)
    ), waits AS (
      SELECT s.*, h.first_at,
             CASE WHEN s.job_id IS NOT NULL
                  THEN coalesce(h.first_at, s.closed_at, now()) END AS ended_at
        FROM s
        LEFT JOIN LATERAL (
          SELECT min(hd.created_at) AS first_at
            FROM holds hd
            JOIN parts p ON p.id = hd.part_id AND p.kind = s.part
           WHERE hd.job_id = s.job_id
             AND (s.cylinder IS NULL OR hd.cylinder = s.cylinder)
             AND hd.created_at >= s.at) h ON s.job_id IS NOT NULL
    ), per_step AS (
      SELECT w.family_id, w.step_id, count(*)::int AS times_short,
             array_remove(array_agg(DISTINCT w.job_id), NULL) AS job_ids,
             coalesce(sum(extract(epoch FROM greatest(w.ended_at - w.at, interval '0'))), 0)
               / 86400 AS days,
             array_agg(DISTINCT w.part) AS parts_short,
             max(w.at) AS last_short_at
        FROM waits w
       GROUP BY w.family_id, w.step_id
    ), now_waiting AS (
      SELECT n.family_id, n.step_id, array_agg(DISTINCT n.job_id) AS job_ids,
             array_remove(ARRAY[CASE WHEN bool_or(n.waiting_piston) THEN 'piston' END,
                                CASE WHEN bool_or(n.waiting_rings) THEN 'rings' END], NULL)
               AS waiting_for
        FROM cylinder_part_needs n
       WHERE n.waiting_piston OR n.waiting_rings
       GROUP BY n.family_id, n.step_id
    ), joined AS (
      SELECT coalesce(ps.family_id, nw.family_id) AS family_id,
             coalesce(ps.step_id, nw.step_id) AS step_id,
             coalesce(ps.times_short, 0) AS times_short,
             cardinality(ARRAY(SELECT DISTINCT x FROM unnest(
               coalesce(ps.job_ids, '{}') || coalesce(nw.job_ids, '{}')) x)) AS jobs_waited,
             coalesce(ps.days, 0) AS days,
             coalesce(cardinality(nw.job_ids), 0) AS still_waiting,
             coalesce(ps.parts_short, '{}') || coalesce(nw.waiting_for, '{}') AS parts_short,
             coalesce(nw.waiting_for, '{}') AS waiting_for,
             ps.last_short_at
        FROM per_step ps
        FULL JOIN now_waiting nw ON nw.family_id = ps.family_id AND nw.step_id = ps.step_id
    )
    SELECT js.family_id, js.step_id, js.times_short, js.jobs_waited::int,
           round(js.days::numeric, 1) AS days_waited, js.still_waiting::int, js.parts_short,
           js.waiting_for, js.last_short_at,
           ef.code AS family_code, ef.name AS family_name,
           ss.label AS step_label, ss.position AS step_position
      FROM joined js
      JOIN engine_families ef ON ef.id = js.family_id
      JOIN series_steps ss ON ss.id = js.step_id
     ORDER BY js.times_short DESC, js.days DESC, ef.code, ss.position
    `,
    { months },
  );
  return result.rows.map((r) => ({
    ...r,
    parts_short: orderedParts(r.parts_short),
    waiting_for: orderedParts(r.waiting_for),
  }));
}

/** Open jobs with some cylinder waiting for a piston or a ring set now, each job once. */
export async function jobsWaitingNow(k: Knex = db): Promise<number> {
  const [row] = await k('cylinder_part_needs')
    .where((w) => w.where('waiting_piston', true).orWhere('waiting_rings', true))
    .countDistinct<{ n: number }[]>('job_id as n');
  return Number(row.n);
}

export interface ShortageInsert {
  family_id: string;
  step_id: string;
  job_id: string | null;
  cylinder: number | null;
  source: 'hold' | 'counter';
  part: NeededPart;
  user_id: string | null;
}

/** Adds a shortage; a job's cylinder already recorded short of that part at that step is left. */
export async function insertShortage(row: ShortageInsert, k: Knex = db): Promise<boolean> {
  const result = await k.raw<{ rowCount: number }>(
    `INSERT INTO step_shortages (family_id, step_id, job_id, cylinder, source, part, user_id)
     VALUES (:family_id, :step_id, :job_id, :cylinder, :source, :part, :user_id)
     ON CONFLICT DO NOTHING`,
    { ...row },
  );
  return result.rowCount === 1;
}
