// Every hour, delete price-list previews nobody committed within PRICE_LIST_PREVIEW_HOURS, so
// uploads that are looked at and left cannot fill the disk with staged rows. Several server
// processes may run it side by side: the sweep takes an advisory lock, and one of them does it.
import type { Background } from '../background-work';
import { config } from '../config';
import { logger } from '../logger';
import { deleteExpiredPreviews } from './previews-repository';

const FIRST_RUN_MS = 60 * 1000;
const EVERY_MS = 60 * 60 * 1000;

export async function sweepExpiredPreviews(
  hours: number = config.PRICE_LIST_PREVIEW_HOURS,
): Promise<number | null> {
  const deleted = await deleteExpiredPreviews(hours);
  if (deleted) logger.info({ deleted, hours }, 'expired price-list previews deleted');
  return deleted;
}

export function startPreviewSweep(): Background {
  let running: Promise<unknown> = Promise.resolve();
  const run = () => {
    running = sweepExpiredPreviews().catch((err: unknown) =>
      logger.warn(
        { err },
        'sweeping expired price-list previews failed; it runs again within the hour',
      ),
    );
  };
  const first = setTimeout(run, FIRST_RUN_MS);
  const hourly = setInterval(run, EVERY_MS);
  first.unref();
  hourly.unref();
  return {
    stop: async () => {
      clearTimeout(first);
      clearInterval(hourly);
      await running;
    },
  };
}
