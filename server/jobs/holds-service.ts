// Holding parts for a cylinder before it is cut. A hold is, in one transaction: the unit claimed
// with a conditional UPDATE (or the ring sets counted aside while enough are free), part_levels
// held + n (guarded by its CHECK), a ledger 'reservation' row, the hold row, a note on the job and
// the audit trail. A release is the reverse with a 'release' row. Whoever loses a race for a
// piston gets 409 not_available and the next best free piston of the same step.
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { logger } from '../logger';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotAvailable, NotFound } from '../errors';
import { faultPoint } from '../testing-faults';
import { getSettings } from '../settings/settings-service';
import { formatLength, toLengthJson, type LengthUnit } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import {
  JOB_STATE_LABELS,
  isOpenState,
  type HoldInput,
  type HoldJson,
  type HoldMoveInput,
  type ProposedUnitJson,
  type SweepResultJson,
} from '../../shared/jobs-api';
import * as repo from './holds-repository';
import * as jobsRepo from './jobs-repository';
import { holdJson } from './jobs-json';
import { advanceState } from './job-state';
import { recordShortage } from '../insights/insights-service';
import { isCheckViolation, isUniqueViolation } from '../db/pg-errors';

type Conn = Knex;

const DAY_MS = 24 * 60 * 60 * 1000;
/** Holds released per sweep transaction; a backlog is worked off over several rounds. */
const SWEEP_BATCH = 500;

const UNIT_STATUS_WORDS: Record<repo.HoldUnitRow['status'], string> = {
  free: 'free',
  held: 'already held for a job',
  issued: 'already issued',
  returned: 'sent back to the supplier',
  scrapped: 'scrapped',
};

export function proposedJson(row: repo.FreeUnitRow): ProposedUnitJson {
  return {
    id: row.id,
    label: row.label,
    partId: row.part_id,
    sku: row.sku,
    skirt: toLengthJson(row.skirt_nm),
    bin: row.bin_code,
    stepLabel: row.step_label,
  };
}

async function requireHoldJob(trx: Conn, jobId: string, mode: 'share' | 'change') {
  const job = await jobsRepo.lockJob(trx, jobId, mode);
  if (!job) throw new NotFound('That job');
  if (!isOpenState(job.state)) {
    throw new Conflict(
      `Job ${job.number} is ${JOB_STATE_LABELS[job.state].toLowerCase()}; nothing more can be held for it.`,
      'job_closed',
    );
  }
  return job;
}

async function requireCylinderRow(trx: Conn, job: jobsRepo.JobRow, n: number) {
  if (n > job.cylinders) {
    throw new NotFound(`Cylinder ${n} of job ${job.number} (it has ${job.cylinders})`);
  }
  const cylinder = (await jobsRepo.cylindersOf(job.id, trx)).find((c) => c.n === n);
  if (!cylinder) throw new NotFound(`Cylinder ${n} of job ${job.number}`);
  return cylinder;
}

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

