// Supplier routes: buyers and the owner keep suppliers and map their items to catalog parts; staff,
// who bring price lists in, read them too.
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField, pageQuery } from '../../shared/api/common';
import {
  ITEM_SORTS,
  SUPPLIER_SORTS,
  itemMappingInput,
  supplierInput,
  supplierPatch,
} from '../../shared/api/suppliers';
import { withHeavyListSlot } from '../http/heavy-gate';
import * as service from './suppliers-service';
import { may } from '../../shared/access';

const idParams = z.object({ id: idField });
const itemParams = z.object({ id: idField, itemId: idField });

const booleanFilter = z.pipe(
  z.optional(z.enum(['true', 'false', 'all'], { error: 'must be true, false or all' })),
  z.transform((v) => (v === 'true' ? true : v === 'false' ? false : undefined)),
);

const suppliersQuery = z.extend(pageQuery, {
  sort: z.optional(
    z.enum(SUPPLIER_SORTS, { error: `must be one of ${SUPPLIER_SORTS.join(', ')}` }),
  ),
});

const itemsQuery = z.extend(pageQuery, {
  sort: z.optional(z.enum(ITEM_SORTS, { error: `must be one of ${ITEM_SORTS.join(', ')}` })),
  mapped: booleanFilter,
  dropped: booleanFilter,
});

const historyQuery = z.pick(pageQuery, { page: true, pageSize: true });

const unmappedQuery = z.extend(z.pick(pageQuery, { q: true, page: true, pageSize: true }), {
  supplierId: z.optional(idField),
});

export function registerSuppliersRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/suppliers',
    access: may.readSuppliers,
    query: suppliersQuery,
    handler: ({ query }) => service.listSuppliers(query),
  });
  route(router, {
    method: 'post',
    path: '/api/suppliers',
    access: may.editSuppliers,
    body: supplierInput,
    status: 201,
    handler: ({ body, user }) => service.createSupplier(user.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/suppliers/:id',
    access: may.readSuppliers,
    params: idParams,
    handler: ({ params }) => service.getSupplier(params.id),
  });
  route(router, {
    method: 'patch',
    path: '/api/suppliers/:id',
    access: may.editSuppliers,
    params: idParams,
    body: supplierPatch,
    handler: ({ params, body, user }) => service.updateSupplier(user.id, params.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/suppliers/:id/items',
    access: may.readSuppliers,
    params: idParams,
    query: itemsQuery,
    handler: ({ params, query }) => withHeavyListSlot(() => service.listItems(params.id, query)),
  });
  route(router, {
    method: 'get',
    path: '/api/suppliers/:id/items/:itemId/prices',
    access: may.readSuppliers,
    params: itemParams,
    query: historyQuery,
    handler: ({ params, query }) => service.priceHistory(params.id, params.itemId, query),
  });
  route(router, {
    method: 'get',
    path: '/api/supplier-items/unmapped',
    access: may.readSuppliers,
    query: unmappedQuery,
    handler: ({ query }) => withHeavyListSlot(() => service.listUnmapped(query)),
  });
  route(router, {
    method: 'patch',
    path: '/api/supplier-items/:id',
    access: may.editSuppliers,
    params: idParams,
    body: itemMappingInput,
    handler: ({ params, body, user }) => service.mapItem(user.id, params.id, body.partId),
  });
}
