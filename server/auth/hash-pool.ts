// A small pool of worker threads that compute bcrypt hashes off the main thread, with a bounded
// queue: past it, callers are told the server is busy at once instead of waiting behind a flood.
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import path from 'node:path';

type Job =
  { op: 'hash'; plain: string; cost: number } | { op: 'compare'; plain: string; hash: string };

interface Pending {
  job: Job & { id: number };
  resolve(v: unknown): void;
  reject(e: Error): void;
}

/** The queue of waiting hashes is full: refuse the request rather than let it wait for seconds. */
export class HashQueueFull extends Error {
  constructor() {
    super('Too many passwords are being checked at once.');
  }
}

const WORKER_FILE = path.join(__dirname, 'hash-worker.cjs');

class HashPool {
  private idle: Worker[] = [];
  private busy = new Map<Worker, Pending>();
  private waiting: Pending[] = [];
  private nextId = 1;
  private started = 0;

  constructor(
    private readonly size: number,
    private readonly maxWaiting: number,
  ) {}

  /** Jobs running or waiting; the sign-in route refuses early when this is at the ceiling. */
  get load(): number {
    return this.busy.size + this.waiting.length;
  }

  get full(): boolean {
    return this.waiting.length >= this.maxWaiting;
  }

  run<T>(job: Job): Promise<T> {
    if (this.full) return Promise.reject(new HashQueueFull());
    return new Promise<T>((resolve, reject) => {
      this.waiting.push({
        job: { ...job, id: this.nextId++ },
        resolve: resolve as (v: unknown) => void,
        reject,
      });
      this.dispatch();
    });
  }

  private dispatch(): void {
    while (this.waiting.length > 0) {
      const worker = this.idle.pop() ?? (this.started < this.size ? this.spawn() : undefined);
      if (!worker) return;
      const next = this.waiting.shift() as Pending;
      this.busy.set(worker, next);
      worker.ref();
      worker.postMessage(next.job);
    }
  }

  private spawn(): Worker {
    this.started++;
    const worker = new Worker(WORKER_FILE);
    worker.unref();
    worker.on('message', (msg: { id: number; result?: unknown; error?: string }) => {
      const pending = this.busy.get(worker);
      this.busy.delete(worker);
      // Idle workers must not keep the process (or a test run) alive.
      worker.unref();
      this.idle.push(worker);
      if (pending) {
        if (msg.error) pending.reject(new Error(msg.error));
        else pending.resolve(msg.result);
      }
      this.dispatch();
    });
    worker.on('error', (err) => this.lose(worker, err));
    worker.on('exit', (code) => this.lose(worker, new Error(`hash worker stopped (${code})`)));
    return worker;
  }

  /** A worker that died fails its own job only; the next job starts a fresh one. */
  private lose(worker: Worker, err: Error): void {
    const pending = this.busy.get(worker);
    const wasKnown = this.busy.delete(worker) || this.idle.includes(worker);
    this.idle = this.idle.filter((w) => w !== worker);
    if (wasKnown) this.started--;
    pending?.reject(err);
    this.dispatch();
  }
}

// One core stays with the main thread (it answers every other request); at least one worker.
const WORKERS = Math.max(1, Math.min(4, availableParallelism() - 1));
// About two seconds of work for one worker at bcrypt cost 10: beyond it a sign-in waits too long.
const MAX_WAITING = 32;

export const hashPool = new HashPool(WORKERS, MAX_WAITING);
