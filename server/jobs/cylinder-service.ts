// One cylinder of a job: its bore readings, the step it goes to, the numbers on its bore sheet,
// marking it cut, and the sizes recorded after honing. Every size comes from the shared
// computations the readings form previews with.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { BadRequest, Conflict, NotFound } from '../errors';
import { getSettings } from '../settings/settings-service';
import { settingLength } from '../settings/setting-length';
import { assessBore } from '../../shared/bore-assessment';
import { looksLikeFirstRebore, recommendStep } from '../../shared/bore-choice';
import { ReadingsError } from '../../shared/bore-wear';
import { formatLength, toLengthJson, type LengthUnit, type Nm } from '../../shared/lengths';
import type {
  CylinderJson,
  CylinderPatch,
  EarlierBoreJson,
  ReadingsInput,
  ReadingsResultJson,
  RecommendationJson,
} from '../../shared/api/jobs';
import { stepNominalBore } from '../../shared/step-series';
import type { BoreJson } from '../../shared/api/customers';
import * as repo from './jobs-repository';
import * as holdsRepo from './holds-repository';
import { lockOpenCylinder, requireCylinder } from './jobs-service';
import { advanceAfterHoning, advanceState } from './job-state';
import {
  cylinderJson,
  familyClearances,
  familyLimits,
  lengthOrNull,
  readingJson,
} from './jobs-json';
import { clearanceRangeFor } from '../../shared/finish-checks';
import { refuseStaleFinish } from './cylinder-stale';
import { checkLink, ladderOf, lastBoreBefore } from '../customers/cylinders-service';
import { lastBoreConstraint, stepsLeftAfter, stepsLeftWarning } from '../../shared/bore-history';

type Conn = Knex;

/** A job's cylinder with the job and its engine family, read (not locked); not found when any is missing. */
export async function cylinderContext(jobId: string, n: number, k: Conn) {
  const job = await repo.findJob(jobId, k);
  if (!job) throw new NotFound('That job');
  requireCylinder(job, n);
  const family = await repo.findFamily(job.family_id, k);
  if (!family) throw new NotFound("That job's engine family");
  const cylinder = (await repo.cylindersOf(jobId, k)).find((c) => c.n === n);
  if (!cylinder) throw new NotFound(`Cylinder ${n} of job ${job.number}`);
  return { job, family, cylinder };
}

export async function getCylinder(
  jobId: string,
  n: number,
  unit: LengthUnit,
  k: Conn = db,
): Promise<CylinderJson> {
  const { family, cylinder } = await cylinderContext(jobId, n, k);
  const [readings, holds] = await Promise.all([
    repo.readingsOf(jobId, k),
    holdsRepo.holdsOfJob(jobId, { activeOnly: true }, k),
  ]);
  return cylinderJson(cylinder, family, readings, holds, unit);
}

// ---- Readings ---------------------------------------------------------------------------------

/**
 * Readings typed against an earlier state (offline at the bench, or two people on one cylinder)
 * must not overwrite newer ones: when the stored readings are not the ones the entry was based on,
 * 409 with both, so the machinist sees which values differ and chooses.
 */
async function refuseStaleReadings(
  trx: Conn,
  jobNumber: string,
  cylinder: repo.CylinderRow,
  input: ReadingsInput,
): Promise<void> {
  if (input.basedOn === undefined) return;
  const stored = cylinder.measured_at ? cylinder.measured_at.toISOString() : null;
  const based = input.basedOn === null ? null : new Date(input.basedOn).toISOString();
  if (stored === based) return;
  const storedReadings = (await repo.readingsOf(cylinder.job_id, trx))
    .filter((r) => r.n === cylinder.n)
    .map(readingJson);
  throw new Conflict(
    stored === null
      ? `Cylinder ${cylinder.n} of job ${jobNumber} has no readings now, but these were typed against earlier ones; check them and send again.`
      : `The readings of cylinder ${cylinder.n} of job ${jobNumber} were changed at ${stored} since these were typed; compare both and send the right ones again.`,
    'stale_readings',
    {
      stored: { measuredAt: stored, readings: storedReadings },
      yours: {
        basedOn: input.basedOn,
        readings: input.readings.map((r) => ({
          depth: r.depth,
          axis: r.axis,
          diameter: toLengthJson(r.diameter.nm),
          unit: r.diameter.unit,
        })),
      },
    },
  );
}

