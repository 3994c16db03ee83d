// The only file building queries for the home page's own lists (the others reuse their features).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { OPEN_STATES, type JobState } from '../../shared/api/jobs';

export interface HomeJobRow {
  id: string;
  number: string;
  state: JobState;
  customer_name: string;
  family_code: string;
  due_date: string | null;
  overdue: boolean;
}

function openJobs(k: Knex, today: string) {
  return k('jobs as j')
    .join('engine_families as f', 'f.id', 'j.family_id')
    .whereIn('j.state', [...OPEN_STATES])
    .select(
      'j.id',
      'j.number',
      'j.state',
      'j.customer_name',
      'f.code as family_code',
      k.raw(`to_char(j.due_date, 'YYYY-MM-DD') AS due_date`),
      k.raw(`(j.due_date IS NOT NULL AND j.due_date < ?::date) AS overdue`, [today]),
    );
}

async function page(
  k: Knex,
  q: Knex.QueryBuilder,
  limit: number,
): Promise<{ rows: HomeJobRow[]; total: number }> {
  const [{ count }] = await k
    .from(q.clone().clearSelect().clearOrder().select('j.id').as('x'))
    .count<{ count: number }[]>('* as count');
  const rows = (await q.clone().limit(limit)) as HomeJobRow[];
  return { rows, total: Number(count) };
}

/** Open jobs due on `today` or before it, the oldest due date first. */
export function jobsDueBy(today: string, limit: number, k: Knex = db) {
  const q = openJobs(k, today)
    .where('j.due_date', '<=', today)
    .orderBy([{ column: 'j.due_date' }, { column: 'j.number' }]);
  return page(k, q, limit);
}

/** Open jobs whose estimate is with the customer, unanswered; the longest waiting first. */
export function jobsAwaitingApproval(today: string, limit: number, k: Knex = db) {
  const q = openJobs(k, today)
    .join('estimates as e', 'e.job_id', 'j.id')
    .where('e.state', 'sent')
    .orderBy([{ column: 'e.sent_at' }, { column: 'j.number' }]);
  return page(k, q, limit);
}
