// The customer's page for one job, opened from the e-mailed link without signing in: the shop, the
// job's number and state in plain words, the estimate as it stands, and the payments asked for.
// Reading it never changes the estimate (no proposal runs here).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { NotFound } from '../errors';
import { CUSTOMER_JOB_WORDS, type PublicJobJson } from '../../shared/api/money';
import { JOB_STATE_LABELS, type JobState } from '../../shared/api/jobs';
import { getSettings } from '../settings/settings-service';
import * as repo from './estimate-repository';
import { estimateJson } from './estimate-json';
import { jobOfLink } from './public-links';
import { publicPayments } from './public-payments';

export async function publicJob(token: string, k: Knex = db): Promise<PublicJobJson> {
  const jobId = await jobOfLink(token, k);
  const settings = await getSettings(k);
  const job = await k('jobs').where({ id: jobId }).first('number', 'state', 'cylinders');
  if (!job) throw new NotFound('That link');
  const est = await repo.findEstimate(jobId, k);
  const lines = est ? await repo.linesOf(jobId, k) : [];
  const estimate = estimateJson(est ?? null, lines, settings);
  // The customer never sees who at the shop took an approval.
  if (estimate.approval) estimate.approval = { ...estimate.approval, by: null };
  const state = job.state as JobState;
  return {
    shop: { name: settings.shopName, hours: settings.shopHours },
    job: {
      number: job.number as string,
      state,
      stateText: `${JOB_STATE_LABELS[state]}. ${CUSTOMER_JOB_WORDS[state] ?? ''}`.trim(),
      cylinders: job.cylinders as number,
    },
    estimate,
    payments: await publicPayments(jobId, settings.homeCurrency, k),
  };
}