export async function putReadings(
  actorId: string,
  jobId: string,
  n: number,
  input: ReadingsInput,
  unit: LengthUnit,
  k: Conn = db,
): Promise<ReadingsResultJson> {
  const readings = input.readings.map((r) => ({
    depth: r.depth,
    axis: r.axis,
    nm: r.diameter.nm,
    unit: r.diameter.unit,
  }));
  const result = await k.transaction(async (trx) => {
    const { job, cylinder } = await lockOpenCylinder(trx, jobId, n);
    if (cylinder.cut_at) {
      throw new Conflict(
        `Cylinder ${n} is already cut; its wear readings are kept as they were before the cut.`,
        'already_cut',
      );
    }
    await refuseStaleReadings(trx, job.number, cylinder, input);
    const family = await repo.findFamily(job.family_id, trx);
    if (!family) throw new NotFound("That job's engine family");
    let assessment;
    try {
      assessment = assessBore(readings, familyLimits(family), unit);
    } catch (e) {
      if (e instanceof ReadingsError) {
        throw new BadRequest(`readings: ${e.message}`, [{ field: 'readings', message: e.message }]);
      }
      throw e;
    }
    const { wear } = assessment;
    await repo.replaceReadings(trx, jobId, n, readings, wear, actorId);
    const show = (nm: Nm) => formatLength(nm, unit);
    await repo.insertEvent(trx, {
      jobId,
      userId: actorId,
      kind: 'work',
      text: `Cylinder ${n} gauged: largest ${show(wear.largest)}, taper ${show(wear.taper)}, out-of-round ${show(wear.outOfRound)}.`,
    });
    await advanceState(trx, job, 'gauged', actorId);
    return assessment;
  });
  const { wear, warnings } = result;
  return {
    wear: {
      largest: toLengthJson(wear.largest),
      taper: toLengthJson(wear.taper),
      outOfRound: toLengthJson(wear.outOfRound),
    },
    overStandard: lengthOrNull(wear.overStandard),
    taperKnown: wear.taperKnown,
    outOfRoundKnown: wear.outOfRoundKnown,
    warnings,
    cylinder: await getCylinder(jobId, n, unit, k),
  };
}

// ---- The step ---------------------------------------------------------------------------------

