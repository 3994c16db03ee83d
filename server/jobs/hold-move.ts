// Moving a hold to another job or cylinder without the part ever being free in between.
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import { getSettings } from '../settings/settings-service';
import { whyNotHoldable } from '../../shared/hold-rules';
import type { HoldJson, HoldMoveInput } from '../../shared/api/jobs';
import { isUniqueViolation } from '../db/pg-errors';
import * as repo from './holds-repository';
import * as jobsRepo from './jobs-repository';
import {
  DAY_MS,
  holdName,
  holdOut,
  lockActiveHold,
  refuse,
  requireCylinderRow,
  requireHoldJob,
} from './hold-common';
import * as moves from '../stock/stock-movements';

type Conn = Knex;

/**
 * Moves a hold to another job or cylinder without the part ever being free in between: the old
 * hold ends as 'moved' and a new one starts, with a release and a reservation in the ledger.
 */
export async function moveHold(
  actorId: string,
  id: string,
  target: HoldMoveInput,
  k: Conn = db,
): Promise<HoldJson> {
  const newId = randomUUID();
  try {
    return await k.transaction(async (trx) => {
      const settings = await getSettings(trx);
      const peek = await repo.findHold(id, trx);
      if (!peek) throw new NotFound('That hold');
      // Jobs first (in id order, so two moves between the same jobs cannot cross), then the hold.
      const jobIds = [...new Set([peek.job_id, target.jobId])].sort();
      const locked = new Map<string, jobsRepo.JobRow | undefined>();
      for (const jobId of jobIds) locked.set(jobId, await jobsRepo.lockJob(trx, jobId, 'share'));
      const source = await jobsRepo.lockCylinder(trx, peek.job_id, peek.cylinder);
      const hold = await lockActiveHold(trx, id);
      if (hold.unit_id && source?.cut_at) {
        throw new Conflict(
          `Cylinder ${hold.cylinder} is already cut to fit ${peek.unit_label}; the piston stays with it.`,
          'already_cut',
        );
      }
      const to = await requireHoldJob(trx, target.jobId, 'share');
      const cylinder = await requireCylinderRow(trx, to, target.cylinder);
      if (hold.job_id === to.id && hold.cylinder === cylinder.n) {
        throw new BadRequest('The hold is already on that cylinder of that job.', [
          { field: 'cylinder', message: 'already held there' },
        ]);
      }
      if (cylinder.cut_at) {
        throw new Conflict(`Cylinder ${cylinder.n} of job ${to.number} is already cut.`);
      }
      const part = await repo.holdPart(hold.part_id, trx);
      if (!part) throw new NotFound('The held part');
      refuse(
        whyNotHoldable(
          {
            name: part.sku,
            kind: part.kind,
            familyId: part.family_id,
            stepId: part.step_id,
            stepLabel: part.step_label,
            byUnit: hold.unit_id !== null,
          },
          {
            jobNumber: to.number,
            familyId: to.family_id,
            cylinder: cylinder.n,
            chosenStepId: cylinder.chosen_step_id,
            chosenStepLabel: cylinder.step_label,
            moving: true,
          },
        ),
      );
      if (hold.unit_id && (await repo.activePistonHold(trx, to.id, cylinder.n))) {
        throw new Conflict(
          `Cylinder ${cylinder.n} of job ${to.number} already has a piston held; release it first.`,
        );
      }
      const from = locked.get(hold.job_id);
      const fromNumber = from?.number ?? peek.job_number;
      const expiresAt = hold.expires_at
        ? new Date(Date.now() + settings.holdExpiryDays * DAY_MS)
        : null;

      await repo.endHold(trx, hold.id, 'moved', actorId);
      await repo.insertHold(trx, {
        id: newId,
        job_id: to.id,
        cylinder: cylinder.n,
        part_id: hold.part_id,
        unit_id: hold.unit_id,
        quantity: hold.quantity,
        expires_at: expiresAt,
        created_by: actorId,
        moved_from_hold_id: hold.id,
      });
      if (hold.unit_id) {
        const marked = await repo.remarkUnit(trx, hold.unit_id, {
          jobId: to.id,
          cylinder: cylinder.n,
          holdId: newId,
          expiresAt,
        });
        if (!marked) throw new Error(`piston unit ${hold.unit_id} of hold ${hold.id} is not held`);
        if (!cylinder.chosen_step_id && part.step_id) {
          await jobsRepo.updateCylinder(trx, to.id, cylinder.n, { chosen_step_id: part.step_id });
        }
      }
      const where = `job ${to.number}, cylinder ${cylinder.n}`;
      await moves.insertLedger(trx, [
        {
          user_id: actorId,
          part_id: hold.part_id,
          unit_id: hold.unit_id,
          kind: 'release',
          quantity: 0,
          held_delta: -hold.quantity,
          job_id: hold.job_id,
          reason: `moved to ${where}`,
          ref: hold.id,
        },
        {
          user_id: actorId,
          part_id: hold.part_id,
          unit_id: hold.unit_id,
          kind: 'reservation',
          quantity: 0,
          held_delta: hold.quantity,
          job_id: to.id,
          reason: `moved from job ${fromNumber}, cylinder ${hold.cylinder}`,
          ref: newId,
        },
      ]);
      await jobsRepo.insertEvent(trx, {
        jobId: hold.job_id,
        userId: actorId,
        kind: 'hold',
        text: `Moved ${holdName(peek)} from cylinder ${hold.cylinder} to ${where}.`,
      });
      if (to.id !== hold.job_id) {
        await jobsRepo.insertEvent(trx, {
          jobId: to.id,
          userId: actorId,
          kind: 'hold',
          text: `${holdName(peek)} moved here from job ${fromNumber} for cylinder ${cylinder.n}.`,
        });
      }
      await recordAudit(trx, {
        userId: actorId,
        action: 'hold.move',
        entity: 'hold',
        entityId: newId,
        before: { holdId: hold.id, jobId: hold.job_id, cylinder: hold.cylinder },
        after: { holdId: newId, jobId: to.id, cylinder: cylinder.n },
      });
      return holdOut(newId, trx);
    });
  } catch (e) {
    if (isUniqueViolation(e)) {
      throw new Conflict(
        `Cylinder ${target.cylinder} already has a piston held; release it first.`,
      );
    }
    throw e;
  }
}
