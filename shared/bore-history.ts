// What a cylinder's earlier bores allow. Metal once cut cannot come back: a rebore must finish
// above the last finished bore by at least the family's clean-up allowance, so the new cut removes
// the wear and the marks of the last hone all round (the same allowance the worn diameter is
// held to). The steps a cylinder has left are the steps that still do so, up to the largest
// oversize its wall allows; after the last of them comes a sleeve or a new cylinder.
import { formatLengthCompact, type LengthUnit, type Nm } from './lengths';

export interface LastBore {
  finishedBoreNm: Nm;
  /** Words for the reason, for example "job CY-2612-0042 on 2026-03-14 at +0.50". */
  where: string;
}

export interface LadderStep {
  offsetNm: Nm;
}

export interface Ladder {
  standardBoreNm: Nm;
  cleanupNm: Nm;
  maxOversizeNm: Nm;
  steps: readonly LadderStep[];
}

/** The smallest finished bore a rebore may reach after a bore of boreNm. */
export function nextBoreFloor(boreNm: Nm, cleanupNm: Nm): Nm {
  return boreNm + cleanupNm;
}

/** True when a step finishing at finishedNm may follow a bore of boreNm. */
export function clearsBore(finishedNm: Nm, boreNm: Nm, cleanupNm: Nm): boolean {
  return finishedNm > boreNm && finishedNm >= nextBoreFloor(boreNm, cleanupNm);
}

/**
 * How many steps of the ladder may still follow a bore of boreNm, within the largest oversize.
 * A cylinder never bored counts from the standard bore.
 */
export function stepsLeftAfter(ladder: Ladder, boreNm: Nm | null): number {
  const from = boreNm ?? ladder.standardBoreNm;
  return ladder.steps.filter(
    (s) =>
      s.offsetNm <= ladder.maxOversizeNm &&
      clearsBore(ladder.standardBoreNm + s.offsetNm, from, ladder.cleanupNm),
  ).length;
}

/** A rule a step must pass; answers why it fails, or null. Step choice applies each one. */
export type StepConstraint = (step: { offsetNm: Nm; finishedBoreNm: Nm }) => string | null;

/** The history rule as a step constraint: refuses every step that would not clear the last bore. */
export function lastBoreConstraint(
  last: LastBore,
  cleanupNm: Nm,
  unit: LengthUnit = 'mm',
): StepConstraint {
  const show = (nm: Nm) => formatLengthCompact(nm, unit);
  return ({ finishedBoreNm }) => {
    if (clearsBore(finishedBoreNm, last.finishedBoreNm, cleanupNm)) return null;
    if (finishedBoreNm <= last.finishedBoreNm) {
      return `already passed: the earlier bore (${last.where}) finished at ${show(last.finishedBoreNm)}`;
    }
    return `too close to the earlier bore (${last.where}), finished at ${show(last.finishedBoreNm)}: a rebore must finish at least ${show(nextBoreFloor(last.finishedBoreNm, cleanupNm))}`;
  };
}

/** Plain words for how many steps remain after the chosen one. */
export function stepsLeftWarning(stepsLeft: number): string | null {
  if (stepsLeft > 0) return null;
  return (
    'This is the last step this cylinder allows: after it, the next rebore needs a sleeve (liner) ' +
    "or a new cylinder. Tell the customer, and check the engine maker's limits."
  );
}
