import type { Router, Request } from 'express';
import { z } from 'zod';
import passport from 'passport';
import { route } from '../http/route';
import { TooManyRequests, Unauthorized } from '../errors';
import { setXsrfCookie } from '../auth/xsrf';
import { clearFailures, countRecentFailures, recordFailure } from '../users/users-repository';
import { getSettings } from '../settings/settings-service';
import type { SessionUser } from '../../shared/session-types';

// Throttling: at most this many failed sign-ins per account and address in the window.
export const MAX_FAILURES = 10;
export const FAILURE_WINDOW_MINUTES = 15;

const signInBody = z.object({
  email: z.string().trim().min(1, 'enter your e-mail').max(320),
  password: z.string().min(1, 'enter your password').max(200),
});

function authenticate(req: Request): Promise<SessionUser | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', (err: unknown, user: SessionUser | false) =>
      err ? reject(err) : resolve(user),
    )(req);
  });
}

function logIn(req: Request, user: SessionUser): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, (e) => (e ? reject(e) : resolve())));
}

async function sessionBody(user: SessionUser) {
  const settings = await getSettings();
  return { user, shop: { name: settings.shopName, timeZone: settings.timeZone } };
}

export function registerSessionRoutes(router: Router): void {
  route(router, {
    method: 'post',
    path: '/api/session',
    access: 'public',
    body: signInBody,
    handler: async ({ body, req, res }) => {
      const address = req.ip ?? 'unknown';
      if (
        (await countRecentFailures(body.email, address, FAILURE_WINDOW_MINUTES)) >= MAX_FAILURES
      ) {
        throw new TooManyRequests(
          `Too many failed sign-ins for this account from this address. Wait ${FAILURE_WINDOW_MINUTES} minutes or ask the owner to reset the password.`,
        );
      }
      const user = await authenticate(req);
      if (!user) {
        await recordFailure(body.email, address);
        throw new Unauthorized('Wrong e-mail or password, or the account is deactivated.');
      }
      await clearFailures(body.email, address);
      // passport 0.7 regenerates the session in logIn: a fresh id at sign-in defeats fixation.
      await logIn(req, user);
      setXsrfCookie(res);
      return sessionBody(user);
    },
  });

  route(router, {
    method: 'get',
    path: '/api/session',
    access: 'public',
    // The XSRF-TOKEN cookie is set by the XSRF guard whenever the request has no valid one.
    handler: async ({ req }) => {
      const user = req.user as SessionUser | undefined;
      if (!user) throw new Unauthorized('Not signed in.');
      return sessionBody(user);
    },
  });

  route(router, {
    method: 'delete',
    path: '/api/session',
    access: 'public',
    handler: async ({ req, res }) => {
      await new Promise<void>((resolve) => req.logout(() => resolve()));
      await new Promise<void>((resolve) => req.session?.destroy(() => resolve()) ?? resolve());
      res.clearCookie('stepstock.sid');
      return undefined;
    },
  });
}
