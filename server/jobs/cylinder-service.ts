// One cylinder of a job: its bore readings, the step it goes to, the numbers on its bore sheet,
// marking it cut, and the sizes recorded after honing. Every size comes from the shared
// computations the readings form previews with.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { BadRequest, Conflict, NotFound } from '../errors';
import { getSettings, type ShopSettings } from '../settings/settings-service';
import { assessBore } from '../../shared/bore-assessment';
import { recommendStep } from '../../shared/bore-choice';
import {
  BORE_SHEET_CAUTIONS,
  BoreSheetError,
  chooseClearance,
  computeBoreSheet,
} from '../../shared/bore-sheet';
import { ReadingsError } from '../../shared/bore-wear';
import {
  formatLength,
  parseLength,
  toLengthJson,
  type LengthUnit,
  type Nm,
} from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import type {
  BoreSheetJson,
  CylinderJson,
  CylinderPatch,
  ReadingsInput,
  ReadingsResultJson,
  RecommendationJson,
} from '../../shared/jobs-api';
import * as repo from './jobs-repository';
import * as holdsRepo from './holds-repository';
import { requireCylinder, requireOpenJob } from './jobs-service';
import { advanceState } from './job-state';
import { cylinderJson, familyLimits, lengthOrNull } from './jobs-json';

type Conn = Knex;

async function context(jobId: string, n: number, k: Conn) {
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
  const { family, cylinder } = await context(jobId, n, k);
  const [readings, holds] = await Promise.all([
    repo.readingsOf(jobId, k),
    holdsRepo.holdsOfJob(jobId, { activeOnly: true }, k),
  ]);
  return cylinderJson(cylinder, family, readings, holds, unit);
}

/** A length the owner typed into the settings, or null when it is left empty. */
function settingLength(name: string, text: string): Nm | null {
  if (text.trim() === '') return null;
  const parsed = parseLength(text);
  if (!parsed.ok) {
    throw new Conflict(
      `The shop setting "${name}" ("${text}") is not a length: ${parsed.message} The owner sets it under Settings.`,
      'bad_setting',
    );
  }
  return parsed.nm;
}

// ---- Readings ---------------------------------------------------------------------------------

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
    const job = await requireOpenJob(trx, jobId, 'change');
    requireCylinder(job, n);
    const cylinder = await repo.lockCylinder(trx, jobId, n);
    if (!cylinder) throw new NotFound(`Cylinder ${n} of job ${job.number}`);
    if (cylinder.cut_at) {
      throw new Conflict(
        `Cylinder ${n} is already cut; its wear readings are kept as they were before the cut.`,
        'already_cut',
      );
    }
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
  const { job, family, cylinder } = await context(jobId, n, k);
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
  const verdict = recommendStep({
    largestWornNm: cylinder.largest_nm,
    standardBoreNm: family.standard_bore_nm,
    cleanupNm: family.cleanup_nm,
    maxOversizeNm: family.max_oversize_nm,
    skipMarginal: settings.skipMarginalStep && marginal !== null,
    marginalNm: marginal ?? undefined,
    unit,
    steps: steps.map((s) => {
      const st = stock.find((x) => x.step_id === s.id);
      return {
        stepId: s.id,
        label: s.label,
        offsetNm: s.offset_nm,
        freePistons: st?.free_pistons ?? 0,
        freeRings: st?.free_rings ?? 0,
        onOrder: st?.on_order ?? 0,
      };
    }),
  });
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
    ...(verdict.warning ? { warning: verdict.warning } : {}),
    largestWorn: toLengthJson(cylinder.largest_nm),
    chosenStepId: cylinder.chosen_step_id,
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
    const job = await requireOpenJob(trx, jobId, 'change');
    requireCylinder(job, n);
    const cylinder = await repo.lockCylinder(trx, jobId, n);
    if (!cylinder) throw new NotFound(`Cylinder ${n} of job ${job.number}`);
    const family = await repo.findFamily(job.family_id, trx);
    if (!family) throw new NotFound("That job's engine family");
    const show = (nm: Nm) => formatLength(nm, unit);
    const changes: Record<string, unknown> = {};
    const notes: string[] = [];

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
      if (c !== null && (c < family.clearance_min_nm || c > family.clearance_max_nm)) {
        const message = `must be within ${family.code}'s range, ${show(family.clearance_min_nm)} to ${show(family.clearance_max_nm)}`;
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
    }
  });
  return getCylinder(jobId, n, unit, k);
}

// ---- The bore sheet ---------------------------------------------------------------------------

