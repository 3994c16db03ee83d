import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';

import type {
  CustomerCylinderJson,
  CustomerJson,
  CustomerListItemJson,
  customerPatch,
  CylinderByMarkJson,
  CylinderDetailJson,
} from '../../../shared/api/customers';
import type { Page } from '../../../shared/api/common';
import type * as z from '../../../shared/zod';
import { queryParams } from '../core/query-params';

/** A customer's fields as a form sends them (the changed ones when editing). */
export type CustomerBody = z.input<typeof customerPatch>;

/** The customers API as the pages use it: search, the record, merge, export, erase, cylinders. */
@Injectable({ providedIn: 'root' })
export class CustomersApi {
  private readonly http = inject(HttpClient);

  search(q: string, page = 1, pageSize = 8): Observable<Page<CustomerListItemJson>> {
    return this.http.get<Page<CustomerListItemJson>>('/api/customers', {
      params: queryParams({ q, page, pageSize }),
    });
  }

  get(id: string): Observable<CustomerJson> {
    return this.http.get<CustomerJson>(`/api/customers/${id}`);
  }

  create(body: CustomerBody & { name: string }): Observable<CustomerJson> {
    return this.http.post<CustomerJson>('/api/customers', body);
  }

  update(id: string, body: CustomerBody): Observable<CustomerJson> {
    return this.http.patch<CustomerJson>(`/api/customers/${id}`, body);
  }

  merge(id: string, fromId: string): Observable<CustomerJson> {
    return this.http.post<CustomerJson>(`/api/customers/${id}/merge`, { fromId });
  }

  erase(id: string): Observable<CustomerJson> {
    return this.http.post<CustomerJson>(`/api/customers/${id}/erase`, {});
  }

  exportUrl(id: string, format: 'json' | 'csv'): string {
    return `/api/customers/${id}/export${format === 'csv' ? '?format=csv' : ''}`;
  }

  cylinders(id: string): Observable<CustomerCylinderJson[]> {
    return this.http
      .get<{ items: CustomerCylinderJson[] }>(`/api/customers/${id}/cylinders`)
      .pipe(map((r) => r.items));
  }

  addCylinder(
    id: string,
    body: { mark: string; familyId: string; castNumber?: string | null },
  ): Observable<CustomerCylinderJson> {
    return this.http.post<CustomerCylinderJson>(`/api/customers/${id}/cylinders`, body);
  }

  /** The cylinder whose tag carries this mark, if any (a scanned tag, or a mark typed whole). */
  cylinderByMark(mark: string): Observable<CylinderByMarkJson['items'][number] | null> {
    return this.http
      .get<CylinderByMarkJson>('/api/cylinders', { params: queryParams({ mark }) })
      .pipe(map((r) => r.items[0] ?? null));
  }

  cylinder(id: string): Observable<CylinderDetailJson> {
    return this.http.get<CylinderDetailJson>(`/api/cylinders/${id}`);
  }
}
