// The customer's link: 256 random bits, written base64url into the e-mail; only its SHA-256 is
// stored. A link is good for a fixed number of days and only while the job is open.
import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { NotFound } from '../errors';
import { PUBLIC_LINK_DAYS } from '../../shared/api/money';

const TOKEN = /^[A-Za-z0-9_-]{43}$/;

function hashOf(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A new link for the job, inside the caller's transaction; returns the token (never stored). */
export async function newPublicLink(trx: Knex, jobId: string): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await trx('public_links').insert({
    token_hash: hashOf(token),
    job_id: jobId,
    expires_at: trx.raw(`now() + make_interval(days => ?)`, [PUBLIC_LINK_DAYS]),
  });
  return token;
}

/** The job a link opens, or 404 for a malformed, unknown or expired link or a closed job. */
export async function jobOfLink(token: string, k: Knex = db): Promise<string> {
  const gone = new NotFound('That link');
  if (!TOKEN.test(token)) throw gone;
  const row = await k('public_links as l')
    .join('jobs as j', 'j.id', 'l.job_id')
    .where('l.token_hash', hashOf(token))
    .where('l.expires_at', '>', k.fn.now())
    .whereNotIn('j.state', ['handed_back', 'called_off'])
    .first('l.job_id');
  if (!row) throw gone;
  return row.job_id as string;
}

export function publicPath(token: string): string {
  return `/c/${token}`;
}