export async function boreSheet(jobId: string, n: number, k: Conn = db): Promise<BoreSheetJson> {
  const { job, family, cylinder } = await context(jobId, n, k);
  const holds = await holdsRepo.holdsOfJob(jobId, { activeOnly: true }, k);
  const piston = holds.find((h) => h.cylinder === n && h.unit_id !== null);
  if (!piston || piston.unit_id === null || piston.unit_label === null) {
    throw new Conflict(
      `Hold a measured piston for cylinder ${n} first: the bore sheet is worked out from its measured skirt.`,
      'not_held',
    );
  }
  if (piston.skirt_nm === null) {
    throw new Conflict(
      `${piston.unit_label} has no measured skirt; measure it first.`,
      'not_measured',
    );
  }
  if (cylinder.largest_nm === null) {
    throw new Conflict(
      `Enter the bore readings for cylinder ${n} first: the passes start from the largest worn diameter.`,
      'no_readings',
    );
  }
  const settings: ShopSettings = await getSettings(k);
  const maxCut = settingLength('maximum cut per pass', settings.maxCutPerPass);
  if (maxCut === null) {
    throw new Conflict(
      'The shop has no maximum cut per pass set; the owner sets it under Settings.',
      'bad_setting',
    );
  }
  const finishPass = settingLength('finishing pass', settings.finishPass);
  const clearanceNm =
    cylinder.clearance_nm ??
    chooseClearance(family.clearance_min_nm, family.clearance_max_nm, settings.clearancePolicy);
  let sheet;
  try {
    sheet = computeBoreSheet({
      skirtNm: piston.skirt_nm,
      clearanceNm,
      honeAllowanceNm: family.hone_allowance_nm,
      currentNm: cylinder.largest_nm,
      maxCutNm: maxCut,
      finishPassNm: finishPass ?? undefined,
    });
  } catch (e) {
    if (e instanceof BoreSheetError) throw new Conflict(e.message, 'sheet_impossible');
    throw e;
  }
  const part = await holdsRepo.holdPart(piston.part_id, k);
  return {
    job: { id: job.id, number: job.number, customerName: job.customer_name, state: job.state },
    family: { id: family.id, code: family.code, name: family.name },
    cylinder: n,
    step:
      cylinder.chosen_step_id && cylinder.step_label !== null && cylinder.step_offset_nm !== null
        ? {
            id: cylinder.chosen_step_id,
            label: cylinder.step_label,
            nominalBore: toLengthJson(
              stepNominalBore(family.standard_bore_nm, cylinder.step_offset_nm),
            ),
          }
        : null,
    piston: {
      unitId: piston.unit_id,
      label: piston.unit_label,
      sku: piston.sku,
      material: part?.material ?? null,
    },
    skirt: toLengthJson(piston.skirt_nm),
    clearance: toLengthJson(clearanceNm),
    clearanceRange: {
      min: toLengthJson(family.clearance_min_nm),
      max: toLengthJson(family.clearance_max_nm),
    },
    clearanceFrom: cylinder.clearance_nm === null ? 'policy' : 'cylinder',
    finishedBore: toLengthJson(sheet.finishedBoreNm),
    boreTo: toLengthJson(sheet.boreToNm),
    honeStock: toLengthJson(sheet.honeStockNm),
    largestWorn: toLengthJson(cylinder.largest_nm),
    maxCutPerPass: toLengthJson(maxCut),
    finishPass: lengthOrNull(finishPass),
    passes: sheet.passes.map(toLengthJson),
    passesNote: sheet.error ?? null,
    ringGap: {
      min: lengthOrNull(family.ring_gap_min_nm),
      max: lengthOrNull(family.ring_gap_max_nm),
    },
    cutAt: cylinder.cut_at ? cylinder.cut_at.toISOString() : null,
    measuredAfterHone: lengthOrNull(cylinder.measured_after_hone_nm),
    ringGapMeasured: lengthOrNull(cylinder.ring_gap_nm),
    cautions: [...BORE_SHEET_CAUTIONS],
  };
}

// ---- The cut ----------------------------------------------------------------------------------

/** Marks a cylinder as cut; refused unless its measured piston is held for this job. */
export async function markCut(
  actorId: string,
  jobId: string,
  n: number,
  unit: LengthUnit,
  k: Conn = db,
): Promise<CylinderJson> {
  await k.transaction(async (trx) => {
    const job = await requireOpenJob(trx, jobId, 'change');
    requireCylinder(job, n);
    const cylinder = await repo.lockCylinder(trx, jobId, n);
    if (!cylinder) throw new NotFound(`Cylinder ${n} of job ${job.number}`);
    if (cylinder.cut_at) {
      throw new Conflict(
        `Cylinder ${n} of job ${job.number} is already marked as cut.`,
        'already_cut',
      );
    }
    const piston = await holdsRepo.activePistonHold(trx, jobId, n, { lock: true });
    if (!piston) {
      throw new Conflict(
        `Cylinder ${n} has no piston held for job ${job.number}: hold its measured piston before cutting.`,
        'not_held',
      );
    }
    await repo.updateCylinder(trx, jobId, n, { cut_at: trx.fn.now(), cut_by: actorId });
    // From here the piston belongs with this bore: its hold must not lapse.
    await holdsRepo.clearExpiry(trx, piston.id, piston.unit_id);
    const view = await holdsRepo.findHold(piston.id, trx);
    await repo.insertEvent(trx, {
      jobId,
      userId: actorId,
      kind: 'work',
      text: `Cylinder ${n} cut to fit ${view?.unit_label ?? 'its held piston'}.`,
    });
    await advanceState(trx, job, 'on_the_bar', actorId);
  });
  return getCylinder(jobId, n, unit, k);
}
