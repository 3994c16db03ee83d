// The queries behind taking back a cut: who marked it and when, and clearing the mark.
import type { Knex } from 'knex';

export interface CutRow {
  cut_at: Date | null;
  cut_by: string | null;
  cut_by_name: string | null;
  measured_after_hone_nm: string | number | null;
  ring_gap_nm: string | number | null;
  cleanup_override_reason: string | null;
}

export async function cutOf(k: Knex, jobId: string, n: number): Promise<CutRow | undefined> {
  return k('job_cylinders as c')
    .leftJoin('users as u', 'u.id', 'c.cut_by')
    .select(
      'c.cut_at',
      'c.cut_by',
      'u.name as cut_by_name',
      'c.measured_after_hone_nm',
      'c.ring_gap_nm',
      'c.cleanup_override_reason',
    )
    .where({ 'c.job_id': jobId, 'c.n': n })
    .first();
}

/** The mark and the reason to cut though the bore did not clean up go together. */
export async function clearCut(trx: Knex, jobId: string, n: number): Promise<void> {
  await trx('job_cylinders')
    .update({
      cut_at: null,
      cut_by: null,
      cleanup_override_reason: null,
      cleanup_override_by: null,
      cleanup_override_at: null,
    })
    .where({ job_id: jobId, n });
}

export async function cutCount(trx: Knex, jobId: string): Promise<number> {
  const row = await trx('job_cylinders')
    .where({ job_id: jobId })
    .whereNotNull('cut_at')
    .count<{ count: string }[]>('* as count')
    .first();
  return Number(row?.count ?? 0);
}
