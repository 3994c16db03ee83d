// The history rule and the steps a cylinder has left, on metric and imperial ladders. The rule is
// common practice (no source): metal once cut cannot come back, so a rebore must finish above the
// last finished bore by at least the clean-up allowance the family asks of any bore. Every
// expected value is worked by hand in the comments; mm and in are read exactly (1 in = 25.4 mm,
// NIST SP 811) by mmToNm / inToNm, which have their own tests.
import { recommendStep, type StepStock } from '../../shared/bore-choice';
import {
  clearsBore,
  lastBoreConstraint,
  nextBoreFloor,
  stepsLeftAfter,
  stepsLeftWarning,
  type Ladder,
} from '../../shared/bore-history';
import { inToNm, mmToNm } from '../../shared/lengths';

// Invented metric family: standard 74.000 mm; steps +0.25, +0.50, +0.75, +1.00, +1.50 mm; the wall
// allows +1.00 mm; clean-up 0.05 mm on the diameter.
const METRIC: Ladder = {
  standardBoreNm: mmToNm('74.000'),
  cleanupNm: mmToNm('0.05'),
  maxOversizeNm: mmToNm('1.00'),
  steps: ['0.25', '0.50', '0.75', '1.00', '1.50'].map((o) => ({ offsetNm: mmToNm(o) })),
};

// Invented imperial family: standard 3.5000 in; steps +0.010, +0.020, +0.030, +0.040, +0.060 in;
// the wall allows +0.040 in; clean-up 0.0030 in.
const IMPERIAL: Ladder = {
  standardBoreNm: inToNm('3.5000'),
  cleanupNm: inToNm('0.0030'),
  maxOversizeNm: inToNm('0.040'),
  steps: ['0.010', '0.020', '0.030', '0.040', '0.060'].map((o) => ({ offsetNm: inToNm(o) })),
};

describe('steps left after the last bore', () => {
  // [last finished bore, steps left, worked by hand]
  const metric: [string | null, number, string][] = [
    [
      null,
      4,
      'never bored: from 74.000, floor 74.050; +0.25…+1.00 clear it; +1.50 is past the wall',
    ],
    ['74.262', 3, 'floor 74.312: +0.50 (74.50), +0.75 (74.75), +1.00 (75.00)'],
    ['74.520', 2, 'floor 74.570: +0.75 (74.75), +1.00 (75.00)'],
    ['74.950', 1, 'floor 75.000: +1.00 finishes at 75.000 exactly, which is enough'],
    ['74.960', 0, 'floor 75.010: +1.00 (75.000) falls 0.010 short; +1.50 is past the wall'],
    ['75.003', 0, 'past the last step the wall allows'],
  ];
  it.each(metric)('metric: after %s mm, %i steps are left (%s)', (last, left) => {
    expect(stepsLeftAfter(METRIC, last === null ? null : mmToNm(last))).toBe(left);
  });

  const imperial: [string | null, number, string][] = [
    [null, 4, 'never bored: floor 3.5030; +0.010 (3.5100) … +0.040 (3.5400)'],
    ['3.5203', 2, 'floor 3.5233: +0.030 (3.5300), +0.040 (3.5400)'],
    ['3.5370', 1, 'floor 3.5400: +0.040 finishes at 3.5400 exactly'],
    ['3.5372', 0, 'floor 3.5402: +0.040 (3.5400) is 0.0002 short; +0.060 is past the wall'],
  ];
  it.each(imperial)('imperial: after %s in, %i steps are left (%s)', (last, left) => {
    expect(stepsLeftAfter(IMPERIAL, last === null ? null : inToNm(last))).toBe(left);
  });

  it('when the clean-up allowance is zero, then a step at exactly the last bore still does not count', () => {
    // 74.50 after 74.50 removes nothing: it is not a rebore.
    expect(clearsBore(mmToNm('74.50'), mmToNm('74.50'), 0)).toBe(false);
    expect(clearsBore(mmToNm('74.501'), mmToNm('74.50'), 0)).toBe(true);
    expect(nextBoreFloor(inToNm('3.5203'), inToNm('0.0030'))).toBe(inToNm('3.5233'));
  });
});

describe('the history rule in the step choice', () => {
  const stock = (ladder: Ladder, labels: string[]): StepStock[] =>
    ladder.steps.map((s, i) => ({
      stepId: labels[i],
      label: labels[i],
      offsetNm: s.offsetNm,
      freePistons: 2,
      freeRings: 2,
      onOrder: 0,
    }));

  it('when a metric cylinder was bored to 74.262 mm, then +0.25 is refused as passed, and +0.50 is chosen though the readings alone would allow +0.25', () => {
    // Readings of 74.120 mm (mistyped or another cylinder): +0.25 (74.25) would clean up by
    // 0.130 ≥ 0.05. The history forbids it: 74.25 ≤ 74.262. +0.50 (74.50) ≥ 74.312 passes.
    const rule = lastBoreConstraint(
      { finishedBoreNm: mmToNm('74.262'), where: 'job CY-2601-0007 on 2026-01-14 at +0.25' },
      METRIC.cleanupNm,
      'mm',
    );
    const rec = recommendStep({
      largestWornNm: mmToNm('74.120'),
      standardBoreNm: METRIC.standardBoreNm,
      cleanupNm: METRIC.cleanupNm,
      maxOversizeNm: METRIC.maxOversizeNm,
      steps: stock(METRIC, ['+0.25', '+0.50', '+0.75', '+1.00', '+1.50']),
      constraints: [rule],
    });
    expect(rec.choice).toBe('+0.50');
    const first = rec.steps[0];
    expect(first.suitable).toBe(false);
    expect(first.reason).toMatch(/already passed: the earlier bore \(job CY-2601-0007/);
    expect(first.reason).toContain('74.262');
    expect(rec.steps[4].reason).toMatch(/past the largest oversize/);
  });

  it('when an imperial step finishes above the last bore but within the clean-up, then it is refused as too close', () => {
    // Last bore 3.5372 in; floor 3.5402 in. A step finishing at 3.5400 in is above the bore by
    // 0.0028 in, short of the 0.0030 in allowance.
    const rule = lastBoreConstraint(
      { finishedBoreNm: inToNm('3.5372'), where: 'job CY-2603-0011' },
      IMPERIAL.cleanupNm,
      'in',
    );
    const why = rule({ offsetNm: inToNm('0.040'), finishedBoreNm: inToNm('3.5400') });
    expect(why).toMatch(/too close to the earlier bore/);
    expect(why).toContain('3.5402');
    expect(rule({ offsetNm: inToNm('0.060'), finishedBoreNm: inToNm('3.5600') })).toBeNull();
  });

  it('when no steps are left, then the warning names a sleeve; with steps left, there is none', () => {
    expect(stepsLeftWarning(0)).toMatch(/last step .* sleeve/);
    expect(stepsLeftWarning(1)).toBeNull();
  });
});
