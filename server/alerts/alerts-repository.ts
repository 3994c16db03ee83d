// The only file building queries for alerts and their mail.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { pageOf } from '../db/paging';
import type { AlertsQuery } from '../../shared/api/alerts';

export interface AlertRow {
  id: string;
  part_id: string;
  kind: 'reorder_point';
  raised_at: Date;
  free_at_raise: number;
  reorder_point: number;
  recovered_at: Date | null;
  acknowledged_at: Date | null;
  acknowledged_by_name: string | null;
  sku: string;
  description: string;
  part_kind: string;
  family_id: string | null;
  family_code: string | null;
  family_name: string | null;
  step_label: string | null;
  free: number;
  on_order: number;
  order_up_to: number | null;
}

function alertsBase(k: Knex) {
  return k('alerts as a')
    .join('parts as p', 'p.id', 'a.part_id')
    .join('part_levels as pl', 'pl.part_id', 'a.part_id')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as s', 's.id', 'p.step_id')
    .leftJoin('users as u', 'u.id', 'a.acknowledged_by')
    .leftJoin(
      k.raw(
        '(SELECT part_id, sum(quantity)::int AS quantity FROM parts_on_order() GROUP BY part_id) AS oo',
      ),
      'oo.part_id',
      'a.part_id',
    );
}

const ALERT_COLUMNS = [
  'a.id',
  'a.part_id',
  'a.kind',
  'a.raised_at',
  'a.free_at_raise',
  'a.reorder_point',
  'a.recovered_at',
  'a.acknowledged_at',
  'u.name as acknowledged_by_name',
  'p.sku',
  'p.description',
  'p.kind as part_kind',
  'p.family_id',
  'p.order_up_to',
  'f.code as family_code',
  'f.name as family_name',
  's.label as step_label',
];

export async function listAlerts(
  q: AlertsQuery,
  k: Knex = db,
): Promise<{ rows: AlertRow[]; total: number }> {
  const base = alertsBase(k).modify((qb) => {
    if (q.state === 'open') qb.whereNull('a.acknowledged_at');
    if (q.state === 'acknowledged') qb.whereNotNull('a.acknowledged_at');
    if (q.partId) qb.where('a.part_id', q.partId);
  });
  return pageOf<AlertRow>(base, q, (list) =>
    list
      .select(ALERT_COLUMNS)
      .select(k.raw('(pl.on_hand - pl.held)::int AS free'))
      .select(k.raw('coalesce(oo.quantity, 0)::int AS on_order'))
      .orderBy([
        { column: 'a.raised_at', order: 'desc' },
        { column: 'a.id', order: 'desc' },
      ]),
  );
}

export async function findAlert(id: string, k: Knex = db): Promise<AlertRow | undefined> {
  return (await alertsBase(k)
    .where('a.id', id)
    .select(ALERT_COLUMNS)
    .select(k.raw('(pl.on_hand - pl.held)::int AS free'))
    .select(k.raw('coalesce(oo.quantity, 0)::int AS on_order'))
    .first()) as AlertRow | undefined;
}

export async function alertsRaisedBetween(
  from: Date,
  until: Date,
  k: Knex = db,
): Promise<AlertRow[]> {
  return (await alertsBase(k)
    .where('a.raised_at', '>', from)
    .andWhere('a.raised_at', '<=', until)
    .select(ALERT_COLUMNS)
    .select(k.raw('(pl.on_hand - pl.held)::int AS free'))
    .select(k.raw('coalesce(oo.quantity, 0)::int AS on_order'))
    .orderBy('a.raised_at')) as AlertRow[];
}

/** Marks an unacknowledged alert as seen; undefined when it does not exist or was already seen. */
export async function acknowledge(
  k: Knex,
  id: string,
  userId: string,
): Promise<{ id: string } | undefined> {
  const [row] = await k('alerts')
    .where({ id })
    .whereNull('acknowledged_at')
    .update({ acknowledged_at: k.fn.now(), acknowledged_by: userId })
    .returning(['id']);
  return row as { id: string } | undefined;
}

export async function alertExists(id: string, k: Knex = db): Promise<boolean> {
  return Boolean(await k('alerts').where({ id }).first('id'));
}

/** Runs the database's reorder watch for one part; returns the new alert's id, if one was raised. */
export async function reorderCheck(k: Knex, partId: string, fell: boolean): Promise<string | null> {
  const { rows } = (await k.raw('SELECT reorder_check(?::uuid, ?) AS id', [partId, fell])) as {
    rows: { id: string | null }[];
  };
  return rows[0]?.id ?? null;
}

export interface DigestUserRow {
  id: string;
  email: string;
  name: string;
}

export async function digestBuyers(k: Knex = db): Promise<DigestUserRow[]> {
  return k('users')
    .where({ role: 'buyer', active: true, mail_mode: 'digest' })
    .select('id', 'email', 'name')
    .orderBy('email');
}

/** Claims the digest of a day for a buyer; false when another process already did. */
export async function claimDigestDay(
  k: Knex,
  userId: string,
  day: string,
  coveredUntil: Date,
): Promise<boolean> {
  const rows = await k('alert_digest_runs')
    .insert({ user_id: userId, day, covered_until: coveredUntil, alerts: 0 })
    .onConflict(['user_id', 'day'])
    .ignore()
    .returning('day');
  return rows.length > 0;
}

export async function setDigestCount(k: Knex, userId: string, day: string, alerts: number) {
  await k('alert_digest_runs').where({ user_id: userId, day }).update({ alerts });
}

/** Where the buyer's previous digest stopped; null before the first one. */
export async function previousDigestEnd(
  k: Knex,
  userId: string,
  day: string,
): Promise<Date | null> {
  const row = await k('alert_digest_runs')
    .where({ user_id: userId })
    .andWhere('day', '<', day)
    .orderBy('day', 'desc')
    .first('covered_until');
  return (row?.covered_until as Date | undefined) ?? null;
}

export async function userMailMode(
  userId: string,
  k: Knex = db,
): Promise<{ mail_mode: 'instant' | 'digest' | 'none'; role: string } | undefined> {
  return k('users').where({ id: userId }).first('mail_mode', 'role');
}

export interface ReadySizeRow {
  n: number;
  step_label: string | null;
  measured_after_hone_nm: number | null;
  ring_gap_nm: number | null;
  /** The measured skirt of the piston held (or already issued) for this cylinder. */
  skirt_nm: number | null;
}

/** What the customer's copy of a finished job lists per cylinder. */
export async function jobReadySizes(jobId: string, k: Knex = db): Promise<ReadySizeRow[]> {
  const result = await k.raw<{ rows: ReadySizeRow[] }>(
    `SELECT c.n, ss.label AS step_label, c.measured_after_hone_nm, c.ring_gap_nm,
            (SELECT pu.skirt_nm FROM holds h JOIN piston_units pu ON pu.id = h.unit_id
              WHERE h.job_id = c.job_id AND h.cylinder = c.n
                AND (h.released_at IS NULL OR h.release_reason = 'issued')
              ORDER BY h.created_at DESC LIMIT 1) AS skirt_nm
       FROM job_cylinders c
       LEFT JOIN series_steps ss ON ss.id = c.chosen_step_id
      WHERE c.job_id = ?
      ORDER BY c.n`,
    [jobId],
  );
  return result.rows;
}
