// Which oversize step a worn cylinder should go to. The bore must go to a step that cleans up: the finished
// bore (standard + step offset) must exceed the largest worn diameter by at least the family's clean-up
// allowance, and the step must not be past the largest oversize the cylinder wall allows.
// Clean-up is measured on the diameter, like every bore size here.
import { formatLengthCompact, isNm } from './lengths';
import type { LengthUnit, Nm } from './lengths';

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
  /** Unit for the amounts in the reasons (default mm). */
  unit?: LengthUnit;
}

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

export interface StepRecommendation {
  steps: StepVerdict[];
  choice: string | null;
  warning?: string;
}

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
    let reason: string;
    if (past) reason = 'past the largest oversize the wall allows';
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
      suitable: !past && cleans,
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
  const notes: string[] = [];
  // Common practice (no source): on a first rebore some shops skip a step that only just cleans up, so one
  // cut gives a straight, clean bore and the later steps stay available.
  if (input.skipMarginal && chosen.cleanupNm < input.cleanupNm + (input.marginalNm ?? 0)) {
    if (suitable.length > 1) {
      notes.push(`${chosen.label} only just cleans up, so the next step is chosen.`);
      chosen = suitable[1];
    } else {
      notes.push(`${chosen.label} only just cleans up, and no larger step is allowed.`);
    }
  }
  if (chosen.freePistons === 0) {
    notes.push(
      chosen.onOrder > 0
        ? `No free piston at ${chosen.label}: ${chosen.onOrder} on order.`
        : `No free piston at ${chosen.label} and none on order.`,
    );
  } else if (chosen.freeRings === 0) {
    notes.push(`No free ring set at ${chosen.label}.`);
  }
  return notes.length > 0
    ? { steps, choice: chosen.stepId, warning: notes.join(' ') }
    : { steps, choice: chosen.stepId };
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
