import {
  datePattern,
  dueDateWarning,
  formatShopDate,
  parseShopDay,
  timePattern,
} from '../../shared/dates';

// Field order and separators of each locale's numeric date: Unicode CLDR (the data behind Intl),
// short and medium numeric date formats — en-GB dd/MM/y, en-US M/d/y, de dd.MM.y, nl dd-MM-y,
// sv y-MM-dd (the ISO 8601 order); en-GB and de use a 24-hour clock, en-US a 12-hour one.
describe('datePattern', () => {
  it.each([
    ['en-GB', 'dd/MM/yyyy'],
    ['en-US', 'MM/dd/yyyy'],
    ['de-DE', 'dd.MM.yyyy'],
    ['nl-NL', 'dd-MM-yyyy'],
    ['sv-SE', 'yyyy-MM-dd'],
  ])('when the shop writes dates as %s, then the pattern is %s', (locale, pattern) => {
    expect(datePattern(locale)).toBe(pattern);
  });

  it('when the clock is asked, then en-GB has 24 hours and en-US two halves (CLDR)', () => {
    expect(timePattern('en-GB')).toBe('HH:mm');
    expect(timePattern('en-US')).toBe('h:mm a');
  });
});

describe('formatShopDate', () => {
  const gb = { locale: 'en-GB', timeZone: 'Europe/Berlin', now: new Date('2026-12-03T12:00:00Z') };

  it('when a timestamp is shown, then it is in the shop zone: 23:30 UTC is 00:30 next day in Berlin (CET, UTC+1, IANA tz database)', () => {
    expect(formatShopDate('2026-12-02T23:30:00Z', 'datetime', gb)).toBe('03/12/2026 00:30');
    expect(formatShopDate('2026-12-02T23:30:00Z', 'date', gb)).toBe('03/12/2026');
  });

  it('when a due date is this year, then the short form leaves the year out; in another year it shows it', () => {
    // 3 Dec 2026 was a Thursday and 1 Jan 2099 is a Thursday (any perpetual calendar).
    expect(formatShopDate('2026-12-03', 'shortday', gb)).toBe('Thu 03/12');
    expect(formatShopDate('2099-01-01', 'shortday', gb)).toBe('Thu 01/01/2099');
    expect(formatShopDate('2099-01-01', 'day', gb)).toBe('Thu 01/01/2099');
  });

  it('when a calendar day is shown in a zone behind UTC, then it stays that day', () => {
    const us = { locale: 'en-US', timeZone: 'America/Los_Angeles' };
    expect(formatShopDate('2026-12-16', 'date', us)).toBe('12/16/2026');
  });

  it('when there is no value, then nothing is written', () => {
    expect(formatShopDate(null, 'date', gb)).toBe('');
  });
});

describe('parseShopDay', () => {
  it('when a day is typed in the shop pattern, then the API gets it as YYYY-MM-DD', () => {
    expect(parseShopDay('01/03/2027', 'en-GB')).toBe('2027-03-01');
    expect(parseShopDay('03/01/2027', 'en-US')).toBe('2027-03-01');
    expect(parseShopDay('1.3.2027', 'de-DE')).toBe('2027-03-01');
    expect(parseShopDay('31/02/2027', 'en-GB')).toBeNull();
  });
});

describe('dueDateWarning', () => {
  const now = new Date('2026-12-03T10:00:00Z');
  it('when the due date is next week, then there is no caution', () => {
    expect(dueDateWarning('2026-12-10', 'UTC', now)).toBeNull();
    expect(dueDateWarning('2026-12-03', 'UTC', now)).toBeNull();
  });
  it('when the due date is 2099-01-01 or last month, then the person is asked to check it', () => {
    expect(dueDateWarning('2099-01-01', 'UTC', now)).toBe(
      'That is more than a year ahead: check the year.',
    );
    expect(dueDateWarning('2026-11-03', 'UTC', now)).toBe(
      'That day has already passed: check the date.',
    );
  });
});