export async function recommendation(
  jobId: string,
  n: number,
  unit: LengthUnit,
  k: Conn = db,
): Promise<RecommendationJson> {
  const { job, family, cylinder } = await cylinderContext(jobId, n, k);
  if (cylinder.largest_nm === null) {
    throw new Conflict(
      `Enter the bore readings for cylinder ${n} of job ${job.number} first; the step follows from the worst wear.`,
      'no_readings',
    );
  }
  const settings = await getSettings(k);
  const [steps, stock] = await Promise.all([
    repo.stepsOfSeries(family.step_series_id, k),
    holdsRepo.stepStock(family.id, k),
  ]);
  const marginal = settings.skipMarginalStep
    ? settingLength('marginal clean-up', settings.marginalCleanup)
    : null;
  // A cylinder bored before may only go on from its last finished bore; a linked cylinder with
  // no bores yet is known to be on its first rebore.
  const earlier = cylinder.cylinder_id
    ? await lastBoreBefore(cylinder.cylinder_id, jobId, k)
    : null;
  const stepStock = steps.map((s) => {
    const st = stock.find((x) => x.step_id === s.id);
    return {
      stepId: s.id,
      label: s.label,
      offsetNm: s.offset_nm,
      freePistons: st?.free_pistons ?? 0,
      freeRings: st?.free_rings ?? 0,
      onOrder: st?.on_order ?? 0,
    };
  });
  const verdict = recommendStep({
    policy: settings.stepPolicy,
    firstRebore: cylinder.cylinder_id
      ? earlier === null
      : looksLikeFirstRebore(cylinder.largest_nm, family.standard_bore_nm, stepStock),
    constraints: earlier ? [lastBoreConstraint(earlier.last, family.cleanup_nm, unit)] : [],
    largestWornNm: cylinder.largest_nm,
    standardBoreNm: family.standard_bore_nm,
    cleanupNm: family.cleanup_nm,
    maxOversizeNm: family.max_oversize_nm,
    skipMarginal: settings.skipMarginalStep && marginal !== null,
    marginalNm: marginal ?? undefined,
    unit,
    steps: stepStock,
  });
  const ladder = await ladderOf(family, k);
  const chosen = verdict.steps.find((v) => v.stepId === verdict.choice);
  const stepsLeft = chosen
    ? stepsLeftAfter(ladder, chosen.finishedBoreNm)
    : verdict.choice === null && verdict.steps.every((v) => !v.suitable)
      ? 0
      : stepsLeftAfter(ladder, earlier?.row.finished_bore_nm ?? null);
  const lastStep = chosen ? stepsLeftWarning(stepsLeft) : null;
  const warning = [verdict.warning, lastStep].filter((w) => w).join(' ');
  return {
    steps: verdict.steps.map((v) => ({
      stepId: v.stepId,
      label: v.label,
      finishedBore: toLengthJson(v.finishedBoreNm),
      cleanup: toLengthJson(v.cleanupNm),
      freePistons: v.freePistons,
      freeRings: v.freeRings,
      onOrder: v.onOrder,
      suitable: v.suitable,
      reason: v.reason,
    })),
    choice: verdict.choice,
    ...(verdict.rule ? { rule: verdict.rule } : {}),
    ...(warning ? { warning } : {}),
    ...(verdict.alternative ? { alternative: verdict.alternative } : {}),
    largestWorn: toLengthJson(cylinder.largest_nm),
    chosenStepId: cylinder.chosen_step_id,
    stepsLeft,
    earlierBore: earlier ? earlierBoreJson(earlier.json) : null,
    cylinder:
      cylinder.cylinder_id && cylinder.cylinder_mark
        ? { id: cylinder.cylinder_id, mark: cylinder.cylinder_mark }
        : null,
  };
}

