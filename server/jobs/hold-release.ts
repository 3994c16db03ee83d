// Ending a hold: the part back on the shelf (the unit free again, held − n, a ledger 'release' row)
// and the hold closed with its reason, on its own or inside a larger change (a cancelled job).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { Conflict, NotFound } from '../errors';
import * as repo from './holds-repository';
import * as jobsRepo from './jobs-repository';
import { holdName, lockActiveHold } from './hold-common';
import * as moves from '../stock/stock-movements';

type Conn = Knex;

/**
 * Puts a held part back on the shelf: the unit is free again, held − n, a ledger 'release' row,
 * and the hold ends with its reason. The caller holds the hold row's lock.
 */
export async function releaseInTransaction(
  trx: Conn,
  hold: { id: string; part_id: string; unit_id: string | null; quantity: number },
  opts: { reason: repo.ReleaseReason; userId: string | null; jobId: string; ledgerReason: string },
): Promise<void> {
  if (hold.unit_id && !(await repo.freeUnit(trx, hold.unit_id))) {
    throw new Error(`piston unit ${hold.unit_id} of hold ${hold.id} is not held`);
  }
  await moves.changeLevels(trx, hold.part_id, { onHand: 0, held: -hold.quantity });
  await moves.insertLedger(trx, [
    {
      user_id: opts.userId,
      part_id: hold.part_id,
      unit_id: hold.unit_id,
      kind: 'release',
      quantity: 0,
      held_delta: -hold.quantity,
      job_id: opts.jobId,
      reason: opts.ledgerReason,
      ref: hold.id,
    },
  ]);
  await repo.endHold(trx, hold.id, opts.reason, opts.userId);
}

export async function releaseHold(actorId: string, id: string, k: Conn = db): Promise<void> {
  await k.transaction(async (trx) => {
    const peek = await repo.findHold(id, trx);
    if (!peek) throw new NotFound('That hold');
    // The cylinder before the hold: the order a cut takes them in.
    const cylinder = await jobsRepo.lockCylinder(trx, peek.job_id, peek.cylinder);
    const hold = await lockActiveHold(trx, id);
    const view = await repo.findHold(id, trx);
    if (!view) throw new NotFound('That hold');
    if (hold.unit_id && cylinder?.cut_at) {
      throw new Conflict(
        `Cylinder ${hold.cylinder} is already cut to fit ${view.unit_label}; the piston stays with it.`,
        'already_cut',
      );
    }
    await releaseInTransaction(trx, hold, {
      reason: 'released',
      userId: actorId,
      jobId: hold.job_id,
      ledgerReason: `released from job ${view.job_number}, cylinder ${hold.cylinder}`,
    });
    await jobsRepo.insertEvent(trx, {
      jobId: hold.job_id,
      userId: actorId,
      kind: 'hold',
      text: `Released ${holdName(view)} from cylinder ${hold.cylinder} back to the shelf.`,
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'hold.release',
      entity: 'hold',
      entityId: id,
      before: { jobId: hold.job_id, cylinder: hold.cylinder, unitId: hold.unit_id },
    });
  });
}
