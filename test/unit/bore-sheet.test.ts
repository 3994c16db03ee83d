import {
  BORE_SHEET_CAUTIONS,
  BoreSheetError,
  chooseClearance,
  computeBoreSheet,
} from '../../shared/bore-sheet';
import { formatIn, formatMm, inToNm, mmToNm } from '../../shared/lengths';

// Every conversion below uses 1 in = 25.4 mm exactly (NIST SP 811, appendix B).

describe('computeBoreSheet, inch job', () => {
  // Check values: common practice (no source) — from an experienced cylinder-boring practitioner, for a
  // new cast piston in an air-cooled two-stroke: skirt 2.5555 in, clearance 0.0015 in, hone allowance
  // 0.0020 in, worn to 2.5260 in, at most 0.020 in per pass on the diameter.
  const sheet = computeBoreSheet({
    skirtNm: inToNm('2.5555'),
    clearanceNm: inToNm('0.0015'),
    honeAllowanceNm: inToNm('0.0020'),
    currentNm: inToNm('2.5260'),
    maxCutNm: inToNm('0.020'),
  });

  it('when the skirt is 2.5555 in and the clearance 0.0015 in, then the finished bore is 2.5570 in exactly', () => {
    expect(sheet.finishedBoreNm).toBe(inToNm('2.5570'));
    expect(formatIn(sheet.finishedBoreNm)).toBe('2.5570');
    // NIST SP 811: 2.5570 × 25.4 = 64.9478 mm.
    expect(formatMm(sheet.finishedBoreNm)).toBe('64.9478');
  });

  it('when the hone allowance is 0.0020 in, then the bar bores to 2.5550 in and leaves 0.0020 in to hone', () => {
    expect(formatIn(sheet.boreToNm)).toBe('2.5550');
    expect(formatIn(sheet.honeStockNm)).toBe('0.0020');
    expect(sheet.error).toBeUndefined();
  });

  it('when 0.0290 in must come off at 0.020 in a pass, then two passes: 2.5405 in, then 2.5550 in', () => {
    // 2.5550 − 2.5260 = 0.0290 in; ⌈0.0290 / 0.020⌉ = 2 passes of 0.0145 in; half-way 2.5405 in.
    expect(sheet.passes.map(formatIn)).toEqual(['2.5405', '2.5550']);
  });

  it('when a 0.002 in finish pass is asked for, then the roughing passes share the rest and the last is light', () => {
    // Roughing 2.5260 → 2.5530 (0.0270 in) in 2 passes of 0.0135: 2.5395, 2.5530; finish to 2.5550.
    const withFinish = computeBoreSheet({
      skirtNm: inToNm('2.5555'),
      clearanceNm: inToNm('0.0015'),
      honeAllowanceNm: inToNm('0.0020'),
      currentNm: inToNm('2.5260'),
      maxCutNm: inToNm('0.020'),
      finishPassNm: inToNm('0.002'),
    });
    expect(withFinish.passes.map(formatIn)).toEqual(['2.5395', '2.5530', '2.5550']);
  });
});

