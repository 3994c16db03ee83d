// Holding parts for a cylinder before it is cut. A hold is, in one transaction: the unit claimed
// with a conditional UPDATE (or the ring sets counted aside while enough are free), part_levels
// held + n (guarded by its CHECK), a ledger 'reservation' row, the hold row, a note on the job and
// the audit trail. Whoever loses a race for a piston gets 409 not_available and the next best free
// piston of the same step. Releasing is in hold-release.ts, moving in hold-move.ts, the expiry
// sweep in hold-expiry.ts; whether a part may be held at all is shared/hold-rules.ts.
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { logger } from '../logger';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotAvailable, NotFound } from '../errors';
import { faultPoint } from '../testing-faults';
import { getSettings } from '../settings/settings-service';
import { formatLength, type LengthUnit } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import type { HoldInput, HoldJson, ProposedUnitJson } from '../../shared/api/jobs';
import { whyNotHoldable, type HoldTarget } from '../../shared/hold-rules';
import * as repo from './holds-repository';
import * as jobsRepo from './jobs-repository';
import {
  DAY_MS,
  holdOut,
  proposedJson,
  refuse,
  requireCylinderRow,
  requireHoldJob,
} from './hold-common';
import { advanceState } from './job-state';
import { holdJson } from './jobs-json';
import { recordShortage } from '../insights/insights-service';
import { isCheckViolation, isUniqueViolation } from '../db/pg-errors';
import * as moves from '../stock/stock-movements';

type Conn = Knex;

const UNIT_STATUS_WORDS: Record<repo.HoldUnitRow['status'], string> = {
  free: 'free',
  held: 'already held for a job',
  issued: 'already issued',
  returned: 'sent back to the supplier',
  scrapped: 'scrapped',
};

/** The next best free piston after a lost race: same step, skirt nearest the step's nominal. */
async function nextBest(
  k: Conn,
  unit: repo.HoldUnitRow,
  familyId: string,
): Promise<ProposedUnitJson | null> {
  if (!unit.step_id) return null;
  const [family, step] = await Promise.all([
    jobsRepo.findFamily(familyId, k),
    jobsRepo.findStep(unit.step_id, k),
  ]);
  if (!family || !step) return null;
  const nominal = stepNominalBore(family.standard_bore_nm, step.offset_nm);
  const [best] = await repo.nearestFreeUnits(
    familyId,
    unit.step_id,
    nominal,
    {
      excludeId: unit.id,
      limit: 1,
    },
    k,
  );
  return best ? proposedJson(best) : null;
}

// ---- Placing a hold ---------------------------------------------------------------------------

export async function placeHold(
  actorId: string,
  jobId: string,
  input: HoldInput,
  unit: LengthUnit,
  k: Conn = db,
): Promise<HoldJson> {
  const holdId = randomUUID();
  try {
    // Everything on the transaction's one connection, answer included: under a burst of holds
    // the pool is busy, and a hold that is already committed must never end up answered with a
    // "try again" because a second connection could not be had in time.
    return await k.transaction(async (trx) => {
      const settings = await getSettings(trx);
      const days =
        input.expiresInDays === undefined ? settings.holdExpiryDays : input.expiresInDays;
      const expiresAt = days === null ? null : new Date(Date.now() + days * DAY_MS);
      // The job row is locked for a state change from the start, so the job can move on to
      // parts-set-aside in this same transaction; holds on different jobs never wait here.
      const job = await requireHoldJob(trx, jobId, 'change');
      const cylinder = await requireCylinderRow(trx, job, input.cylinder);
      if (cylinder.cut_at) {
        throw new Conflict(`Cylinder ${cylinder.n} of job ${job.number} is already cut.`);
      }
      let held: repo.HoldRow | null = null;
      if (input.unitId) {
        held = await holdUnit(trx, {
          actorId,
          job,
          cylinder,
          unitId: input.unitId,
          holdId,
          expiresAt,
          unit,
        });
      } else if (input.partId) {
        await holdCounted(trx, {
          actorId,
          job,
          cylinder,
          partId: input.partId,
          quantity: input.quantity ?? 1,
          holdId,
          expiresAt,
        });
      }
      faultPoint('holds.place.afterLedger');
      // Once every cylinder with a step has its piston, a job at booked-in or gauged moves on.
      await advanceState(trx, job, 'parts_set_aside', actorId);
      return held ? holdJson(held) : holdOut(holdId, trx);
    });
  } catch (e) {
    // Nothing free at that step: noted for Ran short after the rollback, so the note survives.
    if (e instanceof NotAvailable && !e.extra.nextBest) {
      await noteShortage(actorId, jobId, input).catch((err) =>
        logger.warn({ err }, 'could not record a shortage'),
      );
    }
    // Two holds for one cylinder at the same moment: the unique index lets one through.
    if (isUniqueViolation(e)) {
      throw new Conflict(
        `Cylinder ${input.cylinder} already has a piston held; release or move it first.`,
      );
    }
    throw e;
  }
}

