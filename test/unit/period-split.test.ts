// Splitting a period of days into whole months and the odd days at its ends. The expected months
// and month lengths are the Gregorian calendar's (ISO 8601): January 31 days, February 28 in 2026
// and 29 in 2028 (a leap year: divisible by 4, not by 100).
import { splitPeriod } from '../../server/insights/period-split';

describe('splitPeriod', () => {
  it.each([
    [
      'a year from the first: twelve whole months, no odd days',
      '2026-01-01',
      '2026-12-31',
      { months: { from: '2026-01-01', toExclusive: '2027-01-01' }, days: [] },
    ],
    [
      'mid-January to 10 March: February whole, the ends as days',
      '2026-01-15',
      '2026-03-10',
      {
        months: { from: '2026-02-01', toExclusive: '2026-03-01' },
        days: [
          { from: '2026-01-15', to: '2026-01-31' },
          { from: '2026-03-01', to: '2026-03-10' },
        ],
      },
    ],
    [
      'inside one month: days only',
      '2026-01-05',
      '2026-01-20',
      { months: null, days: [{ from: '2026-01-05', to: '2026-01-20' }] },
    ],
    [
      'exactly January: one whole month',
      '2026-01-01',
      '2026-01-31',
      { months: { from: '2026-01-01', toExclusive: '2026-02-01' }, days: [] },
    ],
    [
      'the 2nd of February to the end of a leap-year February: days only',
      '2028-02-02',
      '2028-02-29',
      { months: null, days: [{ from: '2028-02-02', to: '2028-02-29' }] },
    ],
    [
      'from the first of a month to mid next: a whole month and days after',
      '2026-02-01',
      '2026-03-15',
      {
        months: { from: '2026-02-01', toExclusive: '2026-03-01' },
        days: [{ from: '2026-03-01', to: '2026-03-15' }],
      },
    ],
    [
      'one day',
      '2026-07-04',
      '2026-07-04',
      { months: null, days: [{ from: '2026-07-04', to: '2026-07-04' }] },
    ],
  ])('%s', (_what, from, to, expected) => {
    expect(splitPeriod(from, to)).toEqual(expected);
  });

  it('refuses an end before the start', () => {
    expect(() => splitPeriod('2026-03-02', '2026-03-01')).toThrow('not a period of days');
  });
});
