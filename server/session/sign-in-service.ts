// Checking a sign-in, throttled so that neither guessing nor a flood works and a stranger cannot
// lock a person out:
//   - every attempt is counted before its password is checked (one atomic statement per counter),
//     so a burst of simultaneous guesses cannot slip past the limit;
//   - per address across all e-mails (a flood of made-up e-mails from one place stops early, before
//     any hash is computed), and per account from that address;
//   - a browser this account has signed in on before carries a device cookie and is counted on its
//     own, so failures from elsewhere (even from behind the same shop router) do not lock it out;
//   - passwords are compared in a worker thread, and when too many are already waiting the caller
//     is told at once that the server is busy.
import type { Request, Response } from 'express';
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import { config } from '../config';
import { ServiceUnavailable, TooManyRequests, Unauthorized } from '../errors';
import { BCRYPT_COST, verifyPassword } from '../auth/passwords';
import { HashQueueFull, hashPool } from '../auth/hash-pool';
import { clearHits, countHit, forgiveHit, type RateLimit } from '../http/rate-limit';
import { findUserByEmail, toSessionUser } from '../users/users-repository';
import type { SessionUser } from '../../shared/session-types';
import bcrypt from 'bcryptjs';

export const FAILURE_WINDOW_MINUTES = 15;
const WINDOW = FAILURE_WINDOW_MINUTES * 60;

/** Failed sign-ins per account from one address (or from one known device) in the window. */
export const MAX_FAILURES = 10;

export const SIGN_IN_LIMITS = {
  address: {
    bucket: 'sign-in-address',
    max: config.SIGN_IN_FAILURES_PER_ADDRESS,
    windowSeconds: WINDOW,
  },
  account: { bucket: 'sign-in-account', max: MAX_FAILURES, windowSeconds: WINDOW },
  device: { bucket: 'sign-in-device', max: MAX_FAILURES, windowSeconds: WINDOW },
} satisfies Record<string, RateLimit>;

// A fixed hash to compare against when the e-mail is unknown, at the same cost as real ones, so a
// wrong e-mail takes as long as a wrong password and the timing does not tell which accounts exist.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', BCRYPT_COST);

const BUSY = 'Many sign-ins are being checked just now. Try again in a few seconds.';

export const DEVICE_COOKIE = 'stepstock.device';
const DEVICE_DAYS = 180;

function deviceMac(email: string, nonce: string): string {
  return createHmac('sha256', config.sessionSecret)
    .update(`device\n${email}\n${nonce}`)
    .digest('base64url');
}

function readCookie(req: Request, name: string): string | undefined {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const [k, ...v] = part.trim().split('=');
    if (k === name) return decodeURIComponent(v.join('='));
  }
  return undefined;
}

/** The device's nonce when the request carries this account's device cookie, else undefined. */
function knownDevice(req: Request, email: string): string | undefined {
  const [nonce, mac] = (readCookie(req, DEVICE_COOKIE) ?? '').split('.');
  if (!nonce || !mac) return undefined;
  const expected = Buffer.from(deviceMac(email, nonce));
  const given = Buffer.from(mac);
  return expected.length === given.length && timingSafeEqual(expected, given) ? nonce : undefined;
}

function setDeviceCookie(res: Response, email: string): void {
  const nonce = randomBytes(16).toString('base64url');
  res.cookie(DEVICE_COOKIE, `${nonce}.${deviceMac(email, nonce)}`, {
    httpOnly: true,
    sameSite: 'lax',
    secure: config.TRUST_PROXY === '1' ? res.req.secure : false,
    path: '/api/session',
    maxAge: DEVICE_DAYS * 24 * 60 * 60 * 1000,
  });
}

function minutes(seconds: number): string {
  const m = Math.max(1, Math.ceil(seconds / 60));
  return m === 1 ? '1 minute' : `${m} minutes`;
}

/**
 * Checks e-mail (already trimmed and lower-cased) and password; answers the user or throws 401,
 * 429 (with Retry-After) or 503 when the server is too busy checking passwords.
 */
export async function checkSignIn(
  req: Request,
  res: Response,
  email: string,
  password: string,
): Promise<SessionUser> {
  if (hashPool.full) {
    throw new ServiceUnavailable(BUSY, 3);
  }
  const address = req.ip ?? 'unknown';
  const device = knownDevice(req, email);
  if (device) {
    const c = await countHit(SIGN_IN_LIMITS.device, `${email}|${device}`);
    if (!c.allowed) {
      throw new TooManyRequests(
        `Too many failed sign-ins for this account on this device. Wait ${minutes(c.retryAfterSeconds)} or ask the owner to reset the password.`,
        c.retryAfterSeconds,
      );
    }
  } else {
    const byAddress = await countHit(SIGN_IN_LIMITS.address, address);
    if (!byAddress.allowed) {
      throw new TooManyRequests(
        `Too many failed sign-ins from this address. Wait ${minutes(byAddress.retryAfterSeconds)}, or sign in on a device you have signed in on before.`,
        byAddress.retryAfterSeconds,
      );
    }
    const byAccount = await countHit(SIGN_IN_LIMITS.account, `${email}|${address}`);
    if (!byAccount.allowed) {
      throw new TooManyRequests(
        `Too many failed sign-ins for this account from this address. Wait ${minutes(byAccount.retryAfterSeconds)}, sign in on a device you have signed in on before, or ask the owner to reset the password.`,
        byAccount.retryAfterSeconds,
      );
    }
  }

  const row = await findUserByEmail(email);
  let ok: boolean;
  try {
    ok = await verifyPassword(password, row?.password_hash ?? DUMMY_HASH);
  } catch (e) {
    if (e instanceof HashQueueFull) throw new ServiceUnavailable(BUSY, 3);
    throw e;
  }
  if (!row || !ok || !row.active) {
    throw new Unauthorized('Wrong e-mail or password, or the account is deactivated.');
  }

  // A right password: this attempt was no failure.
  if (device) await clearHits(SIGN_IN_LIMITS.device, `${email}|${device}`);
  else {
    await forgiveHit(SIGN_IN_LIMITS.address, address);
    await clearHits(SIGN_IN_LIMITS.account, `${email}|${address}`);
  }
  setDeviceCookie(res, email);
  return toSessionUser(row);
}

/** A password reset (by the owner or by the person) lifts every sign-in lock on the account. */
export async function liftSignInLocks(email: string): Promise<void> {
  const normal = email.trim().toLowerCase();
  await clearHits(SIGN_IN_LIMITS.account, `${normal}|`, { prefix: true });
  await clearHits(SIGN_IN_LIMITS.device, `${normal}|`, { prefix: true });
}
