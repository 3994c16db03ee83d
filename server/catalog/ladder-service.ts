// A family's step ladder and the Empty steps list. What is free at a step and which steps are
// empty come from the one rule every page counts (stock/part-needs), so the ladder's summary,
// a family's empty steps, Empty steps, the job bench and Ran short say the same thing.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { NotFound } from '../errors';
import type {
  ExposureItemJson,
  LadderJson,
  LadderStepJson,
  LadderUnitJson,
} from '../../shared/api/catalog';
import { kitFree } from '../../shared/kits';
import { toLengthJson } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import * as needs from '../stock/part-needs-repository';
import * as repo from './catalog-repository';
import { familyJson, lengthOrNull } from './catalog-json';
import { containsPattern } from '../db/like-pattern';
import type { Page } from '../../shared/api/common';

/** How many pistons of a step the ladder itself shows; the rest come a page at a time. */
export const LADDER_UNITS_PER_STEP = 12;

function unitJson(u: repo.LadderUnitRow): LadderUnitJson {
  return {
    id: u.id,
    partId: u.part_id,
    label: u.label,
    skirt: lengthOrNull(u.skirt_nm),
    status: u.status,
    bin: u.bin_code,
    binId: u.bin_id,
  };
}

export async function ladder(familyId: string, k: Knex = db): Promise<LadderJson> {
  const row = await repo.findFamily(familyId, k);
  if (!row) throw new NotFound('That engine family');
  const [steps, levels, onOrder, units, kits] = await Promise.all([
    needs.familyStepFree(familyId, k),
    repo.familyStepLevels(familyId, k),
    repo.familyStepOnOrder(familyId, k),
    repo.familyShelfUnits(familyId, LADDER_UNITS_PER_STEP, k),
    repo.familyKits(familyId, k),
  ]);
  const components = await repo.componentsOf(
    kits.map((kit) => kit.id),
    k,
  );

  const level = (stepId: string, kind: 'piston' | 'rings') =>
    levels.find((x) => x.step_id === stepId && x.kind === kind);
  const counts = (stepId: string, kind: 'piston' | 'rings', free: number) => {
    const l = level(stepId, kind);
    const ordered = onOrder.find((x) => x.step_id === stepId && x.kind === kind)?.quantity ?? 0;
    return { onHand: l?.on_hand ?? 0, held: l?.held ?? 0, free, onOrder: ordered };
  };

  const ladderSteps: LadderStepJson[] = steps.map((step) => {
    const kitsFree = kits
      .filter((kit) => kit.step_id === step.step_id)
      .map((kit) => components.filter((c) => c.kit_part_id === kit.id))
      .filter((list) => list.length > 0)
      .reduce(
        (sum, list) =>
          sum + kitFree(list.map((c) => ({ free: c.on_hand - c.held, perKit: c.quantity }))),
        0,
      );
    const missing = needs.missingAtStep(step);
    return {
      stepId: step.step_id,
      label: step.label,
      offset: toLengthJson(step.offset_nm),
      nominalBore: toLengthJson(stepNominalBore(row.standard_bore_nm, step.offset_nm)),
      // Free pistons are measured ones nobody holds; a piston still to measure is on hand but
      // cannot be matched to a bore yet.
      pistons: counts(step.step_id, 'piston', step.pistons_free),
      pistonsToMeasure: step.pistons_to_measure,
      rings: counts(step.step_id, 'rings', step.rings_free),
      kitsFree,
      nothingFree: missing.length > 0,
      missing,
      // Every piston on the shelf is free or held, so the step's on hand counts them all.
      units: units.filter((u) => u.step_id === step.step_id).map(unitJson),
      unitsTotal: level(step.step_id, 'piston')?.on_hand ?? 0,
    };
  });
  return { family: familyJson(row), steps: ladderSteps };
}

/** All of one step's pistons on the shelf, paged, for "show them all" under a step. */
export async function stepUnits(
  familyId: string,
  stepId: string,
  query: { page: number; pageSize: number },
  k: Knex = db,
): Promise<Page<LadderUnitJson>> {
  const family = await repo.findFamily(familyId, k);
  if (!family) throw new NotFound('That engine family');
  const { rows, total } = await repo.stepShelfUnits(familyId, stepId, query, k);
  return { items: rows.map(unitJson), total };
}

export async function listExposure(
  query: { q?: string; familyId?: string; page: number; pageSize: number },
  k: Knex = db,
): Promise<Page<ExposureItemJson>> {
  const { rows, total } = await needs.emptySteps(
    {
      like: query.q ? containsPattern(query.q) : undefined,
      familyId: query.familyId,
      page: query.page,
      pageSize: query.pageSize,
    },
    k,
  );
  return {
    items: rows.map((r) => ({
      familyId: r.family_id,
      familyCode: r.family_code,
      familyName: r.family_name,
      stepId: r.step_id,
      stepLabel: r.label,
      offset: toLengthJson(r.offset_nm),
      nominalBore: toLengthJson(stepNominalBore(r.standard_bore_nm, r.offset_nm)),
      pistonParts: r.piston_parts,
      pistonsOnHand: r.pistons_on_hand,
      pistonsHeld: r.pistons_held,
      pistonsFree: r.pistons_free,
      pistonsToMeasure: r.pistons_to_measure,
      ringsFree: r.rings_free,
      missing: needs.missingAtStep(r),
      issued: Number(r.issued),
    })),
    total,
  };
}
