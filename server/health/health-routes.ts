// /api/health for a load balancer or a watchdog. It has its own connection to PostgreSQL, outside
// the request pool: under a burst of heavy requests the pool is full and queued, and a health check
// waiting in that queue would report a busy but healthy server as "db down" and get it taken out.
import type { Router } from 'express';
import pg from 'pg';
import { route } from '../http/route';
import { config } from '../config';

export interface HealthProbe {
  /** Resolves true when PostgreSQL answers within the time limit; never hangs, never throws. */
  databaseAnswers(ms?: number): Promise<boolean>;
  close(): Promise<void>;
}

export function createHealthProbe(databaseUrl = config.databaseUrl): HealthProbe {
  // One connection, kept open so a check under load does not pay for a new one; a dropped one is
  // replaced on the next check.
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max: 1,
    idleTimeoutMillis: 0,
    connectionTimeoutMillis: 1000,
    allowExitOnIdle: true,
    application_name: 'stepstock-health',
    statement_timeout: 1000,
  });
  pool.on('error', () => undefined);
  return {
    async databaseAnswers(ms = 1500) {
      let timer: NodeJS.Timeout | undefined;
      const timeout = new Promise<boolean>((resolve) => {
        timer = setTimeout(() => resolve(false), ms);
      });
      const probe = pool
        .query('select 1')
        .then(() => true)
        .catch(() => false);
      const ok = await Promise.race([probe, timeout]);
      clearTimeout(timer);
      return ok;
    },
    close: () => pool.end(),
  };
}

export function registerHealthRoutes(router: Router, probe: HealthProbe): void {
  route(router, {
    method: 'get',
    path: '/api/health',
    access: 'public',
    handler: async ({ res }) => {
      if (await probe.databaseAnswers()) return { status: 'ok', db: 'ok' };
      res.status(503).json({ status: 'degraded', db: 'down' });
      return undefined;
    },
  });
}
