import { formatIn, formatMm, inToNm, mmToNm } from '../../shared/lengths';
import {
  IMPERIAL_SERIES,
  IMPERIAL_SERIES_060,
  METRIC_SERIES,
  StepSeriesError,
  customSeries,
  stepLabel,
  stepNominalBore,
} from '../../shared/step-series';

describe('built-in step series', () => {
  // Common practice (no source): metric pistons in 0.25 mm steps to +1.00 mm, imperial in 0.010 in steps.
  it('when the metric series is listed, then it is STD and 0.25 mm steps to +1.00 mm', () => {
    expect(METRIC_SERIES.map((s) => s.label)).toEqual([
      'STD',
      '+0.25 mm',
      '+0.50 mm',
      '+0.75 mm',
      '+1.00 mm',
    ]);
    expect(METRIC_SERIES.map((s) => s.offsetNm)).toEqual([0, 250_000, 500_000, 750_000, 1_000_000]);
    expect(METRIC_SERIES.map((s) => s.code)).toEqual(['STD', '+0.25', '+0.50', '+0.75', '+1.00']);
  });

  it('when the imperial series are listed, then they step by 0.010 in (254 000 nm, NIST SP 811)', () => {
    // 0.010 in × 25.4 mm/in = 0.254 mm = 254 000 nm (NIST SP 811: 1 in = 25.4 mm exactly).
    expect(IMPERIAL_SERIES.map((s) => s.offsetNm)).toEqual([
      0, 254_000, 508_000, 762_000, 1_016_000,
    ]);
    expect(IMPERIAL_SERIES.map((s) => s.label)).toEqual([
      'STD',
      '+0.010 in',
      '+0.020 in',
      '+0.030 in',
      '+0.040 in',
    ]);
    expect(IMPERIAL_SERIES_060.at(-1)).toEqual({
      code: '+0.060',
      label: '+0.060 in',
      offsetNm: 1_524_000,
    });
  });

  it('when a series is used, then it cannot be changed by accident', () => {
    expect(Object.isFrozen(METRIC_SERIES)).toBe(true);
  });
});

describe('stepNominalBore', () => {
  it('when 54.00 mm STD gets +0.25 mm, then the nominal bore is 54.25 mm exactly', () => {
    // 54.00 + 0.25 = 54.25 mm (decimal addition by hand).
    const bore = stepNominalBore(mmToNm('54.00'), METRIC_SERIES[1].offsetNm);
    expect(bore).toBe(54_250_000);
    expect(formatMm(bore)).toBe('54.250');
  });

  it('when every metric step is added to 54.00 mm, then each bore is exact', () => {
    const bores = METRIC_SERIES.map((s) => formatMm(stepNominalBore(mmToNm('54'), s.offsetNm)));
    expect(bores).toEqual(['54.000', '54.250', '54.500', '54.750', '55.000']);
  });

  it('when 2.5000 in gets +0.030 in, then the nominal bore is 2.5300 in exactly', () => {
    // 2.5000 + 0.030 = 2.5300 in; in nm 63 500 000 + 762 000 = 64 262 000 (NIST SP 811 factor).
    const bore = stepNominalBore(inToNm('2.5000'), IMPERIAL_SERIES[3].offsetNm);
    expect(bore).toBe(64_262_000);
    expect(formatIn(bore)).toBe('2.5300');
    expect(formatMm(bore)).toBe('64.262'); // 2.53 × 25.4 = 64.262 mm
  });

  it('when an inch bore gets a metric step, then the sum is still exact in both units', () => {
    // 2.5000 in + 0.25 mm = 63.5 + 0.25 = 63.75 mm = 2.50984… in → 2.5098 in at 4 decimals.
    const bore = stepNominalBore(inToNm('2.5'), mmToNm('0.25'));
    expect(formatMm(bore)).toBe('63.750');
    expect(formatIn(bore)).toBe('2.5098');
  });

  it('when the bore or offset is not a usable length, then it throws', () => {
    expect(() => stepNominalBore(0, 0)).toThrow(StepSeriesError);
    expect(() => stepNominalBore(54_000_000, -250_000)).toThrow(StepSeriesError);
    expect(() => stepNominalBore(54_000_000.5, 0)).toThrow(StepSeriesError);
  });
});

describe('stepLabel and customSeries', () => {
  it('when offsets are labelled, then STD, mm with 2+ decimals and inches with 3+ decimals', () => {
    expect(stepLabel(0, 'mm')).toBe('STD');
    expect(stepLabel(250_000, 'mm')).toBe('+0.25 mm');
    expect(stepLabel(1_000_000, 'mm')).toBe('+1.00 mm');
    expect(stepLabel(125_000, 'mm')).toBe('+0.125 mm');
    expect(stepLabel(254_000, 'in')).toBe('+0.010 in');
    expect(stepLabel(inToNm('0.0625'), 'in')).toBe('+0.0625 in');
    // 0.25 mm shown in inches: 0.00984… in, rounded at the trade's 0.0001 in.
    expect(stepLabel(250_000, 'in')).toBe('+0.0098 in');
  });

  it('when a custom series is built from text, then STD is added and offsets are exact', () => {
    const series = customSeries(['0.010', '0.020', '0.030', '0.040', '0.050', '0.060'], 'in');
    expect(series[0]).toEqual({ code: 'STD', label: 'STD', offsetNm: 0 });
    expect(series.map((s) => s.code)).toEqual([
      'STD',
      '+0.010',
      '+0.020',
      '+0.030',
      '+0.040',
      '+0.050',
      '+0.060',
    ]);
    expect(series[5].offsetNm).toBe(1_270_000);
  });

  it('when a custom series mixes nm and "+0.50 mm" text, then both are read', () => {
    const series = customSeries([0, 250_000, '+0.50 mm', '1.0'], 'mm');
    expect(series.map((s) => s.label)).toEqual(['STD', '+0.25 mm', '+0.50 mm', '+1.00 mm']);
  });

  it('when offsets do not go up, then the series is refused with the offsets named', () => {
    expect(() => customSeries(['0.50', '0.25'], 'mm')).toThrow(
      /offset 2 \(0.250 mm\) is not above offset 1/,
    );
    expect(() => customSeries(['0.25', '0.25'], 'mm')).toThrow(StepSeriesError);
    expect(() => customSeries([], 'mm')).toThrow(/at least one/);
    expect(() => customSeries(['-0.25'], 'mm')).toThrow(/must not be negative/);
    expect(() => customSeries(['0.25 furlongs'], 'mm')).toThrow(/unit must be mm or in/);
    expect(() => customSeries([1.5], 'mm')).toThrow(/whole number/);
  });
});
