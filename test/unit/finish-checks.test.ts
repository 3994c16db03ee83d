// After honing: the piston's clearance in the honed bore, and the ring end gap, each worked by hand.
import {
  checkRingGap,
  clearanceRangeFor,
  honedFit,
  suggestedRingGapNm,
} from '../../shared/finish-checks';

const IN = 25_400_000; // nm per inch, exact by definition (1 in = 25.4 mm)
const MM = 1_000_000;
const inch = (x: number) => Math.round(x * IN);

const family = {
  clearanceMinNm: inch(0.0012),
  clearanceMaxNm: inch(0.002),
  forgedMinNm: inch(0.0025),
  forgedMaxNm: inch(0.0035),
};
const castRange = clearanceRangeFor(family, 'cast');

describe('honedFit: honed bore − measured skirt against the range', () => {
  it('when a 2.5295 in honed bore takes a 2.5280 in skirt, then 0.0015 in is in the 0.0012–0.0020 in range', () => {
    // By hand: 2.5295 − 2.5280 = 0.0015 in; 0.0012 ≤ 0.0015 ≤ 0.0020.
    const fit = honedFit(inch(2.5295), inch(2.528), castRange, 'in');
    expect(fit.verdict).toBe('in_range');
    expect(fit.clearanceNm).toBe(inch(0.0015));
    expect(fit.text).toBe('Clearance 0.0015 in: in range (0.0012 in to 0.0020 in).');
  });

  it('when the honed bore is 2.5290 in, then it is tight by 0.0002 in', () => {
    // By hand: 2.5290 − 2.5280 = 0.0010 in, under 0.0012 by 0.0002 in.
    const fit = honedFit(inch(2.529), inch(2.528), castRange, 'in');
    expect(fit.verdict).toBe('tight');
    expect(fit.byNm).toBe(inch(0.0002));
    expect(fit.text).toMatch(/^Clearance 0\.0010 in: tight by 0\.0002 in/);
  });

  it('when the honed bore is 2.5310 in, then it is loose by 0.0010 in and the piston will rock', () => {
    // By hand: 2.5310 − 2.5280 = 0.0030 in, over 0.0020 by 0.0010 in.
    const fit = honedFit(inch(2.531), inch(2.528), castRange, 'in');
    expect(fit.verdict).toBe('loose');
    expect(fit.byNm).toBe(inch(0.001));
    expect(fit.text).toMatch(/loose by 0\.0010 in .*the piston will rock/);
  });

  it('when it is over by less than the display shows, then the digits show the difference', () => {
    // 0.00204 in over a 0.0020 in limit: by 0.00004 in, which must not read "0.0000 in".
    const fit = honedFit(inch(2.53004), inch(2.528), castRange, 'in');
    expect(fit.verdict).toBe('loose');
    expect(fit.text).toMatch(/loose by 0\.00004 in/);
  });

  it('when the piston is forged and the family has a forged range, then that range is used', () => {
    // 0.0030 in is loose for cast (max 0.0020) but in the forged range 0.0025–0.0035 in.
    const forged = clearanceRangeFor(family, 'forged');
    expect(forged.basis).toBe('forged');
    const fit = honedFit(inch(2.531), inch(2.528), forged, 'in');
    expect(fit.verdict).toBe('in_range');
    expect(fit.text).toMatch(/for a forged piston/);
    // Without a forged range of its own, or for a piston of unknown material: the family's range.
    const single = { ...family, forgedMinNm: null, forgedMaxNm: null };
    expect(clearanceRangeFor(single, 'forged').basis).toBe('family');
    expect(clearanceRangeFor(family, null).minNm).toBe(inch(0.0012));
  });
});

describe('ring end gap', () => {
  // Rule of thumb (from memory): about 0.004 in of end gap per inch of bore, so the factor 0.004 is
  // the same in millimetres per millimetre.
  it('when the finished bore is 54.000 mm and the factor 0.004, then the suggested gap is 0.216 mm', () => {
    // By hand: 54.000 × 0.004 = 0.216 mm exactly.
    expect(suggestedRingGapNm(54 * MM, '0.004')).toBe(216_000);
  });

  it('when the finished bore is 2.5295 in, then 0.0101 in is suggested, rounded up to 0.001 mm', () => {
    // By hand: 2.5295 in = 64.2493 mm; × 0.004 = 0.2569972 mm → rounded up to 0.257 mm (0.01012 in).
    expect(suggestedRingGapNm(inch(2.5295), '0.004')).toBe(257_000);
  });

  it('when a measured gap is under the suggestion, then it is tight and says what to file to', () => {
    // 0.200 mm measured against 0.216 mm suggested: tight by 0.016 mm.
    const check = checkRingGap(200_000, 216_000, null, 'mm');
    expect(check.verdict).toBe('tight');
    expect(check.byNm).toBe(16_000);
    expect(check.text).toBe(
      'Ring end gap 0.200 mm: tight by 0.016 mm — file the ring to at least 0.216 mm, or its ends may butt when hot.',
    );
  });

  it('when a measured gap is over the family largest, then it is wide; between, it is fine', () => {
    expect(checkRingGap(450_000, 216_000, 400_000, 'mm').verdict).toBe('wide');
    expect(checkRingGap(450_000, 216_000, 400_000, 'mm').byNm).toBe(50_000);
    expect(checkRingGap(250_000, 216_000, 400_000, 'mm').verdict).toBe('ok');
    expect(checkRingGap(216_000, 216_000, null, 'mm').verdict).toBe('ok');
  });

  it('when the factor is outside what a ring gap can be, then it is refused', () => {
    expect(() => suggestedRingGapNm(54 * MM, '0')).toThrow(RangeError);
    expect(() => suggestedRingGapNm(54 * MM, '0.05')).toThrow(RangeError);
  });
});
