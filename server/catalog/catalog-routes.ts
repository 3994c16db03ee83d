// Catalog routes: engine families, step series, the step ladder, exposure and parts. Everyone
// signed in reads; owner and buyer change the catalog.
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField, pageQuery } from '../../shared/api/common';
import {
  familyInput,
  familyPatch,
  FAMILY_SORTS,
  PART_KINDS,
  PART_SORTS,
  partInput,
  partPatch,
  stepSeriesInput,
} from '../../shared/api/catalog';
import type { MoneyFields } from '../../shared/money-visibility';
import * as service from './catalog-service';
import * as ladders from './ladder-service';
import { may } from '../../shared/access';

/** A part's average cost is the shop's cost; its sale price is the list price everyone quotes. */
const PART_MONEY: MoneyFields = { cost: ['averageCost'] };
const idParams = z.object({ id: idField });
const activeFilter = z.pipe(
  z.optional(z.enum(['true', 'false', 'all'], { error: 'must be true, false or all' })),
  z.transform((v) => (v === 'true' ? true : v === 'false' ? false : undefined)),
);

const familiesQuery = z.extend(pageQuery, {
  sort: z.optional(z.enum(FAMILY_SORTS, { error: `must be one of ${FAMILY_SORTS.join(', ')}` })),
  active: activeFilter,
});

const partsQuery = z.extend(pageQuery, {
  sort: z.optional(z.enum(PART_SORTS, { error: `must be one of ${PART_SORTS.join(', ')}` })),
  familyId: z.optional(idField),
  stepId: z.optional(idField),
  kind: z.optional(z.enum(PART_KINDS, { error: 'must be piston, rings, kit or other' })),
  active: activeFilter,
});

const exposureQuery = z.extend(pageQuery, { familyId: z.optional(idField) });

export function registerCatalogRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/step-series',
    access: 'signed-in',
    handler: () => service.listStepSeries(),
  });
  route(router, {
    method: 'post',
    path: '/api/step-series',
    access: may.editCatalog,
    body: stepSeriesInput,
    status: 201,
    handler: ({ body, user }) => service.createStepSeries(user.id, body),
  });

  route(router, {
    method: 'get',
    path: '/api/engine-families',
    access: 'signed-in',
    query: familiesQuery,
    handler: ({ query }) => service.listFamilies(query),
  });
  route(router, {
    method: 'post',
    path: '/api/engine-families',
    access: may.editCatalog,
    body: familyInput,
    status: 201,
    handler: ({ body, user }) => service.createFamily(user.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/engine-families/:id',
    access: 'signed-in',
    params: idParams,
    handler: ({ params }) => service.getFamily(params.id),
  });
  route(router, {
    method: 'patch',
    path: '/api/engine-families/:id',
    access: may.editCatalog,
    params: idParams,
    body: familyPatch,
    handler: ({ params, body, user }) => service.updateFamily(user.id, params.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/engine-families/:id/ladder',
    access: 'signed-in',
    params: idParams,
    handler: ({ params }) => ladders.ladder(params.id),
  });
  route(router, {
    method: 'get',
    path: '/api/engine-families/:id/ladder/steps/:stepId/units',
    access: 'signed-in',
    params: z.object({ id: idField, stepId: idField }),
    query: pageQuery,
    handler: ({ params, query }) => ladders.stepUnits(params.id, params.stepId, query),
  });

  route(router, {
    method: 'get',
    path: '/api/exposure',
    access: 'signed-in',
    query: exposureQuery,
    handler: ({ query }) => ladders.listExposure(query),
  });

  route(router, {
    method: 'get',
    path: '/api/parts',
    access: 'signed-in',
    money: PART_MONEY,
    query: partsQuery,
    handler: ({ query }) => service.listParts(query),
  });
  route(router, {
    method: 'post',
    path: '/api/parts',
    access: may.editCatalog,
    money: PART_MONEY,
    body: partInput,
    status: 201,
    handler: ({ body, user }) => service.createPart(user.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/parts/:id',
    access: 'signed-in',
    money: PART_MONEY,
    params: idParams,
    handler: ({ params }) => service.getPart(params.id),
  });
  route(router, {
    method: 'patch',
    path: '/api/parts/:id',
    access: may.editCatalog,
    money: PART_MONEY,
    params: idParams,
    body: partPatch,
    handler: ({ params, body, user }) => service.updatePart(user.id, params.id, body),
  });
}
