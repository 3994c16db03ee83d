// Customer routes: search and the record for everyone signed in; the counter and the workshop
// create and edit customers and their cylinders; merging two records and erasing one are the
// owner's. An export is everything the shop holds about the customer, as JSON or CSV.
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField, pageQuery } from '../../shared/api/common';
import type { MoneyFields } from '../../shared/money-visibility';
import {
  customerInput,
  customerPatch,
  cylinderInput,
  cylinderMarkQuery,
  eraseInput,
  EXPORT_FORMATS,
  mergeInput,
} from '../../shared/api/customers';
import { sendCsv } from '../insights/insights-csv';
import * as customers from './customers-service';
import * as cylinders from './cylinders-service';
import { exportCsvTable, exportCustomer } from './customer-export';
import { may } from '../../shared/access';

/** A job's estimate total is what the shop charges: staff and the owner see it (shared/money-visibility). */
const CUSTOMER_MONEY: MoneyFields = { sold: ['total'] };

const idParams = z.object({ id: idField });
const searchQuery = z.pick(pageQuery, { q: true, page: true, pageSize: true });
const exportQuery = z.strictObject({
  format: z.optional(
    z.enum(EXPORT_FORMATS, { error: `must be one of ${EXPORT_FORMATS.join(', ')}` }),
  ),
});

export function registerCustomersRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/customers',
    access: 'signed-in',
    query: searchQuery,
    handler: ({ query }) => customers.searchCustomers(query),
  });
  route(router, {
    method: 'post',
    path: '/api/customers',
    money: CUSTOMER_MONEY,
    access: may.runCounter,
    body: customerInput,
    status: 201,
    handler: ({ body, user }) => customers.createCustomer(user.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/customers/:id',
    money: CUSTOMER_MONEY,
    access: 'signed-in',
    params: idParams,
    handler: ({ params }) => customers.getCustomer(params.id),
  });
  route(router, {
    method: 'patch',
    path: '/api/customers/:id',
    money: CUSTOMER_MONEY,
    access: may.runCounter,
    params: idParams,
    body: customerPatch,
    handler: ({ params, body, user }) => customers.patchCustomer(user.id, params.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/customers/:id/merge',
    money: CUSTOMER_MONEY,
    access: may.mergeCustomers,
    params: idParams,
    body: mergeInput,
    handler: ({ params, body, user }) => customers.mergeCustomers(user.id, params.id, body.fromId),
  });
  route(router, {
    method: 'get',
    path: '/api/customers/:id/export',
    money: CUSTOMER_MONEY,
    access: 'signed-in',
    params: idParams,
    query: exportQuery,
    handler: async ({ params, query, res }) => {
      const data = await exportCustomer(params.id);
      if (query.format === 'csv') {
        sendCsv(res, exportCsvTable(data));
        return undefined;
      }
      res.setHeader(
        'Content-Disposition',
        `attachment; filename="stepstock-customer-${params.id.slice(0, 8)}.json"`,
      );
      return data;
    },
  });
  route(router, {
    method: 'post',
    path: '/api/customers/:id/erase',
    money: CUSTOMER_MONEY,
    access: may.mergeCustomers,
    params: idParams,
    body: eraseInput,
    handler: ({ params, user }) => customers.eraseCustomer(user.id, params.id),
  });
  route(router, {
    method: 'get',
    path: '/api/customers/:id/cylinders',
    access: 'signed-in',
    params: idParams,
    handler: ({ params }) => cylinders.listCylinders(params.id),
  });
  route(router, {
    method: 'post',
    path: '/api/customers/:id/cylinders',
    access: may.runCounter,
    params: idParams,
    body: cylinderInput,
    status: 201,
    handler: ({ params, body, user }) => cylinders.addCylinder(user.id, params.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/cylinders',
    access: 'signed-in',
    query: cylinderMarkQuery,
    handler: ({ query }) => cylinders.cylindersByMark(query.mark),
  });
  route(router, {
    method: 'get',
    path: '/api/cylinders/:id',
    access: 'signed-in',
    params: idParams,
    handler: ({ params }) => cylinders.cylinderDetail(params.id),
  });
}
