// The numbers for the boring bar and the hone. Finished bore = the measured piston skirt + the
// piston-to-wall clearance; the bar stops short of it by the hone allowance, which the hone removes.
// Every size here is a diameter, and every cut is measured on the diameter; the passes are planned in
// pass-plan.ts.
import { isNm } from './lengths';
import type { Nm } from './lengths';
import { gridDown, planPasses, PassPlanError, type Pass } from './pass-plan';

export type ClearancePolicy = 'min' | 'mid' | 'max';

export interface BoreSheetInput {
  /** The measured skirt diameter of the piston held for this cylinder. */
  skirtNm: Nm;
  clearanceNm: Nm;
  honeAllowanceNm: Nm;
  /** Smallest reading (least worn, usually below the ring travel), or the standard bore without one. */
  smallestNm: Nm;
  /** Largest worn diameter. */
  largestNm: Nm;
  /** Deepest cut per pass anywhere in the bore, on the diameter. */
  maxCutNm: Nm;
  /** Lightest cut the bar takes reliably. */
  minCutNm: Nm;
  /** One step of the bar's dial (barGridNm). */
  gridNm: Nm;
  /** A light last cut for the finish (on the diameter); the other passes share the rest. */
  finishPassNm?: Nm;
  /** A light first cut that shows the bore's shape before the real cuts. */
  truingPassNm?: Nm;
}

export interface BoreSheet {
  finishedBoreNm: Nm;
  /** Finished bore less the hone allowance, down to the bar's grid (the hone takes the difference). */
  boreToNm: Nm;
  honeStockNm: Nm;
  /** The passes; the last one is at boreToNm. Empty when there is an error. */
  passes: Pass[];
  notes: string[];
  error?: string;
}

/** The usual cautions printed with every bore sheet. */
export const BORE_SHEET_CAUTIONS: readonly string[] = Object.freeze([
  "Follow the machine maker's instructions; the engine maker's sizes and clearances override these figures.",
  'Wear eye and hearing protection; keep guards in place; hot chips fly from the boring bar.',
  'Chips and freshly cut parts are sharp and hot: let them cool, and clear chips with a brush, not compressed air.',
  'Wear gloves where suitable for handling parts and solvents, never near a turning spindle or hone.',
  'Honing oil mists and cleaning solvents are flammable: ventilate, and keep ignition sources away.',
  'Measure the bore again before honing and after, and check the ring end gap in the bore.',
  'Local codes and licensed practice come before anything on this sheet.',
]);

/** The clearance midpoint is rounded to a whole 100 nm (0.0001 mm), finer than any gauge reads. */
export const SIZE_GRID_NM = 100;

export class BoreSheetError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BoreSheetError';
  }
}

/** The clearance to use from the maker's range; the midpoint is rounded down to a whole 100 nm. */
export function chooseClearance(minNm: Nm, maxNm: Nm, policy: ClearancePolicy): Nm {
  if (!isNm(minNm) || !isNm(maxNm) || minNm < 0 || maxNm < 0) {
    throw new BoreSheetError('Clearances must be zero or positive whole numbers of nanometres.');
  }
  if (minNm > maxNm) throw new BoreSheetError('The smallest clearance is larger than the largest.');
  if (policy === 'min') return minNm;
  if (policy === 'max') return maxNm;
  if (policy !== 'mid') throw new BoreSheetError('The clearance policy must be min, mid or max.');
  const mid = Math.floor((minNm + maxNm) / 2 / SIZE_GRID_NM) * SIZE_GRID_NM;
  return Math.max(mid, minNm);
}

export function computeBoreSheet(input: BoreSheetInput): BoreSheet {
  const { skirtNm, clearanceNm, honeAllowanceNm } = input;
  requirePositive('skirt diameter', skirtNm);
  requireNonNegative('clearance', clearanceNm);
  requireNonNegative('hone allowance', honeAllowanceNm);
  requirePositive('bar resolution', input.gridNm);

  const finishedBoreNm = skirtNm + clearanceNm;
  // Down to the grid, never up: a bore cut too small is honed a little longer; one cut too big is lost.
  const boreToNm = gridDown(finishedBoreNm - honeAllowanceNm, input.gridNm);
  if (boreToNm <= 0)
    throw new BoreSheetError('The hone allowance is larger than the finished bore.');
  const sheet = { finishedBoreNm, boreToNm, honeStockNm: finishedBoreNm - boreToNm };
  let plan;
  try {
    plan = planPasses({
      smallestNm: input.smallestNm,
      largestNm: input.largestNm,
      boreToNm,
      maxCutNm: input.maxCutNm,
      minCutNm: input.minCutNm,
      gridNm: input.gridNm,
      finishPassNm: input.finishPassNm,
      truingPassNm: input.truingPassNm,
    });
  } catch (e) {
    if (e instanceof PassPlanError) throw new BoreSheetError(e.message);
    throw e;
  }
  return plan.error
    ? { ...sheet, passes: [], notes: plan.notes, error: plan.error }
    : { ...sheet, passes: plan.passes, notes: plan.notes };
}

export interface PistonCleanup {
  /** Finished bore minus the largest worn diameter, on the diameter. */
  removedNm: Nm;
  /** removedNm minus the family's clean-up allowance (negative when the bore would not clean up). */
  spareNm: Nm;
  cleansUp: boolean;
}

/**
 * Whether the bore cut for the piston actually held cleans up: the finished bore (its measured skirt
 * + clearance), not the step's nominal size, must exceed the largest worn diameter by the allowance.
 */
export function pistonCleanup(finishedBoreNm: Nm, largestWornNm: Nm, cleanupNm: Nm): PistonCleanup {
  requirePositive('finished bore', finishedBoreNm);
  requirePositive('largest worn diameter', largestWornNm);
  requireNonNegative('clean-up allowance', cleanupNm);
  const removedNm = finishedBoreNm - largestWornNm;
  const spareNm = removedNm - cleanupNm;
  return { removedNm, spareNm, cleansUp: spareNm >= 0 };
}

function requirePositive(name: string, nm: Nm): void {
  if (!isNm(nm) || nm <= 0) throw new BoreSheetError(`The ${name} must be a positive length.`);
}

function requireNonNegative(name: string, nm: Nm): void {
  if (!isNm(nm) || nm < 0)
    throw new BoreSheetError(`The ${name} must be zero or a positive length.`);
}
