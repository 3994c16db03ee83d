import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type { PartJson } from '../../../shared/api/catalog';
import type {
  PriceHistoryJson,
  SupplierItemJson,
  supplierInput,
  SupplierJson,
  UnmappedItemJson,
} from '../../../shared/api/suppliers';
import type { Page } from '../../../shared/api/common';
import { queryParams } from '../core/query-params';
import type * as z from '../../../shared/zod';

/** A supplier as the form sends it. */
export type SupplierBody = z.input<typeof supplierInput>;

export interface SupplierQuery {
  q?: string;
  sort?: 'name' | 'currency' | 'leadDays' | 'items' | 'lastImport';
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export interface ItemQuery {
  q?: string;
  mapped?: 'true' | 'false' | 'all';
  dropped?: 'true' | 'false' | 'all';
  sort?: 'sku' | 'description' | 'size' | 'price' | 'available' | 'updated';
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

const id = encodeURIComponent;

/** The suppliers feature's one door to the server: suppliers, their items and price history, mapping. */
@Injectable({ providedIn: 'root' })
export class SuppliersApi {
  private readonly http = inject(HttpClient);

  suppliers(query: SupplierQuery): Observable<Page<SupplierJson>> {
    return this.http.get<Page<SupplierJson>>('/api/suppliers', { params: queryParams(query) });
  }

  supplier(supplierId: string): Observable<SupplierJson> {
    return this.http.get<SupplierJson>(`/api/suppliers/${id(supplierId)}`);
  }

  createSupplier(body: SupplierBody): Observable<SupplierJson> {
    return this.http.post<SupplierJson>('/api/suppliers', body);
  }

  updateSupplier(supplierId: string, body: Partial<SupplierBody>): Observable<SupplierJson> {
    return this.http.patch<SupplierJson>(`/api/suppliers/${id(supplierId)}`, body);
  }

  items(supplierId: string, query: ItemQuery): Observable<Page<SupplierItemJson>> {
    return this.http.get<Page<SupplierItemJson>>(`/api/suppliers/${id(supplierId)}/items`, {
      params: queryParams(query),
    });
  }

  priceHistory(
    supplierId: string,
    itemId: string,
  ): Observable<Page<PriceHistoryJson> & { item: SupplierItemJson }> {
    return this.http.get<Page<PriceHistoryJson> & { item: SupplierItemJson }>(
      `/api/suppliers/${id(supplierId)}/items/${id(itemId)}/prices`,
      { params: queryParams({ page: 1, pageSize: 100 }) },
    );
  }

  unmapped(query: {
    supplierId?: string;
    q?: string;
    page: number;
    pageSize: number;
  }): Observable<Page<UnmappedItemJson>> {
    return this.http.get<Page<UnmappedItemJson>>('/api/supplier-items/unmapped', {
      params: queryParams(query),
    });
  }

  mapItem(itemId: string, partId: string | null): Observable<SupplierItemJson> {
    return this.http.patch<SupplierItemJson>(`/api/supplier-items/${id(itemId)}`, { partId });
  }

  /** Catalog parts by SKU, description or family code, to map an item the suggestions missed. */
  findParts(q: string): Observable<Page<PartJson>> {
    return this.http.get<Page<PartJson>>('/api/parts', {
      params: queryParams({ q, active: 'true', page: 1, pageSize: 10 }),
    });
  }
}
