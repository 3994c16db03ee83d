import { HttpClient, HttpEvent } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type {
  CommitJson,
  DuplicateJson,
  ImportJson,
  ImportLogEntryJson,
  ImportProgressJson,
  MappingJson,
  SupplierJson,
} from '../../../shared/api/suppliers';
import type { Page } from '../../../shared/api/common';
import { queryParams } from '../core/query-params';

const id = encodeURIComponent;

/** The price-list import's one door to the server: upload, preview, commit, the log and progress. */
@Injectable({ providedIn: 'root' })
export class ImportsApi {
  private readonly http = inject(HttpClient);

  /** Suppliers to bring a list in for (all of them, by name). */
  suppliers(): Observable<Page<SupplierJson>> {
    return this.http.get<Page<SupplierJson>>('/api/suppliers', {
      params: queryParams({ sort: 'name', page: 1, pageSize: 500 }),
    });
  }

  /**
   * Uploads a list for preview. Emits the upload's progress events and then the answer; the server
   * reports its own reading under `progressToken` (see progress()).
   */
  upload(
    supplierId: string,
    file: File,
    mapping: MappingJson | null,
    progressToken: string,
  ): Observable<HttpEvent<ImportJson | DuplicateJson>> {
    const form = new FormData();
    form.append('file', file, file.name);
    if (mapping) form.append('mapping', JSON.stringify(mapping));
    return this.http.post<ImportJson | DuplicateJson>(
      `/api/suppliers/${id(supplierId)}/price-lists`,
      form,
      { params: queryParams({ progress: progressToken }), reportProgress: true, observe: 'events' },
    );
  }

  commit(
    importId: string,
    dropMissing: boolean,
    progressToken: string,
  ): Observable<CommitJson | DuplicateJson> {
    return this.http.post<CommitJson | DuplicateJson>(
      `/api/price-list-imports/${id(importId)}/commit`,
      { dropMissing },
      { params: queryParams({ progress: progressToken }) },
    );
  }

  progress(progressToken: string): Observable<ImportProgressJson> {
    return this.http.get<ImportProgressJson>(
      `/api/price-list-imports/progress/${id(progressToken)}`,
    );
  }

  importOf(importId: string): Observable<ImportJson> {
    return this.http.get<ImportJson>(`/api/price-list-imports/${id(importId)}`);
  }

  log(query: {
    supplierId?: string;
    status?: string;
    page: number;
    pageSize: number;
  }): Observable<Page<ImportLogEntryJson>> {
    return this.http.get<Page<ImportLogEntryJson>>('/api/price-list-imports', {
      params: queryParams(query),
    });
  }
}
