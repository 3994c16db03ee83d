import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';

import type {
  AbcAnswer,
  DeadStockAnswer,
  DepositsHeldAnswer,
  EstimatesAnswer,
  ExposureAnswer,
  MonthlyAnswer,
  OutstandingAnswer,
  RevenueAnswer,
  SalesAnswer,
  SalesGroup,
  StockValueAnswer,
  SupplierReliabilityAnswer,
  TopSellerRank,
  TopSellersAnswer,
} from '../../../shared/api/insights';
import type { NearLastStepAnswer } from '../../../shared/api/customers';

/** A period of calendar days, both ends included (YYYY-MM-DD). */
export interface DayRange {
  from: string;
  to: string;
}

type Params = Record<string, string | number>;

/** The insights pages' one door to the server. */
@Injectable({ providedIn: 'root' })
export class InsightsApi {
  private readonly http = inject(HttpClient);

  sales(period: DayRange, by: SalesGroup[] = ['family', 'step']): Observable<SalesAnswer> {
    return this.get('sales', { ...period, by: by.join(',') });
  }

  monthly(period: DayRange): Observable<MonthlyAnswer> {
    return this.get('sales/monthly', { ...period });
  }

  topSellers(period: DayRange, rank: TopSellerRank, limit = 10): Observable<TopSellersAnswer> {
    return this.get('top-sellers', { ...period, rank, limit });
  }

  stockValue(months: number): Observable<StockValueAnswer> {
    return this.get('stock-value', { months });
  }

  deadStock(months: number): Observable<DeadStockAnswer> {
    return this.get('dead-stock', { months });
  }

  abc(months: number): Observable<AbcAnswer> {
    return this.get('abc', { months });
  }

  exposure(months: number): Observable<ExposureAnswer> {
    return this.get('exposure', { months });
  }

  supplierReliability(months: number): Observable<SupplierReliabilityAnswer> {
    return this.get('supplier-reliability', { months });
  }

  nearLastStep(within: number): Observable<NearLastStepAnswer> {
    return this.get('cylinders-near-last-step', { within });
  }

  revenue(period: DayRange): Observable<RevenueAnswer> {
    return this.get('revenue', { ...period });
  }

  estimates(period: DayRange): Observable<EstimatesAnswer> {
    return this.get('estimates', { ...period });
  }

  balancesOwed(): Observable<OutstandingAnswer> {
    return this.get('balances-owed', {});
  }

  depositsHeld(): Observable<DepositsHeldAnswer> {
    return this.get('deposits-held', {});
  }

  /** Where the same table downloads as CSV (a plain link: the browser saves the file). */
  csvUrl(table: string, params: Params): string {
    const query = new HttpParams({ fromObject: params }).toString();
    return `/api/insights/${table}.csv${query ? `?${query}` : ''}`;
  }

  private get<T>(table: string, params: Params): Observable<T> {
    return this.http.get<T>(`/api/insights/${table}`, {
      params: new HttpParams({ fromObject: params }),
    });
  }
}
