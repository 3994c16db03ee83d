import type { Router, Request } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { Unauthorized } from '../errors';
import { setXsrfCookie } from '../auth/xsrf';
import { getSettings } from '../settings/settings-service';
import { checkSignIn } from './sign-in-service';
import { atMost } from '../../shared/text-rules';
import type { SessionUser } from '../../shared/session-types';

// The e-mail is normalised here, once: every counter and the account look-up see the same text.
const signInBody = z.object({
  email: z
    .string()
    .check(
      z.maxLength(320, atMost(320)),
      z.trim(),
      z.toLowerCase(),
      z.minLength(1, 'enter your e-mail'),
    ),
  password: z.string().check(z.minLength(1, 'enter your password'), z.maxLength(200, atMost(200))),
});

function logIn(req: Request, user: SessionUser): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, (e) => (e ? reject(e) : resolve())));
}

async function sessionBody(user: SessionUser) {
  const settings = await getSettings();
  return {
    user,
    shop: {
      name: settings.shopName,
      timeZone: settings.timeZone,
      locale: settings.locale,
      currency: settings.homeCurrency,
      labelStock: settings.labelStock,
    },
  };
}

export function registerSessionRoutes(router: Router): void {
  route(router, {
    method: 'post',
    path: '/api/session',
    access: 'public',
    body: signInBody,
    handler: async ({ body, req, res }) => {
      const user = await checkSignIn(req, res, body.email, body.password);
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
