import {
  BORE_SHEET_CAUTIONS,
  BoreSheetError,
  chooseClearance,
  computeBoreSheet,
  pistonCleanup,
} from '../../shared/bore-sheet';
import { barGridNm, planPasses, type Pass } from '../../shared/pass-plan';
import { formatIn, formatMm, inToNm, mmToNm } from '../../shared/lengths';

// Every conversion below uses 1 in = 25.4 mm exactly (NIST SP 811, appendix B).

const IN_GRID = 2540; // 0.0001 in: 25.4 mm ÷ 10 000 = 0.00254 mm (NIST SP 811)
const MM_GRID = 1000; // 0.001 mm

/** Passes as the machinist reads them: size, cut where least worn, cut where most worn. */
function inchPlan(passes: Pass[]): string[][] {
  return passes.map((p) => [
    p.kind,
    formatIn(p.sizeNm),
    formatIn(p.cutUnwornNm),
    formatIn(p.cutWornNm),
  ]);
}

describe('computeBoreSheet, inch job worn in the ring travel', () => {
  // An invented air-cooled two-stroke, worked by hand: worn to 2.5300 in at the top of the ring travel,
  // 2.5200 in below it; skirt 2.5685 in + clearance 0.0015 in = 2.5700 in finished; hone allowance
  // 0.0020 in → bore to 2.5680 in; at most 0.020 in a pass, at least 0.001 in; dial reads 0.0001 in.
  const base = {
    skirtNm: inToNm('2.5685'),
    clearanceNm: inToNm('0.0015'),
    honeAllowanceNm: inToNm('0.0020'),
    smallestNm: inToNm('2.5200'),
    largestNm: inToNm('2.5300'),
    maxCutNm: inToNm('0.020'),
    minCutNm: inToNm('0.001'),
    gridNm: IN_GRID,
  };

  it('when the skirt is 2.5685 in, clearance 0.0015 in and hone 0.0020 in, then finished 2.5700, bore to 2.5680', () => {
    const sheet = computeBoreSheet(base);
    expect(formatIn(sheet.finishedBoreNm)).toBe('2.5700');
    // NIST SP 811: 2.5700 × 25.4 = 65.278 mm.
    expect(formatMm(sheet.finishedBoreNm)).toBe('65.278');
    expect(formatIn(sheet.boreToNm)).toBe('2.5680');
    expect(formatIn(sheet.honeStockNm)).toBe('0.0020');
  });

  it('when passes are planned, then they start from the unworn 2.5200 in and no cut passes 0.020 in anywhere', () => {
    // From the smallest reading: 2.5680 − 2.5200 = 0.0480 in; ⌈0.0480 / 0.020⌉ = 3 passes of 0.0160 in:
    // 2.5360, 2.5520, 2.5680. At the worn part the first pass cuts 2.5360 − 2.5300 = 0.0060 in.
    // (Planned from the largest worn diameter instead, 0.0380 in in 2 passes would set 2.5490 in first:
    // a 2.5490 − 2.5200 = 0.0290 in cut below the ring travel, over the 0.020 in limit.)
    const sheet = computeBoreSheet(base);
    expect(inchPlan(sheet.passes)).toEqual([
      ['roughing', '2.5360', '0.0160', '0.0060'],
      ['roughing', '2.5520', '0.0160', '0.0160'],
      ['roughing', '2.5680', '0.0160', '0.0160'],
    ]);
    expect(sheet.notes).toEqual([]);
  });

  it('when a 0.002 in finish pass is asked for, then the roughing shares 2.5200 → 2.5660 in and the last is light', () => {
    // 2.5660 − 2.5200 = 0.0460 in in 3 passes of 0.015333… in: 2.535333 → 2.5353, 2.550667 → 2.5507
    // (nearest 0.0001 in), 2.5660; then the finish to 2.5680. Cuts 0.0153, 0.0154, 0.0153, 0.0020.
    // At the worn part: 2.5353 − 2.5300 = 0.0053, then the same as below it.
    const sheet = computeBoreSheet({ ...base, finishPassNm: inToNm('0.002') });
    expect(inchPlan(sheet.passes)).toEqual([
      ['roughing', '2.5353', '0.0153', '0.0053'],
      ['roughing', '2.5507', '0.0154', '0.0154'],
      ['roughing', '2.5660', '0.0153', '0.0153'],
      ['finish', '2.5680', '0.0020', '0.0020'],
    ]);
  });

  it('when a 0.002 in truing pass is asked for, then a light first cut to 2.5220 in, then the roughing', () => {
    // Truing: 2.5200 + 0.002 = 2.5220 in (it does not reach the 2.5300 in wear: 0 there).
    // Then 2.5680 − 2.5220 = 0.0460 in in 3: 2.537333 → 2.5373, 2.552667 → 2.5527, 2.5680.
    // At the worn part: 2.5373 − 2.5300 = 0.0073 in.
    const sheet = computeBoreSheet({ ...base, truingPassNm: inToNm('0.002') });
    expect(inchPlan(sheet.passes)).toEqual([
      ['truing', '2.5220', '0.0020', '0.0000'],
      ['roughing', '2.5373', '0.0153', '0.0073'],
      ['roughing', '2.5527', '0.0154', '0.0154'],
      ['roughing', '2.5680', '0.0153', '0.0153'],
    ]);
  });

  it('when the bar reads 0.0005 in, then bore-to goes down to that grid and every pass is on it', () => {
    // Skirt 2.5687 + 0.0015 = 2.5702 in; less 0.0020 = 2.5682 → down to 2.5680 (0.0005 in grid); hone
    // stock 2.5702 − 2.5680 = 0.0022 in. With a 0.002 in finish: roughing 2.5200 → 2.5660 in 3:
    // 2.535333 / 0.0005 = 5070.67 → 5071 × 0.0005 = 2.5355; 2.550667 / 0.0005 = 5101.33 → 2.5505.
    // Cuts 0.0155, 0.0150, 0.0155, finish 0.0020.
    const sheet = computeBoreSheet({
      ...base,
      skirtNm: inToNm('2.5687'),
      gridNm: inToNm('0.0005'),
      finishPassNm: inToNm('0.002'),
    });
    expect(formatIn(sheet.boreToNm)).toBe('2.5680');
    expect(formatIn(sheet.honeStockNm)).toBe('0.0022');
    expect(inchPlan(sheet.passes)).toEqual([
      ['roughing', '2.5355', '0.0155', '0.0055'],
      ['roughing', '2.5505', '0.0150', '0.0150'],
      ['roughing', '2.5660', '0.0155', '0.0155'],
      ['finish', '2.5680', '0.0020', '0.0020'],
    ]);
  });

  it('when 0.0290 in comes off at 0.010 in a pass on a 0.0001 in dial, then each size is a whole dial step', () => {
    // 2.5550 − 2.5260 = 0.0290 in; 3 passes of 0.009667 in: 2.535667 → 2.5357, 2.545333 → 2.5453, 2.5550.
    // Cuts 0.0097, 0.0096, 0.0097 in, each exactly that many 0.0001 in steps (2540 nm each).
    const sheet = computeBoreSheet({
      ...base,
      skirtNm: inToNm('2.5555'),
      smallestNm: inToNm('2.5260'),
      largestNm: inToNm('2.5260'),
      maxCutNm: inToNm('0.010'),
    });
    expect(sheet.passes.map((p) => formatIn(p.sizeNm))).toEqual(['2.5357', '2.5453', '2.5550']);
    expect(sheet.passes.map((p) => p.cutUnwornNm)).toEqual([
      97 * IN_GRID,
      96 * IN_GRID,
      97 * IN_GRID,
    ]);
  });

  it('when less than the smallest cut is left, then no passes and a plain reason', () => {
    // 2.5680 − 2.5675 = 0.0005 in, under the 0.001 in the bar takes reliably.
    const sheet = computeBoreSheet({
      ...base,
      smallestNm: inToNm('2.5675'),
      largestNm: inToNm('2.5675'),
    });
    expect(sheet.passes).toEqual([]);
    expect(sheet.error).toMatch(/lighter than the smallest cut/);
  });

  it('when a finish pass would leave a roughing cut under the smallest cut, then one pass and a note', () => {
    // 2.5680 − 2.5655 = 0.0025 in: roughing to 2.5660 would be 0.0005 in (< 0.001), so one 0.0025 in pass.
    const sheet = computeBoreSheet({
      ...base,
      smallestNm: inToNm('2.5655'),
      largestNm: inToNm('2.5660'),
      finishPassNm: inToNm('0.002'),
    });
    expect(inchPlan(sheet.passes)).toEqual([['roughing', '2.5680', '0.0025', '0.0020']]);
    expect(sheet.notes).toEqual(['no separate finish pass: too little to cut for one']);
  });
});

