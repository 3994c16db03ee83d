import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type {
  familyInput,
  FamilyJson,
  familyPatch,
  LadderJson,
  LadderUnitJson,
  PartDetailJson,
  PartJson,
  PartKind,
  partInput,
  partPatch,
  StepSeriesJson,
} from '../../../shared/api/catalog';
import type { Page } from '../../../shared/api/common';
import { queryParams } from '../core/query-params';
import type * as z from '../../../shared/zod';

/** A family as the form sends it: lengths as typed, each with its unit. */
export type FamilyBody = z.input<typeof familyInput>;
/** The changed fields of a family (and whether it is still in use). */
export type FamilyChanges = z.input<typeof familyPatch>;
/** A part's fields as the form sends them: all of them for a new part, the changed ones after. */
export type PartBody = z.input<typeof partPatch> & Pick<Partial<z.input<typeof partInput>>, 'kind'>;

export interface FamilyQuery {
  q?: string;
  sort?: 'code' | 'name' | 'standardBore' | 'strokeType';
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export interface PartQuery {
  q?: string;
  familyId?: string;
  stepId?: string;
  kind?: PartKind;
  active?: 'true' | 'false' | 'all';
  sort?: string;
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

/** The catalog's one door to the server: engine families, step series, the ladder and parts. */
@Injectable({ providedIn: 'root' })
export class CatalogApi {
  private readonly http = inject(HttpClient);

  families(query: FamilyQuery): Observable<Page<FamilyJson>> {
    return this.http.get<Page<FamilyJson>>('/api/engine-families', { params: queryParams(query) });
  }

  family(id: string): Observable<FamilyJson> {
    return this.http.get<FamilyJson>(`/api/engine-families/${encodeURIComponent(id)}`);
  }

  createFamily(body: FamilyBody): Observable<FamilyJson> {
    return this.http.post<FamilyJson>('/api/engine-families', body);
  }

  updateFamily(id: string, body: FamilyChanges): Observable<FamilyJson> {
    return this.http.patch<FamilyJson>(`/api/engine-families/${encodeURIComponent(id)}`, body);
  }

  ladder(familyId: string): Observable<LadderJson> {
    return this.http.get<LadderJson>(`/api/engine-families/${encodeURIComponent(familyId)}/ladder`);
  }

  /** One step's pistons on the shelf, a page at a time (the ladder itself shows a few). */
  stepUnits(
    familyId: string,
    stepId: string,
    page: number,
    pageSize: number,
  ): Observable<Page<LadderUnitJson>> {
    return this.http.get<Page<LadderUnitJson>>(
      `/api/engine-families/${encodeURIComponent(familyId)}/ladder/steps/${encodeURIComponent(stepId)}/units`,
      { params: queryParams({ page, pageSize }) },
    );
  }

  stepSeries(): Observable<Page<StepSeriesJson>> {
    return this.http.get<Page<StepSeriesJson>>('/api/step-series');
  }

  createStepSeries(body: {
    code: string;
    name: string;
    unit: 'mm' | 'in';
    offsets: string[];
  }): Observable<StepSeriesJson> {
    return this.http.post<StepSeriesJson>('/api/step-series', body);
  }

  parts(query: PartQuery): Observable<Page<PartJson>> {
    return this.http.get<Page<PartJson>>('/api/parts', { params: queryParams(query) });
  }

  part(id: string): Observable<PartDetailJson> {
    return this.http.get<PartDetailJson>(`/api/parts/${encodeURIComponent(id)}`);
  }

  createPart(body: PartBody): Observable<PartDetailJson> {
    return this.http.post<PartDetailJson>('/api/parts', body);
  }

  updatePart(id: string, body: PartBody): Observable<PartDetailJson> {
    return this.http.patch<PartDetailJson>(`/api/parts/${encodeURIComponent(id)}`, body);
  }
}
