// Lists that can cost the database real work at a large supplier's size (the mapping queue, a
// search through a supplier's items) run a few at a time per server process. The rest wait their
// turn briefly and are then told to come back (503 with Retry-After): a burst of them can no
// longer take every database connection and every core, so the health check, sign-in and the
// light pages keep answering.
import { ServiceUnavailable } from '../errors';

const AT_ONCE = 2;
const WAIT_MS = 1500;

let running = 0;
const queue: Array<() => void> = [];

function release(): void {
  const next = queue.shift();
  if (next) next();
  else running--;
}

export async function withHeavyListSlot<T>(work: () => Promise<T>): Promise<T> {
  if (running < AT_ONCE) running++;
  else {
    await new Promise<void>((resolve, reject) => {
      const start = () => {
        clearTimeout(timer);
        resolve();
      };
      const timer = setTimeout(() => {
        queue.splice(queue.indexOf(start), 1);
        reject(
          new ServiceUnavailable(
            'The server is busy with other long lists. Try again in a moment.',
            2,
          ),
        );
      }, WAIT_MS);
      queue.push(start);
    });
  }
  try {
    return await work();
  } finally {
    release();
  }
}
