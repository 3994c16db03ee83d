// Whether a part may be held for a cylinder: one rule for holding a piston unit, holding counted
// parts (ring sets, sundries) and moving a hold to another job or cylinder. Pure, so the three
// paths cannot drift apart; the server turns a refusal into its 400 or 409.

export interface HoldablePart {
  /** What the user sees the part as: a unit's label or a part's SKU. */
  name: string;
  kind: 'piston' | 'rings' | 'kit' | 'other';
  familyId: string | null;
  stepId: string | null;
  stepLabel: string | null;
  /** Pistons only: whether its skirt has been measured. */
  measured?: boolean;
  /** True when the request names a piston by its unit (pistons must be). */
  byUnit: boolean;
}

export interface HoldTarget {
  jobNumber: string;
  familyId: string;
  cylinder: number;
  chosenStepId: string | null;
  chosenStepLabel: string | null;
  /** Moving a hold: the other job is named in the message. */
  moving?: boolean;
}

export type HoldRefusal =
  | { status: 400; field: 'unitId' | 'partId' | 'jobId'; message: string }
  | { status: 409; code: 'not_measured' | 'wrong_step'; message: string };

export function whyNotHoldable(part: HoldablePart, target: HoldTarget): HoldRefusal | null {
  const field = target.moving ? 'jobId' : part.byUnit ? 'unitId' : 'partId';
  if (!part.byUnit && part.kind === 'piston' && !target.moving) {
    return {
      status: 400,
      field,
      message: `${part.name} is a piston; hold a piston by its unit, so its measured size is on the bore sheet`,
    };
  }
  if (!part.byUnit && part.kind === 'kit' && !target.moving) {
    return {
      status: 400,
      field,
      message: `${part.name} is a kit; hold its piston unit and its ring set one by one`,
    };
  }
  if (part.familyId !== null && part.familyId !== target.familyId) {
    return {
      status: 400,
      field,
      message: target.moving
        ? `${part.name} does not fit job ${target.jobNumber}'s engine family`
        : `${part.name} is ${part.kind === 'piston' ? 'a piston ' : ''}for another engine family`,
    };
  }
  if (part.byUnit && part.measured === false) {
    return {
      status: 409,
      code: 'not_measured',
      message: `${part.name} has not been measured yet: measure its skirt before holding it, so the bore sheet can use it.`,
    };
  }
  if (part.stepId && target.chosenStepId && part.stepId !== target.chosenStepId) {
    const where = target.moving
      ? `cylinder ${target.cylinder} of job ${target.jobNumber}`
      : `cylinder ${target.cylinder}`;
    return {
      status: 409,
      code: 'wrong_step',
      message: `${part.name} is for ${part.stepLabel ?? 'another step'}; ${where} is set to go to ${target.chosenStepLabel}. Choose that step or another ${part.kind === 'piston' ? 'piston' : 'part'}.`,
    };
  }
  return null;
}
