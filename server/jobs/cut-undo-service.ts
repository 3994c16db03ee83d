// Taking back "marked as cut": the machinist who marked it, within a few minutes, or the owner at
// any time with a reason. The job keeps an event and the audit trail a row with the reason.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, Forbidden, NotFound } from '../errors';
import { JOB_STATE_LABELS, type CylinderJson } from '../../shared/api/jobs';
import type { LengthUnit } from '../../shared/lengths';
import {
  undoUntil,
  whyNoCutUndo,
  type CutUndoActor,
  type CutUndoJson,
  type UndoCutInput,
} from '../../shared/cut-undo';
import * as repo from './jobs-repository';
import * as cuts from './cut-undo-repository';
import { getCylinder } from './cylinder-service';
import { lockOpenCylinder } from './jobs-service';

export async function undoCut(
  actor: CutUndoActor,
  jobId: string,
  n: number,
  unit: LengthUnit,
  input: UndoCutInput,
  k: Knex = db,
): Promise<CylinderJson> {
  await k.transaction(async (trx) => {
    const { job } = await lockOpenCylinder(trx, jobId, n);
    const cut = await cuts.cutOf(trx, jobId, n);
    if (!cut) throw new NotFound(`Cylinder ${n} of job ${job.number}`);
    const reason = input.reason?.trim() ?? '';
    // The clock is the database's, the same one that stamped the cut.
    const { now } = (await trx.raw('SELECT now() AS now')).rows[0] as { now: Date };
    const refusal = whyNoCutUndo(
      {
        cutAt: cut.cut_at,
        cutBy: cut.cut_by,
        measuredAfter: cut.measured_after_hone_nm !== null || cut.ring_gap_nm !== null,
      },
      actor,
      reason,
      now,
    );
    if (refusal?.code === 'reason_needed') {
      throw new BadRequest(
        refusal.message,
        [{ field: 'reason', message: 'say why' }],
        'reason_needed',
      );
    }
    if (refusal?.code === 'not_allowed') throw new Forbidden(refusal.message, 'undo_not_allowed');
    if (refusal) throw new Conflict(refusal.message, refusal.code);

    await cuts.clearCut(trx, jobId, n);
    await repo.insertEvent(trx, {
      jobId,
      userId: actor.id,
      kind: 'work',
      text:
        reason === ''
          ? `Cut of cylinder ${n} taken back; its readings and step may change again.`
          : `Cut of cylinder ${n} taken back; reason: ${reason}`,
    });
    await recordAudit(trx, {
      userId: actor.id,
      action: 'cylinder.cut_undo',
      entity: 'job',
      entityId: jobId,
      before: {
        cylinder: n,
        cutAt: cut.cut_at?.toISOString() ?? null,
        cutBy: cut.cut_by,
        cleanupOverrideReason: cut.cleanup_override_reason,
      },
      after: { cylinder: n, cutAt: null, reason: reason || null },
    });
    // The job went onto the bar with its first cut; with no cut left it is back to waiting.
    if (job.state === 'on_the_bar' && (await cuts.cutCount(trx, jobId)) === 0) {
      await repo.setJobState(trx, jobId, 'parts_set_aside');
      await repo.insertEvent(trx, {
        jobId,
        userId: actor.id,
        kind: 'state',
        text: `${JOB_STATE_LABELS.on_the_bar} → ${JOB_STATE_LABELS.parts_set_aside}.`,
      });
    }
  });
  return getCylinder(jobId, n, unit, k);
}

/** For the bore sheet: who marked the cut, and until when they may take it back alone. */
export async function cutUndoFacts(jobId: string, n: number, k: Knex = db): Promise<CutUndoJson> {
  const cut = await cuts.cutOf(k, jobId, n);
  if (!cut?.cut_at) return { cutBy: null, undoUntil: null };
  return {
    cutBy: cut.cut_by ? { id: cut.cut_by, name: cut.cut_by_name ?? '' } : null,
    undoUntil: undoUntil(cut.cut_at).toISOString(),
  };
}
