import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type { FamilyJson, LadderJson, PartJson } from '../../../shared/api/catalog';
import type {
  draftsInput,
  DraftsJson,
  orderInput,
  orderLineInput,
  orderPatch,
  receiptLinesInput,
  ExchangeRateJson,
  OrderJson,
  OrderListItemJson,
  OrderReceiptJson,
  OrderState,
  ReorderDefaultInput,
  ReorderDefaultJson,
  ReorderLineJson,
  ReorderRuleJson,
  ReorderSuggestionJson,
  SourcingJson,
  WaitCandidateJson,
  WaitJson,
} from '../../../shared/api/purchasing';
import type { SupplierJson } from '../../../shared/api/suppliers';
import type { Page } from '../../../shared/api/common';
import { queryParams } from '../core/query-params';
import type * as z from '../../../shared/zod';

const id = encodeURIComponent;

export type OrderLineBody = z.input<typeof orderLineInput>;
export type ReceiptBody = z.input<typeof receiptLinesInput>;

/** The purchasing feature's one door to the server. */
@Injectable({ providedIn: 'root' })
export class PurchasingApi {
  private readonly http = inject(HttpClient);

  // ---- Reorder ----
  reorder(query: { q?: string; familyId?: string; low: boolean; page: number; pageSize: number }) {
    return this.http.get<Page<ReorderLineJson>>('/api/reorder', {
      params: queryParams({ ...query, low: String(query.low) }),
    });
  }

  rule(partId: string): Observable<ReorderRuleJson> {
    return this.http.get<ReorderRuleJson>(`/api/parts/${id(partId)}/reorder-rule`);
  }

  setRule(partId: string, body: { reorderPoint: number | null; orderUpTo: number | null }) {
    return this.http.put<ReorderRuleJson>(`/api/parts/${id(partId)}/reorder-rule`, body);
  }

  suggestion(
    partId: string,
    query: { windowDays: number; leadDays?: number; serviceLevel?: number },
  ) {
    return this.http.get<ReorderSuggestionJson>(`/api/parts/${id(partId)}/reorder-suggestion`, {
      params: queryParams(query),
    });
  }

  part(partId: string): Observable<PartJson> {
    return this.http.get<PartJson>(`/api/parts/${id(partId)}`);
  }

  findParts(q: string): Observable<Page<PartJson>> {
    return this.http.get<Page<PartJson>>('/api/parts', {
      params: queryParams({ q, pageSize: 20 }),
    });
  }

  defaults(familyId?: string) {
    return this.http.get<{ items: ReorderDefaultJson[]; total: number }>('/api/reorder-defaults', {
      params: queryParams({ familyId }),
    });
  }

  setDefault(input: ReorderDefaultInput): Observable<ReorderDefaultJson> {
    return this.http.put<ReorderDefaultJson>('/api/reorder-defaults', input);
  }

  deleteDefault(defaultId: string): Observable<void> {
    return this.http.delete<void>(`/api/reorder-defaults/${id(defaultId)}`);
  }

  families(): Observable<Page<FamilyJson>> {
    return this.http.get<Page<FamilyJson>>('/api/engine-families', {
      params: queryParams({ pageSize: 500 }),
    });
  }

  ladder(familyId: string): Observable<LadderJson> {
    return this.http.get<LadderJson>(`/api/engine-families/${id(familyId)}/ladder`);
  }

  // ---- Sourcing and rates ----
  sourcing(query: {
    partId?: string;
    familyId?: string;
    stepId?: string;
    neededBy?: string;
    quantity?: number;
  }) {
    return this.http.get<SourcingJson>('/api/sourcing', { params: queryParams(query) });
  }

  rates() {
    return this.http.get<{ items: ExchangeRateJson[]; homeCurrency: string }>(
      '/api/exchange-rates',
    );
  }

  setRate(currency: string, rate: string): Observable<ExchangeRateJson> {
    return this.http.put<ExchangeRateJson>(`/api/exchange-rates/${id(currency)}`, { rate });
  }

  deleteRate(currency: string): Observable<void> {
    return this.http.delete<void>(`/api/exchange-rates/${id(currency)}`);
  }

  suppliers(): Observable<Page<SupplierJson>> {
    return this.http.get<Page<SupplierJson>>('/api/suppliers', {
      params: queryParams({ pageSize: 500 }),
    });
  }

  // ---- Orders ----
  orders(query: {
    q?: string;
    state?: OrderState | 'open';
    sort?: string;
    dir?: string;
    page: number;
    pageSize: number;
  }) {
    return this.http.get<Page<OrderListItemJson>>('/api/purchase-orders', {
      params: queryParams(query),
    });
  }

  order(orderId: string): Observable<OrderJson> {
    return this.http.get<OrderJson>(`/api/purchase-orders/${id(orderId)}`);
  }

  createOrder(body: z.input<typeof orderInput>) {
    return this.http.post<OrderJson>('/api/purchase-orders', body);
  }

  updateOrder(orderId: string, body: z.input<typeof orderPatch>) {
    return this.http.patch<OrderJson>(`/api/purchase-orders/${id(orderId)}`, body);
  }

  draftFromSuggestions(body: z.input<typeof draftsInput>): Observable<DraftsJson> {
    return this.http.post<DraftsJson>('/api/purchase-orders/drafts', body);
  }

  send(orderId: string): Observable<OrderJson> {
    return this.http.post<OrderJson>(`/api/purchase-orders/${id(orderId)}/send`, {});
  }

  cancel(orderId: string): Observable<OrderJson> {
    return this.http.post<OrderJson>(`/api/purchase-orders/${id(orderId)}/cancel`, {});
  }

  receive(orderId: string, body: ReceiptBody): Observable<OrderReceiptJson> {
    return this.http.post<OrderReceiptJson>(`/api/purchase-orders/${id(orderId)}/receipts`, body);
  }

  // ---- Waits ----
  waitCandidates(lineId: string) {
    return this.http.get<{ items: WaitCandidateJson[]; total: number }>(
      `/api/order-lines/${id(lineId)}/wait-candidates`,
    );
  }

  addWait(body: { jobId: string; cylinder: number; lineId: string }): Observable<WaitJson> {
    return this.http.post<WaitJson>('/api/order-waits', body);
  }

  cancelWait(waitId: string): Observable<void> {
    return this.http.delete<void>(`/api/order-waits/${id(waitId)}`);
  }
}