describe('computeBoreSheet, metric job', () => {
  // An invented metric job, worked by hand: skirt 54.215 mm + clearance 0.040 mm = 54.255 mm finished;
  // hone allowance 0.030 mm → bore to 54.225 mm; worn 54.180 mm at the top, 54.120 mm below the ring
  // travel; at most 0.10 mm a pass, at least 0.02 mm; dial reads 0.001 mm.
  const base = {
    skirtNm: mmToNm('54.215'),
    clearanceNm: mmToNm('0.040'),
    honeAllowanceNm: mmToNm('0.030'),
    smallestNm: mmToNm('54.120'),
    largestNm: mmToNm('54.180'),
    maxCutNm: mmToNm('0.10'),
    minCutNm: mmToNm('0.02'),
    gridNm: MM_GRID,
  };

  it('when 0.105 mm must come off at 0.10 mm a pass, then 54.173 then 54.225 mm', () => {
    // 54.225 − 54.120 = 0.105 mm → 2 passes; half-way 54.1725 → 54.173 (nearest 0.001 mm, half up).
    // Cuts below the ring travel 0.053 and 0.052 mm; at the top the first pass does not reach 54.180
    // (0), the second cuts 54.225 − 54.180 = 0.045 mm.
    const sheet = computeBoreSheet(base);
    expect(formatMm(sheet.finishedBoreNm)).toBe('54.255');
    expect(formatMm(sheet.boreToNm)).toBe('54.225');
    expect(
      sheet.passes.map((p) => [formatMm(p.sizeNm), formatMm(p.cutUnwornNm), formatMm(p.cutWornNm)]),
    ).toEqual([
      ['54.173', '0.053', '0.000'],
      ['54.225', '0.052', '0.045'],
    ]);
    // NIST SP 811: 54.255 mm ÷ 25.4 = 2.13602… in → 2.1360 in.
    expect(formatIn(sheet.finishedBoreNm)).toBe('2.1360');
  });

  it('when the bore is already at or past the bore-to size, then no passes and an error', () => {
    for (const current of ['54.225', '54.300']) {
      const sheet = computeBoreSheet({
        ...base,
        smallestNm: mmToNm(current),
        largestNm: mmToNm(current),
      });
      expect(sheet.passes).toEqual([]);
      expect(sheet.error).toBe('the bore is already at or past the bore-to size');
    }
  });

  it('when the cut per pass is tiny, then the sheet refuses rather than list hundreds of passes', () => {
    const sheet = computeBoreSheet({ ...base, maxCutNm: 2000, minCutNm: 1000 });
    expect(sheet.passes).toEqual([]);
    expect(sheet.error).toMatch(/more than 50 passes/);
  });

  it('when the finish or truing pass is deeper than the largest cut, then an error', () => {
    expect(computeBoreSheet({ ...base, finishPassNm: mmToNm('0.2') }).error).toMatch(
      /finish pass is deeper/,
    );
    expect(computeBoreSheet({ ...base, truingPassNm: mmToNm('0.2') }).error).toMatch(
      /truing pass is deeper/,
    );
  });

  it.each([
    [{ skirtNm: 0 }, /skirt diameter/],
    [{ maxCutNm: 0 }, /largest cut per pass/],
    [{ clearanceNm: -1 }, /clearance/],
    [{ honeAllowanceNm: 1.5 }, /hone allowance/],
    [{ honeAllowanceNm: mmToNm('60') }, /larger than the finished bore/],
    [{ largestNm: mmToNm('54.000') }, /largest reading is smaller/],
  ])('when the input is bad (%#), then a BoreSheetError explains', (extra, message) => {
    expect(() => computeBoreSheet({ ...base, ...extra })).toThrow(BoreSheetError);
    expect(() => computeBoreSheet({ ...base, ...extra })).toThrow(message);
  });

  it('when a sheet is printed, then the usual cautions defer to the makers and local codes', () => {
    expect(BORE_SHEET_CAUTIONS.join(' ')).toMatch(/machine maker's instructions/);
    expect(BORE_SHEET_CAUTIONS.join(' ')).toMatch(/Local codes and licensed practice/);
  });
});

describe('planPasses over many bores', () => {
  // The limits themselves, not a recomputation: for every bore below, no cut anywhere passes the
  // largest cut or is under the smallest, every size is on the dial's grid, and the last is bore-to.
  it('when bores from 2.5000 to 2.5600 in are planned to 2.5680 in, then every pass keeps the limits', () => {
    const maxCut = inToNm('0.012');
    const minCut = inToNm('0.001');
    for (let small = 25000; small <= 25600; small += 37) {
      for (const wear of [0, 13, 100, 250]) {
        for (const extra of [
          {},
          { finishPassNm: inToNm('0.002') },
          { truingPassNm: inToNm('0.003') },
        ]) {
          const smallestNm = small * IN_GRID;
          const plan = planPasses({
            smallestNm,
            largestNm: smallestNm + wear * IN_GRID,
            boreToNm: inToNm('2.5680'),
            maxCutNm: maxCut,
            minCutNm: minCut,
            gridNm: IN_GRID,
            ...extra,
          });
          expect(plan.error).toBeUndefined();
          let previous = smallestNm;
          for (const pass of plan.passes) {
            expect(pass.sizeNm % IN_GRID).toBe(0);
            expect(pass.sizeNm - previous).toBe(pass.cutUnwornNm);
            expect(pass.cutUnwornNm).toBeLessThanOrEqual(maxCut);
            expect(pass.cutUnwornNm).toBeGreaterThanOrEqual(minCut);
            expect(pass.cutWornNm).toBeLessThanOrEqual(pass.cutUnwornNm);
            previous = pass.sizeNm;
          }
          expect(plan.passes.at(-1)?.sizeNm).toBe(inToNm('2.5680'));
        }
      }
    }
  });

  it('when the bar resolutions are asked for, then 0.0001 in, 0.001 mm and 0.0005 in in nanometres', () => {
    // NIST SP 811: 0.0001 in = 0.00254 mm = 2540 nm; 0.0005 in = 0.0127 mm = 12 700 nm.
    expect(barGridNm('0.0001 in')).toBe(2540);
    expect(barGridNm('0.001 mm')).toBe(1000);
    expect(barGridNm('0.0005 in')).toBe(12_700);
  });
});

describe('pistonCleanup', () => {
  it('when a 2.5280 in skirt + 0.0015 in clearance meets a 2.5260 in wear and 0.004 in allowance, then it does not clean up', () => {
    // Finished 2.5280 + 0.0015 = 2.5295 in; removes 2.5295 − 2.5260 = 0.0035 in; 0.0035 − 0.0040 = −0.0005.
    const check = pistonCleanup(inToNm('2.5295'), inToNm('2.5260'), inToNm('0.004'));
    expect(formatIn(check.removedNm)).toBe('0.0035');
    expect(check.spareNm).toBe(-inToNm('0.0005'));
    expect(check.cleansUp).toBe(false);
  });

  it('when the finished bore removes exactly the allowance, then it cleans up with nothing to spare', () => {
    // 2.5300 − 2.5260 = 0.0040 in = the allowance.
    expect(pistonCleanup(inToNm('2.5300'), inToNm('2.5260'), inToNm('0.004'))).toEqual({
      removedNm: inToNm('0.004'),
      spareNm: 0,
      cleansUp: true,
    });
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
