import { ReadingsError, computeWear, wearWarnings } from '../../shared/bore-wear';
import type { Reading } from '../../shared/bore-wear';
import { formatIn, formatMm, inToNm, mmToNm } from '../../shared/lengths';

// Taper = difference between depths along one axis; out-of-round = difference between the pin and thrust
// axes at one depth; both on the diameter. Common practice (no source). All figures below are an invented
// cylinder, worked by hand.
const metric: Reading[] = [
  { depth: 'top', axis: 'pin', nm: mmToNm('54.080') },
  { depth: 'top', axis: 'thrust', nm: mmToNm('54.120') },
  { depth: 'middle', axis: 'pin', nm: mmToNm('54.050') },
  { depth: 'middle', axis: 'thrust', nm: mmToNm('54.070') },
  { depth: 'bottom', axis: 'pin', nm: mmToNm('54.020') },
  { depth: 'bottom', axis: 'thrust', nm: mmToNm('54.025') },
];

describe('computeWear', () => {
  it('when six metric readings are taken, then taper and out-of-round are the worst axis and depth', () => {
    // By hand: taper pin 54.080 − 54.020 = 0.060, thrust 54.120 − 54.025 = 0.095 → 0.095 mm;
    // out-of-round top 0.040, middle 0.020, bottom 0.005 → 0.040 mm; over standard 54.120 − 54.000 = 0.120.
    const wear = computeWear(metric, mmToNm('54.00'));
    expect(formatMm(wear.largest)).toBe('54.120');
    expect(formatMm(wear.smallest)).toBe('54.020');
    expect(formatMm(wear.taper)).toBe('0.095');
    expect(formatMm(wear.outOfRound)).toBe('0.040');
    expect(formatMm(wear.overStandard ?? -1)).toBe('0.120');
    expect(wear.taperKnown && wear.outOfRoundKnown).toBe(true);
  });

  it('when inch readings are taken at two depths, then results are exact in inches', () => {
    // By hand: taper thrust 2.5260 − 2.5235 = 0.0025, pin 2.5250 − 2.5232 = 0.0018 → 0.0025 in;
    // out-of-round top 0.0010, bottom 0.0003 → 0.0010 in; over a 2.5200 in standard: 0.0060 in.
    const wear = computeWear(
      [
        { depth: 'top', axis: 'pin', nm: inToNm('2.5250') },
        { depth: 'top', axis: 'thrust', nm: inToNm('2.5260') },
        { depth: 'bottom', axis: 'pin', nm: inToNm('2.5232') },
        { depth: 'bottom', axis: 'thrust', nm: inToNm('2.5235') },
      ],
      inToNm('2.5200'),
    );
    expect(formatIn(wear.taper)).toBe('0.0025');
    expect(formatIn(wear.outOfRound)).toBe('0.0010');
    expect(formatIn(wear.overStandard ?? -1)).toBe('0.0060');
    expect(formatIn(wear.largest)).toBe('2.5260');
  });

  it('when only one reading is taken, then taper and out-of-round are 0 and marked unknown', () => {
    const wear = computeWear([{ depth: 'top', axis: 'thrust', nm: mmToNm('54.1') }]);
    expect(wear).toMatchObject({
      taper: 0,
      outOfRound: 0,
      taperKnown: false,
      outOfRoundKnown: false,
    });
    expect(wear.overStandard).toBeNull();
  });

  it('when the bore is under the standard size, then overStandard is negative', () => {
    const wear = computeWear([{ depth: 'top', axis: 'pin', nm: mmToNm('53.990') }], mmToNm('54'));
    expect(wear.overStandard).toBe(-10_000);
  });

  it.each([
    [[], /at least one/],
    [[...metric, metric[0]], /At most 6 readings/],
    [[metric[0], { ...metric[0], nm: 1 }], /top on the pin axis is entered twice/],
    [[{ depth: 'upper', axis: 'pin', nm: 1 }], /depth must be top, middle or bottom/],
    [[{ depth: 'top', axis: 'side', nm: 1 }], /axis must be pin or thrust/],
    [[{ depth: 'top', axis: 'pin', nm: 0 }], /positive whole number/],
    [[{ depth: 'top', axis: 'pin', nm: 54.5 }], /positive whole number/],
  ])('when readings are bad (%#), then a ReadingsError explains', (readings, message) => {
    expect(() => computeWear(readings as Reading[])).toThrow(ReadingsError);
    expect(() => computeWear(readings as Reading[])).toThrow(message);
  });
});