describe('computeBoreSheet, metric job', () => {
  // An invented metric job, worked by hand: skirt 54.215 mm + clearance 0.040 mm = 54.255 mm finished;
  // hone allowance 0.030 mm → bore to 54.225 mm; worn 54.120 mm; at most 0.10 mm a pass.
  const base = {
    skirtNm: mmToNm('54.215'),
    clearanceNm: mmToNm('0.040'),
    honeAllowanceNm: mmToNm('0.030'),
    currentNm: mmToNm('54.120'),
    maxCutNm: mmToNm('0.10'),
  };

  it('when 0.105 mm must come off at 0.10 mm a pass, then two equal passes: 54.1725 then 54.225 mm', () => {
    const sheet = computeBoreSheet(base);
    expect(formatMm(sheet.finishedBoreNm)).toBe('54.255');
    expect(formatMm(sheet.boreToNm)).toBe('54.225');
    expect(sheet.passes.map(formatMm)).toEqual(['54.1725', '54.225']);
    // NIST SP 811: 54.255 mm ÷ 25.4 = 2.13602… in → 2.1360 in.
    expect(formatIn(sheet.finishedBoreNm)).toBe('2.1360');
  });

  it('when a 0.02 mm finish pass is asked for, then one roughing pass and the light finish', () => {
    const sheet = computeBoreSheet({ ...base, finishPassNm: mmToNm('0.02') });
    expect(sheet.passes.map(formatMm)).toEqual(['54.205', '54.225']);
  });

  it('when the half-way size is off the 100 nm grid, then it is rounded and the last pass is exact', () => {
    // 54.1201 → 54.225: 0.1049 mm in 2 passes; half-way 54.17255 → 54.1726 (nearest 100 nm).
    const sheet = computeBoreSheet({ ...base, currentNm: mmToNm('54.1201') });
    expect(sheet.passes).toEqual([54_172_600, 54_225_000]);
  });

  it('when rounding would make a pass deeper than allowed, then one more pass is taken', () => {
    // Max cut 0.05245 mm: 2 passes would need cuts of 0.0525 and 0.0524 mm after rounding → 3 passes.
    const sheet = computeBoreSheet({ ...base, currentNm: mmToNm('54.1201'), maxCutNm: 52_450 });
    expect(sheet.passes).toHaveLength(3);
    let previous = mmToNm('54.1201');
    for (const size of sheet.passes) {
      expect(size - previous).toBeLessThanOrEqual(52_450);
      previous = size;
    }
    expect(sheet.passes.at(-1)).toBe(54_225_000);
  });

  it('when the bore is already at or past the bore-to size, then no passes and an error', () => {
    for (const current of ['54.225', '54.300']) {
      const sheet = computeBoreSheet({ ...base, currentNm: mmToNm(current) });
      expect(sheet.passes).toEqual([]);
      expect(sheet.error).toBe('the bore is already at or past the bore-to size');
      expect(formatMm(sheet.boreToNm)).toBe('54.225');
    }
  });

  it('when the cut per pass is tiny, then the sheet refuses rather than list hundreds of passes', () => {
    const sheet = computeBoreSheet({ ...base, maxCutNm: 1000 });
    expect(sheet.passes).toEqual([]);
    expect(sheet.error).toMatch(/more than 50 passes/);
  });

  it('when the finish pass is deeper than the largest cut, then an error', () => {
    const sheet = computeBoreSheet({ ...base, finishPassNm: mmToNm('0.2') });
    expect(sheet.error).toMatch(/finish pass is deeper/);
  });

  it.each([
    [{ skirtNm: 0 }, /skirt diameter/],
    [{ maxCutNm: 0 }, /largest cut per pass/],
    [{ clearanceNm: -1 }, /clearance/],
    [{ honeAllowanceNm: 1.5 }, /hone allowance/],
    [{ honeAllowanceNm: mmToNm('60') }, /larger than the finished bore/],
  ])('when the input is bad (%#), then a BoreSheetError explains', (extra, message) => {
    expect(() => computeBoreSheet({ ...base, ...extra })).toThrow(BoreSheetError);
    expect(() => computeBoreSheet({ ...base, ...extra })).toThrow(message);
  });

  it('when a sheet is printed, then the usual cautions defer to the makers and local codes', () => {
    expect(BORE_SHEET_CAUTIONS.join(' ')).toMatch(/machine maker's instructions/);
    expect(BORE_SHEET_CAUTIONS.join(' ')).toMatch(/Local codes and licensed practice/);
  });
});

describe('chooseClearance', () => {
  it('when a 0.0015–0.0025 in range is given, then min, mid and max are 0.0015, 0.0020, 0.0025 in', () => {
    const min = inToNm('0.0015');
    const max = inToNm('0.0025');
    expect(formatIn(chooseClearance(min, max, 'min'))).toBe('0.0015');
    expect(formatIn(chooseClearance(min, max, 'mid'))).toBe('0.0020');
    expect(formatIn(chooseClearance(min, max, 'max'))).toBe('0.0025');
  });

  it('when a 0.035–0.050 mm range is given, then the mid is 0.0425 mm', () => {
    expect(formatMm(chooseClearance(mmToNm('0.035'), mmToNm('0.050'), 'mid'))).toBe('0.0425');
  });

  it('when the midpoint is off the 100 nm grid, then it is rounded toward the minimum, never below it', () => {
    expect(chooseClearance(38_100, 38_400, 'mid')).toBe(38_200); // mid 38 250 → 38 200
    expect(chooseClearance(38_150, 38_160, 'mid')).toBe(38_150); // 38 100 would be below min
  });

  it('when the range is upside down or the policy unknown, then it throws', () => {
    expect(() => chooseClearance(50_000, 40_000, 'mid')).toThrow(/smallest clearance is larger/);
    expect(() => chooseClearance(40_000, 50_000, 'tight' as 'mid')).toThrow(/min, mid or max/);
    expect(() => chooseClearance(-1, 50_000, 'min')).toThrow(BoreSheetError);
  });
});
