// The API description, generated from the same route declarations and zod schemas that validate
// requests, so it cannot drift from what the server accepts.
import * as z from '../../shared/zod';
import { declaredRoutes, type DeclaredRoute } from '../http/route';
import { MONEY_SEEN_BY } from '../../shared/money-visibility';

type Json = Record<string, unknown>;

function jsonSchema(schema: z.ZodMiniType | undefined): Json | undefined {
  if (!schema) return undefined;
  try {
    return z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as Json;
  } catch {
    return { description: 'validated on the server' };
  }
}

/** '/api/jobs/:id/cylinders/:n' → '/api/jobs/{id}/cylinders/{n}' */
export function openApiPath(path: string): string {
  return path.replace(/:(\w+)/g, '{$1}');
}

function parameters(r: DeclaredRoute): Json[] {
  const out: Json[] = [];
  for (const m of r.path.matchAll(/:(\w+)/g)) {
    out.push({ name: m[1], in: 'path', required: true, schema: { type: 'string' } });
  }
  const q = jsonSchema(r.query) as
    { properties?: Record<string, Json>; required?: string[] } | undefined;
  for (const [name, schema] of Object.entries(q?.properties ?? {})) {
    out.push({ name, in: 'query', required: q?.required?.includes(name) ?? false, schema });
  }
  return out;
}

function accessText(r: DeclaredRoute): string {
  if (r.access === 'public') return 'Open to anyone.';
  if (r.access === 'signed-in') return 'Any signed-in user.';
  return `Roles: ${r.access.join(', ')}.`;
}

/** Which money fields each role gets: the ones a role may not see are left out of its answer. */
function moneyText(r: DeclaredRoute): string {
  if (!r.money) return '';
  const kinds = Object.entries(r.money)
    .map(([kind, names]) => `${kind}: ${(names ?? []).join(', ')}`)
    .join('; ');
  const seen = Object.entries(MONEY_SEEN_BY)
    .map(([role, k]) => `${role} sees ${k.length ? k.join(', ') : 'none'}`)
    .join('; ');
  return ` Money fields (${kinds}) are left out for roles that may not see them (${seen}).`;
}

export function buildOpenApi(routes: readonly DeclaredRoute[] = declaredRoutes): Json {
  const paths: Record<string, Json> = {};
  for (const r of routes) {
    const p = openApiPath(r.path);
    paths[p] ??= {};
    const body = jsonSchema(r.body);
    const ok = String(r.status ?? 200);
    (paths[p] as Json)[r.method] = {
      summary: `${r.method.toUpperCase()} ${r.path}`,
      description: accessText(r) + moneyText(r),
      'x-access': r.access,
      ...(r.money ? { 'x-money': r.money } : {}),
      parameters: parameters(r),
      ...(body
        ? { requestBody: { required: true, content: { 'application/json': { schema: body } } } }
        : {}),
      responses: {
        [ok]: { description: 'Success' },
        '400': { $ref: '#/components/responses/Error' },
        ...(r.access === 'public' ? {} : { '401': { $ref: '#/components/responses/Error' } }),
        ...(Array.isArray(r.access) ? { '403': { $ref: '#/components/responses/Error' } } : {}),
      },
    };
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Stepstock API',
      version: '0.1.0',
      description:
        'JSON under /api. Lengths are sent as strings with a unit ("2.5555 in", "64.91 mm") and returned as {"mm","in"}. Mutating requests carry the X-XSRF-TOKEN header echoing the XSRF-TOKEN cookie.',
    },
    paths,
    components: {
      schemas: {
        Error: {
          type: 'object',
          required: ['error'],
          properties: {
            error: {
              type: 'object',
              required: ['code', 'message'],
              properties: {
                code: { type: 'string' },
                message: { type: 'string' },
                details: {
                  type: 'array',
                  items: {
                    type: 'object',
                    properties: {
                      field: { type: 'string' },
                      line: { type: 'integer' },
                      message: { type: 'string' },
                    },
                  },
                },
              },
            },
          },
        },
      },
      responses: {
        Error: {
          description: 'Error',
          content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
        },
      },
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'stepstock.sid' } },
    },
    security: [{ session: [] }],
  };
}