describe('wearWarnings', () => {
  const wear = computeWear(metric);

  it('when taper and out-of-round are over the limits, then both are named with values', () => {
    // Invented limits for the test: taper 0.050 mm, out-of-round 0.030 mm.
    expect(wearWarnings(wear, { maxTaperNm: 50_000, maxOutOfRoundNm: 30_000 })).toEqual([
      'Taper 0.095 mm is over the limit of 0.050 mm.',
      'Out-of-round 0.040 mm is over the limit of 0.030 mm.',
    ]);
  });

  it('when wear is within the limits or no limits are given, then there are no warnings', () => {
    expect(wearWarnings(wear, { maxTaperNm: 95_000, maxOutOfRoundNm: 40_000 })).toEqual([]);
    expect(wearWarnings(wear, {})).toEqual([]);
  });

  it('when asked in inches, then the amounts are in inches', () => {
    // 0.095 mm = 0.00374… in → 0.0037 in; 0.0020 in limit = 50 800 nm.
    expect(wearWarnings(wear, { maxTaperNm: 50_800 }, 'in')).toEqual([
      'Taper 0.0037 in is over the limit of 0.0020 in.',
    ]);
  });

  it('when the wear is over the limit by less than the display resolution, then the message shows the digits that tell them apart', () => {
    // Readings typed in inches: top pin 2.1895, thrust 2.1875 → out-of-round 0.0020 in = 50 800 nm.
    // Limit 0.050 mm = 50 000 nm. 50 000 / 25 400 000 = 0.0019685… in (NIST SP 811 factor, by hand):
    // both read 0.0020 in at 4 decimals; at 5 they read 0.00200 and 0.00197.
    const inch = computeWear([
      { depth: 'top', axis: 'pin', nm: inToNm('2.1895') },
      { depth: 'top', axis: 'thrust', nm: inToNm('2.1875') },
    ]);
    expect(wearWarnings(inch, { maxOutOfRoundNm: 50_000 }, 'in')).toEqual([
      'Out-of-round 0.00200 in is over the limit of 0.00197 in.',
    ]);
    // In millimetres 0.0508 mm rounds to 0.051, already apart from 0.050.
    expect(wearWarnings(inch, { maxOutOfRoundNm: 50_000 }, 'mm')).toEqual([
      'Out-of-round 0.051 mm is over the limit of 0.050 mm.',
    ]);
    // Over by 1 nm: the comparison is exact, so the message goes to the nanometre.
    expect(wearWarnings(inch, { maxOutOfRoundNm: 50_799 }, 'mm')).toEqual([
      'Out-of-round 0.050800 mm is over the limit of 0.050799 mm.',
    ]);
  });

  it('when a limit is set but the readings cannot show it, then the warning says what to measure', () => {
    const one = computeWear([{ depth: 'top', axis: 'pin', nm: mmToNm('54.1') }]);
    expect(wearWarnings(one, { maxTaperNm: 50_000, maxOutOfRoundNm: 30_000 })).toEqual([
      'Taper is unknown: measure at two depths or more along one axis.',
      'Out-of-round is unknown: measure both axes at one depth or more.',
    ]);
    expect(() => wearWarnings(one, { maxTaperNm: -1 })).toThrow(ReadingsError);
  });
});
