// The daily sweep that releases expired holds, started in every server process. The sweep itself
// takes an advisory lock, so when several processes run it at once only one does the work.
import type { Background } from '../background-work';
import { logger } from '../logger';
import { sweepExpiredHolds } from './hold-expiry';

const FIRST_RUN_MS = 60 * 1000;
const EVERY_MS = 24 * 60 * 60 * 1000;

export function startHoldSweep(): Background {
  let running: Promise<unknown> = Promise.resolve();
  const run = () => {
    running = sweepExpiredHolds().catch((err: unknown) =>
      logger.error({ err }, 'the expired-hold sweep failed; it runs again tomorrow'),
    );
  };
  // Soon after start (a shop's server may restart daily), then once a day.
  const first = setTimeout(run, FIRST_RUN_MS);
  const daily = setInterval(run, EVERY_MS);
  first.unref();
  daily.unref();
  return {
    stop: async () => {
      clearTimeout(first);
      clearInterval(daily);
      await running;
    },
  };
}
