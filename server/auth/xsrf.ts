// Angular's XSRF convention with a signed double-submit cookie: the server sets XSRF-TOKEN (readable
// by the page), and every mutating /api request must echo it in X-XSRF-TOKEN. The token is signed
// with the session secret so a cookie planted by a sibling domain is refused too.
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler, Response, Request } from 'express';
import { config } from '../config';
import { Forbidden } from '../errors';

export const XSRF_COOKIE = 'XSRF-TOKEN';
export const XSRF_HEADER = 'x-xsrf-token';

function sign(nonce: string): string {
  return createHmac('sha256', config.sessionSecret).update(nonce).digest('base64url');
}

export function newXsrfToken(): string {
  const nonce = randomBytes(18).toString('base64url');
  return `${nonce}.${sign(nonce)}`;
}

function validToken(token: string): boolean {
  const [nonce, mac] = token.split('.');
  if (!nonce || !mac) return false;
  const expected = Buffer.from(sign(nonce));
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

export function setXsrfCookie(res: Response): void {
  res.cookie(XSRF_COOKIE, newXsrfToken(), {
    httpOnly: false,
    sameSite: 'lax',
    // Behind a TLS proxy the token travels only over HTTPS, like the session cookie.
    secure: config.TRUST_PROXY === '1' ? res.req.secure : false,
    path: '/',
  });
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Sign-in itself needs no header: there is no session to ride on yet. */
function exempt(req: Request): boolean {
  return req.method === 'POST' && req.path === '/api/session';
}

export const xsrfGuard: RequestHandler = (req, res, next) => {
  const cookie = readCookie(req, XSRF_COOKIE);
  if (!cookie || !validToken(cookie)) setXsrfCookieOnce(res);
  if (SAFE.has(req.method) || !req.path.startsWith('/api/') || exempt(req)) return next();
  const header = req.get(XSRF_HEADER);
  if (!header || !cookie || header !== cookie || !validToken(header)) {
    return next(
      new Forbidden(
        'This request is missing its XSRF token. Reload the page and try again.',
        'xsrf_missing',
      ),
    );
  }
  next();
};

function setXsrfCookieOnce(res: Response) {
  if (!res.getHeader('set-cookie')?.toString().includes(XSRF_COOKIE)) setXsrfCookie(res);
}
