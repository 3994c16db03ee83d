// Angular's XSRF convention with a signed double-submit cookie: the server sets XSRF-TOKEN (readable
// by the page), and every mutating /api request must echo it in X-XSRF-TOKEN. The token is an HMAC,
// under the session secret, of a nonce and the session it was minted for: a cookie planted by a
// sibling domain is refused, and so is a token minted for one visitor (or for nobody signed in)
// presented with another person's session cookie.
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler, Response, Request } from 'express';
import { config } from '../config';
import { Forbidden, Unauthorized } from '../errors';

export const XSRF_COOKIE = 'XSRF-TOKEN';
export const XSRF_HEADER = 'x-xsrf-token';

/** What a token is bound to: the signed-in session's id, or nobody before sign-in. */
function boundTo(req: Request): string {
  return req.user && req.sessionID ? `session:${req.sessionID}` : 'anonymous';
}

function sign(nonce: string, binding: string): string {
  return createHmac('sha256', config.sessionSecret)
    .update(`${binding}\n${nonce}`)
    .digest('base64url');
}

export function newXsrfToken(req: Request): string {
  const nonce = randomBytes(18).toString('base64url');
  return `${nonce}.${sign(nonce, boundTo(req))}`;
}

function validToken(req: Request, token: string): boolean {
  const [nonce, mac] = token.split('.');
  if (!nonce || !mac) return false;
  const expected = Buffer.from(sign(nonce, boundTo(req)));
  const given = Buffer.from(mac);
  return expected.length === given.length && timingSafeEqual(expected, given);
}

function readCookie(req: Request, name: string): string | undefined {
  const header = req.headers.cookie;
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const [k, ...v] = part.trim().split('=');
    if (k === name) return decodeURIComponent(v.join('='));
  }
  return undefined;
}

/**
 * Sets a fresh token for the request's session, replacing one this answer already carries (sign-in
 * mints a token for the new session after the guard may have set one for the visitor).
 */
export function setXsrfCookie(res: Response): void {
  const earlier = ([] as string[])
    .concat((res.getHeader('set-cookie') as string | string[] | undefined) ?? [])
    .filter((c) => !c.startsWith(`${XSRF_COOKIE}=`));
  if (earlier.length) res.setHeader('set-cookie', earlier);
  else res.removeHeader('set-cookie');
  res.cookie(XSRF_COOKIE, newXsrfToken(res.req), {
    httpOnly: false,
    sameSite: 'lax',
    // Behind a TLS proxy the token travels only over HTTPS, like the session cookie.
    secure: config.tls || (config.TRUST_PROXY === '1' && res.req.secure),
    path: '/',
  });
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Sign-in itself needs no header: there is no session to ride on yet. The customer's page carries
 * its own credential (the token in the link) and uses no session; the payment service's events are
 * signed by the service.
 */
function exempt(req: Request): boolean {
  if (req.method !== 'POST') return false;
  return (
    req.path === '/api/session' ||
    req.path.startsWith('/api/public/') ||
    req.path === '/api/payments/webhook'
  );
}

export const xsrfGuard: RequestHandler = (req, res, next) => {
  const cookie = readCookie(req, XSRF_COOKIE);
  const cookieValid = cookie !== undefined && validToken(req, cookie);
  if (!cookieValid) setXsrfCookie(res);
  if (SAFE.has(req.method) || !req.path.startsWith('/api/') || exempt(req)) return next();
  const header = req.get(XSRF_HEADER);
  // The header must be the cookie's own token, and that token valid for this session (checked once).
  if (!header || header !== cookie || !cookieValid) {
    // A session that ended (idle timeout, signed out elsewhere) leaves the page a token bound to
    // it: say so, so the page asks the person to sign in rather than to reload.
    if (!req.user && readCookie(req, 'stepstock.sid')) {
      return next(new Unauthorized('Your session has ended. Sign in again.'));
    }
    return next(
      new Forbidden(
        'This request is missing its XSRF token. Reload the page and try again.',
        'xsrf_missing',
      ),
    );
  }
  next();
};
