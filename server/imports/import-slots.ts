// Price-list imports are heavy (a 50 MB list is read, checked and staged in one go), so each server
// process runs at most two at once, and at most one per supplier; the rest wait their turn in the
// order they came, for up to IMPORT_WAIT_SECONDS, and are then told to come back (503 with
// Retry-After) rather than piling up in memory. Several processes each keep their own count; a
// supplier's list is still applied by one commit at a time through its database lock.
import { config } from '../config';
import { ServiceUnavailable } from '../errors';

export const MAX_IMPORTS_AT_ONCE = 2;

interface Waiter {
  supplierId: string;
  start: () => void;
}

const runningSuppliers = new Map<string, number>();
let running = 0;
const queue: Waiter[] = [];

function free(supplierId: string): boolean {
  return running < MAX_IMPORTS_AT_ONCE && !runningSuppliers.has(supplierId);
}

function take(supplierId: string): void {
  running++;
  runningSuppliers.set(supplierId, 1);
}

function release(supplierId: string): void {
  running--;
  runningSuppliers.delete(supplierId);
  // The first waiter whose supplier is now free starts: first come, first served per supplier.
  const next = queue.findIndex((w) => free(w.supplierId));
  if (next >= 0) {
    const [waiter] = queue.splice(next, 1);
    take(waiter.supplierId);
    waiter.start();
  }
}

/** How many imports this process is running and how many wait, for tests and the log. */
export function importLoad(): { running: number; waiting: number } {
  return { running, waiting: queue.length };
}

export async function withImportSlot<T>(
  supplierId: string,
  work: () => Promise<T>,
  waitMs: number = config.IMPORT_WAIT_SECONDS * 1000,
): Promise<T> {
  if (free(supplierId)) take(supplierId);
  else {
    await new Promise<void>((resolve, reject) => {
      const waiter: Waiter = {
        supplierId,
        start: () => {
          clearTimeout(timer);
          resolve();
        },
      };
      const timer = setTimeout(() => {
        queue.splice(queue.indexOf(waiter), 1);
        reject(
          new ServiceUnavailable(
            'Two price lists are being imported already (one at a time per supplier). Try again in a moment.',
            Math.max(5, Math.ceil(waitMs / 1000)),
          ),
        );
      }, waitMs);
      queue.push(waiter);
    });
  }
  try {
    return await work();
  } finally {
    release(supplierId);
  }
}
