// Every Knex query of customers and their cylinders. Writers take the caller's transaction. A
// customer row is locked FOR UPDATE by whoever merges or erases it, so the two cannot interleave.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { insertRow, updateRow } from '../db/rows';
import { pageOf } from '../db/paging';
import { containsPattern } from '../db/like-pattern';
import type { JobState } from '../../shared/api/jobs';

export interface CustomerRow {
  id: string;
  name: string;
  phone: string | null;
  email: string | null;
  accepts_email: boolean;
  notes: string;
  erased_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

export interface CustomerJobRow {
  id: string;
  number: string;
  state: JobState;
  family_code: string;
  cylinders: number;
  asked_for: string;
  notes: string;
  due_date: string | null;
  notify_customer: boolean;
  created_at: Date;
  closed_at: Date | null;
}

export interface CylinderRow {
  id: string;
  customer_id: string;
  customer_name: string;
  family_id: string;
  family_code: string;
  mark: string;
  cast_number: string | null;
  created_at: Date;
}

export interface BoreRow {
  cylinder_id: string;
  job_id: string;
  job_number: string;
  n: number;
  step_id: string | null;
  step_label: string | null;
  finished_bore_nm: number;
  measured: boolean;
  cut_at: Date;
  piston_label: string | null;
}

const COLUMNS = [
  'id',
  'name',
  'phone',
  'email',
  'accepts_email',
  'notes',
  'erased_at',
  'created_at',
  'updated_at',
];

export async function findCustomer(id: string, k: Knex = db): Promise<CustomerRow | undefined> {
  return (await k('customers').select(COLUMNS).where({ id }).first()) as CustomerRow | undefined;
}

export async function lockCustomer(trx: Knex, id: string): Promise<CustomerRow | undefined> {
  return (await trx('customers').select(COLUMNS).where({ id }).forUpdate().first()) as
    CustomerRow | undefined;
}

/**
 * Search as you type: name words that start with the text come first, then any name, phone or
 * e-mail that contains it; a phone matches on its digits alone, so "5550101" finds "555 0101".
 * Erased customers are left out of searches.
 */
export async function searchCustomers(
  f: { q?: string; page: number; pageSize: number },
  k: Knex = db,
): Promise<{ rows: CustomerRow[]; total: number }> {
  const base = k('customers as c').whereNull('c.erased_at');
  const q = f.q?.trim() ?? '';
  const digits = q.replace(/\D/g, '');
  if (q !== '') {
    const like = containsPattern(q);
    base.where((w) => {
      w.whereILike('c.name', like).orWhereILike('c.email', like).orWhereILike('c.phone', like);
      if (digits.length >= 2) {
        w.orWhereRaw(`regexp_replace(coalesce(c.phone, ''), '\\D', '', 'g') LIKE ?`, [
          containsPattern(digits),
        ]);
      }
    });
  }
  const prefix = `${q.replace(/[\\%_]/g, (ch) => `\\${ch}`)}%`;
  return pageOf<CustomerRow>(base, f, (list) =>
    list.select(COLUMNS.map((c) => `c.${c}`)).orderByRaw(
      `(c.name ILIKE ? OR c.name ILIKE ?) DESC,
       (SELECT max(j.created_at) FROM jobs j WHERE j.customer_id = c.id) DESC NULLS LAST,
       lower(c.name), c.id`,
      [prefix, `% ${prefix}`],
    ),
  );
}

/**
 * The customer an old-style job (a typed name, phone and e-mail) belongs to: the same name
 * (ignoring case) with the same phone digits or e-mail, and no given detail that contradicts the
 * record (the same name with another e-mail may be another person; a merge joins them later).
 * With neither phone nor e-mail given: the one customer of that name, if only one has it.
 */
export async function findByContact(
  c: { name: string; phone: string | null; email: string | null },
  k: Knex = db,
): Promise<CustomerRow | undefined> {
  const same = k('customers')
    .select(COLUMNS)
    .whereNull('erased_at')
    .whereRaw('lower(name) = lower(?)', [c.name.trim()]);
  if (c.phone === null && c.email === null) {
    const rows = (await same.limit(2)) as CustomerRow[];
    return rows.length === 1 ? rows[0] : undefined;
  }
  const phoneDigits = c.phone?.replace(/\D/g, '') ?? '';
  const digitsOf = `regexp_replace(coalesce(phone, ''), '\\D', '', 'g')`;
  if (c.email !== null) same.whereRaw('(email IS NULL OR lower(email) = lower(?))', [c.email]);
  if (phoneDigits !== '') same.whereRaw(`(phone IS NULL OR ${digitsOf} = ?)`, [phoneDigits]);
  return (await same
    .where((w) => {
      if (c.email !== null) w.orWhereRaw('lower(email) = lower(?)', [c.email]);
      if (phoneDigits !== '') w.orWhereRaw(`${digitsOf} = ?`, [phoneDigits]);
    })
    .orderBy('created_at')
    .first()) as CustomerRow | undefined;
}

export function insertCustomer(
  trx: Knex,
  row: {
    name: string;
    phone: string | null;
    email: string | null;
    accepts_email: boolean;
    notes: string;
  },
): Promise<string> {
  return insertRow(trx, 'customers', row);
}

export function updateCustomer(
  trx: Knex,
  id: string,
  changes: Record<string, unknown>,
): Promise<void> {
  return updateRow(trx, 'customers', id, changes);
}

export async function deleteCustomer(trx: Knex, id: string): Promise<void> {
  await trx('customers').where({ id }).delete();
}

export function jobsOfCustomer(customerId: string, k: Knex = db): Promise<CustomerJobRow[]> {
  return k('jobs as j')
    .join('engine_families as f', 'f.id', 'j.family_id')
    .select(
      'j.id',
      'j.number',
      'j.state',
      'f.code as family_code',
      'j.cylinders',
      'j.asked_for',
      'j.notes',
      k.raw(`to_char(j.due_date, 'YYYY-MM-DD') AS due_date`),
      'j.notify_customer',
      'j.created_at',
      'j.closed_at',
    )
    .where('j.customer_id', customerId)
    .orderBy([
      { column: 'j.created_at', order: 'desc' },
      { column: 'j.number', order: 'desc' },
    ]);
}

/** Moves every job and cylinder of one customer to another; answers how many of each moved. */
export async function moveBelongings(
  trx: Knex,
  fromId: string,
  toId: string,
): Promise<{ jobs: number; cylinders: number }> {
  const jobs = await trx('jobs').update({ customer_id: toId }).where({ customer_id: fromId });
  const cylinders = await trx('cylinders')
    .update({ customer_id: toId })
    .where({ customer_id: fromId });
  return { jobs, cylinders };
}

export function mailToAddress(
  email: string,
  k: Knex = db,
): Promise<{ template: string | null; status: string; created_at: Date }[]> {
  return k('outbox')
    .select('template', 'status', 'created_at')
    .whereRaw('lower(to_address) = lower(?)', [email])
    .orderBy('created_at');
}

// ---- Cylinders --------------------------------------------------------------------------------

function cylinderBase(k: Knex) {
  return k('cylinders as y')
    .join('customers as c', 'c.id', 'y.customer_id')
    .join('engine_families as f', 'f.id', 'y.family_id')
    .select(
      'y.id',
      'y.customer_id',
      'c.name as customer_name',
      'y.family_id',
      'f.code as family_code',
      'y.mark',
      'y.cast_number',
      'y.created_at',
    );
}

export function cylindersOfCustomer(customerId: string, k: Knex = db): Promise<CylinderRow[]> {
  return cylinderBase(k)
    .where('y.customer_id', customerId)
    .orderBy([{ column: 'y.created_at' }, { column: 'y.mark' }]) as Promise<CylinderRow[]>;
}

/** Every marked cylinder with at least one bore, with its customer's contact details. */
export function boredCylinders(
  k: Knex = db,
): Promise<(CylinderRow & { customer_phone: string | null; customer_email: string | null })[]> {
  return cylinderBase(k)
    .select('c.phone as customer_phone', 'c.email as customer_email')
    .whereExists(
      k('job_cylinders as jc').whereRaw('jc.cylinder_id = y.id').whereNotNull('jc.cut_at'),
    )
    .orderBy([{ column: 'y.mark' }]) as Promise<
    (CylinderRow & { customer_phone: string | null; customer_email: string | null })[]
  >;
}

export async function findCylinder(id: string, k: Knex = db): Promise<CylinderRow | undefined> {
  return (await cylinderBase(k).where('y.id', id).first()) as CylinderRow | undefined;
}

export async function findCylinderByMark(
  mark: string,
  k: Knex = db,
): Promise<{ id: string; customer_id: string; mark: string } | undefined> {
  return k('cylinders')
    .select('id', 'customer_id', 'mark')
    .whereRaw('lower(mark) = lower(?)', [mark.trim()])
    .first();
}

export function insertCylinder(
  trx: Knex,
  row: {
    customer_id: string;
    family_id: string;
    mark: string;
    cast_number: string | null;
    created_by: string | null;
  },
): Promise<string> {
  return insertRow(trx, 'cylinders', row);
}

/**
 * The bores of the given cylinders, oldest first: every linked job cylinder that was cut, with
 * its honed size when recorded (else the step's nominal bore) and the measured piston that went
 * in (held for it, or issued with the job). A job may be left out (the one being worked on).
 */
export function boresOf(
  cylinderIds: string[],
  k: Knex = db,
  opts: { exceptJobId?: string } = {},
): Promise<BoreRow[]> {
  if (cylinderIds.length === 0) return Promise.resolve([]);
  const query = k('job_cylinders as jc')
    .join('jobs as j', 'j.id', 'jc.job_id')
    .join('engine_families as f', 'f.id', 'j.family_id')
    .leftJoin('series_steps as s', 's.id', 'jc.chosen_step_id')
    .select(
      'jc.cylinder_id',
      'jc.job_id',
      'j.number as job_number',
      'jc.n',
      'jc.chosen_step_id as step_id',
      's.label as step_label',
      k.raw(
        `coalesce(jc.measured_after_hone_nm, f.standard_bore_nm + s.offset_nm) AS finished_bore_nm`,
      ),
      k.raw('(jc.measured_after_hone_nm IS NOT NULL) AS measured'),
      'jc.cut_at',
      k.raw(`(SELECT pu.label FROM holds h JOIN piston_units pu ON pu.id = h.unit_id
               WHERE h.job_id = jc.job_id AND h.cylinder = jc.n
                 AND (h.released_at IS NULL OR h.release_reason = 'issued')
               ORDER BY h.created_at DESC LIMIT 1) AS piston_label`),
    )
    .whereIn('jc.cylinder_id', cylinderIds)
    .whereNotNull('jc.cut_at')
    .whereRaw('coalesce(jc.measured_after_hone_nm, f.standard_bore_nm + s.offset_nm) IS NOT NULL')
    .orderBy([{ column: 'jc.cut_at' }, { column: 'j.number' }]);
  if (opts.exceptJobId) query.whereNot('jc.job_id', opts.exceptJobId);
  return query as unknown as Promise<BoreRow[]>;
}

/** Job cylinders linked to a cylinder and not cut yet. */
export function openLinksOf(
  cylinderId: string,
  k: Knex = db,
): Promise<{ job_id: string; job_number: string; n: number; state: JobState }[]> {
  return k('job_cylinders as jc')
    .join('jobs as j', 'j.id', 'jc.job_id')
    .select('jc.job_id', 'j.number as job_number', 'jc.n', 'j.state')
    .where('jc.cylinder_id', cylinderId)
    .whereNull('jc.cut_at')
    .orderBy('j.created_at');
}

export function cylinderIdsOfJob(
  jobId: string,
  k: Knex = db,
): Promise<{ n: number; cylinder_id: string | null; mark: string | null }[]> {
  return k('job_cylinders as jc')
    .leftJoin('cylinders as y', 'y.id', 'jc.cylinder_id')
    .select('jc.n', 'jc.cylinder_id', 'y.mark')
    .where('jc.job_id', jobId)
    .orderBy('jc.n');
}
