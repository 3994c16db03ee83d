// The customer's page for a job, without signing in: the token in the link is the credential (no
// session, no XSRF cookie), so each address is rate-limited against guessing.
import type { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { TooManyRequests } from '../errors';
import * as publicPage from './public-service';
import { answerByLink } from './approval-service';
import { jobOfLink } from './public-links';

const tokenParams = z.object({ token: z.string().check(z.maxLength(200)) });

function limiter(limit: number) {
  return rateLimit({
    windowMs: 60_000,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(new TooManyRequests('Too many tries from this address; wait a minute and try again.')),
  });
}

export function registerPublicRoutes(router: Router): void {
  const reads = limiter(120);
  const answers = limiter(30);
  route(router, {
    method: 'get',
    path: '/api/public/jobs/:token',
    access: 'public',
    before: [reads],
    params: tokenParams,
    handler: ({ params }) => publicPage.publicJob(params.token),
  });
  for (const answer of ['approve', 'decline'] as const) {
    route(router, {
      method: 'post',
      path: `/api/public/jobs/:token/${answer}`,
      access: 'public',
      before: [answers],
      params: tokenParams,
      body: z.strictObject({}),
      handler: async ({ params }) => answerByLink(await jobOfLink(params.token), answer),
    });
  }
}
