// Purchasing routes: reorder rules and suggestions, sourcing and exchange rates, purchase orders,
// receiving against them, and jobs waiting on an order line. Buyers and the owner buy; staff
// receive; everyone may see what is on order; machinists may set a job to wait for a piston.
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField } from '../../shared/api/common';
import {
  currencyParam,
  draftsInput,
  orderInput,
  orderPatch,
  ordersQuery,
  rateInput,
  receiptLinesInput,
  reorderDefaultInput,
  reorderListQuery,
  reorderRuleInput,
  reorderSuggestionQuery,
  sourcingQuery,
  waitInput,
  waitsQuery,
} from '../../shared/api/purchasing';
import type { MoneyFields } from '../../shared/money-visibility';
import * as drafts from './drafts-service';
import * as orders from './orders-service';
import * as openLines from './open-lines-service';
import { sendOrder } from './order-send-service';
import { receiveAgainstOrder } from './receiving-service';
import * as reorder from './reorder-service';
import * as sourcing from './sourcing-service';
import { may } from '../../shared/access';

/** What the shop agreed to pay a supplier, and the unit costs of pistons received against it. */
const ORDER_MONEY: MoneyFields = {
  cost: ['unitPrice', 'lineTotal', 'total', 'shipping', 'unitCost', 'averageCost'],
};
const idParams = z.object({ id: idField });

export function registerPurchasingRoutes(router: Router): void {
  // ---- Reorder rules ----
  route(router, {
    method: 'get',
    path: '/api/parts/:id/reorder-rule',
    access: may.buy,
    params: idParams,
    handler: ({ params }) => reorder.getRule(params.id),
  });
  route(router, {
    method: 'put',
    path: '/api/parts/:id/reorder-rule',
    access: may.buy,
    params: idParams,
    body: reorderRuleInput,
    handler: ({ params, body, user }) => reorder.setRule(user.id, params.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/parts/:id/reorder-suggestion',
    access: may.buy,
    params: idParams,
    query: reorderSuggestionQuery,
    handler: ({ params, query }) => reorder.suggestion(params.id, query),
  });
  route(router, {
    method: 'get',
    path: '/api/reorder',
    access: may.buy,
    query: reorderListQuery,
    handler: ({ query }) => reorder.listReorder(query),
  });
  route(router, {
    method: 'get',
    path: '/api/reorder-defaults',
    access: may.buy,
    query: z.object({ familyId: z.optional(idField) }),
    handler: ({ query }) => reorder.listDefaults(query.familyId),
  });
  route(router, {
    method: 'put',
    path: '/api/reorder-defaults',
    access: may.buy,
    body: reorderDefaultInput,
    handler: ({ body, user }) => reorder.setDefault(user.id, body),
  });
  route(router, {
    method: 'delete',
    path: '/api/reorder-defaults/:id',
    access: may.buy,
    params: idParams,
    handler: async ({ params, user }) => {
      await reorder.deleteDefault(user.id, params.id);
      return undefined;
    },
  });

  // ---- Sourcing and exchange rates ----
  route(router, {
    method: 'get',
    path: '/api/sourcing',
    access: may.buy,
    query: sourcingQuery,
    handler: ({ query }) => sourcing.sourcing(query),
  });
  route(router, {
    method: 'get',
    path: '/api/exchange-rates',
    access: may.buy,
    handler: () => sourcing.listRates(),
  });
  route(router, {
    method: 'put',
    path: '/api/exchange-rates/:currency',
    access: may.setRates,
    params: currencyParam,
    body: rateInput,
    handler: ({ params, body, user }) => sourcing.setRate(user.id, params.currency, body.rate),
  });
  route(router, {
    method: 'delete',
    path: '/api/exchange-rates/:currency',
    access: may.setRates,
    params: currencyParam,
    handler: async ({ params, user }) => {
      await sourcing.deleteRate(user.id, params.currency);
      return undefined;
    },
  });

  // ---- Purchase orders ----
  route(router, {
    method: 'get',
    path: '/api/purchase-orders',
    access: 'signed-in',
    money: ORDER_MONEY,
    query: ordersQuery,
    handler: ({ query }) => orders.listOrders(query),
  });
  route(router, {
    method: 'post',
    path: '/api/purchase-orders',
    access: may.buy,
    money: ORDER_MONEY,
    body: orderInput,
    status: 201,
    handler: ({ body, user }) => orders.createOrder(user.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/purchase-orders/drafts',
    access: may.buy,
    money: ORDER_MONEY,
    body: draftsInput,
    status: 201,
    handler: ({ body, user }) => drafts.draftFromSuggestions(user.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/purchase-orders/open-lines',
    access: may.receiveStock,
    money: ORDER_MONEY,
    // By a scanned box's GTIN, or by the part being received (the one receiving page).
    query: z
      .object({
        gtin: z.optional(
          z.string().check(z.trim(), z.minLength(1, 'scan or type a GTIN'), z.maxLength(40)),
        ),
        partId: z.optional(idField),
      })
      .check(
        z.refine((q) => q.gtin !== undefined || q.partId !== undefined, {
          message: 'scan or type a GTIN, or name the part',
          path: ['gtin'],
        }),
      ),
    handler: ({ query }) =>
      query.gtin !== undefined
        ? openLines.openLinesForGtin(query.gtin)
        : openLines.openLinesForPart(query.partId as string),
  });
  route(router, {
    method: 'get',
    path: '/api/purchase-orders/:id',
    access: 'signed-in',
    money: ORDER_MONEY,
    params: idParams,
    handler: ({ params }) => orders.getOrder(params.id),
  });
  route(router, {
    method: 'patch',
    path: '/api/purchase-orders/:id',
    access: may.buy,
    money: ORDER_MONEY,
    params: idParams,
    body: orderPatch,
    handler: ({ params, body, user }) => orders.patchOrder(user.id, params.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/purchase-orders/:id/send',
    access: may.buy,
    money: ORDER_MONEY,
    params: idParams,
    body: z.strictObject({}),
    handler: ({ params, user }) => sendOrder(user.id, params.id),
  });
  route(router, {
    method: 'post',
    path: '/api/purchase-orders/:id/cancel',
    access: may.buy,
    money: ORDER_MONEY,
    params: idParams,
    body: z.strictObject({}),
    handler: ({ params, user }) => orders.cancelOrder(user.id, params.id),
  });
  route(router, {
    method: 'post',
    path: '/api/purchase-orders/:id/receipts',
    access: may.receiveStock,
    money: ORDER_MONEY,
    params: idParams,
    body: receiptLinesInput,
    status: 201,
    handler: ({ params, body, user }) => receiveAgainstOrder(user.id, params.id, body),
  });

  // ---- Jobs waiting on an order line ----
  route(router, {
    method: 'get',
    path: '/api/order-waits',
    access: 'signed-in',
    query: waitsQuery,
    handler: ({ query }) => orders.listWaits(query),
  });
  route(router, {
    method: 'post',
    path: '/api/order-waits',
    access: may.keepOrderWaits,
    body: waitInput,
    status: 201,
    handler: ({ body, user }) => orders.addWait(user.id, body),
  });
  route(router, {
    method: 'delete',
    path: '/api/order-waits/:id',
    access: may.keepOrderWaits,
    params: idParams,
    handler: async ({ params, user }) => {
      await orders.cancelWait(user.id, params.id);
      return undefined;
    },
  });
  route(router, {
    method: 'get',
    path: '/api/order-lines/:id/wait-candidates',
    access: may.keepOrderWaits,
    params: idParams,
    handler: ({ params }) => orders.waitCandidates(params.id),
  });
}
