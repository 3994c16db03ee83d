// Every Knex query of jobs: the job, its cylinders and readings, its notes and photos. Writers take
// the caller's transaction. A job row is locked FOR NO KEY UPDATE by whoever may change its state
// (a state change, readings, a hold, a cut, collect, cancel) and FOR SHARE by whoever only needs it
// to stay open (moving a hold, adding a photo), so nothing lands on a job that is being closed; NO
// KEY keeps inserts that merely reference the job (notes, ledger rows) from waiting on it.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { updateRow } from '../db/rows';
import { pageOf } from '../db/paging';
import { containsPattern } from '../db/like-pattern';
import { OPEN_STATES, type JobState } from '../../shared/api/jobs';
import type { NeededPart } from '../../shared/part-needs';
import { waitingForSql, waitingSql } from '../stock/part-needs-repository';
import type { EngineFamilyRow } from '../catalog/catalog-repository';
export * from './job-records-repository';

export interface JobRow {
  id: string;
  number: string;
  customer_id: string;
  customer_name: string;
  customer_phone: string | null;
  customer_email: string | null;
  family_id: string;
  cylinders: number;
  asked_for: string;
  due_date: string | null;
  notes: string;
  state: JobState;
  notify_customer: boolean;
  created_by: string | null;
  created_by_name: string | null;
  created_at: Date;
  updated_at: Date;
  state_changed_at: Date;
  closed_at: Date | null;
}

export interface JobListRow {
  id: string;
  number: string;
  state: JobState;
  customer_id: string;
  customer_name: string;
  family_id: string;
  family_code: string;
  family_name: string;
  cylinders: number;
  asked_for: string;
  due_date: string | null;
  overdue: boolean;
  waiting_for_parts: boolean;
  waiting_for: NeededPart[];
  pistons_held: number;
  cylinders_cut: number;
  awaiting_approval: boolean;
  created_at: Date;
}

export interface StepRow {
  id: string;
  label: string;
  offset_nm: number;
  position: number;
}

// ---- Families and steps -----------------------------------------------------------------------

const FAMILY_COLUMNS = [
  'id',
  'code',
  'name',
  'cylinders',
  'standard_bore_nm',
  'clearance_min_nm',
  'clearance_max_nm',
  'hone_allowance_nm',
  'cleanup_nm',
  'max_oversize_nm',
  'max_taper_nm',
  'max_out_of_round_nm',
  'ring_gap_min_nm',
  'ring_gap_max_nm',
  'forged_clearance_min_nm',
  'forged_clearance_max_nm',
  'ring_gap_per_bore',
  'stroke_nm',
  'hone_crosshatch_deg',
  'hone_grits',
  'step_series_id',
  'stroke_type',
  'active',
] as const;

/** The family columns a job's rules and pages read. */
export type FamilyRow = Pick<EngineFamilyRow, (typeof FAMILY_COLUMNS)[number]>;

export async function findFamily(id: string, k: Knex = db): Promise<FamilyRow | undefined> {
  return k('engine_families').select(FAMILY_COLUMNS).where({ id }).first();
}

export function stepsOfSeries(seriesId: string, k: Knex = db): Promise<StepRow[]> {
  return k('series_steps')
    .select('id', 'label', 'offset_nm', 'position')
    .where({ series_id: seriesId })
    .orderBy('offset_nm');
}

export async function findStep(
  id: string,
  k: Knex = db,
): Promise<(StepRow & { series_id: string }) | undefined> {
  return k('series_steps')
    .select('id', 'label', 'offset_nm', 'position', 'series_id')
    .where({ id })
    .first();
}

// ---- Jobs -------------------------------------------------------------------------------------

/** The customer's fields are copied from the customer by the database. */
export interface NewJob {
  customer_id: string;
  family_id: string;
  cylinders: number;
  asked_for: string;
  due_date: string | null;
  notes: string;
  notify_customer: boolean;
  created_by: string | null;
}

export async function insertJob(
  trx: Knex,
  job: NewJob,
  cylinderIds: (string | null)[] = [],
): Promise<{ id: string; number: string }> {
  const [row] = await trx('jobs')
    .insert(job)
    .returning<{ id: string; number: string }[]>(['id', 'number']);
  const cylinders = Array.from({ length: job.cylinders }, (_, i) => ({
    job_id: row.id,
    n: i + 1,
    cylinder_id: cylinderIds[i] ?? null,
  }));
  await trx('job_cylinders').insert(cylinders);
  return row;
}

function jobBase(k: Knex) {
  return k('jobs as j')
    .leftJoin('users as u', 'u.id', 'j.created_by')
    .select(
      'j.id',
      'j.number',
      'j.customer_id',
      'j.customer_name',
      'j.customer_phone',
      'j.customer_email',
      'j.family_id',
      'j.cylinders',
      'j.asked_for',
      k.raw(`to_char(j.due_date, 'YYYY-MM-DD') AS due_date`),
      'j.notes',
      'j.state',
      'j.notify_customer',
      'j.created_by',
      'u.name as created_by_name',
      'j.created_at',
      'j.updated_at',
      'j.state_changed_at',
      'j.closed_at',
    );
}

export async function findJob(id: string, k: Knex = db): Promise<JobRow | undefined> {
  return (await jobBase(k).where('j.id', id).first()) as JobRow | undefined;
}

