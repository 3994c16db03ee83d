// The bore sheet of one cylinder and the cut. Every size is worked out from the piston actually held
// (its measured skirt + the clearance), the passes are planned from the least-worn part of the bore
// on the bar's grid, and the cut is refused when that bore would not clean up the wear unless the
// machinist overrides it with a reason that stays with the cylinder.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { BadRequest, Conflict } from '../errors';
import { getSettings } from '../settings/settings-service';
import { whyNotApproved } from '../money/approval-service';
import { requiredSettingLength, settingLength } from '../settings/setting-length';
import {
  BORE_SHEET_CAUTIONS,
  BoreSheetError,
  chooseClearance,
  computeBoreSheet,
  pistonCleanup,
} from '../../shared/bore-sheet';
import { afterHoningChecks, engineCautions, honingGuidance } from '../../shared/bore-sheet-wording';
import { clearanceRangeFor, honedFit, suggestedRingGapNm } from '../../shared/finish-checks';
import { barGridNm, passStartNm } from '../../shared/pass-plan';
import { formatLength, toLengthJson, type LengthUnit, type Nm } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import type { BoreSheetJson, CylinderJson } from '../../shared/api/jobs';
import type { CutUndoJson } from '../../shared/cut-undo';
import { cutUndoFacts } from './cut-undo-service';
import * as repo from './jobs-repository';
import * as holdsRepo from './holds-repository';
import { cylinderContext, getCylinder } from './cylinder-service';
import { lockOpenCylinder } from './jobs-service';
import { advanceState } from './job-state';
import { familyClearances, honedFitJson, lengthOrNull, toReadings } from './jobs-json';
import { earlierBoreJson } from './cylinder-service';
import { lastBoreBefore } from '../customers/cylinders-service';

/** Everything the sheet and the cut are worked out from, read in one place so they cannot disagree. */
async function sheetFacts(jobId: string, n: number, k: Knex) {
  const { job, family, cylinder } = await cylinderContext(jobId, n, k);
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
      `Enter the bore readings for cylinder ${n} first: the passes are planned from them.`,
      'no_readings',
    );
  }
  const readings = toReadings((await repo.readingsOf(jobId, k)).filter((r) => r.n === n));
  const start = passStartNm(readings, family.standard_bore_nm);
  const settings = await getSettings(k);
  const maxCut = requiredSettingLength('maximum cut per pass', settings.maxCutPerPass);
  const minCut = requiredSettingLength('smallest cut per pass', settings.minCutPerPass);
  const finishPass = settingLength('finishing pass', settings.finishPass);
  const truingPass = settingLength('truing pass', settings.truingPass);
  // Forged pistons may have a range of their own: the policy picks within the held piston's.
  const material = (await holdsRepo.holdPart(piston.part_id, k))?.material ?? null;
  const range = clearanceRangeFor(familyClearances(family), material);
  const clearanceNm =
    cylinder.clearance_nm ?? chooseClearance(range.minNm, range.maxNm, settings.clearancePolicy);
  let sheet;
  try {
    sheet = computeBoreSheet({
      skirtNm: piston.skirt_nm,
      clearanceNm,
      honeAllowanceNm: family.hone_allowance_nm,
      smallestNm: start.nm,
      largestNm: Math.max(cylinder.largest_nm, start.nm),
      maxCutNm: maxCut,
      minCutNm: minCut,
      gridNm: barGridNm(settings.barResolution),
      finishPassNm: finishPass ?? undefined,
      truingPassNm: truingPass ?? undefined,
    });
  } catch (e) {
    if (e instanceof BoreSheetError) throw new Conflict(e.message, 'sheet_impossible');
    throw e;
  }
  const cleanup = pistonCleanup(sheet.finishedBoreNm, cylinder.largest_nm, family.cleanup_nm);
  return {
    job,
    family,
    cylinder,
    largestNm: cylinder.largest_nm,
    piston: { ...piston, unit_id: piston.unit_id, unit_label: piston.unit_label },
    skirtNm: piston.skirt_nm,
    settings,
    start,
    maxCut,
    minCut,
    finishPass,
    truingPass,
    clearanceNm,
    range,
    material,
    sheet,
    cleanup,
  };
}

type Facts = Awaited<ReturnType<typeof sheetFacts>>;

/** Why the held piston's bore does not clean up, in the machinist's unit. */
function cleanupShortMessage(f: Facts, unit: LengthUnit): string {
  const show = (nm: Nm) => formatLength(nm, unit);
  return (
    `The bore for ${f.piston.unit_label} (skirt ${show(f.skirtNm)} + clearance ${show(f.clearanceNm)} = ${show(f.sheet.finishedBoreNm)}) ` +
    `removes ${show(f.cleanup.removedNm)} past the worst wear of ${show(f.largestNm)}, ` +
    `${show(-f.cleanup.spareNm)} short of the ${show(f.family.cleanup_nm)} clean-up allowance: the bore would not clean up.`
  );
}

