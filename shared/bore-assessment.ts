// What the readings of one cylinder say against its engine family: the wear figures and every
// warning a machinist should see before choosing a step. The readings form previews it as figures
// are typed and the server stores the same result, so the two cannot disagree.
import { computeWear, wearWarnings, type Reading, type Wear } from './bore-wear';
import { formatLength, type LengthUnit, type Nm } from './lengths';

export interface FamilyLimits {
  standardBoreNm: Nm;
  /** Least stock to remove beyond the worst wear so the bore cleans up (on the diameter). */
  cleanupNm: Nm;
  /** Largest oversize the cylinder wall allows. */
  maxOversizeNm: Nm;
  maxTaperNm: Nm | null;
  maxOutOfRoundNm: Nm | null;
}

export interface BoreAssessment {
  wear: Wear;
  warnings: string[];
}

export function assessBore(
  readings: readonly Reading[],
  limits: FamilyLimits,
  unit: LengthUnit = 'mm',
): BoreAssessment {
  const wear = computeWear(readings, limits.standardBoreNm);
  const show = (nm: Nm) => formatLength(nm, unit);
  const warnings = wearWarnings(
    wear,
    {
      maxTaperNm: limits.maxTaperNm ?? undefined,
      maxOutOfRoundNm: limits.maxOutOfRoundNm ?? undefined,
    },
    unit,
  );
  // Below the standard bore is not wear: a misread gauge, a reading in the other unit, or the
  // job booked against the wrong engine family.
  if (wear.smallest < limits.standardBoreNm) {
    warnings.push(
      `A reading of ${show(wear.smallest)} is under the standard bore of ${show(limits.standardBoreNm)}: check the gauge, the unit and the engine family.`,
    );
  }
  const largestCleanBore = limits.standardBoreNm + limits.maxOversizeNm;
  if (wear.largest + limits.cleanupNm > largestCleanBore) {
    warnings.push(
      `Worn past what the largest oversize cleans up (${show(largestCleanBore)} less ${show(limits.cleanupNm)} clean-up): the cylinder needs a sleeve (liner) or replacing.`,
    );
  }
  return { wear, warnings };
}
