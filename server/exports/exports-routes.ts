// CSV exports: the stock list and the price comparison for the people who buy and receive; a family's
// step ladder for everyone who may read the ladder.
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField } from '../../shared/api/common';
import { sendCsv } from '../insights/insights-csv';
import * as service from './exports-service';
import { may } from '../../shared/access';

export function registerExportsRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/exports/stock.csv',
    access: may.exportStock,
    handler: async ({ res, user }) => sendCsv(res, await service.stockTable(user.role)),
  });
  route(router, {
    method: 'get',
    path: '/api/exports/families/:id/ladder.csv',
    access: 'signed-in',
    params: z.object({ id: idField }),
    handler: async ({ params, res }) => sendCsv(res, await service.ladderTable(params.id)),
  });
  route(router, {
    method: 'get',
    path: '/api/exports/price-comparison.csv',
    access: may.exportStock,
    query: z.strictObject({ familyId: z.optional(idField) }),
    handler: async ({ query, res }) =>
      sendCsv(res, await service.priceComparisonTable(query.familyId)),
  });
}