/**
 * Locks the job row: 'change' (FOR NO KEY UPDATE) to change its state or close it, 'share'
 * (FOR SHARE) to add holds to it while nobody closes it.
 */
export async function lockJob(
  trx: Knex,
  id: string,
  mode: 'change' | 'share',
): Promise<JobRow | undefined> {
  const query = jobBase(trx).where('j.id', id);
  const locked = mode === 'change' ? query.forNoKeyUpdate('j') : query.forShare('j');
  return (await locked.first()) as JobRow | undefined;
}

export function updateJob(trx: Knex, id: string, changes: Record<string, unknown>): Promise<void> {
  return updateRow(trx, 'jobs', id, changes);
}

export async function setJobState(trx: Knex, id: string, state: JobState): Promise<void> {
  const closing = state === 'handed_back' || state === 'called_off';
  await trx('jobs')
    .update({
      state,
      state_changed_at: trx.fn.now(),
      updated_at: trx.fn.now(),
      closed_at: closing ? trx.fn.now() : null,
    })
    .where({ id });
}

const LIST_SORTS: Record<string, string> = {
  due: 'j.due_date',
  number: 'j.number',
  customer: 'lower(j.customer_name)',
  created: 'j.created_at',
  state: `array_position(ARRAY['booked_in','gauged','parts_set_aside','on_the_bar','at_the_hone','ready_to_go','handed_back','called_off'], j.state)`,
};

export interface JobFilter {
  states?: JobState[];
  q?: string;
  familyId?: string;
  waiting?: boolean;
  sort?: string;
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
  /** The shop's local date, for "overdue". */
  today: string;
}

/** Waiting for parts has one definition, shared with every other count (stock/part-needs). */
const WAITING_SQL = waitingSql('j');
const WAITING_FOR_SQL = waitingForSql('j');
/** The estimate is with the customer and unanswered (the same rule as home's list). */
const AWAITING_APPROVAL_SQL = `EXISTS (SELECT 1 FROM estimates e WHERE e.job_id = j.id
  AND e.state = 'sent') AS awaiting_approval`;

export async function listJobs(
  f: JobFilter,
  k: Knex = db,
): Promise<{ rows: JobListRow[]; total: number }> {
  // The filters read jobs alone (the family search through a subquery), so the open jobs are
  // counted from an index without visiting a row; the page joins the families for its 50 rows.
  const base = k('jobs as j');
  if (f.states && f.states.length > 0) base.whereIn('j.state', f.states);
  if (f.familyId) base.where('j.family_id', f.familyId);
  if (f.waiting) base.whereRaw(WAITING_SQL);
  if (f.q) {
    const q = f.q.trim();
    const like = containsPattern(q);
    base.where((w) =>
      w
        .whereILike('j.number', like)
        .orWhereILike('j.customer_name', like)
        .orWhereILike('j.customer_phone', like)
        .orWhereILike('j.customer_email', like)
        .orWhereIn(
          'j.family_id',
          k('engine_families').select('id').whereILike('code', like).orWhereILike('name', like),
        ),
    );
  }
  const column = LIST_SORTS[f.sort ?? 'due'] ?? LIST_SORTS.due;
  const order = f.dir === 'desc' ? 'DESC' : 'ASC';
  return pageOf<JobListRow>(base, f, (list) =>
    list
      .join('engine_families as f', 'f.id', 'j.family_id')
      .select(
        'j.id',
        'j.number',
        'j.state',
        'j.customer_id',
        'j.customer_name',
        'j.family_id',
        'f.code as family_code',
        'f.name as family_name',
        'j.cylinders',
        'j.asked_for',
        k.raw(`to_char(j.due_date, 'YYYY-MM-DD') AS due_date`),
        ...jobFlags(k, f.today),
        'j.created_at',
      )
      .orderByRaw(`${column} ${order} NULLS LAST, j.number ASC`),
  );
}

/** The flags of a job's list row, worked out in SQL; `today` is the shop's local date. */
function jobFlags(k: Knex, today: string) {
  return [
    k.raw(`${WAITING_SQL} AS waiting_for_parts`),
    k.raw(`${WAITING_FOR_SQL} AS waiting_for`),
    k.raw(
      `(j.due_date IS NOT NULL AND j.due_date < ?::date AND j.state IN (${OPEN_STATES.map((s) => `'${s}'`).join(', ')})) AS overdue`,
      [today],
    ),
    k.raw(
      `(SELECT count(*) FROM holds h WHERE h.job_id = j.id AND h.unit_id IS NOT NULL
            AND h.released_at IS NULL)::int AS pistons_held`,
    ),
    k.raw(
      `(SELECT count(*) FROM job_cylinders c WHERE c.job_id = j.id AND c.cut_at IS NOT NULL)::int
          AS cylinders_cut`,
    ),
    k.raw(AWAITING_APPROVAL_SQL),
  ];
}

export async function jobListRow(id: string, today: string, k: Knex = db): Promise<JobListRow> {
  const found = await k('jobs as j')
    .join('engine_families as f', 'f.id', 'j.family_id')
    .select(...jobFlags(k, today), 'f.code as family_code', 'f.name as family_name')
    .where('j.id', id)
    .first();
  return found as JobListRow;
}
