import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type {
  ExposureItemJson,
  PartDetailJson,
  PartJson,
  UnitStatus,
} from '../../../shared/api/catalog';
import type {
  BinJson,
  LedgerJson,
  LedgerKind,
  deskReceiptInput,
  DeskReceiptJson,
  StockChangeJson,
  UnitJson,
} from '../../../shared/api/stock';
import type { OpenLineJson } from '../../../shared/api/purchasing';
import type { Page } from '../../../shared/api/common';
import { queryParams } from '../core/query-params';
import type * as z from '../../../shared/zod';

/** A delivery as the receive page sends it; skirts typed with their unit, null for "to measure". */
export type ReceiptBody = z.input<typeof deskReceiptInput>;

export interface UnitQuery {
  q?: string;
  partId?: string;
  familyId?: string;
  binId?: string;
  receiptId?: string;
  status?: UnitStatus | 'on-shelf';
  sort?: string;
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export interface LedgerQuery {
  partId?: string;
  unitId?: string;
  kind?: LedgerKind;
  page: number;
  pageSize: number;
}

/** Stock's one door to the server: bins, receipts, units, movements and the exposure list. */
@Injectable({ providedIn: 'root' })
export class StockApi {
  private readonly http = inject(HttpClient);

  /** Part search for receiving and counting (the catalog's list, filtered by text). */
  findParts(q: string, pageSize = 10): Observable<Page<PartJson>> {
    return this.http.get<Page<PartJson>>('/api/parts', {
      params: queryParams({ q, active: 'true', page: 1, pageSize }),
    });
  }

  part(id: string): Observable<PartDetailJson> {
    return this.http.get<PartDetailJson>(`/api/parts/${encodeURIComponent(id)}`);
  }

  bins(query: { q?: string; page: number; pageSize: number }): Observable<Page<BinJson>> {
    return this.http.get<Page<BinJson>>('/api/bins', { params: queryParams(query) });
  }

  createBin(body: { code: string; name?: string }): Observable<BinJson> {
    return this.http.post<BinJson>('/api/bins', body);
  }

  receive(body: ReceiptBody): Observable<DeskReceiptJson> {
    return this.http.post<DeskReceiptJson>('/api/stock/receipts', body);
  }

  /** Open order lines for a part, oldest expected first: what a delivery of it may be. */
  openLinesForPart(partId: string): Observable<{ items: OpenLineJson[]; total: number }> {
    return this.http.get<{ items: OpenLineJson[]; total: number }>(
      '/api/purchase-orders/open-lines',
      { params: queryParams({ partId }) },
    );
  }

  adjust(body: { partId: string; quantity: number; reason: string }): Observable<StockChangeJson> {
    return this.http.post<StockChangeJson>('/api/stock/adjustments', body);
  }

  move(body: { unitId?: string; partId?: string; toBinId: string }): Observable<StockChangeJson> {
    return this.http.post<StockChangeJson>('/api/stock/moves', body);
  }

  scrap(unitId: string, reason: string): Observable<StockChangeJson> {
    return this.http.post<StockChangeJson>(`/api/stock/units/${encodeURIComponent(unitId)}/scrap`, {
      reason,
    });
  }

  measure(unitId: string, skirt: string): Observable<StockChangeJson> {
    return this.http.post<StockChangeJson>(
      `/api/stock/units/${encodeURIComponent(unitId)}/measure`,
      { skirt },
    );
  }

  units(query: UnitQuery): Observable<Page<UnitJson>> {
    return this.http.get<Page<UnitJson>>('/api/stock/units', { params: queryParams(query) });
  }

  unit(id: string): Observable<UnitJson> {
    return this.http.get<UnitJson>(`/api/stock/units/${encodeURIComponent(id)}`);
  }

  unitByLabel(label: string): Observable<UnitJson> {
    return this.http.get<UnitJson>(`/api/stock/units/by-label/${encodeURIComponent(label.trim())}`);
  }

  ledger(query: LedgerQuery): Observable<Page<LedgerJson>> {
    return this.http.get<Page<LedgerJson>>('/api/stock/ledger', { params: queryParams(query) });
  }

  exposure(query: {
    q?: string;
    page: number;
    pageSize: number;
  }): Observable<Page<ExposureItemJson>> {
    return this.http.get<Page<ExposureItemJson>>('/api/exposure', { params: queryParams(query) });
  }
}
