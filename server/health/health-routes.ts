import type { Router } from 'express';
import type { Knex } from 'knex';
import { route } from '../http/route';
import { db } from '../db/knex';

/** Resolves true when PostgreSQL answers within the time limit; never hangs. */
export async function databaseAnswers(q: Knex = db, ms = 1500): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<boolean>((resolve) => {
    timer = setTimeout(() => resolve(false), ms);
  });
  const probe = q
    .raw('select 1')
    .then(() => true)
    .catch(() => false);
  const ok = await Promise.race([probe, timeout]);
  clearTimeout(timer);
  return ok;
}

export function registerHealthRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/health',
    access: 'public',
    handler: async ({ res }) => {
      if (await databaseAnswers()) return { status: 'ok', db: 'ok' };
      res.status(503).json({ status: 'degraded', db: 'down' });
      return undefined;
    },
  });
}