async function noteShortage(actorId: string, jobId: string, input: HoldInput): Promise<void> {
  const target = await repo.holdTargetStep(jobId, input);
  if (!target?.stepId || (target.kind !== 'piston' && target.kind !== 'rings')) return;
  await recordShortage({
    familyId: target.familyId,
    stepId: target.stepId,
    jobId,
    cylinder: input.cylinder,
    source: 'hold',
    part: target.kind,
    userId: actorId,
  });
}

function holdTarget(job: jobsRepo.JobRow, cylinder: jobsRepo.CylinderRow): HoldTarget {
  return {
    jobNumber: job.number,
    familyId: job.family_id,
    cylinder: cylinder.n,
    chosenStepId: cylinder.chosen_step_id,
    chosenStepLabel: cylinder.step_label,
  };
}

interface HoldContext {
  actorId: string;
  job: jobsRepo.JobRow;
  cylinder: jobsRepo.CylinderRow;
  holdId: string;
  expiresAt: Date | null;
}

/** Holds one measured piston; returns the hold as the answer shows it, from the rows already read. */
async function holdUnit(
  trx: Conn,
  c: HoldContext & { unitId: string; unit: LengthUnit },
): Promise<repo.HoldRow> {
  const { job, cylinder } = c;
  const piston = await repo.holdUnit({ id: c.unitId }, trx);
  if (!piston) throw new NotFound('That piston unit');
  refuse(
    whyNotHoldable(
      {
        name: piston.label,
        kind: 'piston',
        familyId: piston.family_id,
        stepId: piston.step_id,
        stepLabel: piston.step_label,
        measured: piston.skirt_nm !== null,
        byUnit: true,
      },
      holdTarget(job, cylinder),
    ),
  );
  const skirtNm = piston.skirt_nm as number;
  const existing = await repo.activePistonHold(trx, job.id, cylinder.n);
  if (existing) {
    if (existing.unit_id === piston.id) {
      throw new Conflict(`${piston.label} is already held for cylinder ${cylinder.n} of this job.`);
    }
    throw new Conflict(
      `Cylinder ${cylinder.n} already has a piston held; release or move it first.`,
    );
  }

  let claimed: { partId: string; createdAt: Date } | null;
  try {
    claimed = await moves.claimUnitForHold(trx, {
      unitId: piston.id,
      holdId: c.holdId,
      jobId: job.id,
      cylinder: cylinder.n,
      expiresAt: c.expiresAt,
      userId: c.actorId,
      reason: `held for job ${job.number}, cylinder ${cylinder.n}`,
    });
  } catch (e) {
    if (isCheckViolation(e)) {
      throw new NotAvailable(`${piston.label} cannot be held: its part has nothing free on hand.`);
    }
    throw e;
  }
  if (!claimed) {
    const now = await repo.holdUnit({ id: piston.id }, trx);
    const status = now?.status ?? piston.status;
    throw new NotAvailable(
      `${piston.label} is no longer free: it is ${UNIT_STATUS_WORDS[status]}.`,
      { nextBest: await nextBest(trx, piston, job.family_id) },
    );
  }
  // Holding a piston settles the step when none was chosen yet.
  if (!cylinder.chosen_step_id && piston.step_id) {
    await jobsRepo.updateCylinder(trx, job.id, cylinder.n, { chosen_step_id: piston.step_id });
  }
  await jobsRepo.insertEvent(trx, {
    jobId: job.id,
    userId: c.actorId,
    kind: 'hold',
    text: `Held ${piston.label} (${piston.step_label ?? ''}, skirt ${formatLength(skirtNm, c.unit)}) for cylinder ${cylinder.n}.`,
  });
  await recordAudit(trx, {
    userId: c.actorId,
    action: 'hold.create',
    entity: 'hold',
    entityId: c.holdId,
    after: {
      jobId: job.id,
      cylinder: cylinder.n,
      unitId: piston.id,
      partId: piston.part_id,
      expiresAt: c.expiresAt,
    },
  });
  return {
    id: c.holdId,
    job_id: job.id,
    job_number: job.number,
    cylinder: cylinder.n,
    part_id: piston.part_id,
    sku: piston.sku,
    kind: 'piston',
    description: piston.description,
    step_id: piston.step_id,
    step_label: piston.step_label,
    unit_id: piston.id,
    unit_label: piston.label,
    skirt_nm: piston.skirt_nm,
    material: piston.material,
    bin_code: piston.bin_code,
    quantity: 1,
    expires_at: c.expiresAt,
    created_at: claimed.createdAt,
    released_at: null,
    release_reason: null,
  };
}

