// One rule for holding a part for a cylinder (a piston unit, counted parts, or a hold being moved),
// as a table: which requests are refused, with which status and field or code.
import { whyNotHoldable, type HoldablePart, type HoldTarget } from '../../shared/hold-rules';

const target: HoldTarget = {
  jobNumber: 'J-0042',
  familyId: 'fam-a',
  cylinder: 2,
  chosenStepId: 'step-20',
  chosenStepLabel: '+0.020 in',
};
const piston: HoldablePart = {
  name: 'U-0007',
  kind: 'piston',
  familyId: 'fam-a',
  stepId: 'step-20',
  stepLabel: '+0.020 in',
  measured: true,
  byUnit: true,
};
const rings: HoldablePart = { ...piston, name: 'RNG-20', kind: 'rings', byUnit: false };

describe('whyNotHoldable', () => {
  it.each([
    ['a measured piston of the family at the chosen step', piston, target, null],
    ['a ring set of the family at the chosen step', rings, target, null],
    ['a piston before any step is chosen', piston, { ...target, chosenStepId: null }, null],
    [
      'a sundry for no family and no step',
      { ...rings, kind: 'other' as const, familyId: null, stepId: null },
      target,
      null,
    ],
  ])('when it is %s, then it may be held', (_what, part, to, expected) => {
    expect(whyNotHoldable(part, to)).toBe(expected);
  });

  it.each([
    [
      'a piston named by its part',
      { ...piston, byUnit: false },
      target,
      { status: 400, field: 'partId' },
    ],
    ['a kit', { ...rings, kind: 'kit' as const }, target, { status: 400, field: 'partId' }],
    [
      'a piston of another family',
      { ...piston, familyId: 'fam-b' },
      target,
      { status: 400, field: 'unitId' },
    ],
    [
      'ring sets of another family',
      { ...rings, familyId: 'fam-b' },
      target,
      { status: 400, field: 'partId' },
    ],
    [
      'a piston not yet measured',
      { ...piston, measured: false },
      target,
      { status: 409, code: 'not_measured' },
    ],
    [
      'a piston of another step',
      { ...piston, stepId: 'step-30', stepLabel: '+0.030 in' },
      target,
      { status: 409, code: 'wrong_step' },
    ],
    [
      'a hold moved to a job of another family',
      { ...rings, familyId: 'fam-b' },
      { ...target, moving: true },
      { status: 400, field: 'jobId' },
    ],
    [
      'a hold moved to a cylinder set to another step',
      { ...rings, stepId: 'step-30' },
      { ...target, moving: true },
      { status: 409, code: 'wrong_step' },
    ],
  ])('when it is %s, then it is refused', (_what, part, to, expected) => {
    expect(whyNotHoldable(part, to)).toMatchObject(expected);
  });

  it('when a hold moves to another job at the wrong step, then the message names that job', () => {
    const refusal = whyNotHoldable(
      { ...rings, stepId: 'step-30', stepLabel: '+0.030 in' },
      { ...target, moving: true },
    );
    expect(refusal?.message).toBe(
      'RNG-20 is for +0.030 in; cylinder 2 of job J-0042 is set to go to +0.020 in. Choose that step or another part.',
    );
  });
});
