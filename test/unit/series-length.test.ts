import { formatInSeriesUnit, toLengthJson } from '../../shared/lengths';

// 1 in = 25.4 mm exactly (the international inch of 1959, as NIST SP 811 gives it), so
// +0.50 mm = 0.50 / 25.4 in = 0.019685… in → 0.0197 in at the trade's 0.0001 in, and
// +0.020 in = 0.508 mm exactly.
describe('formatInSeriesUnit', () => {
  it('when a metric step is read by an inch user, then the step leads in mm with inches beside it', () => {
    expect(formatInSeriesUnit(toLengthJson(500_000), 'mm', 'in', { signed: true })).toBe(
      '+0.50 mm (0.0197 in)',
    );
  });

  it('when an inch step is read by a millimetre user, then the step leads in inches', () => {
    expect(formatInSeriesUnit(toLengthJson(508_000), 'in', 'mm', { signed: true })).toBe(
      '+0.020 in (0.508 mm)',
    );
  });

  it('when the reader uses the series unit, then it is said once', () => {
    expect(formatInSeriesUnit(toLengthJson(250_000), 'mm', 'mm', { signed: true })).toBe(
      '+0.25 mm',
    );
  });
});
