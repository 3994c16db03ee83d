// The API description must list every route the app registers (OpenAPI 3.1).
import request from 'supertest';
import type { Router } from 'express';
import { createApp } from '../../server/app';
import { openApiPath } from '../../server/openapi/openapi';
import { closeTestApp, testApp } from '../support/api';

afterAll(closeTestApp);

function registered(routers: Router[]): string[] {
  const out: string[] = [];
  for (const router of routers) {
    for (const layer of router.stack as unknown as Array<{
      route?: { path: string; methods: Record<string, boolean> };
    }>) {
      if (!layer.route) continue;
      for (const m of Object.keys(layer.route.methods))
        out.push(`${m} ${openApiPath(layer.route.path)}`);
    }
  }
  return out;
}

describe('GET /api/openapi.json', () => {
  it('when fetched, then it is an OpenAPI 3.1 document that describes every registered route', async () => {
    const res = await request(testApp()).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    const routes = registered(createApp({ serveClient: false }).routers);
    expect(routes.length).toBeGreaterThan(5);
    const missing = routes.filter((r) => {
      const [method, path] = r.split(' ');
      return !res.body.paths?.[path]?.[method];
    });
    expect(missing).toEqual([]);
  });

  it('when a route takes a JSON body, then its schema is described', async () => {
    const res = await request(testApp()).get('/api/openapi.json');
    const signIn = res.body.paths['/api/session'].post;
    expect(signIn.requestBody.content['application/json'].schema.properties).toHaveProperty(
      'email',
    );
  });
});