export async function patchCylinder(
  actorId: string,
  jobId: string,
  n: number,
  patch: CylinderPatch,
  unit: LengthUnit,
  k: Conn = db,
): Promise<CylinderJson> {
  await k.transaction(async (trx) => {
    const { job, cylinder } = await lockOpenCylinder(trx, jobId, n);
    refuseStaleFinish(job.number, cylinder, patch);
    const family = await repo.findFamily(job.family_id, trx);
    if (!family) throw new NotFound("That job's engine family");
    const show = (nm: Nm) => formatLength(nm, unit);
    const changes: Record<string, unknown> = {};
    const notes: string[] = [];

    if (patch.cylinderId !== undefined && patch.cylinderId !== cylinder.cylinder_id) {
      if (patch.cylinderId === null) {
        notes.push('no longer linked to a marked cylinder');
      } else {
        notes.push(`is cylinder ${await checkLink(trx, job, n, patch.cylinderId)}`);
      }
      changes.cylinder_id = patch.cylinderId;
    }
    const linkedId = patch.cylinderId !== undefined ? patch.cylinderId : cylinder.cylinder_id;

    if (patch.stepId !== undefined && patch.stepId !== cylinder.chosen_step_id) {
      if (cylinder.cut_at) {
        throw new Conflict(`Cylinder ${n} is already cut; its step cannot change.`, 'already_cut');
      }
      let label = 'none';
      if (patch.stepId !== null) {
        const step = await repo.findStep(patch.stepId, trx);
        if (!step || step.series_id !== family.step_series_id) {
          throw new BadRequest(`stepId: not a step of the series ${family.code} uses.`, [
            { field: 'stepId', message: `not a step of ${family.code}'s series` },
          ]);
        }
        if (step.offset_nm > family.max_oversize_nm) {
          const message = `${step.label} is past the largest oversize ${family.code}'s wall allows (${show(family.max_oversize_nm)}): the cylinder needs a sleeve (liner) or replacing`;
          throw new BadRequest(`stepId: ${message}.`, [{ field: 'stepId', message }]);
        }
        const earlier = linkedId ? await lastBoreBefore(linkedId, jobId, trx) : null;
        const why = earlier
          ? lastBoreConstraint(
              earlier.last,
              family.cleanup_nm,
              unit,
            )({
              offsetNm: step.offset_nm,
              finishedBoreNm: stepNominalBore(family.standard_bore_nm, step.offset_nm),
            })
          : null;
        if (why !== null) {
          const message = `${step.label} is ${why}`;
          throw new BadRequest(`stepId: ${message}.`, [{ field: 'stepId', message }]);
        }
        label = step.label;
      }
      const held = (await holdsRepo.holdsOfJob(jobId, { activeOnly: true }, trx)).filter(
        (h) => h.cylinder === n && h.step_id !== null && h.step_id !== patch.stepId,
      );
      if (held.length > 0) {
        const names = held.map((h) => h.unit_label ?? h.sku).join(', ');
        throw new Conflict(
          `${names} ${held.length === 1 ? 'is' : 'are'} held for cylinder ${n} at ${held[0].step_label}; release ${held.length === 1 ? 'it' : 'them'} before changing the step.`,
          'held_for_step',
        );
      }
      changes.chosen_step_id = patch.stepId;
      notes.push(`step ${label}`);
    }

    if (patch.clearance !== undefined) {
      const c = patch.clearance;
      const piston = (await holdsRepo.holdsOfJob(jobId, { activeOnly: true }, trx)).find(
        (h) => h.cylinder === n && h.unit_id !== null,
      );
      const range = clearanceRangeFor(familyClearances(family), piston?.material ?? null);
      if (c !== null && (c < range.minNm || c > range.maxNm)) {
        const whose = range.basis === 'forged' ? ` for a forged piston` : '';
        const message = `must be within ${family.code}'s range${whose}, ${show(range.minNm)} to ${show(range.maxNm)}`;
        throw new BadRequest(`clearance: ${message}.`, [{ field: 'clearance', message }]);
      }
      changes.clearance_nm = c;
      notes.push(c === null ? "clearance from the shop's policy" : `clearance ${show(c)}`);
    }

    if (patch.measuredAfterHone !== undefined || patch.ringGap !== undefined) {
      if (!cylinder.cut_at) {
        throw new Conflict(
          `Cylinder ${n} has not been marked as cut; record the honed bore and ring gap after the cut.`,
          'not_cut',
        );
      }
      if (patch.measuredAfterHone !== undefined) {
        changes.measured_after_hone_nm = patch.measuredAfterHone;
        if (patch.measuredAfterHone !== null) {
          notes.push(`honed bore ${show(patch.measuredAfterHone)}`);
        }
      }
      if (patch.ringGap !== undefined) {
        changes.ring_gap_nm = patch.ringGap;
        if (patch.ringGap !== null) notes.push(`ring end gap ${show(patch.ringGap)}`);
      }
    }

    if (Object.keys(changes).length > 0) {
      await repo.updateCylinder(trx, jobId, n, changes);
      if (notes.length > 0) {
        await repo.insertEvent(trx, {
          jobId,
          userId: actorId,
          kind: 'work',
          text: `Cylinder ${n}: ${notes.join(', ')}.`,
        });
      }
      if (patch.measuredAfterHone !== undefined || patch.ringGap !== undefined) {
        await advanceAfterHoning(trx, job, actorId);
      }
    }
  });
  return getCylinder(jobId, n, unit, k);
}

export function earlierBoreJson(b: BoreJson): EarlierBoreJson {
  return {
    jobId: b.jobId,
    jobNumber: b.jobNumber,
    date: b.date,
    stepLabel: b.stepLabel,
    finishedBore: b.finishedBore,
  };
}
