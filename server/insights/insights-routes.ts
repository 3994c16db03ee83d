// Insights routes. The owner sees everything; the buyer sees the stock side (what sits, ABC,
// exposure, supplier reliability), which is what ordering decisions rest on. Each table also comes
// as CSV at the same path with ".csv".
import type { Router } from 'express';
import type * as z from '../../shared/zod';
import type { Role } from '../../shared/session-types';
import {
  emptyQuery,
  monthlyQuery,
  monthsQuery,
  salesQuery,
  topSellersQuery,
} from '../../shared/api/insights';
import { nearLastStepQuery } from '../../shared/api/customers';
import { route } from '../http/route';
import { nearLastStep } from '../customers/cylinders-service';
import { nearLastStepTable } from './cylinders-table';
import * as service from './insights-service';
import * as tables from './insights-tables';
import { sendCsv, type CsvTable } from './insights-csv';
import { may } from '../../shared/access';
import * as money from './money-insights-service';
import * as moneyTables from './money-insights-tables';

/** Declares one figure twice: as JSON at `path` and as a CSV download at `path.csv`. */
function figure<Q, A, R>(
  router: Router,
  path: string,
  access: readonly Role[],
  query: z.ZodMiniType<Q>,
  load: (query: Q) => Promise<A>,
  table: (answer: A) => CsvTable<R>,
): void {
  route(router, { method: 'get', path, access, query, handler: ({ query: q }) => load(q) });
  route(router, {
    method: 'get',
    path: `${path}.csv`,
    access,
    query,
    handler: async ({ query: q, res }) => sendCsv(res, table(await load(q))),
  });
}

export function registerInsightsRoutes(router: Router): void {
  figure(
    router,
    '/api/insights/sales',
    may.readSales,
    salesQuery,
    service.sales,
    tables.salesTable,
  );
  figure(
    router,
    '/api/insights/sales/monthly',
    may.readSales,
    monthlyQuery,
    service.monthly,
    tables.monthlyTable,
  );
  figure(
    router,
    '/api/insights/top-sellers',
    may.readSales,
    topSellersQuery,
    service.topSellers,
    tables.topSellersTable,
  );
  figure(
    router,
    '/api/insights/stock-value',
    may.readStockFigures,
    monthsQuery,
    (q) => service.stockValue(q.months),
    tables.stockValueTable,
  );
  figure(
    router,
    '/api/insights/dead-stock',
    may.readStockFigures,
    monthsQuery,
    (q) => service.deadStock(q.months),
    tables.deadStockTable,
  );
  figure(
    router,
    '/api/insights/abc',
    may.readStockFigures,
    monthsQuery,
    (q) => service.abc(q.months),
    tables.abcTable,
  );
  figure(
    router,
    '/api/insights/exposure',
    may.readStockFigures,
    monthsQuery,
    (q) => service.exposure(q.months),
    tables.exposureTable,
  );
  figure(
    router,
    '/api/insights/supplier-reliability',
    may.readStockFigures,
    monthsQuery,
    (q) => service.supplierReliability(q.months),
    tables.supplierReliabilityTable,
  );
  figure(
    router,
    '/api/insights/cylinders-near-last-step',
    may.readSales,
    nearLastStepQuery,
    (q) => nearLastStep(q.within),
    nearLastStepTable,
  );
  // The money side, with the sales: from invoices, estimates and payments.
  figure(
    router,
    '/api/insights/revenue',
    may.readSales,
    monthlyQuery,
    money.revenue,
    moneyTables.revenueTable,
  );
  figure(
    router,
    '/api/insights/estimates',
    may.readSales,
    monthlyQuery,
    money.estimates,
    moneyTables.estimatesTable,
  );
  figure(
    router,
    '/api/insights/balances-owed',
    may.readSales,
    emptyQuery,
    () => money.outstanding(),
    moneyTables.outstandingTable,
  );
  figure(
    router,
    '/api/insights/deposits-held',
    may.readSales,
    emptyQuery,
    () => money.depositsHeld(),
    moneyTables.depositsHeldTable,
  );
}
