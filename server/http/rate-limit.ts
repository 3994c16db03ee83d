// Rate limits kept in PostgreSQL, so every server process counts against the same numbers. An
// attempt is counted before the work it guards (one atomic upsert), so a burst of simultaneous
// attempts cannot all pass a read-then-write check. Fixed windows: the first hit opens a window of
// `windowSeconds`; hits beyond `max` inside it are refused until it ends.
import type { Request, RequestHandler } from 'express';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { TooManyRequests } from '../errors';

export interface RateLimit {
  /** Names the counter; one limit, one name. */
  bucket: string;
  max: number;
  windowSeconds: number;
}

export interface Counted {
  allowed: boolean;
  hits: number;
  /** Seconds until the window ends (and the count starts again). */
  retryAfterSeconds: number;
}

const MAX_KEY = 400;

function keyText(key: string): string {
  return key.slice(0, MAX_KEY);
}

/** Counts one hit against `key` and says whether it is within the limit. */
export async function countHit(limit: RateLimit, key: string, q: Knex = db): Promise<Counted> {
  const { rows } = await q.raw<{ rows: Array<{ hits: number; retry_after: number }> }>(
    `INSERT INTO rate_limit_buckets AS b (bucket, key, hits, expires_at)
     VALUES (?, ?, 1, now() + make_interval(secs => ?))
     ON CONFLICT (bucket, key) DO UPDATE SET
       hits = CASE WHEN b.expires_at <= now() THEN 1 ELSE b.hits + 1 END,
       expires_at = CASE WHEN b.expires_at <= now() THEN excluded.expires_at ELSE b.expires_at END
     RETURNING hits, ceil(extract(epoch FROM (expires_at - now())))::int AS retry_after`,
    [limit.bucket, keyText(key), limit.windowSeconds],
  );
  const { hits, retry_after } = rows[0];
  return { allowed: hits <= limit.max, hits, retryAfterSeconds: Math.max(1, retry_after) };
}

/** Takes back one hit (the attempt turned out to be legitimate, e.g. a successful sign-in). */
export async function forgiveHit(limit: RateLimit, key: string, q: Knex = db): Promise<void> {
  await q('rate_limit_buckets')
    .where({ bucket: limit.bucket, key: keyText(key) })
    .update({ hits: q.raw('greatest(hits - 1, 0)') });
}

/** Forgets every hit of `key`, or with `prefix` of every key starting with it. */
export async function clearHits(
  limit: RateLimit,
  key: string,
  opts: { prefix?: boolean } = {},
  q: Knex = db,
): Promise<void> {
  const query = q('rate_limit_buckets').where({ bucket: limit.bucket });
  if (opts.prefix) query.andWhereLike('key', `${escapeLike(keyText(key))}%`);
  else query.andWhere({ key: keyText(key) });
  await query.delete();
}

export function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/** Deletes counters whose window has ended; run by the background sweep. */
export async function pruneRateLimits(q: Knex = db): Promise<number> {
  return q('rate_limit_buckets').where('expires_at', '<', q.fn.now()).delete();
}

/**
 * Middleware for a route's `before`: counts each request under `keyOf(req)` (the caller's address
 * unless told otherwise) and answers 429 with Retry-After past the limit.
 */
export function rateLimited(
  limit: RateLimit,
  keyOf: (req: Request) => string = (req) => req.ip ?? 'unknown',
  message = 'Too many requests from this address. Wait a moment and try again.',
): RequestHandler {
  return (req, _res, next) => {
    countHit(limit, keyOf(req))
      .then((c) => (c.allowed ? next() : next(new TooManyRequests(message, c.retryAfterSeconds))))
      .catch(next);
  };
}
