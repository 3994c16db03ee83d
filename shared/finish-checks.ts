// Checks after honing: the clearance the piston really has in the honed bore, against the range for
// its material, and the ring end gap against the gap the finished bore calls for. Lengths are whole
// nanometres; the ring-gap factor is exact decimal text.
import Decimal from 'decimal.js';
import { formatLength, formatLengthsApart, type LengthUnit, type Nm } from './lengths';

export type PistonMaterialName = 'cast' | 'forged';

export interface ClearanceRange {
  minNm: Nm;
  maxNm: Nm;
  /** Whose range it is: the family's one range, or its own range for forged pistons. */
  basis: 'family' | 'forged';
}

export interface FamilyClearances {
  clearanceMinNm: Nm;
  clearanceMaxNm: Nm;
  /** A range of its own for forged pistons; null: forged pistons use the family's one range. */
  forgedMinNm: Nm | null;
  forgedMaxNm: Nm | null;
}

/**
 * The clearance range for a piston of this material. Forged pistons grow more with heat than cast
 * ones and are commonly fitted looser (common practice, no source), so a family may carry a range
 * of their own; without one, or for a cast piston or one of unknown material, the family's range.
 */
export function clearanceRangeFor(
  family: FamilyClearances,
  material: PistonMaterialName | string | null,
): ClearanceRange {
  if (material === 'forged' && family.forgedMinNm !== null && family.forgedMaxNm !== null) {
    return { minNm: family.forgedMinNm, maxNm: family.forgedMaxNm, basis: 'forged' };
  }
  return { minNm: family.clearanceMinNm, maxNm: family.clearanceMaxNm, basis: 'family' };
}

export type FitVerdict = 'in_range' | 'tight' | 'loose';

export interface HonedFit {
  clearanceNm: Nm;
  verdict: FitVerdict;
  /** How far outside the range; 0 when in range. */
  byNm: Nm;
  text: string;
}

/** Honed bore − measured skirt, against the range: in range, tight by …, or loose by …. */
export function honedFit(
  honedBoreNm: Nm,
  skirtNm: Nm,
  range: ClearanceRange,
  unit: LengthUnit,
): HonedFit {
  const clearanceNm = honedBoreNm - skirtNm;
  const show = (nm: Nm) => formatLength(nm, unit);
  // A difference too small for the trade's resolution still shows its digits, never "by 0.0000 in".
  const showBy = (nm: Nm) => formatLengthsApart(nm, 0, unit)[0];
  const rangeText = `${show(range.minNm)} to ${show(range.maxNm)}${range.basis === 'forged' ? ' for a forged piston' : ''}`;
  if (clearanceNm < range.minNm) {
    const byNm = range.minNm - clearanceNm;
    return {
      clearanceNm,
      verdict: 'tight',
      byNm,
      text: `Clearance ${show(clearanceNm)}: tight by ${showBy(byNm)} (range ${rangeText}) — hone further before fitting, or the piston may seize when hot.`,
    };
  }
  if (clearanceNm > range.maxNm) {
    const byNm = clearanceNm - range.maxNm;
    return {
      clearanceNm,
      verdict: 'loose',
      byNm,
      text: `Clearance ${show(clearanceNm)}: loose by ${showBy(byNm)} (range ${rangeText}) — the piston will rock in the bore.`,
    };
  }
  return {
    clearanceNm,
    verdict: 'in_range',
    byNm: 0,
    text: `Clearance ${show(clearanceNm)}: in range (${rangeText}).`,
  };
}

/** Suggested gaps are rounded up to this: a thousandth of a millimetre, finer than a feeler gauge. */
const GAP_GRID_NM = 1000;

/**
 * The ring end gap the finished bore calls for: bore × the family's factor (gap per unit of bore,
 * the same in inches per inch or millimetres per millimetre), rounded up to 0.001 mm.
 */
export function suggestedRingGapNm(finishedBoreNm: Nm, gapPerBore: string): Nm {
  const factor = new Decimal(gapPerBore);
  if (!factor.isFinite() || factor.lte(0) || factor.gte(0.02)) {
    throw new RangeError('The ring gap factor must be above 0 and below 0.02 of the bore.');
  }
  const exact = factor.times(finishedBoreNm);
  return exact.dividedBy(GAP_GRID_NM).ceil().times(GAP_GRID_NM).toNumber();
}

export type GapVerdict = 'ok' | 'tight' | 'wide';

export interface RingGapCheck {
  suggestedNm: Nm;
  verdict: GapVerdict;
  byNm: Nm;
  text: string;
}

/**
 * A measured end gap against the suggestion: under it the ring ends can butt when hot (tight);
 * above the family's largest gap, if it names one, the ring leaks (wide).
 */
export function checkRingGap(
  measuredNm: Nm,
  suggestedNm: Nm,
  familyMaxNm: Nm | null,
  unit: LengthUnit,
): RingGapCheck {
  const show = (nm: Nm) => formatLength(nm, unit);
  const showBy = (nm: Nm) => formatLengthsApart(nm, 0, unit)[0];
  if (measuredNm < suggestedNm) {
    const byNm = suggestedNm - measuredNm;
    return {
      suggestedNm,
      verdict: 'tight',
      byNm,
      text: `Ring end gap ${show(measuredNm)}: tight by ${showBy(byNm)} — file the ring to at least ${show(suggestedNm)}, or its ends may butt when hot.`,
    };
  }
  if (familyMaxNm !== null && measuredNm > familyMaxNm) {
    const byNm = measuredNm - familyMaxNm;
    return {
      suggestedNm,
      verdict: 'wide',
      byNm,
      text: `Ring end gap ${show(measuredNm)}: wide by ${showBy(byNm)} over the family's largest, ${show(familyMaxNm)}.`,
    };
  }
  return {
    suggestedNm,
    verdict: 'ok',
    byNm: 0,
    text: `Ring end gap ${show(measuredNm)}: at least the ${show(suggestedNm)} this bore calls for.`,
  };
}
