import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type { AuditPageJson } from '../../../shared/api/audit';
import { queryParams } from '../core/query-params';

export interface AuditListQuery {
  entity?: string;
  entityId?: string;
  user?: string;
  /** Calendar days YYYY-MM-DD in the shop's time zone, both included. */
  from?: string;
  to?: string;
  dir: 'asc' | 'desc';
  /** 1-based. */
  page: number;
  pageSize: number;
}

/** The audit trail's one door to the server. */
@Injectable({ providedIn: 'root' })
export class AuditApi {
  private readonly http = inject(HttpClient);

  page(query: AuditListQuery): Observable<AuditPageJson> {
    return this.http.get<AuditPageJson>('/api/audit', { params: queryParams(query) });
  }
}
