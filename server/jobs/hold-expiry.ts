// The expiry sweep: every hold past its expiry released, each with a ledger row and a note on its job.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { logger } from '../logger';
import { recordAudit } from '../audit/audit';
import type { SweepResultJson } from '../../shared/api/jobs';
import * as repo from './holds-repository';
import * as jobsRepo from './jobs-repository';
import { holdName } from './hold-common';
import { releaseInTransaction } from './hold-release';

type Conn = Knex;

/** Holds released per sweep transaction; a backlog is worked off over several rounds. */
const SWEEP_BATCH = 500;

/**
 * Releases every hold past its expiry, each with a ledger row and a note on its job. Only one
 * server process sweeps at a time (an advisory lock); a second caller returns ran: false.
 */
export async function sweepExpiredHolds(
  actorId: string | null = null,
  k: Conn = db,
): Promise<SweepResultJson> {
  let released = 0;
  for (;;) {
    const round = await k.transaction(async (trx) => {
      if (!(await repo.trySweepLock(trx))) return null;
      const expired = await repo.lockExpiredHolds(trx, SWEEP_BATCH);
      for (const { id } of expired) {
        const hold = await repo.lockHold(trx, id);
        const view = await repo.findHold(id, trx);
        if (!hold || !view || hold.released_at) continue;
        await releaseInTransaction(trx, hold, {
          reason: 'expired',
          userId: actorId,
          jobId: hold.job_id,
          ledgerReason: `hold for job ${view.job_number}, cylinder ${hold.cylinder} expired`,
        });
        await jobsRepo.insertEvent(trx, {
          jobId: hold.job_id,
          userId: null,
          kind: 'system',
          text: `The hold on ${holdName(view)} for cylinder ${hold.cylinder} expired and was released back to the shelf.`,
        });
        await recordAudit(trx, {
          userId: actorId,
          action: 'hold.expire',
          entity: 'hold',
          entityId: id,
          before: { jobId: hold.job_id, cylinder: hold.cylinder, expiresAt: hold.expires_at },
        });
      }
      return expired.length;
    });
    if (round === null) return { ran: released > 0, released };
    released += round;
    if (round < SWEEP_BATCH) break;
  }
  if (released > 0) logger.info({ released }, 'expired holds released');
  return { ran: true, released };
}
