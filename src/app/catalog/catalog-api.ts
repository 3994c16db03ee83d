import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type {
  FamilyJson,
  LadderJson,
  LadderUnitJson,
  PartDetailJson,
  PartJson,
  PartKind,
  StepSeriesJson,
} from '../../../shared/api/catalog';
import type { Page } from '../../../shared/api/common';

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

/** A family as the form sends it: lengths as typed, each with its unit. */
export interface FamilyBody {
  code: string;
  name: string;
  strokeType: 'two' | 'four';
  cylinders: number;
  cooling: 'air' | 'liquid';
  standardBore: string;
  stroke: string;
  clearanceMin: string;
  clearanceMax: string;
  honeAllowance: string;
  cleanup: string;
  maxOversize: string;
  stepSeriesId: string;
  maxTaper?: string | null;
  maxOutOfRound?: string | null;
  ringGapMin?: string | null;
  ringGapMax?: string | null;
  forgedClearanceMin?: string | null;
  forgedClearanceMax?: string | null;
  ringGapPerBore?: string;
  honeCrosshatch?: number;
  honeGrits?: string;
  notes?: string;
  active?: boolean;
}

export interface PartBody {
  kind?: PartKind;
  sku?: string;
  familyId?: string | null;
  stepId?: string | null;
  description?: string;
  material?: 'cast' | 'forged' | null;
  ringCount?: number | null;
  pinDiameter?: string | null;
  gtin?: string | null;
  salePrice?: string;
  reorderPoint?: number | null;
  orderUpTo?: number | null;
  components?: { partId: string; quantity: number }[];
  active?: boolean;
}

function params(query: object): HttpParams {
  let result = new HttpParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== null && value !== '') {
      result = result.set(key, String(value));
    }
  }
  return result;
}

/** The catalog's one door to the server: engine families, step series, the ladder and parts. */
@Injectable({ providedIn: 'root' })
export class CatalogApi {
  private readonly http = inject(HttpClient);

  families(query: FamilyQuery): Observable<Page<FamilyJson>> {
    return this.http.get<Page<FamilyJson>>('/api/engine-families', { params: params(query) });
  }

  family(id: string): Observable<FamilyJson> {
    return this.http.get<FamilyJson>(`/api/engine-families/${encodeURIComponent(id)}`);
  }

  createFamily(body: FamilyBody): Observable<FamilyJson> {
    return this.http.post<FamilyJson>('/api/engine-families', body);
  }

  updateFamily(id: string, body: Partial<FamilyBody>): Observable<FamilyJson> {
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
      { params: params({ page, pageSize }) },
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
    return this.http.get<Page<PartJson>>('/api/parts', { params: params(query) });
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
