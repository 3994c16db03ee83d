import { assessBore, type FamilyLimits } from '../../shared/bore-assessment';
import { ReadingsError, type Reading } from '../../shared/bore-wear';
import { formatIn, formatMm, inToNm, mmToNm } from '../../shared/lengths';

// Every conversion: NIST SP 811, 1 in = 25.4 mm exactly.

// An invented air-cooled two-stroke family: standard bore 2.5170 in, steps to +0.040 in, clean-up
// 0.0030 in, taper limit 0.0040 in, out-of-round limit 0.0020 in (figures chosen for the test).
const INCH_FAMILY: FamilyLimits = {
  standardBoreNm: inToNm('2.5170'),
  cleanupNm: inToNm('0.0030'),
  maxOversizeNm: inToNm('0.040'),
  maxTaperNm: inToNm('0.0040'),
  maxOutOfRoundNm: inToNm('0.0020'),
};

const inch = (depth: Reading['depth'], axis: Reading['axis'], value: string): Reading => ({
  depth,
  axis,
  nm: inToNm(value),
});

describe('assessBore, inch readings', () => {
  const readings = [
    inch('top', 'pin', '2.5260'),
    inch('top', 'thrust', '2.5248'),
    inch('middle', 'pin', '2.5231'),
    inch('middle', 'thrust', '2.5227'),
    inch('bottom', 'pin', '2.5205'),
    inch('bottom', 'thrust', '2.5204'),
  ];

  it('when six readings are given, then largest, taper and out-of-round follow their definitions', () => {
    // Taper: largest difference between depths along one axis, pin 2.5260 − 2.5205 = 0.0055 in.
    // Out-of-round: largest difference between axes at one depth, top 2.5260 − 2.5248 = 0.0012 in.
    const { wear } = assessBore(readings, INCH_FAMILY, 'in');
    expect(formatIn(wear.largest)).toBe('2.5260');
    expect(formatIn(wear.taper)).toBe('0.0055');
    expect(formatIn(wear.outOfRound)).toBe('0.0012');
    expect(formatIn(wear.overStandard ?? -1)).toBe('0.0090');
    expect(formatMm(wear.largest)).toBe('64.1604');
  });

  it("when the taper is over the limit, then one warning in the reader's unit and nothing else", () => {
    expect(assessBore(readings, INCH_FAMILY, 'in').warnings).toEqual([
      'Taper 0.0055 in is over the limit of 0.0040 in.',
    ]);
    expect(assessBore(readings, INCH_FAMILY, 'mm').warnings).toEqual([
      'Taper 0.140 mm is over the limit of 0.102 mm.',
    ]);
  });

  it('when the wear plus clean-up passes the largest oversize, then a sleeve warning', () => {
    // 2.5545 + 0.0030 = 2.5575 in > 2.5170 + 0.040 = 2.5570 in.
    const { warnings } = assessBore([inch('top', 'thrust', '2.5545')], INCH_FAMILY, 'in');
    expect(warnings.join(' ')).toMatch(/sleeve \(liner\) or replacing/);
    // 2.5540 + 0.0030 = 2.5570 in: exactly at the largest oversize still cleans up.
    const edge = assessBore([inch('top', 'thrust', '2.5540')], INCH_FAMILY, 'in');
    expect(edge.warnings.join(' ')).not.toMatch(/sleeve/);
  });

  it('when a reading is under the standard bore, then a warning to check gauge, unit and family', () => {
    const { warnings } = assessBore([inch('top', 'pin', '2.5160')], INCH_FAMILY, 'in');
    expect(warnings.join(' ')).toMatch(/under the standard bore of 2.5170 in/);
  });

  it('when taper and out-of-round cannot be known from the readings, then the limits say so', () => {
    const { warnings } = assessBore([inch('top', 'pin', '2.5200')], INCH_FAMILY, 'in');
    expect(warnings).toEqual([
      'Taper is unknown: measure at two depths or more along one axis.',
      'Out-of-round is unknown: measure both axes at one depth or more.',
    ]);
  });

  it('when a reading is repeated, then the shared wear check refuses it', () => {
    expect(() =>
      assessBore([inch('top', 'pin', '2.5200'), inch('top', 'pin', '2.5201')], INCH_FAMILY),
    ).toThrow(ReadingsError);
  });
});

describe('assessBore, metric readings', () => {
  // An invented metric family: standard 54.000 mm, largest oversize +1.00 mm, clean-up 0.05 mm, no
  // limits recorded for taper or out-of-round.
  const METRIC: FamilyLimits = {
    standardBoreNm: mmToNm('54.000'),
    cleanupNm: mmToNm('0.05'),
    maxOversizeNm: mmToNm('1.00'),
    maxTaperNm: null,
    maxOutOfRoundNm: null,
  };

  it('when the bore is worn 0.085 mm, then the figures are exact and there is no warning', () => {
    const readings: Reading[] = [
      { depth: 'top', axis: 'pin', nm: mmToNm('54.085') },
      { depth: 'top', axis: 'thrust', nm: mmToNm('54.062') },
      { depth: 'bottom', axis: 'pin', nm: mmToNm('54.021') },
      { depth: 'bottom', axis: 'thrust', nm: mmToNm('54.020') },
    ];
    const { wear, warnings } = assessBore(readings, METRIC, 'mm');
    expect(formatMm(wear.largest)).toBe('54.085');
    expect(formatMm(wear.taper)).toBe('0.064');
    expect(formatMm(wear.outOfRound)).toBe('0.023');
    expect(formatMm(wear.overStandard ?? -1)).toBe('0.085');
    // NIST SP 811: 54.085 mm ÷ 25.4 = 2.12933… in → 2.1293 in.
    expect(formatIn(wear.largest)).toBe('2.1293');
    expect(warnings).toEqual([]);
  });

  it('when worn to 54.960 mm, then +1.00 mm leaves only 0.040 mm, short of the clean-up: sleeve', () => {
    const { warnings } = assessBore(
      [{ depth: 'middle', axis: 'thrust', nm: mmToNm('54.960') }],
      METRIC,
      'mm',
    );
    expect(warnings).toEqual([
      'Worn past what the largest oversize cleans up (55.000 mm less 0.050 mm clean-up): the cylinder needs a sleeve (liner) or replacing.',
    ]);
  });
});
