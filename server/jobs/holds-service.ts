// Holding parts for a cylinder before it is cut. A hold is, in one transaction: the unit claimed
// with a conditional UPDATE (or the ring sets counted aside while enough are free), part_levels
// held + n (guarded by its CHECK), a ledger 'reservation' row, the hold row, a note on the job and
// the audit trail. In SQL that is BEGIN, the job locked, one read of all the rules and the answer
// need, one write of all of it (hold-place-repository.ts) and COMMIT. Whoever loses a race for a
// piston gets 409 not_available and the next best free piston of the same step. Releasing is in
// hold-release.ts, moving in hold-move.ts, the expiry sweep in hold-expiry.ts; whether a part may
// be held at all is shared/hold-rules.ts.
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { logger } from '../logger';
import { BadRequest, Conflict, NotAvailable, NotFound } from '../errors';
import { faultPoint } from '../testing-faults';
import { settingsFromStored } from '../settings/settings-service';
import { formatLength, type LengthUnit } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import type { HoldInput, HoldJson, ProposedUnitJson } from '../../shared/api/jobs';
import { whyNotHoldable, type HoldTarget } from '../../shared/hold-rules';
import * as repo from './holds-repository';
import * as jobsRepo from './jobs-repository';
import { DAY_MS, proposedJson, refuse, requireHoldJob } from './hold-common';
import { movesForward, stateNote } from './job-state';
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
  unit: { id: string; step_id: string | null },
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
      // The job row is locked for a state change from the start, so the job can move on to
      // parts-set-aside in this same transaction; holds on different jobs never wait here.
      const job = await requireHoldJob(trx, jobId, 'change');
      if (input.cylinder > job.cylinders) {
        throw new NotFound(
          `Cylinder ${input.cylinder} of job ${job.number} (it has ${job.cylinders})`,
        );
      }
      const place = await repo.readHoldPlace(trx, {
        jobId: job.id,
        cylinder: input.cylinder,
        unitId: input.unitId ?? null,
        partId: input.unitId ? null : (input.partId ?? null),
      });
      if (!place) throw new NotFound(`Cylinder ${input.cylinder} of job ${job.number}`);
      if (place.cut) {
        throw new Conflict(`Cylinder ${place.n} of job ${job.number} is already cut.`);
      }
      const days =
        input.expiresInDays === undefined
          ? settingsFromStored(place.settings).holdExpiryDays
          : input.expiresInDays;
      const expiresAt = days === null ? null : new Date(Date.now() + days * DAY_MS);
      const c = { actorId, job, place, holdId, expiresAt };
      const held = input.unitId
        ? await holdUnit(trx, { ...c, unit })
        : await holdCounted(trx, { ...c, quantity: input.quantity ?? 1 });
      faultPoint('holds.place.afterLedger');
      return holdJson(held);
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

function holdTarget(job: repo.HoldJobRow, place: repo.HoldPlaceRow): HoldTarget {
  return {
    jobNumber: job.number,
    familyId: job.family_id,
    cylinder: place.n,
    chosenStepId: place.chosen_step_id,
    chosenStepLabel: place.chosen_step_label,
  };
}

interface HoldContext {
  actorId: string;
  job: repo.HoldJobRow;
  place: repo.HoldPlaceRow;
  holdId: string;
  expiresAt: Date | null;
}

/**
 * The job's move to parts-set-aside when this hold leaves every cylinder with a step its piston
 * (the same rule as job-state.ts's advanceState, counted from the rows read before the write).
 */
function advanceAfterHold(
  job: repo.HoldJobRow,
  place: repo.HoldPlaceRow,
  after: { stepped: boolean; pistonHeld: boolean },
): repo.HoldNotes['advance'] {
  const to = 'parts_set_aside';
  if (!movesForward(job.state, to)) return null;
  const toBore = place.others_to_bore + (after.stepped ? 1 : 0);
  const withoutPiston = place.others_without_piston + (after.stepped && !after.pistonHeld ? 1 : 0);
  if (toBore === 0 || withoutPiston > 0) return null;
  return { state: to, text: stateNote(job.state, to) };
}

/** The stock half's hold and reservation fields, the same for a measured piston and counted parts. */
function holdStock(c: HoldContext): moves.HoldStock {
  return {
    holdId: c.holdId,
    jobId: c.job.id,
    cylinder: c.place.n,
    expiresAt: c.expiresAt,
    userId: c.actorId,
    reason: `held for job ${c.job.number}, cylinder ${c.place.n}`,
  };
}

