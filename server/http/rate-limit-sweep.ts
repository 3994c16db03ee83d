// Every few minutes, forget rate-limit counters whose window has ended, so the table stays as small
// as the number of addresses and accounts seen in the last quarter hour. Idempotent: several server
// processes may run it side by side.
import type { Background } from '../background-work';
import { logger } from '../logger';
import { pruneRateLimits } from './rate-limit';

const EVERY_MS = 5 * 60 * 1000;

export function startRateLimitSweep(): Background {
  let running: Promise<unknown> = Promise.resolve();
  const timer = setInterval(() => {
    running = pruneRateLimits().catch((err: unknown) =>
      logger.warn({ err }, 'sweeping old rate-limit counters failed; it runs again shortly'),
    );
  }, EVERY_MS);
  timer.unref();
  return {
    stop: async () => {
      clearInterval(timer);
      await running;
    },
  };
}
