// The numbers for the boring bar and the hone. Finished bore = the measured piston skirt + the
// piston-to-wall clearance; the bar stops short of it by the hone allowance, which the hone removes.
// Every size here is a diameter, and every cut is measured on the diameter.
import { isNm } from './lengths';
import type { Nm } from './lengths';

export type ClearancePolicy = 'min' | 'mid' | 'max';

export interface BoreSheetInput {
  /** The measured skirt diameter of the piston held for this cylinder. */
  skirtNm: Nm;
  clearanceNm: Nm;
  honeAllowanceNm: Nm;
  /** Largest worn diameter, or the size the last cut left. */
  currentNm: Nm;
  /** Deepest cut per pass, on the diameter. */
  maxCutNm: Nm;
  /** A light last cut for the finish (on the diameter); the other passes share the rest. */
  finishPassNm?: Nm;
}

export interface BoreSheet {
  finishedBoreNm: Nm;
  boreToNm: Nm;
  honeStockNm: Nm;
  /** The bore size after each pass; the last one is boreToNm. Empty when there is an error. */
  passes: Nm[];
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

/** Sizes are rounded to a whole 100 nm (0.0001 mm), finer than any boring bar is set. */
export const SIZE_GRID_NM = 100;
const MAX_PASSES = 50;

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
  const { skirtNm, clearanceNm, honeAllowanceNm, currentNm, maxCutNm, finishPassNm } = input;
  requirePositive('skirt diameter', skirtNm);
  requirePositive('current bore', currentNm);
  requirePositive('largest cut per pass', maxCutNm);
  requireNonNegative('clearance', clearanceNm);
  requireNonNegative('hone allowance', honeAllowanceNm);
  if (finishPassNm !== undefined) requirePositive('finish pass', finishPassNm);

  const finishedBoreNm = skirtNm + clearanceNm;
  const boreToNm = finishedBoreNm - honeAllowanceNm;
  const sheet = { finishedBoreNm, boreToNm, honeStockNm: finishedBoreNm - boreToNm };
  if (boreToNm <= 0)
    throw new BoreSheetError('The hone allowance is larger than the finished bore.');
  if (currentNm >= boreToNm) {
    return { ...sheet, passes: [], error: 'the bore is already at or past the bore-to size' };
  }
  if (finishPassNm !== undefined && finishPassNm > maxCutNm) {
    return {
      ...sheet,
      passes: [],
      error: 'the finish pass is deeper than the largest cut per pass',
    };
  }

  const total = boreToNm - currentNm;
  // A finish pass only makes sense when there is more to cut than the finish pass itself.
  const roughing =
    finishPassNm === undefined || total <= finishPassNm
      ? equalPasses(currentNm, boreToNm, maxCutNm, MAX_PASSES)
      : equalPasses(currentNm, boreToNm - finishPassNm, maxCutNm, MAX_PASSES - 1);
  const passes =
    roughing && finishPassNm !== undefined && total > finishPassNm
      ? [...roughing, boreToNm]
      : roughing;
  if (!passes) {
    return {
      ...sheet,
      passes: [],
      error: `more than ${MAX_PASSES} passes would be needed; check the largest cut per pass`,
    };
  }
  return { ...sheet, passes };
}

/**
 * The fewest equal passes from `from` to `to` with none deeper than maxCut; intermediate sizes rounded to
 * the 100 nm grid, the last exactly `to`. Rounding can make one cut up to 100 nm deeper than an equal share,
 * so a pass is added when that would break the limit. Null when more than maxPasses would be needed.
 */
function equalPasses(from: Nm, to: Nm, maxCut: Nm, maxPasses: number): Nm[] | null {
  const total = to - from;
  for (let n = Math.ceil(total / maxCut); n <= maxPasses; n++) {
    const sizes: Nm[] = [];
    for (let i = 1; i < n; i++) {
      sizes.push(Math.round((from + (total * i) / n) / SIZE_GRID_NM) * SIZE_GRID_NM);
    }
    sizes.push(to);
    let previous = from;
    const fits = sizes.every((size) => {
      const cut = size - previous;
      previous = size;
      return cut > 0 && cut <= maxCut;
    });
    if (fits) return sizes;
  }
  return null;
}

function requirePositive(name: string, nm: Nm): void {
  if (!isNm(nm) || nm <= 0) throw new BoreSheetError(`The ${name} must be a positive length.`);
}

function requireNonNegative(name: string, nm: Nm): void {
  if (!isNm(nm) || nm < 0)
    throw new BoreSheetError(`The ${name} must be zero or a positive length.`);
}