/** Holds one measured piston; returns the hold as the answer shows it, from the rows already read. */
async function holdUnit(trx: Conn, c: HoldContext & { unit: LengthUnit }): Promise<repo.HoldRow> {
  const { job, place } = c;
  if (!place.unit_id || !place.part_id) throw new NotFound('That piston unit');
  const label = place.unit_label as string;
  refuse(
    whyNotHoldable(
      {
        name: label,
        kind: 'piston',
        familyId: place.family_id,
        stepId: place.step_id,
        stepLabel: place.step_label,
        measured: place.skirt_nm !== null,
        byUnit: true,
      },
      holdTarget(job, place),
    ),
  );
  const skirtNm = place.skirt_nm as number;
  if (place.piston_hold_unit_id) {
    if (place.piston_hold_unit_id === place.unit_id) {
      throw new Conflict(`${label} is already held for cylinder ${place.n} of this job.`);
    }
    throw new Conflict(`Cylinder ${place.n} already has a piston held; release or move it first.`);
  }

  // Holding a piston settles the step when none was chosen yet.
  const settleStepId = !place.chosen_step_id && place.step_id ? place.step_id : null;
  let written: { createdAt: Date; levelRows: number } | null;
  try {
    written = await repo.writeHold(trx, moves.unitHoldCtes(place.unit_id, holdStock(c)), {
      jobId: job.id,
      cylinder: place.n,
      holdId: c.holdId,
      userId: c.actorId,
      settleStepId,
      text: `Held ${label} (${place.step_label ?? ''}, skirt ${formatLength(skirtNm, c.unit)}) for cylinder ${place.n}.`,
      audit: {
        jobId: job.id,
        cylinder: place.n,
        unitId: place.unit_id,
        partId: place.part_id,
        expiresAt: c.expiresAt,
      },
      advance: advanceAfterHold(job, place, {
        stepped: Boolean(place.chosen_step_id ?? settleStepId),
        pistonHeld: true,
      }),
    });
  } catch (e) {
    if (isCheckViolation(e)) {
      throw new NotAvailable(`${label} cannot be held: its part has nothing free on hand.`);
    }
    throw e;
  }
  if (!written) {
    const now = await repo.holdUnit({ id: place.unit_id }, trx);
    const status = now?.status ?? place.unit_status ?? 'free';
    throw new NotAvailable(`${label} is no longer free: it is ${UNIT_STATUS_WORDS[status]}.`, {
      nextBest: await nextBest(trx, { id: place.unit_id, step_id: place.step_id }, job.family_id),
    });
  }
  // Every part has its levels row; a claim without one would leave held and the ledger apart.
  if (written.levelRows !== 1) throw new Error(`part_levels row missing for part ${place.part_id}`);
  return {
    id: c.holdId,
    job_id: job.id,
    job_number: job.number,
    cylinder: place.n,
    part_id: place.part_id,
    sku: place.sku as string,
    kind: 'piston',
    description: place.description as string,
    step_id: place.step_id,
    step_label: place.step_label,
    unit_id: place.unit_id,
    unit_label: label,
    skirt_nm: place.skirt_nm,
    material: place.material,
    bin_code: place.bin_code,
    quantity: 1,
    expires_at: c.expiresAt,
    created_at: written.createdAt,
    released_at: null,
    release_reason: null,
  };
}

/** Sets counted parts aside (ring sets, sundries); returns the hold as the answer shows it. */
async function holdCounted(
  trx: Conn,
  c: HoldContext & { quantity: number },
): Promise<repo.HoldRow> {
  const { job, place } = c;
  if (!place.part_id) {
    throw new BadRequest('partId: no part has this id.', [
      { field: 'partId', message: 'no part has this id' },
    ]);
  }
  const part = {
    id: place.part_id,
    sku: place.sku as string,
    description: place.description as string,
  };
  refuse(
    whyNotHoldable(
      {
        name: part.sku,
        kind: place.kind as NonNullable<repo.HoldPlaceRow['kind']>,
        familyId: place.family_id,
        stepId: place.step_id,
        stepLabel: place.step_label,
        byUnit: false,
      },
      holdTarget(job, place),
    ),
  );
  const written = await repo.writeHold(
    trx,
    moves.countedHoldCtes(part.id, c.quantity, holdStock(c)),
    {
      jobId: job.id,
      cylinder: place.n,
      holdId: c.holdId,
      userId: c.actorId,
      settleStepId: null,
      text: `Held ${c.quantity === 1 ? '' : `${c.quantity} × `}${part.sku} (${part.description}) for cylinder ${place.n}.`,
      audit: { jobId: job.id, cylinder: place.n, partId: part.id, quantity: c.quantity },
      advance: advanceAfterHold(job, place, {
        stepped: place.chosen_step_id !== null,
        pistonHeld: place.piston_hold_unit_id !== null,
      }),
    },
  );
  if (!written) {
    const free = await repo.freeCount(part.id, trx);
    throw new NotAvailable(
      free === 0
        ? `No ${part.sku} is free: every one on hand is held for a job.`
        : `Only ${free} of ${part.sku} ${free === 1 ? 'is' : 'are'} free; ${c.quantity} asked for.`,
      { nextBest: null, free },
    );
  }
  return {
    id: c.holdId,
    job_id: job.id,
    job_number: job.number,
    cylinder: place.n,
    part_id: part.id,
    sku: part.sku,
    kind: place.kind as repo.HoldRow['kind'],
    description: part.description,
    step_id: place.step_id,
    step_label: place.step_label,
    unit_id: null,
    unit_label: null,
    skirt_nm: null,
    material: place.material,
    bin_code: place.bin_code,
    quantity: c.quantity,
    expires_at: c.expiresAt,
    created_at: written.createdAt,
    released_at: null,
    release_reason: null,
  };
}
