// The bore sheet's "Done" ticks, kept with the cylinder: how many of its planned passes are done, in
// order. A tick made against an older count (a tablet that was offline, two people at one bar) is
// refused with both counts instead of moving the machinist's place back or forward unseen.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { Conflict } from '../errors';
import type { PassesDoneInput } from '../../shared/api/jobs';
import * as repo from './jobs-repository';
import { lockOpenCylinder } from './jobs-service';

export async function putPassesDone(
  actorId: string,
  jobId: string,
  n: number,
  input: PassesDoneInput,
  k: Knex = db,
): Promise<{ passesDone: number }> {
  return k.transaction(async (trx) => {
    const { job, cylinder } = await lockOpenCylinder(trx, jobId, n);
    if (cylinder.cut_at) {
      throw new Conflict(
        `Cylinder ${n} is already marked as cut; its passes are all behind it.`,
        'already_cut',
      );
    }
    const stored = cylinder.passes_done;
    if (input.done === stored) return { passesDone: stored };
    if (input.basedOn !== undefined && input.basedOn !== stored) {
      throw new Conflict(
        `The passes done on cylinder ${n} of job ${job.number} were changed to ${stored} since this tick was made; compare both and tick again.`,
        'stale_passes',
        {
          stored: { passesDone: stored },
          yours: { basedOn: input.basedOn, passesDone: input.done },
        },
      );
    }
    await repo.updateCylinder(trx, jobId, n, { passes_done: input.done });
    await repo.insertEvent(trx, {
      jobId,
      userId: actorId,
      kind: 'work',
      text: `Cylinder ${n}: ${input.done} ${input.done === 1 ? 'pass' : 'passes'} done.`,
    });
    return { passesDone: input.done };
  });
}
