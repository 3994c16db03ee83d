// Which oversize step a worn cylinder should go to. The bore must go to a step that cleans up: the finished
// bore (standard + step offset) must exceed the largest worn diameter by at least the family's clean-up
// allowance, and the step must not be past the largest oversize the cylinder wall allows.
// Clean-up is measured on the diameter, like every bore size here.
import { formatLengthCompact, isNm } from './lengths';
import type { LengthUnit, Nm } from './lengths';
import type { StepConstraint } from './bore-history';

export interface StepStock {
  stepId: string;
  label: string;
  offsetNm: Nm;
  freePistons: number;
  freeRings: number;
  onOrder: number;
}

export interface RecommendStepInput {
  largestWornNm: Nm;
  standardBoreNm: Nm;
  /** The family's clean-up allowance: least stock to remove beyond the largest worn diameter. */
  cleanupNm: Nm;
  /** Largest oversize the cylinder wall allows. */
  maxOversizeNm: Nm;
  /** Skip a step that only just cleans up (within marginalNm of the allowance); needs marginalNm. */
  skipMarginal?: boolean;
  marginalNm?: Nm;
  steps: StepStock[];
  /**
   * The shop's step policy. 'first-that-cleans': the smallest step that cleans up. 'save-steps': on
   * a cylinder's first rebore from standard, the second step that cleans up, so later rebores remain.
   */
  policy?: StepPolicy;
  /**
   * True when the cylinder has not been rebored before. Without the cylinder's history it is read
   * from the wear: a bore still under the first oversize's size has not been bored to one.
   */
  firstRebore?: boolean;
  /**
   * Further rules a step must pass (a cylinder's earlier bores, for one); each answers why a step
   * fails, and the first that fails gives the step its reason.
   */
  constraints?: readonly StepConstraint[];
  /** Unit for the amounts in the reasons (default mm). */
  unit?: LengthUnit;
}

export type StepPolicy = 'first-that-cleans' | 'save-steps';
export const STEP_POLICIES: readonly StepPolicy[] = ['first-that-cleans', 'save-steps'];

export interface StepVerdict {
  stepId: string;
  label: string;
  finishedBoreNm: Nm;
  /** Finished bore minus largest worn diameter, on the diameter (negative when the step is too small). */
  cleanupNm: Nm;
  freePistons: number;
  freeRings: number;
  onOrder: number;
  suitable: boolean;
  reason: string;
}

export interface StepAlternative {
  stepId: string;
  label: string;
  freePistons: number;
  /** Suitable steps left above it for later rebores, and how many fewer that is than the choice. */
  stepsLeft: number;
  stepsGivenUp: number;
}

export interface StepRecommendation {
  steps: StepVerdict[];
  choice: string | null;
  /** Which rule chose the step, in plain words; null when there is no choice. */
  rule?: string;
  warning?: string;
  /** When the choice has no free piston: the next suitable step that has one. */
  alternative?: StepAlternative;
}

/**
 * One rule of the step choice: given the suitable steps (smallest first) and the one chosen so far,
 * it keeps the choice or moves it, and says why. Rules run in order; a new one slots into STEP_RULES.
 */
type StepRule = (
  suitable: StepVerdict[],
  chosen: StepVerdict,
  input: RecommendStepInput,
) => { chosen: StepVerdict; rule?: string; note?: string } | null;

const STEP_RULES: StepRule[] = [
  // Common practice (no source): a shop that rebores one cylinder several times over its life goes to
  // the second oversize on the first rebore from standard, so a later rebore still has steps left.
  (suitable, chosen, input) => {
    if (input.policy !== 'save-steps' || !input.firstRebore) return null;
    const at = suitable.indexOf(chosen);
    if (at + 1 < suitable.length) {
      return {
        chosen: suitable[at + 1],
        rule: 'first rebore from standard: the second step that cleans up, so later rebores have steps left',
      };
    }
    return {
      chosen,
      note: `${chosen.label} is the only step that cleans up; no larger step is allowed.`,
    };
  },
  // Common practice (no source): some shops skip a step that only just cleans up, so one cut gives a
  // straight, clean bore.
  (suitable, chosen, input) => {
    if (!input.skipMarginal || chosen.cleanupNm >= input.cleanupNm + (input.marginalNm ?? 0)) {
      return null;
    }
    const at = suitable.indexOf(chosen);
    if (at + 1 < suitable.length) {
      return {
        chosen: suitable[at + 1],
        rule: `${chosen.label} only just cleans up, so the next step`,
        note: `${chosen.label} only just cleans up, so the next step is chosen.`,
      };
    }
    return { chosen, note: `${chosen.label} only just cleans up, and no larger step is allowed.` };
  },
];

export class BoreChoiceError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BoreChoiceError';
  }
}

