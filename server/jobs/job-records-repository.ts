// A job's cylinders and their bore readings, its notes and events, and its intake photos: the
// queries under a job, beside the job's own in jobs-repository.ts (which re-exports these).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { insertRow } from '../db/rows';
import type { Axis, Depth } from '../../shared/bore-wear';
import type { LengthUnit } from '../../shared/lengths';

export interface CylinderRow {
  job_id: string;
  n: number;
  cylinder_id: string | null;
  cylinder_mark: string | null;
  largest_nm: number | null;
  taper_nm: number | null;
  out_of_round_nm: number | null;
  measured_at: Date | null;
  chosen_step_id: string | null;
  step_label: string | null;
  step_offset_nm: number | null;
  clearance_nm: number | null;
  cut_at: Date | null;
  measured_after_hone_nm: number | null;
  ring_gap_nm: number | null;
  passes_done: number;
  cleanup_override_reason: string | null;
}

export interface EventRow {
  id: number;
  at: Date;
  kind: 'note' | 'state' | 'hold' | 'work' | 'system';
  text: string;
  user_name: string | null;
}

export interface PhotoMetaRow {
  id: string;
  job_id: string;
  content_type: string;
  size_bytes: number;
  has_thumbnail: boolean;
  original_name: string;
  created_at: Date;
}

export interface ReadingRow {
  n: number;
  depth: Depth;
  axis: Axis;
  diameter_nm: number;
  unit: LengthUnit;
}

// ---- Cylinders and readings -------------------------------------------------------------------

export function cylindersOf(jobId: string, k: Knex = db): Promise<CylinderRow[]> {
  return k('job_cylinders as c')
    .leftJoin('series_steps as s', 's.id', 'c.chosen_step_id')
    .leftJoin('cylinders as y', 'y.id', 'c.cylinder_id')
    .select(
      'c.job_id',
      'c.n',
      'c.cylinder_id',
      'y.mark as cylinder_mark',
      'c.largest_nm',
      'c.taper_nm',
      'c.out_of_round_nm',
      'c.measured_at',
      'c.chosen_step_id',
      's.label as step_label',
      's.offset_nm as step_offset_nm',
      'c.clearance_nm',
      'c.cut_at',
      'c.measured_after_hone_nm',
      'c.ring_gap_nm',
      'c.cleanup_override_reason',
      'c.passes_done',
    )
    .where('c.job_id', jobId)
    .orderBy('c.n');
}

/** Locks one cylinder row: readings, the step, the cut and the after-hone sizes queue here. */
export async function lockCylinder(
  trx: Knex,
  jobId: string,
  n: number,
): Promise<CylinderRow | undefined> {
  const locked = await trx('job_cylinders')
    .select('n')
    .where({ job_id: jobId, n })
    .forNoKeyUpdate()
    .first();
  if (!locked) return undefined;
  return (await cylindersOf(jobId, trx)).find((c) => c.n === n);
}

export function readingsOf(jobId: string, k: Knex = db): Promise<ReadingRow[]> {
  return k('bore_readings')
    .select('n', 'depth', 'axis', 'diameter_nm', 'unit')
    .where({ job_id: jobId })
    .orderBy([
      'n',
      { column: k.raw(`array_position(ARRAY['top','middle','bottom'], depth)`) as never },
      'axis',
    ]);
}

export async function replaceReadings(
  trx: Knex,
  jobId: string,
  n: number,
  readings: { depth: Depth; axis: Axis; nm: number; unit: LengthUnit }[],
  wear: { largest: number; taper: number; outOfRound: number },
  userId: string | null,
): Promise<void> {
  await trx('bore_readings').where({ job_id: jobId, n }).delete();
  await trx('bore_readings').insert(
    readings.map((r) => ({
      job_id: jobId,
      n,
      depth: r.depth,
      axis: r.axis,
      diameter_nm: r.nm,
      unit: r.unit,
    })),
  );
  await trx('job_cylinders')
    .update({
      largest_nm: wear.largest,
      taper_nm: wear.taper,
      out_of_round_nm: wear.outOfRound,
      measured_at: trx.fn.now(),
      measured_by: userId,
    })
    .where({ job_id: jobId, n });
}

export async function updateCylinder(
  trx: Knex,
  jobId: string,
  n: number,
  changes: Record<string, unknown>,
): Promise<void> {
  await trx('job_cylinders').update(changes).where({ job_id: jobId, n });
}

// ---- Events -----------------------------------------------------------------------------------

export async function insertEvent(
  trx: Knex,
  e: { jobId: string; userId: string | null; kind: EventRow['kind']; text: string },
): Promise<void> {
  await trx('job_events').insert({
    job_id: e.jobId,
    user_id: e.userId,
    kind: e.kind,
    text: e.text.slice(0, 2000),
  });
}

export function eventsOf(jobId: string, k: Knex = db): Promise<EventRow[]> {
  return k('job_events as e')
    .leftJoin('users as u', 'u.id', 'e.user_id')
    .select('e.id', 'e.at', 'e.kind', 'e.text', 'u.name as user_name')
    .where('e.job_id', jobId)
    .orderBy([
      { column: 'e.at', order: 'desc' },
      { column: 'e.id', order: 'desc' },
    ]);
}

// ---- Photos -----------------------------------------------------------------------------------

export function photosOf(jobId: string, k: Knex = db): Promise<PhotoMetaRow[]> {
  return k('job_photos')
    .select(
      'id',
      'job_id',
      'content_type',
      'size_bytes',
      k.raw('(thumbnail IS NOT NULL) AS has_thumbnail'),
      'original_name',
      'created_at',
    )
    .where({ job_id: jobId })
    .orderBy([{ column: 'created_at' }, { column: 'id' }]);
}

export async function countPhotos(trx: Knex, jobId: string): Promise<number> {
  const [{ count }] = await trx('job_photos')
    .where({ job_id: jobId })
    .count<{ count: number }[]>('* as count');
  return Number(count);
}

export function insertPhoto(
  trx: Knex,
  photo: {
    job_id: string;
    content_type: string;
    size_bytes: number;
    data: Buffer;
    thumbnail_type: string | null;
    thumbnail: Buffer | null;
    original_name: string;
    created_by: string | null;
  },
): Promise<string> {
  return insertRow(trx, 'job_photos', photo);
}

export async function photoBytes(
  jobId: string,
  photoId: string,
  which: 'photo' | 'thumbnail',
  k: Knex = db,
): Promise<{ contentType: string; data: Buffer } | undefined> {
  const row = await k('job_photos')
    .select(
      which === 'photo'
        ? ['content_type as contentType', 'data']
        : ['thumbnail_type as contentType', 'thumbnail as data'],
    )
    .where({ id: photoId, job_id: jobId })
    .first();
  if (!row || row.data === null) return undefined;
  return row as { contentType: string; data: Buffer };
}