export async function boreSheet(
  jobId: string,
  n: number,
  unit: LengthUnit = 'mm',
  k: Knex = db,
): Promise<BoreSheetJson & CutUndoJson> {
  const f = await sheetFacts(jobId, n, k);
  const cut = await cutUndoFacts(jobId, n, k);
  const { job, family, cylinder, sheet, cleanup } = f;
  // A cylinder bored before: its last bore goes on the sheet, for the machinist to check against.
  const earlier = f.cylinder.cylinder_id
    ? await lastBoreBefore(f.cylinder.cylinder_id, jobId, k)
    : null;
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
      unitId: f.piston.unit_id,
      label: f.piston.unit_label,
      sku: f.piston.sku,
      material: f.material,
    },
    skirt: toLengthJson(f.skirtNm),
    clearance: toLengthJson(f.clearanceNm),
    clearanceRange: { min: toLengthJson(f.range.minNm), max: toLengthJson(f.range.maxNm) },
    clearanceFrom: cylinder.clearance_nm === null ? 'policy' : 'cylinder',
    finishedBore: toLengthJson(sheet.finishedBoreNm),
    boreTo: toLengthJson(sheet.boreToNm),
    honeStock: toLengthJson(sheet.honeStockNm),
    largestWorn: toLengthJson(f.largestNm),
    smallestBore: toLengthJson(f.start.nm),
    smallestFrom: f.start.from,
    maxCutPerPass: toLengthJson(f.maxCut),
    minCutPerPass: toLengthJson(f.minCut),
    finishPass: lengthOrNull(f.finishPass),
    truingPass: lengthOrNull(f.truingPass),
    barResolution: f.settings.barResolution,
    passes: sheet.passes.map((p) => ({
      kind: p.kind,
      size: toLengthJson(p.sizeNm),
      cutUnworn: toLengthJson(p.cutUnwornNm),
      cutWorn: toLengthJson(p.cutWornNm),
    })),
    passesDone: cylinder.passes_done,
    passesNote: sheet.error ?? null,
    passesNotes: sheet.notes,
    cleanup: {
      allowance: toLengthJson(family.cleanup_nm),
      removed: toLengthJson(cleanup.removedNm),
      spare: cleanup.cleansUp ? toLengthJson(cleanup.spareNm) : null,
      short: cleanup.cleansUp ? null : toLengthJson(-cleanup.spareNm),
      cleansUp: cleanup.cleansUp,
      overrideReason: cylinder.cleanup_override_reason,
      message: cleanup.cleansUp ? null : cleanupShortMessage(f, unit),
    },
    ringGap: {
      min: lengthOrNull(family.ring_gap_min_nm),
      max: lengthOrNull(family.ring_gap_max_nm),
    },
    cutAt: cylinder.cut_at ? cylinder.cut_at.toISOString() : null,
    ...cut,
    measuredAfterHone: lengthOrNull(cylinder.measured_after_hone_nm),
    ringGapMeasured: lengthOrNull(cylinder.ring_gap_nm),
    ringGapSuggested: toLengthJson(
      suggestedRingGapNm(
        cylinder.measured_after_hone_nm ?? sheet.finishedBoreNm,
        family.ring_gap_per_bore,
      ),
    ),
    honedFit:
      cylinder.measured_after_hone_nm === null
        ? null
        : honedFitJson(
            honedFit(cylinder.measured_after_hone_nm, f.skirtNm, f.range, unit),
            f.range,
          ),
    honing: honingGuidance({
      strokeType: family.stroke_type,
      stroke: formatLength(family.stroke_nm, unit),
      crosshatchDeg: family.hone_crosshatch_deg,
      grits: family.hone_grits,
    }),
    cylinderMark: cylinder.cylinder_mark,
    previousBore: earlier ? earlierBoreJson(earlier.json) : null,
    // The engine's own caution first: it is the one this sheet adds to the usual list.
    cautions: [...engineCautions(family.stroke_type), ...BORE_SHEET_CAUTIONS],
    afterHoningChecks: afterHoningChecks(family.stroke_type),
  };
}

/**
 * Marks a cylinder as cut; refused unless its measured piston is held for this job and (when the
 * shop says so) the customer agreed to the estimate, and refused when
 * that piston's bore would not clean up unless the machinist gives a reason to cut anyway.
 */
export async function markCut(
  actorId: string,
  jobId: string,
  n: number,
  unit: LengthUnit,
  input: { overrideReason?: string } = {},
  k: Knex = db,
): Promise<CylinderJson> {
  await k.transaction(async (trx) => {
    const { job, cylinder } = await lockOpenCylinder(trx, jobId, n);
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
    const notApproved = await whyNotApproved(trx, jobId, job.number);
    if (notApproved) throw new Conflict(notApproved, 'not_approved');
    const facts = await sheetFacts(jobId, n, trx);
    const reason = input.overrideReason?.trim() ?? '';
    const changes: Record<string, unknown> = { cut_at: trx.fn.now(), cut_by: actorId };
    if (!facts.cleanup.cleansUp) {
      if (reason === '') {
        throw new Conflict(
          `${cleanupShortMessage(facts, unit)} Hold a larger piston, or give the reason to cut anyway.`,
          'no_cleanup',
        );
      }
      Object.assign(changes, {
        cleanup_override_reason: reason,
        cleanup_override_by: actorId,
        cleanup_override_at: trx.fn.now(),
      });
    } else if (reason !== '') {
      throw new BadRequest('overrideReason: the bore cleans up, so there is nothing to override.', [
        { field: 'overrideReason', message: 'the bore cleans up; nothing to override' },
      ]);
    }
    await repo.updateCylinder(trx, jobId, n, changes);
    // From here the piston belongs with this bore: its hold must not lapse.
    await holdsRepo.clearExpiry(trx, piston.id, piston.unit_id);
    const view = await holdsRepo.findHold(piston.id, trx);
    const label = view?.unit_label ?? 'its held piston';
    await repo.insertEvent(trx, {
      jobId,
      userId: actorId,
      kind: 'work',
      text:
        reason === ''
          ? `Cylinder ${n} cut to fit ${label}.`
          : `Cylinder ${n} cut to fit ${label} although the bore does not clean up; reason: ${reason}`,
    });
    await advanceState(trx, job, 'on_the_bar', actorId);
  });
  return getCylinder(jobId, n, unit, k);
}