async function holdCounted(
  trx: Conn,
  c: HoldContext & { partId: string; quantity: number },
): Promise<void> {
  const { job, cylinder } = c;
  const part = await repo.holdPart(c.partId, trx);
  if (!part) {
    throw new BadRequest('partId: no part has this id.', [
      { field: 'partId', message: 'no part has this id' },
    ]);
  }
  refuse(
    whyNotHoldable(
      {
        name: part.sku,
        kind: part.kind,
        familyId: part.family_id,
        stepId: part.step_id,
        stepLabel: part.step_label,
        byUnit: false,
      },
      holdTarget(job, cylinder),
    ),
  );
  const reserved = await repo.reserveCount(trx, part.id, c.quantity);
  if (!reserved) {
    const free = await repo.freeCount(part.id, trx);
    throw new NotAvailable(
      free === 0
        ? `No ${part.sku} is free: every one on hand is held for a job.`
        : `Only ${free} of ${part.sku} ${free === 1 ? 'is' : 'are'} free; ${c.quantity} asked for.`,
      { nextBest: null, free },
    );
  }
  await repo.insertHold(trx, {
    id: c.holdId,
    job_id: job.id,
    cylinder: cylinder.n,
    part_id: part.id,
    unit_id: null,
    quantity: c.quantity,
    expires_at: c.expiresAt,
    created_by: c.actorId,
  });
  await moves.insertLedger(trx, [
    {
      user_id: c.actorId,
      part_id: part.id,
      unit_id: null,
      kind: 'reservation',
      quantity: 0,
      held_delta: c.quantity,
      job_id: job.id,
      reason: `held for job ${job.number}, cylinder ${cylinder.n}`,
      ref: c.holdId,
    },
  ]);
  await jobsRepo.insertEvent(trx, {
    jobId: job.id,
    userId: c.actorId,
    kind: 'hold',
    text: `Held ${c.quantity === 1 ? '' : `${c.quantity} × `}${part.sku} (${part.description}) for cylinder ${cylinder.n}.`,
  });
  await recordAudit(trx, {
    userId: c.actorId,
    action: 'hold.create',
    entity: 'hold',
    entityId: c.holdId,
    after: { jobId: job.id, cylinder: cylinder.n, partId: part.id, quantity: c.quantity },
  });
}
