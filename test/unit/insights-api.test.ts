import {
  MAX_PERIOD_DAYS,
  defaultPeriod,
  monthsQuery,
  salesQuery,
  topSellersQuery,
} from '../../shared/api/insights';
import { daysBetween, isCalendarDay } from '../../shared/api/common';

describe('calendar days for insight periods', () => {
  // Gregorian leap-year rule (as used by ISO 8601): every 4th year, except centuries not divisible
  // by 400 — 2024 and 2000 are leap years, 2023 and 1900 are not.
  it.each([
    ['2024-02-29', true],
    ['2000-02-29', true],
    ['2023-02-29', false],
    ['1900-02-29', false],
    ['2026-04-31', false],
    ['2026-12-31', true],
    ['2026-1-05', false],
    ['20260105', false],
    ['1899-12-31', false],
  ])('when the day is %s, then it is a calendar day: %s', (text, ok) => {
    expect(isCalendarDay(text)).toBe(ok);
  });

  it('when days are counted across a leap day and a year end, then every day counts once', () => {
    // 2024 is a leap year: 1 Feb → 1 Mar is 29 days; a whole leap year is 366 days.
    expect(daysBetween('2024-02-01', '2024-03-01')).toBe(29);
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366);
    expect(daysBetween('2025-01-01', '2024-12-31')).toBe(-1);
  });
});

describe('the default period', () => {
  it('when no period is asked for, then it runs from the first day eleven months back to today in the shop zone', () => {
    // 22:30 UTC on 15 March is already 16 March at UTC+3 (IANA "Etc/GMT-3").
    const now = new Date('2026-03-15T22:30:00Z');
    expect(defaultPeriod('Etc/GMT-3', now)).toEqual({ from: '2025-04-01', to: '2026-03-16' });
    expect(defaultPeriod('UTC', now)).toEqual({ from: '2025-04-01', to: '2026-03-15' });
  });

  it('when today is in January, then the period starts in February of the year before', () => {
    expect(defaultPeriod('UTC', new Date('2027-01-01T00:00:00Z'))).toEqual({
      from: '2026-02-01',
      to: '2027-01-01',
    });
  });
});

describe('insight queries', () => {
  it('when "by" is left out, then sales group by family and step; order and repeats do not matter', () => {
    expect(salesQuery.parse({}).by).toEqual(['family', 'step']);
    expect(salesQuery.parse({ by: 'step, family,step' }).by).toEqual(['family', 'step']);
    expect(salesQuery.parse({ by: 'step' }).by).toEqual(['step']);
  });

  it.each([
    [{ by: 'family,colour' }, 'by', /family/],
    [{ by: '' }, 'by', /family/],
    [{ from: '2026-01-01' }, 'to', /both ends/],
    [{ to: '2026-01-01' }, 'from', /both ends/],
    [{ from: '2026-02-01', to: '2026-01-31' }, 'to', /end before/],
    [{ from: '2026-02-30', to: '2026-03-01' }, 'from', /real date/],
    [{ page: '2' }, '', /page/],
  ])('when the sales query is %j, then it is refused on "%s"', (input, field, message) => {
    const result = salesQuery.safeParse(input);
    expect(result.success).toBe(false);
    const issue = result.error?.issues[0];
    expect(issue?.path.join('.')).toBe(field);
    expect(JSON.stringify(result.error?.issues)).toMatch(message);
  });

  it('when a period is exactly as long as allowed, then it passes; one day more is refused', () => {
    const from = '2020-01-01';
    const to = new Date(Date.parse(`${from}T00:00:00Z`) + MAX_PERIOD_DAYS * 86_400_000)
      .toISOString()
      .slice(0, 10);
    expect(salesQuery.safeParse({ from, to }).success).toBe(true);
    const after = new Date(Date.parse(`${to}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
    expect(salesQuery.safeParse({ from, to: after }).success).toBe(false);
  });

  it('when months or a limit come as query text, then they are read as whole numbers within bounds', () => {
    expect(monthsQuery.parse({})).toEqual({ months: 12 });
    expect(monthsQuery.parse({ months: '18' })).toEqual({ months: 18 });
    expect(monthsQuery.safeParse({ months: '0' }).success).toBe(false);
    expect(monthsQuery.safeParse({ months: '1.5' }).success).toBe(false);
    expect(monthsQuery.safeParse({ months: '121' }).success).toBe(false);
    expect(topSellersQuery.parse({ limit: '25' })).toMatchObject({ limit: 25, rank: 'units' });
    expect(topSellersQuery.safeParse({ rank: 'profit' }).success).toBe(false);
  });
});