async function holdOut(id: string, k: Conn): Promise<HoldJson> {
  const row = await repo.findHold(id, k);
  if (!row) throw new NotFound('The hold');
  return holdJson(row);
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
      if (input.unitId) {
        await holdUnit(trx, {
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
      return holdOut(holdId, trx);
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

interface HoldContext {
  actorId: string;
  job: jobsRepo.JobRow;
  cylinder: jobsRepo.CylinderRow;
  holdId: string;
  expiresAt: Date | null;
}

async function holdUnit(
  trx: Conn,
  c: HoldContext & { unitId: string; unit: LengthUnit },
): Promise<void> {
  const { job, cylinder } = c;
  const piston = await repo.holdUnit({ id: c.unitId }, trx);
  if (!piston) throw new NotFound('That piston unit');
  if (piston.family_id !== job.family_id) {
    throw new BadRequest(`unitId: ${piston.label} is a piston for another engine family.`, [
      { field: 'unitId', message: `${piston.label} is a piston for another engine family` },
    ]);
  }
  if (piston.skirt_nm === null) {
    throw new Conflict(
      `${piston.label} has not been measured yet: measure its skirt before holding it, so the bore sheet can use it.`,
      'not_measured',
    );
  }
  if (cylinder.chosen_step_id && piston.step_id !== cylinder.chosen_step_id) {
    throw new Conflict(
      `${piston.label} is a ${piston.step_label ?? 'different'} piston; cylinder ${cylinder.n} is set to go to ${cylinder.step_label}. Choose that step or another piston.`,
      'wrong_step',
    );
  }
  const existing = await repo.activePistonHold(trx, job.id, cylinder.n);
  if (existing) {
    if (existing.unit_id === piston.id) {
      throw new Conflict(`${piston.label} is already held for cylinder ${cylinder.n} of this job.`);
    }
    throw new Conflict(
      `Cylinder ${cylinder.n} already has a piston held; release or move it first.`,
    );
  }

  const claimed = await repo.claimUnit(trx, piston.id, {
    jobId: job.id,
    cylinder: cylinder.n,
    holdId: c.holdId,
    expiresAt: c.expiresAt,
  });
  if (!claimed) {
    const now = await repo.holdUnit({ id: piston.id }, trx);
    const status = now?.status ?? piston.status;
    throw new NotAvailable(
      `${piston.label} is no longer free: it is ${UNIT_STATUS_WORDS[status]}.`,
      { nextBest: await nextBest(trx, piston, job.family_id) },
    );
  }
  try {
    await repo.changeLevels(trx, piston.part_id, { onHand: 0, held: 1 });
  } catch (e) {
    if (isCheckViolation(e)) {
      throw new NotAvailable(`${piston.label} cannot be held: its part has nothing free on hand.`);
    }
    throw e;
  }
  await repo.insertHold(trx, {
    id: c.holdId,
    job_id: job.id,
    cylinder: cylinder.n,
    part_id: piston.part_id,
    unit_id: piston.id,
    quantity: 1,
    expires_at: c.expiresAt,
    created_by: c.actorId,
  });
  await repo.insertLedger(trx, [
    {
      user_id: c.actorId,
      part_id: piston.part_id,
      unit_id: piston.id,
      kind: 'reservation',
      quantity: 0,
      held_delta: 1,
      job_id: job.id,
      reason: `held for job ${job.number}, cylinder ${cylinder.n}`,
      ref: c.holdId,
    },
  ]);
  // Holding a piston settles the step when none was chosen yet.
  if (!cylinder.chosen_step_id && piston.step_id) {
    await jobsRepo.updateCylinder(trx, job.id, cylinder.n, { chosen_step_id: piston.step_id });
  }
  await jobsRepo.insertEvent(trx, {
    jobId: job.id,
    userId: c.actorId,
    kind: 'hold',
    text: `Held ${piston.label} (${piston.step_label ?? ''}, skirt ${formatLength(piston.skirt_nm, c.unit)}) for cylinder ${cylinder.n}.`,
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
  if (part.kind === 'piston') {
    throw new BadRequest(
      `partId: ${part.sku} is a piston; hold a piston by its unit, so its measured size is on the bore sheet.`,
      [{ field: 'partId', message: 'hold a piston by its unit (unitId)' }],
    );
  }
  if (part.kind === 'kit') {
    throw new BadRequest(
      `partId: ${part.sku} is a kit; hold its piston unit and its ring set one by one.`,
      [{ field: 'partId', message: 'a kit is held through its parts' }],
    );
  }
  if (part.family_id !== null && part.family_id !== job.family_id) {
    throw new BadRequest(`partId: ${part.sku} is for another engine family.`, [
      { field: 'partId', message: `${part.sku} is for another engine family` },
    ]);
  }
  if (part.step_id && cylinder.chosen_step_id && part.step_id !== cylinder.chosen_step_id) {
    throw new Conflict(
      `${part.sku} is for ${part.step_label}; cylinder ${cylinder.n} is set to go to ${cylinder.step_label}.`,
      'wrong_step',
    );
  }
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
  await repo.insertLedger(trx, [
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

// ---- Ending a hold ----------------------------------------------------------------------------

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
  await repo.changeLevels(trx, hold.part_id, { onHand: 0, held: -hold.quantity });
  await repo.insertLedger(trx, [
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

async function lockActiveHold(trx: Conn, id: string) {
  const hold = await repo.lockHold(trx, id);
  if (!hold) throw new NotFound('That hold');
  if (hold.released_at) {
    const ended = await repo.findHold(id, trx);
    throw new Conflict(
      `That hold has already ended (${ended?.release_reason ?? 'released'}); nothing is held by it now.`,
      'hold_ended',
    );
  }
  return hold;
}

function holdName(row: repo.HoldRow): string {
  return row.unit_label ?? (row.quantity === 1 ? row.sku : `${row.quantity} × ${row.sku}`);
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
      if (part.family_id !== null && part.family_id !== to.family_id) {
        throw new BadRequest(`jobId: ${part.sku} does not fit job ${to.number}'s engine family.`, [
          { field: 'jobId', message: 'another engine family' },
        ]);
      }
      if (part.step_id && cylinder.chosen_step_id && part.step_id !== cylinder.chosen_step_id) {
        throw new Conflict(
          `${part.sku} is for ${part.step_label}; cylinder ${cylinder.n} of job ${to.number} is set to go to ${cylinder.step_label}.`,
          'wrong_step',
        );
      }
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
      await repo.insertLedger(trx, [
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

// ---- The expiry sweep -------------------------------------------------------------------------

/**
 * Releases every hold past its expiry, each with a ledger row and a note on its job. Only one
 * server process sweeps at a time (an advisory lock); a second caller returns ran: false.
 */
export async function sweepExpiredHolds(
  actorId: string | null = null,
  k: Conn = db,
): Promise<SweepResultJson> {
  let released = 0;
  for (;;) {
    const round = await k.transaction(async (trx) => {
      if (!(await repo.trySweepLock(trx))) return null;
      const expired = await repo.lockExpiredHolds(trx, SWEEP_BATCH);
      for (const { id } of expired) {
        const hold = await repo.lockHold(trx, id);
        const view = await repo.findHold(id, trx);
        if (!hold || !view || hold.released_at) continue;
        await releaseInTransaction(trx, hold, {
          reason: 'expired',
          userId: actorId,
          jobId: hold.job_id,
          ledgerReason: `hold for job ${view.job_number}, cylinder ${hold.cylinder} expired`,
        });
        await jobsRepo.insertEvent(trx, {
          jobId: hold.job_id,
          userId: null,
          kind: 'system',
          text: `The hold on ${holdName(view)} for cylinder ${hold.cylinder} expired and was released back to the shelf.`,
        });
        await recordAudit(trx, {
          userId: actorId,
          action: 'hold.expire',
          entity: 'hold',
          entityId: id,
          before: { jobId: hold.job_id, cylinder: hold.cylinder, expiresAt: hold.expires_at },
        });
      }
      return expired.length;
    });
    if (round === null) return { ran: released > 0, released };
    released += round;
    if (round < SWEEP_BATCH) break;
  }
  if (released > 0) logger.info({ released }, 'expired holds released');
  return { ran: true, released };
}

// ---- What to hold -----------------------------------------------------------------------------

/**
 * For a cylinder's step (the chosen one unless another is asked for): the free measured piston
 * whose skirt is nearest the step's nominal size, the next few, and the ring sets with free stock.
 */
