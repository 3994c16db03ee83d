import { computed, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { catchError, map, of } from 'rxjs';

import type { FamilyJson, StepJson, StepSeriesJson } from '../../../shared/api/catalog';
import type { CatalogApi } from './catalog-api';

/**
 * The choices of a family select and of the step select under it (the chosen family's series).
 * Asked once; a failure leaves the selects empty rather than the page broken, since they only
 * narrow. Call in an injection context (a field initializer).
 */
export function familySteps(
  api: CatalogApi,
  familyId: () => string | null | undefined,
): { families: Signal<FamilyJson[]>; steps: Signal<StepJson[]> } {
  const families = toSignal(
    api.families({ page: 1, pageSize: 500 }).pipe(
      map((page) => page.items),
      catchError(() => of<FamilyJson[]>([])),
    ),
    { initialValue: [] as FamilyJson[] },
  );
  const series = toSignal(
    api.stepSeries().pipe(
      map((page) => page.items),
      catchError(() => of<StepSeriesJson[]>([])),
    ),
    { initialValue: [] as StepSeriesJson[] },
  );
  const steps = computed(() => {
    const family = families().find((f) => f.id === familyId());
    return family ? (series().find((s) => s.id === family.stepSeriesId)?.steps ?? []) : [];
  });
  return { families, steps };
}
