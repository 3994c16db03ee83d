// Every API route is declared through `route()`: method, path, who may call it, the zod schemas of
// its input and one async handler. Routes registered any other way have no access declaration and
// the route-matrix test fails on them; at run time a request that reaches no declared route is 404.
import type { Request, Response, RequestHandler, Router } from 'express';
import type * as z from '../../shared/zod';
import type { Role } from '../../shared/session-types';
import { BadRequest, Forbidden, Unauthorized } from '../errors';
import type { ErrorDetail } from '../../shared/api/common';
import type { SessionUser } from '../../shared/session-types';
import { hiddenMoneyFields, withoutMoney, type MoneyFields } from '../../shared/money-visibility';

export type Access = 'public' | 'signed-in' | readonly Role[];
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteInput<B, Q, P> {
  body: B;
  query: Q;
  params: P;
  user: SessionUser;
  req: Request;
  res: Response;
}

export interface RouteSpec<B = unknown, Q = unknown, P = unknown> {
  method: Method;
  path: string;
  access: Access;
  body?: z.ZodMiniType<B>;
  query?: z.ZodMiniType<Q>;
  params?: z.ZodMiniType<P>;
  /** Middleware run after the access check and before validation (multer for uploads). */
  before?: RequestHandler[];
  /** Status for a returned value; default 200. */
  status?: number;
  /**
   * The money in the answer, by kind: each role gets the answer without the kinds it may not see
   * (shared/money-visibility.ts). Declared here, beside `access`, so one place says both.
   */
  money?: MoneyFields;
  handler: (input: RouteInput<B, Q, P>) => Promise<unknown> | unknown;
}

export interface DeclaredRoute {
  method: Method;
  path: string;
  access: Access;
  body?: z.ZodMiniType;
  query?: z.ZodMiniType;
  params?: z.ZodMiniType;
  status?: number;
  money?: MoneyFields;
}

/** Every route declared in this process, for the route × role matrix and the API description. */
export const declaredRoutes: DeclaredRoute[] = [];

type Issue = z.core.$ZodIssue;

/**
 * A value that fits none of a union's forms ("an e-mail, or empty, or null") reports the reason of
 * the form it came closest to (the one whose type matched), not zod's bare "Invalid input".
 */
function closestIssue(issue: Issue): Issue {
  if (issue.code !== 'invalid_union' || !issue.errors?.length) return issue;
  const branch = issue.errors.find(
    (b) => b.length > 0 && b.every((i) => i.code !== 'invalid_type'),
  );
  if (!branch) return issue;
  const inner = closestIssue(branch[0]);
  return { ...inner, path: [...issue.path, ...inner.path] };
}

export function zodDetails(error: z.core.$ZodError, where: string): ErrorDetail[] {
  return error.issues.map((raw) => {
    const issue = closestIssue(raw);
    return {
      field: issue.path.length ? issue.path.join('.') : where,
      message: issue.message,
    };
  });
}

function parseOrThrow<T>(schema: z.ZodMiniType<T> | undefined, value: unknown, where: string): T {
  if (!schema) return value as T;
  const result = schema.safeParse(value ?? {});
  if (!result.success) {
    const details = zodDetails(result.error, where);
    const first = details[0];
    throw new BadRequest(
      first ? `${first.field}: ${first.message}` : `The ${where} is not valid.`,
      details,
    );
  }
  return result.data;
}

export type AccessGuard = RequestHandler & { access: Access };

export function accessGuard(access: Access): AccessGuard {
  const guard: RequestHandler = (req, _res, next) => {
    if (access === 'public') return next();
    const user = req.user as SessionUser | undefined;
    if (!user) return next(new Unauthorized());
    if (access === 'signed-in' || access.includes(user.role)) return next();
    next(new Forbidden());
  };
  // The route matrix reads the declaration back from the guard.
  return Object.assign(guard, { access });
}

/** Nobody signed in sees no money of a route that declares some. */
function moneyHiddenFrom(user: SessionUser | undefined, money: MoneyFields): Set<string> {
  if (user) return hiddenMoneyFields(user.role, money);
  return new Set(Object.values(money).flatMap((names) => [...(names ?? [])]));
}

export function route<B, Q, P>(router: Router, spec: RouteSpec<B, Q, P>): void {
  if (!declaredRoutes.some((r) => r.method === spec.method && r.path === spec.path)) {
    declaredRoutes.push({
      method: spec.method,
      path: spec.path,
      access: spec.access,
      body: spec.body,
      query: spec.query,
      params: spec.params,
      status: spec.status,
      money: spec.money,
    });
  }
  const run: RequestHandler = async (req, res) => {
    const input: RouteInput<B, Q, P> = {
      body: parseOrThrow(spec.body, req.body, 'body'),
      query: parseOrThrow(spec.query, req.query, 'query'),
      params: parseOrThrow(spec.params, req.params, 'params'),
      user: req.user as SessionUser,
      req,
      res,
    };
    const raw = await spec.handler(input);
    if (res.headersSent) return;
    const result = spec.money ? withoutMoney(raw, moneyHiddenFrom(input.user, spec.money)) : raw;
    if (result === undefined) {
      res.status(spec.status ?? 204).end();
      return;
    }
    res.status(spec.status ?? 200).json(result);
  };
  router[spec.method](spec.path, accessGuard(spec.access), ...(spec.before ?? []), run);
}

/**
 * Deny by default: refuses to build an app with a route that was not declared through `route()`
 * (its first handler would carry no access declaration, so nothing would check who calls it).
 */
export function assertEveryRouteDeclared(routers: Router[]): void {
  for (const router of routers) {
    for (const layer of router.stack as unknown as Array<{
      route?: { path: string; stack: Array<{ handle: { access?: Access } }> };
    }>) {
      if (layer.route && layer.route.stack[0]?.handle.access === undefined) {
        throw new Error(
          `Route ${layer.route.path} has no access declaration: declare it with route().`,
        );
      }
    }
  }
}
