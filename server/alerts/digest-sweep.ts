// The daily digest: buyers who chose one message a day get, once a day after the hour below (shop
// time), one e-mail listing the alerts raised since their previous digest. Each day is claimed
// with a row in alert_digest_runs, so two server processes never both send it.
import type { Knex } from 'knex';
import { DateTime } from 'luxon';
import type { Background } from '../background-work';
import { db as defaultDb } from '../db/knex';
import { logger } from '../logger';
import { enqueueMail } from '../mail/outbox';
import { getSettings } from '../settings/settings-service';
import { digestMail } from './alert-mail';
import * as repo from './alerts-repository';

/** The digest goes out from this hour of the shop's day (07:00), before work starts. */
export const DIGEST_HOUR = 7;
const SWEEP_EVERY_MS = 10 * 60_000;

export interface DigestResult {
  day: string;
  /** Buyers whose digest for the day was claimed in this run. */
  claimed: number;
  /** Digests queued (a buyer with nothing new gets none). */
  queued: number;
}

export async function runDigestSweep(
  now: Date = new Date(),
  k: Knex = defaultDb,
): Promise<DigestResult> {
  const settings = await getSettings(k);
  const local = DateTime.fromJSDate(now, { zone: settings.timeZone });
  const day = local.toISODate() ?? '';
  const result: DigestResult = { day, claimed: 0, queued: 0 };
  if (local.hour < DIGEST_HOUR) return result;
  for (const buyer of await repo.digestBuyers(k)) {
    await k.transaction(async (trx) => {
      if (!(await repo.claimDigestDay(trx, buyer.id, day, now))) return;
      result.claimed++;
      const from =
        (await repo.previousDigestEnd(trx, buyer.id, day)) ?? local.minus({ days: 1 }).toJSDate();
      const alerts = await repo.alertsRaisedBetween(from, now, trx);
      await repo.setDigestCount(trx, buyer.id, day, alerts.length);
      if (alerts.length === 0) return;
      await enqueueMail(trx, {
        to: buyer.email,
        ...digestMail(settings.shopName, day, alerts),
        dedupeKey: `alert-digest:${buyer.id}:${day}`,
      });
      result.queued++;
    });
  }
  return result;
}

export function startDigestSweep(): Background {
  let stopped = false;
  let running: Promise<unknown> | null = null;
  const tick = () => {
    if (stopped) return;
    running = runDigestSweep()
      .catch((e: Error) => logger.error({ err: e }, 'alert digest sweep failed'))
      .finally(() => {
        running = null;
      });
  };
  const timer = setInterval(tick, SWEEP_EVERY_MS);
  tick();
  return {
    stop: async () => {
      stopped = true;
      clearInterval(timer);
      await running;
    },
  };
}