export function recommendStep(input: RecommendStepInput): StepRecommendation {
  validate(input);
  const unit = input.unit ?? 'mm';
  const show = (nm: Nm) => formatLengthCompact(nm, unit);
  const sorted = [...input.steps].sort((a, b) => a.offsetNm - b.offsetNm);

  const steps: StepVerdict[] = sorted.map((step) => {
    const finishedBoreNm = input.standardBoreNm + step.offsetNm;
    const cleanupNm = finishedBoreNm - input.largestWornNm;
    const past = step.offsetNm > input.maxOversizeNm;
    const cleans = cleanupNm >= input.cleanupNm;
    const refused = past
      ? null
      : ((input.constraints ?? [])
          .map((rule) => rule({ offsetNm: step.offsetNm, finishedBoreNm }))
          .find((why) => why !== null) ?? null);
    let reason: string;
    if (past) reason = 'past the largest oversize the wall allows';
    else if (refused !== null) reason = refused;
    else if (!cleans) reason = `does not clean up: ${show(input.cleanupNm - cleanupNm)} short`;
    else reason = `cleans up with ${show(cleanupNm - input.cleanupNm)} to spare`;
    return {
      stepId: step.stepId,
      label: step.label,
      finishedBoreNm,
      cleanupNm,
      freePistons: step.freePistons,
      freeRings: step.freeRings,
      onOrder: step.onOrder,
      suitable: !past && refused === null && cleans,
      reason,
    };
  });

  const suitable = steps.filter((s) => s.suitable);
  if (steps.length === 0) {
    return { steps, choice: null, warning: 'This piston family has no steps set up.' };
  }
  if (suitable.length === 0) {
    return {
      steps,
      choice: null,
      warning:
        'No allowed oversize cleans up this bore: the cylinder needs a sleeve (liner) or replacement. ' +
        "Check the engine maker's limits before deciding.",
    };
  }

  let chosen = suitable[0];
  let rule = 'the smallest step that cleans up';
  const notes: string[] = [];
  for (const apply of STEP_RULES) {
    const moved = apply(suitable, chosen, input);
    if (!moved) continue;
    chosen = moved.chosen;
    if (moved.rule) rule = moved.rule;
    if (moved.note) notes.push(moved.note);
  }
  let alternative: StepAlternative | undefined;
  if (chosen.freePistons === 0) {
    notes.push(
      chosen.onOrder > 0
        ? `No free piston at ${chosen.label}: ${chosen.onOrder} on order.`
        : `No free piston at ${chosen.label} and none on order.`,
    );
    const at = suitable.indexOf(chosen);
    const next = suitable.slice(at + 1).find((s) => s.freePistons > 0);
    if (next) {
      const stepsLeft = suitable.length - 1 - suitable.indexOf(next);
      const givenUp = suitable.indexOf(next) - at;
      alternative = {
        stepId: next.stepId,
        label: next.label,
        freePistons: next.freePistons,
        stepsLeft,
        stepsGivenUp: givenUp,
      };
      notes.push(
        `${next.label} has ${next.freePistons} free; going there now leaves ${stepsLeft} step${stepsLeft === 1 ? '' : 's'} for later rebores, ${givenUp} fewer.`,
      );
    }
  } else if (chosen.freeRings === 0) {
    notes.push(`No free ring set at ${chosen.label}.`);
  }
  return {
    steps,
    choice: chosen.stepId,
    rule,
    ...(notes.length > 0 ? { warning: notes.join(' ') } : {}),
    ...(alternative ? { alternative } : {}),
  };
}

/** Without the cylinder's history: a bore still under the smallest oversize has not been bored to one. */
export function looksLikeFirstRebore(
  largestWornNm: Nm,
  standardBoreNm: Nm,
  steps: StepStock[],
): boolean {
  const oversizes = steps.map((s) => s.offsetNm).filter((o) => o > 0);
  if (oversizes.length === 0) return true;
  return largestWornNm < standardBoreNm + Math.min(...oversizes);
}

function validate(input: RecommendStepInput): void {
  const lengths: Array<[string, Nm]> = [
    ['largest worn diameter', input.largestWornNm],
    ['standard bore', input.standardBoreNm],
  ];
  for (const [name, nm] of lengths) {
    if (!isNm(nm) || nm <= 0) throw new BoreChoiceError(`The ${name} must be a positive length.`);
  }
  const amounts: Array<[string, Nm | undefined]> = [
    ['clean-up allowance', input.cleanupNm],
    ['largest oversize', input.maxOversizeNm],
    ['marginal band', input.marginalNm],
  ];
  for (const [name, nm] of amounts) {
    if (nm !== undefined && (!isNm(nm) || nm < 0)) {
      throw new BoreChoiceError(`The ${name} must be zero or a positive length.`);
    }
  }
  if (input.skipMarginal && input.marginalNm === undefined) {
    throw new BoreChoiceError(
      'Give the marginal band when skipping steps that only just clean up.',
    );
  }
  if (!Array.isArray(input.steps)) throw new BoreChoiceError('Steps must be a list.');
  const ids = new Set<string>();
  for (const step of input.steps) {
    if (ids.has(step.stepId)) throw new BoreChoiceError(`Step ${step.stepId} is listed twice.`);
    ids.add(step.stepId);
    if (!isNm(step.offsetNm) || step.offsetNm < 0) {
      throw new BoreChoiceError(
        `Step ${step.label}: the offset must be zero or a positive length.`,
      );
    }
    for (const count of [step.freePistons, step.freeRings, step.onOrder]) {
      if (!Number.isSafeInteger(count) || count < 0) {
        throw new BoreChoiceError(
          `Step ${step.label}: stock counts must be whole numbers, 0 or more.`,
        );
      }
    }
  }
}
