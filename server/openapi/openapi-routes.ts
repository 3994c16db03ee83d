import type { Router } from 'express';
import { route } from '../http/route';
import { buildOpenApi } from './openapi';

export function registerOpenApiRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/openapi.json',
    access: 'public',
    handler: () => buildOpenApi(),
  });
}
