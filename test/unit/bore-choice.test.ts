import { BoreChoiceError, looksLikeFirstRebore, recommendStep } from '../../shared/bore-choice';
import type { RecommendStepInput, StepStock } from '../../shared/bore-choice';
import { inToNm, mmToNm } from '../../shared/lengths';
import { IMPERIAL_SERIES, METRIC_SERIES } from '../../shared/step-series';

// An invented metric piston family: standard bore 54.00 mm, clean-up allowance 0.05 mm on the diameter and
// largest oversize +1.00 mm. The allowance and limit are invented for the test (a real family takes the
// engine maker's figures). Every expected value is worked by hand: finished bore = 54.00 + offset;
// clean-up = finished − largest worn.
function metricSteps(stock: Partial<Record<string, Partial<StepStock>>> = {}): StepStock[] {
  return METRIC_SERIES.map((s) => ({
    stepId: s.code,
    label: s.label,
    offsetNm: s.offsetNm,
    freePistons: 3,
    freeRings: 3,
    onOrder: 0,
    ...stock[s.code],
  }));
}

function metricInput(worn: string, extra: Partial<RecommendStepInput> = {}): RecommendStepInput {
  return {
    largestWornNm: mmToNm(worn),
    standardBoreNm: mmToNm('54.00'),
    cleanupNm: mmToNm('0.05'),
    maxOversizeNm: mmToNm('1.00'),
    steps: metricSteps(),
    ...extra,
  };
}

