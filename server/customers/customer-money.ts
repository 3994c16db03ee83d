// What each of a customer's jobs comes to, read from its estimate as it stands (a draft is not
// brought in line with the job here: reading a customer never writes). A job with no estimate
// lines has no total yet.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { estimateJson } from '../money/estimate-json';
import * as estimates from '../money/estimate-repository';
import { getSettings } from '../settings/settings-service';
import type { CustomerJobMoneyJson } from '../../shared/api/customers';

export async function jobTotals(
  jobIds: readonly string[],
  k: Knex = db,
): Promise<Map<string, CustomerJobMoneyJson>> {
  const out = new Map<string, CustomerJobMoneyJson>();
  if (jobIds.length === 0) return out;
  const settings = await getSettings(k);
  for (const jobId of jobIds) {
    const est = await estimates.findEstimate(jobId, k);
    if (!est) continue;
    const lines = await estimates.linesOf(jobId, k);
    if (lines.length === 0) continue;
    const json = estimateJson(est, lines, settings);
    out.set(jobId, { total: json.total, currency: json.currency, estimateState: json.state });
  }
  return out;
}
