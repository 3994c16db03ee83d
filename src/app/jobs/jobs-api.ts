import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';

import type { CutUndoJson } from '../../../shared/cut-undo';
import type { FamilyJson } from '../../../shared/api/catalog';
import type {
  BoreSheetJson,
  cylinderPatch,
  holdInput,
  jobInput,
  jobPatch,
  readingsInput,
  CylinderJson,
  HoldJson,
  JobJson,
  JobListItemJson,
  JobState,
  PhotoJson,
  ProposalJson,
  ReadingsResultJson,
  RecommendationJson,
} from '../../../shared/api/jobs';
import type { UnitJson } from '../../../shared/api/stock';
import type { Page } from '../../../shared/api/common';
import type * as z from '../../../shared/zod';
import { queryParams } from '../core/query-params';

export interface JobListQuery {
  /** 'open', 'closed', 'all' or one state. */
  state: 'open' | 'closed' | 'all' | JobState;
  q?: string;
  waiting?: boolean;
  sort?: 'due' | 'number' | 'customer' | 'created' | 'state';
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

/** A new job as the intake form sends it: the customer's record, or typed details. */
export type NewJob = z.input<typeof jobInput>;
export type JobChanges = z.input<typeof jobPatch>;
/** One bore-gauge reading, the diameter as typed with its unit ("2.5260 in"). */
export type ReadingBody = z.input<typeof readingsInput>['readings'][number];
export type CylinderChanges = z.input<typeof cylinderPatch>;
/** The after-honing sizes as last read; the server refuses a change made against older ones. */
export type FinishBasedOn = NonNullable<CylinderChanges['basedOn']>;
export type HoldBody = z.input<typeof holdInput>;

/** The jobs feature's one door to the server. */
@Injectable({ providedIn: 'root' })
export class JobsApi {
  private readonly http = inject(HttpClient);

  list(query: JobListQuery): Observable<Page<JobListItemJson>> {
    // The server reads any `waiting` as a filter: send it only when it is on.
    const params = queryParams({ ...query, waiting: query.waiting ? 'true' : undefined });
    return this.http.get<Page<JobListItemJson>>('/api/jobs', { params });
  }

  get(id: string): Observable<JobJson> {
    return this.http.get<JobJson>(`/api/jobs/${encodeURIComponent(id)}`);
  }

  create(job: NewJob): Observable<JobJson> {
    return this.http.post<JobJson>('/api/jobs', job);
  }

  update(id: string, changes: JobChanges): Observable<JobJson> {
    return this.http.patch<JobJson>(`/api/jobs/${encodeURIComponent(id)}`, changes);
  }

  addNote(id: string, text: string): Observable<JobJson> {
    return this.http.post<JobJson>(`/api/jobs/${encodeURIComponent(id)}/notes`, { text });
  }

  collect(id: string): Observable<JobJson> {
    return this.http.post<JobJson>(`/api/jobs/${encodeURIComponent(id)}/collect`, {});
  }

  cancel(id: string): Observable<JobJson> {
    return this.http.post<JobJson>(`/api/jobs/${encodeURIComponent(id)}/cancel`, {});
  }

  /**
   * With `basedOn` (the cylinder's measuredAt when the readings were typed; null: it had none)
   * the server refuses readings typed against older ones (409 stale_readings).
   */
  saveReadings(
    id: string,
    n: number,
    readings: ReadingBody[],
    basedOn?: string | null,
  ): Observable<ReadingsResultJson> {
    const body = basedOn === undefined ? { readings } : { readings, basedOn };
    return this.http.put<ReadingsResultJson>(`${this.cylinder(id, n)}/readings`, body);
  }

  /** Passes ticked done, in order; with `basedOn` (the count last seen) a stale tick is a 409. */
  passesDone(
    id: string,
    n: number,
    done: number,
    basedOn?: number,
  ): Observable<{ passesDone: number }> {
    const body = basedOn === undefined ? { done } : { done, basedOn };
    return this.http.put<{ passesDone: number }>(`${this.cylinder(id, n)}/passes-done`, body);
  }

  updateCylinder(id: string, n: number, changes: CylinderChanges): Observable<CylinderJson> {
    return this.http.patch<CylinderJson>(this.cylinder(id, n), changes);
  }

  recommendation(id: string, n: number): Observable<RecommendationJson> {
    return this.http.get<RecommendationJson>(`${this.cylinder(id, n)}/recommendation`);
  }

  proposal(id: string, n: number): Observable<ProposalJson> {
    return this.http.get<ProposalJson>(`${this.cylinder(id, n)}/proposal`);
  }

  boreSheet(id: string, n: number): Observable<BoreSheetJson & CutUndoJson> {
    return this.http.get<BoreSheetJson & CutUndoJson>(`${this.cylinder(id, n)}/bore-sheet`);
  }

  /** Takes back "marked as cut" (the cutter shortly after, or the owner with a reason). */
  undoCut(id: string, n: number, reason?: string): Observable<CylinderJson> {
    return this.http.post<CylinderJson>(
      `${this.cylinder(id, n)}/cut/undo`,
      reason ? { reason } : {},
    );
  }

  /** The reason is needed, and kept with the cylinder, only when the bore does not clean up. */
  markCut(id: string, n: number, overrideReason?: string): Observable<CylinderJson> {
    const body = overrideReason === undefined ? {} : { overrideReason };
    return this.http.post<CylinderJson>(`${this.cylinder(id, n)}/cut`, body);
  }

  hold(id: string, body: HoldBody): Observable<HoldJson> {
    return this.http.post<HoldJson>(`/api/jobs/${encodeURIComponent(id)}/holds`, body);
  }

  release(holdId: string): Observable<void> {
    return this.http.delete<void>(`/api/holds/${encodeURIComponent(holdId)}`);
  }

  uploadPhoto(id: string, photo: File, thumbnail: Blob | null): Observable<PhotoJson> {
    const form = new FormData();
    form.append('photo', photo, photo.name);
    if (thumbnail) form.append('thumbnail', thumbnail, 'thumbnail.webp');
    return this.http.post<PhotoJson>(`/api/jobs/${encodeURIComponent(id)}/photos`, form);
  }

  /** Engine families a job can be taken in for. */
  families(): Observable<FamilyJson[]> {
    const params = queryParams({ active: 'true', pageSize: 500, sort: 'code' });
    return this.http
      .get<Page<FamilyJson>>('/api/engine-families', { params })
      .pipe(map((page) => page.items));
  }

  /** A piston found by the label on its bag, as a scanner types it. */
  unitByLabel(label: string): Observable<UnitJson> {
    return this.http.get<UnitJson>(
      `/api/stock/units/by-label/${encodeURIComponent(label.trim().toUpperCase())}`,
    );
  }

  private cylinder(id: string, n: number): string {
    return `/api/jobs/${encodeURIComponent(id)}/cylinders/${n}`;
  }
}
