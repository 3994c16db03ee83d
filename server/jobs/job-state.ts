// Where a job stands in the workshop: whether it may be marked as cutting, and the moves Stepstock
// makes by itself after readings, holds and cuts (forward only).
import type { Knex } from 'knex';
import { isOpenState, JOB_STATE_LABELS, JOB_STATES, type JobState } from '../../shared/api/jobs';
import * as repo from './jobs-repository';
import * as holdsRepo from './holds-repository';

type Conn = Knex;

/**
 * Why a job may not be marked as having its parts set aside or as cutting: every cylinder with a
 * step to bore to must have its measured piston held for this job. Null when it may.
 */
export async function whyNotReadyToCut(trx: Conn, jobId: string): Promise<string | null> {
  // One query: it runs after every hold, so it stays a single round trip.
  const toBore = await holdsRepo.pistonsForSteps(trx, jobId);
  if (toBore.length === 0) {
    return 'No cylinder has a step to bore to yet: measure the bores and choose the oversize first.';
  }
  const missing = toBore.filter((c) => !c.held);
  if (missing.length > 0) {
    const names = missing.map((c) => c.n).join(', ');
    return `Cylinder ${names} ${missing.length === 1 ? 'has' : 'have'} no piston held for this job: hold the measured piston before cutting.`;
  }
  return null;
}

/** Whether a job may move from `from` to `to` by itself: it is open and it would go forward. */
export function movesForward(from: JobState, to: JobState): boolean {
  return isOpenState(from) && JOB_STATES.indexOf(from) < JOB_STATES.indexOf(to);
}

/** The note a state change leaves on the job. */
export function stateNote(from: JobState, to: JobState): string {
  return `${JOB_STATE_LABELS[from]} → ${JOB_STATE_LABELS[to]}.`;
}

/** Moves an open job forward by itself (after readings, holds or a cut); never backward. */
export async function advanceState(
  trx: Conn,
  job: { id: string; state: JobState },
  to: JobState,
  userId: string | null,
): Promise<void> {
  if (!movesForward(job.state, to)) return;
  if ((to === 'parts_set_aside' || to === 'on_the_bar') && (await whyNotReadyToCut(trx, job.id))) {
    return;
  }
  await repo.setJobState(trx, job.id, to);
  await repo.insertEvent(trx, {
    jobId: job.id,
    userId,
    kind: 'state',
    text: stateNote(job.state, to),
  });
}

/**
 * After a honed bore or a ring gap is recorded, the job moves on by itself: to "at the hone" once
 * one cylinder has its honed bore, and to "ready to go" once every cylinder with a step is cut and
 * has both its honed bore and its ring gap. Returns the state it moved to, or null.
 */
export async function advanceAfterHoning(
  trx: Conn,
  job: { id: string; state: JobState },
  userId: string | null,
): Promise<JobState | null> {
  const cylinders = await repo.cylindersOf(job.id, trx);
  const toBore = cylinders.filter((c) => c.chosen_step_id !== null);
  const finished =
    toBore.length > 0 &&
    toBore.every(
      (c) => c.cut_at !== null && c.measured_after_hone_nm !== null && c.ring_gap_nm !== null,
    );
  const honed = cylinders.some((c) => c.measured_after_hone_nm !== null);
  const to: JobState | null = finished ? 'ready_to_go' : honed ? 'at_the_hone' : null;
  if (!to) return null;
  const before = job.state;
  await advanceState(trx, job, to, userId);
  const after = (await repo.findJob(job.id, trx))?.state ?? before;
  return after !== before ? after : null;
}
