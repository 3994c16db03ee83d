// A period of whole calendar days split the way the sales sums are kept: the whole months inside
// it (read from the monthly sums) and the days at either end that make up part of a month (read
// from the daily sums). Days are ISO dates (YYYY-MM-DD) in the shop's zone; the months' end is
// exclusive, the days' ranges inclusive.
import { DateTime } from 'luxon';

export interface PeriodSplit {
  months: { from: string; toExclusive: string } | null;
  days: { from: string; to: string }[];
}

const day = (iso: string) => DateTime.fromISO(iso, { zone: 'UTC' });
const iso = (d: DateTime) => d.toISODate() as string;

export function splitPeriod(fromDay: string, toDay: string): PeriodSplit {
  const from = day(fromDay);
  const to = day(toDay);
  if (!from.isValid || !to.isValid || to < from) {
    throw new Error(`not a period of days: ${fromDay} … ${toDay}`);
  }
  const firstMonth = from.day === 1 ? from : from.startOf('month').plus({ months: 1 });
  const afterLastMonth = to.plus({ days: 1 }).startOf('month');
  if (firstMonth >= afterLastMonth) return { months: null, days: [{ from: fromDay, to: toDay }] };
  const days: PeriodSplit['days'] = [];
  if (from < firstMonth) days.push({ from: fromDay, to: iso(firstMonth.minus({ days: 1 })) });
  if (afterLastMonth <= to) days.push({ from: iso(afterLastMonth), to: toDay });
  return { months: { from: iso(firstMonth), toExclusive: iso(afterLastMonth) }, days };
}