describe('recommendStep', () => {
  it('when the bore is worn to 54.12 mm, then +0.25 mm is chosen with 0.08 mm to spare', () => {
    // +0.25: 54.25 − 54.12 = 0.13 mm clean-up, 0.13 − 0.05 = 0.08 mm beyond the allowance.
    // STD: 54.00 − 54.12 = −0.12 mm, 0.05 − (−0.12) = 0.17 mm short.
    const result = recommendStep(metricInput('54.12'));
    expect(result.choice).toBe('+0.25');
    expect(result.warning).toBeUndefined();
    const [std, first, second] = result.steps;
    expect(std).toMatchObject({
      suitable: false,
      cleanupNm: -120_000,
      reason: 'does not clean up: 0.17 mm short',
    });
    expect(first).toMatchObject({
      suitable: true,
      finishedBoreNm: 54_250_000,
      cleanupNm: 130_000,
      reason: 'cleans up with 0.08 mm to spare',
    });
    expect(second).toMatchObject({ suitable: true, cleanupNm: 380_000 });
  });

  it('when the bore is worn to 54.23 mm, then +0.25 mm is 0.03 mm short and +0.50 mm is chosen', () => {
    // +0.25: 54.25 − 54.23 = 0.02 mm; needs 0.05 → 0.03 mm short. +0.50: 0.27 − 0.05 = 0.22 to spare.
    const result = recommendStep(metricInput('54.23'));
    expect(result.steps[1].reason).toBe('does not clean up: 0.03 mm short');
    expect(result.steps[2].reason).toBe('cleans up with 0.22 mm to spare');
    expect(result.choice).toBe('+0.50');
  });

  it('when the clean-up equals the allowance exactly, then the step is suitable with 0 to spare', () => {
    const result = recommendStep(metricInput('54.20'));
    expect(result.steps[1]).toMatchObject({ suitable: true, cleanupNm: 50_000 });
    expect(result.choice).toBe('+0.25');
  });

  it('when steps that only just clean up are skipped, then the next suitable step is chosen', () => {
    // Common practice (no source): skip a step on a first rebore when it only just cleans up.
    // +0.25 cleans up 0.13 mm < 0.05 + 0.10 marginal band = 0.15 mm → skipped; +0.50 chosen.
    const result = recommendStep(
      metricInput('54.12', { skipMarginal: true, marginalNm: mmToNm('0.10') }),
    );
    expect(result.choice).toBe('+0.50');
    expect(result.warning).toBe('+0.25 mm only just cleans up, so the next step is chosen.');
    // 0.13 mm is not below 0.05 + 0.08 = 0.13 mm: not marginal, +0.25 stays.
    expect(
      recommendStep(metricInput('54.12', { skipMarginal: true, marginalNm: mmToNm('0.08') }))
        .choice,
    ).toBe('+0.25');
  });

  it('when the only suitable step is marginal, then it is kept and the warning says so', () => {
    const result = recommendStep(
      metricInput('54.90', { skipMarginal: true, marginalNm: mmToNm('0.10') }),
    );
    expect(result.choice).toBe('+1.00');
    expect(result.warning).toMatch(/only just cleans up, and no larger step is allowed/);
  });

  it('when no allowed oversize cleans up, then there is no choice and a sleeve is suggested', () => {
    // Wall allows +0.75: 54.75 − 54.98 = −0.23 → short; +1.00 is past the allowed oversize.
    const result = recommendStep(metricInput('54.98', { maxOversizeNm: mmToNm('0.75') }));
    expect(result.choice).toBeNull();
    expect(result.warning).toMatch(/needs a sleeve \(liner\) or replacement/);
    expect(result.steps[4]).toMatchObject({
      suitable: false,
      reason: 'past the largest oversize the wall allows',
    });
  });

  it('when the chosen step has no free piston, then it is still chosen and the shortage is named', () => {
    const input = metricInput('54.12', {
      steps: metricSteps({ '+0.25': { freePistons: 0, onOrder: 2 } }),
    });
    const result = recommendStep(input);
    expect(result.choice).toBe('+0.25');
    expect(result.warning).toMatch(/^No free piston at \+0\.25 mm: 2 on order\./);
    expect(result.steps[1]).toMatchObject({ freePistons: 0, onOrder: 2, freeRings: 3 });
  });

  it('when the shop saves steps and this is the first rebore from standard, then the second step is chosen', () => {
    // Common practice (no source): go to the second oversize on a first rebore so later rebores remain.
    // Worn 54.12 mm: +0.25 (0.13 mm clean-up) is the first that cleans up; +0.50 (0.38 mm) the second.
    const result = recommendStep(metricInput('54.12', { policy: 'save-steps', firstRebore: true }));
    expect(result.choice).toBe('+0.50');
    expect(result.rule).toMatch(/first rebore from standard: the second step/);
    expect(result.warning).toBeUndefined();
    // Not a first rebore, or the plain policy: the smallest step that cleans up.
    const later = recommendStep(metricInput('54.12', { policy: 'save-steps', firstRebore: false }));
    expect(later.choice).toBe('+0.25');
    expect(later.rule).toBe('the smallest step that cleans up');
    expect(recommendStep(metricInput('54.12', { firstRebore: true })).choice).toBe('+0.25');
  });

  it('when the second step is past the wall, then the only step that cleans up is kept and said so', () => {
    // Worn 54.90 mm: only +1.00 (1.10 − 0.05 → cleans up) is suitable.
    const result = recommendStep(metricInput('54.90', { policy: 'save-steps', firstRebore: true }));
    expect(result.choice).toBe('+1.00');
    expect(result.warning).toMatch(/only step that cleans up/);
  });

  it('when a bore is still under the first oversize, then it reads as a first rebore', () => {
    // 54.12 < 54.00 + 0.25 = 54.25 → never bored to +0.25; 54.30 is past it → bored before.
    expect(looksLikeFirstRebore(mmToNm('54.12'), mmToNm('54.00'), metricSteps())).toBe(true);
    expect(looksLikeFirstRebore(mmToNm('54.30'), mmToNm('54.00'), metricSteps())).toBe(false);
  });

  it('when the chosen step has no free piston, then the next suitable step with one is offered with its cost in steps', () => {
    // Worn 54.12 mm: suitable +0.25, +0.50, +0.75, +1.00. +0.25 has none free; +0.50 has 3.
    // Going to +0.50 leaves +0.75 and +1.00: 2 steps for later rebores, 1 fewer than from +0.25.
    const one = recommendStep(
      metricInput('54.12', { steps: metricSteps({ '+0.25': { freePistons: 0 } }) }),
    );
    expect(one.choice).toBe('+0.25');
    expect(one.alternative).toEqual({
      stepId: '+0.50',
      label: '+0.50 mm',
      freePistons: 3,
      stepsLeft: 2,
      stepsGivenUp: 1,
    });
    expect(one.warning).toContain(
      '+0.50 mm has 3 free; going there now leaves 2 steps for later rebores, 1 fewer.',
    );
    // +0.50 empty as well: +0.75 leaves only +1.00 (1 step), 2 fewer.
    const two = recommendStep(
      metricInput('54.12', {
        steps: metricSteps({ '+0.25': { freePistons: 0 }, '+0.50': { freePistons: 0 } }),
      }),
    );
    expect(two.alternative).toMatchObject({ stepId: '+0.75', stepsLeft: 1, stepsGivenUp: 2 });
  });

  it('when the steps come unsorted, then they are judged smallest first', () => {
    const result = recommendStep(metricInput('54.12', { steps: metricSteps().reverse() }));
    expect(result.steps.map((s) => s.stepId)).toEqual(['STD', '+0.25', '+0.50', '+0.75', '+1.00']);
    expect(result.choice).toBe('+0.25');
  });

  it('when an imperial cylinder is worn to 2.5260 in, then +0.010 in is chosen with amounts in inches', () => {
    // Standard 2.5200 in, allowance 0.003 in: +0.010 → 2.5300 − 2.5260 = 0.0040 in, 0.0010 in to spare.
    const result = recommendStep({
      largestWornNm: inToNm('2.5260'),
      standardBoreNm: inToNm('2.5200'),
      cleanupNm: inToNm('0.003'),
      maxOversizeNm: inToNm('0.040'),
      unit: 'in',
      steps: IMPERIAL_SERIES.map((s) => ({
        stepId: s.code,
        label: s.label,
        offsetNm: s.offsetNm,
        freePistons: 1,
        freeRings: 1,
        onOrder: 0,
      })),
    });
    expect(result.choice).toBe('+0.010');
    expect(result.steps[1].reason).toBe('cleans up with 0.001 in to spare');
    expect(result.steps[1].cleanupNm).toBe(inToNm('0.0040'));
    expect(result.steps[0].reason).toBe('does not clean up: 0.009 in short');
  });

  it('when the family has no steps, then there is no choice and the warning says why', () => {
    expect(recommendStep(metricInput('54.12', { steps: [] }))).toEqual({
      steps: [],
      choice: null,
      warning: 'This piston family has no steps set up.',
    });
  });

  it.each([
    [{ largestWornNm: 0 }, /largest worn diameter/],
    [{ cleanupNm: -1 }, /clean-up allowance/],
    [{ skipMarginal: true }, /marginal band/],
    [{ steps: [...metricSteps(), metricSteps()[0]] }, /listed twice/],
    [{ steps: metricSteps({ STD: { freePistons: -1 } }) }, /stock counts/],
  ])('when the input is bad (%#), then a BoreChoiceError explains', (extra, message) => {
    expect(() => recommendStep(metricInput('54.12', extra as Partial<RecommendStepInput>))).toThrow(
      BoreChoiceError,
    );
    expect(() => recommendStep(metricInput('54.12', extra as Partial<RecommendStepInput>))).toThrow(
      message,
    );
  });
});
