// Insights routes. The owner sees everything; the buyer sees the stock side (what sits, ABC,
// exposure, supplier reliability), which is what ordering decisions rest on. Each table also comes
// as CSV at the same path with ".csv".
import type { Router } from 'express';
import type { Role } from '../../shared/session-types';
import {
  monthlyQuery,
  monthsQuery,
  salesQuery,
  topSellersQuery,
  type SalesAnswer,
} from '../../shared/insights-api';
import { route } from '../http/route';
import * as service from './insights-service';
import * as tables from './insights-tables';
import { sendCsv } from './insights-csv';

const OWNER: Role[] = ['owner'];
const STOCK_SIDE: Role[] = ['owner', 'buyer'];

export function registerInsightsRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/insights/sales',
    access: OWNER,
    query: salesQuery,
    handler: ({ query }): Promise<SalesAnswer> => service.sales(query),
  });
  route(router, {
    method: 'get',
    path: '/api/insights/sales.csv',
    access: OWNER,
    query: salesQuery,
    handler: async ({ query, res }) => sendCsv(res, tables.salesTable(await service.sales(query))),
  });

  route(router, {
    method: 'get',
    path: '/api/insights/sales/monthly',
    access: OWNER,
    query: monthlyQuery,
    handler: ({ query }) => service.monthly(query),
  });
  route(router, {
    method: 'get',
    path: '/api/insights/sales/monthly.csv',
    access: OWNER,
    query: monthlyQuery,
    handler: async ({ query, res }) =>
      sendCsv(res, tables.monthlyTable(await service.monthly(query))),
  });

  route(router, {
    method: 'get',
    path: '/api/insights/top-sellers',
    access: OWNER,
    query: topSellersQuery,
    handler: ({ query }) => service.topSellers(query),
  });
  route(router, {
    method: 'get',
    path: '/api/insights/top-sellers.csv',
    access: OWNER,
    query: topSellersQuery,
    handler: async ({ query, res }) =>
      sendCsv(res, tables.topSellersTable(await service.topSellers(query))),
  });

  route(router, {
    method: 'get',
    path: '/api/insights/stock-value',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: ({ query }) => service.stockValue(query.months),
  });
  route(router, {
    method: 'get',
    path: '/api/insights/stock-value.csv',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: async ({ query, res }) =>
      sendCsv(res, tables.stockValueTable(await service.stockValue(query.months))),
  });

  route(router, {
    method: 'get',
    path: '/api/insights/dead-stock',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: ({ query }) => service.deadStock(query.months),
  });
  route(router, {
    method: 'get',
    path: '/api/insights/dead-stock.csv',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: async ({ query, res }) =>
      sendCsv(res, tables.deadStockTable(await service.deadStock(query.months))),
  });

  route(router, {
    method: 'get',
    path: '/api/insights/abc',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: ({ query }) => service.abc(query.months),
  });
  route(router, {
    method: 'get',
    path: '/api/insights/abc.csv',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: async ({ query, res }) =>
      sendCsv(res, tables.abcTable(await service.abc(query.months))),
  });

  route(router, {
    method: 'get',
    path: '/api/insights/exposure',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: ({ query }) => service.exposure(query.months),
  });
  route(router, {
    method: 'get',
    path: '/api/insights/exposure.csv',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: async ({ query, res }) =>
      sendCsv(res, tables.exposureTable(await service.exposure(query.months))),
  });

  route(router, {
    method: 'get',
    path: '/api/insights/supplier-reliability',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: ({ query }) => service.supplierReliability(query.months),
  });
  route(router, {
    method: 'get',
    path: '/api/insights/supplier-reliability.csv',
    access: STOCK_SIDE,
    query: monthsQuery,
    handler: async ({ query, res }) =>
      sendCsv(
        res,
        tables.supplierReliabilityTable(await service.supplierReliability(query.months)),
      ),
  });
}
