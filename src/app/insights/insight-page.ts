import { inject } from '@angular/core';
import { Router, type Params } from '@angular/router';

import { defaultPeriod } from '../../../shared/api/insights';
import { isCalendarDay } from '../../../shared/api/common';
import { DataTable } from '../ui/data-table';
import { TableColumn } from '../ui/table-column';
import { ChoiceToggles, type Choice } from './choice-toggles';
import { HeadlineFigures } from './headline-figures';
import { InsightChart } from './insight-chart';
import { InsightPanel } from './insight-panel';
import type { DayRange } from './insights-api';

/** What every insights page is built from: headline figures, panels of a chart and a table, toggles. */
export const INSIGHT_PAGE_PARTS = [
  ChoiceToggles,
  DataTable,
  HeadlineFigures,
  InsightChart,
  InsightPanel,
  TableColumn,
] as const;

export const MONTH_CHOICES = [6, 12, 18, 24] as const;

/** The month windows as toggles: "6 months" … "24 months". */
export const MONTH_TOGGLES: readonly Choice<number>[] = MONTH_CHOICES.map((m) => ({
  value: m,
  label: `${m} months`,
}));

/** The figure a chart shows or a ranking follows. */
export const FIGURE_TOGGLES = [
  { value: 'revenue', label: 'Revenue' },
  { value: 'units', label: 'Units' },
  { value: 'margin', label: 'Margin' },
] as const satisfies readonly Choice<string>[];

/** The months asked for in the address (?months), or twelve. */
export function monthsFrom(text: string | undefined, fallback = 12): number {
  const n = Number(text);
  return Number.isInteger(n) && n >= 1 && n <= 120 ? n : fallback;
}

/** The period in the address (?from&to), or the last twelve months. */
export function periodFrom(from: string | undefined, to: string | undefined): DayRange {
  if (from && to && isCalendarDay(from) && isCalendarDay(to) && from <= to) return { from, to };
  return defaultPeriod(Intl.DateTimeFormat().resolvedOptions().timeZone);
}

/**
 * A page's choices live in the address (?months, ?from&to…), so a reload or a shared link shows the
 * same figures; a new choice replaces the entry instead of filling the back button. Call in an
 * injection context (a field initializer).
 */
export function addressSetter(): (params: Params) => void {
  const router = inject(Router);
  return (params) =>
    void router.navigate([], {
      queryParams: params,
      queryParamsHandling: 'merge',
      replaceUrl: true,
    });
}
