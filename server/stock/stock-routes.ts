// Stock routes: bins, receipts, adjustments, moves, scrapping and measuring pistons, units and the
// ledger. Everyone signed in reads; each change names the roles that do it in the shop.
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField, pageQuery } from '../../shared/api/common';
import type { MoneyFields } from '../../shared/money-visibility';
import { receiveAtDesk } from '../purchasing/receiving-desk-service';
import {
  adjustmentInput,
  binInput,
  LEDGER_KINDS,
  measureInput,
  moveInput,
  deskReceiptInput,
  scrapInput,
  UNIT_SORTS,
  UNIT_STATUSES,
} from '../../shared/api/stock';
import * as service from './stock-service';
import * as care from './unit-care-service';
import { may } from '../../shared/access';

/** Unit and average costs are the shop's costs; an issue's sale price is what it sold for. */
const STOCK_MONEY: MoneyFields = { cost: ['unitCost', 'averageCost'], sold: ['salePrice'] };

const idParams = z.object({ id: idField });

const unitsQuery = z.extend(pageQuery, {
  sort: z.optional(z.enum(UNIT_SORTS, { error: `must be one of ${UNIT_SORTS.join(', ')}` })),
  partId: z.optional(idField),
  familyId: z.optional(idField),
  stepId: z.optional(idField),
  binId: z.optional(idField),
  receiptId: z.optional(idField),
  status: z.optional(
    z.enum([...UNIT_STATUSES, 'on-shelf'], {
      error: `must be one of ${UNIT_STATUSES.join(', ')} or on-shelf`,
    }),
  ),
});

const ledgerQuery = z.extend(pageQuery, {
  partId: z.optional(idField),
  unitId: z.optional(idField),
  kind: z.optional(z.enum(LEDGER_KINDS, { error: `must be one of ${LEDGER_KINDS.join(', ')}` })),
});

export function registerStockRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/bins',
    access: 'signed-in',
    query: pageQuery,
    handler: ({ query }) => service.listBins(query),
  });
  route(router, {
    method: 'post',
    path: '/api/bins',
    access: may.receiveStock,
    body: binInput,
    status: 201,
    handler: ({ body, user }) => service.createBin(user.id, body),
  });

  route(router, {
    method: 'post',
    path: '/api/stock/receipts',
    access: may.receiveStock,
    money: STOCK_MONEY,
    body: deskReceiptInput,
    status: 201,
    // The one receiving page: against an order line when one is named, else a plain receipt.
    handler: ({ body, user }) => receiveAtDesk(user.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/stock/adjustments',
    access: may.adjustStock,
    money: STOCK_MONEY,
    body: adjustmentInput,
    status: 201,
    handler: ({ body, user }) => service.adjust(user.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/stock/moves',
    access: may.receiveStock,
    money: STOCK_MONEY,
    body: moveInput,
    handler: ({ body, user }) => service.move(user.id, body),
  });

  route(router, {
    method: 'get',
    path: '/api/stock/units',
    access: 'signed-in',
    money: STOCK_MONEY,
    query: unitsQuery,
    handler: ({ query }) => {
      const { status, ...rest } = query;
      return service.listUnits(
        status === 'on-shelf' ? { ...rest, onShelf: true } : { ...rest, status },
      );
    },
  });
  route(router, {
    method: 'get',
    path: '/api/stock/units/by-label/:label',
    access: 'signed-in',
    money: STOCK_MONEY,
    params: z.object({ label: z.string().check(z.trim(), z.minLength(1), z.maxLength(40)) }),
    handler: ({ params }) => service.unitByLabel(params.label),
  });
  route(router, {
    method: 'get',
    path: '/api/stock/units/:id',
    access: 'signed-in',
    money: STOCK_MONEY,
    params: idParams,
    handler: ({ params }) => service.getUnit(params.id),
  });
  route(router, {
    method: 'post',
    path: '/api/stock/units/:id/scrap',
    access: may.scrapUnits,
    money: STOCK_MONEY,
    params: idParams,
    body: scrapInput,
    handler: ({ params, body, user }) => care.scrap(user.id, params.id, body.reason),
  });
  route(router, {
    method: 'post',
    path: '/api/stock/units/:id/measure',
    access: may.measureUnits,
    money: STOCK_MONEY,
    params: idParams,
    body: measureInput,
    handler: ({ params, body, user }) => care.measure(user.id, params.id, body.skirt),
  });

  route(router, {
    method: 'get',
    path: '/api/stock/ledger',
    access: 'signed-in',
    money: STOCK_MONEY,
    query: ledgerQuery,
    handler: ({ query }) => service.listLedger(query),
  });
}
