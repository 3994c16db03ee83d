// What placing, releasing, moving and sweeping holds share: the locks on the job and the hold, the
// cylinder look-up, the answer, and turning a refusal of the shared hold rule into its 400 or 409.
import type { Knex } from 'knex';
import { BadRequest, Conflict, NotFound } from '../errors';
import { toLengthJson } from '../../shared/lengths';
import type { HoldRefusal } from '../../shared/hold-rules';
import {
  JOB_STATE_LABELS,
  isOpenState,
  type HoldJson,
  type ProposedUnitJson,
} from '../../shared/api/jobs';
import * as repo from './holds-repository';
import * as jobsRepo from './jobs-repository';
import { holdJson } from './jobs-json';

type Conn = Knex;

export const DAY_MS = 24 * 60 * 60 * 1000;

export function proposedJson(row: repo.FreeUnitRow): ProposedUnitJson {
  return {
    id: row.id,
    label: row.label,
    partId: row.part_id,
    sku: row.sku,
    skirt: toLengthJson(row.skirt_nm),
    bin: row.bin_code,
    stepLabel: row.step_label,
  };
}

export async function requireHoldJob(
  trx: Conn,
  jobId: string,
  mode: 'share' | 'change',
): Promise<repo.HoldJobRow> {
  const job = await repo.lockJobForHolds(trx, jobId, mode);
  if (!job) throw new NotFound('That job');
  if (!isOpenState(job.state)) {
    throw new Conflict(
      `Job ${job.number} is ${JOB_STATE_LABELS[job.state].toLowerCase()}; nothing more can be held for it.`,
      'job_closed',
    );
  }
  return job;
}

export async function requireCylinderRow(
  trx: Conn,
  job: { id: string; number: string; cylinders: number },
  n: number,
) {
  if (n > job.cylinders) {
    throw new NotFound(`Cylinder ${n} of job ${job.number} (it has ${job.cylinders})`);
  }
  const cylinder = (await jobsRepo.cylindersOf(job.id, trx)).find((c) => c.n === n);
  if (!cylinder) throw new NotFound(`Cylinder ${n} of job ${job.number}`);
  return cylinder;
}

export async function holdOut(id: string, k: Conn): Promise<HoldJson> {
  const row = await repo.findHold(id, k);
  if (!row) throw new NotFound('The hold');
  return holdJson(row);
}

export async function lockActiveHold(trx: Conn, id: string) {
  const hold = await repo.lockHold(trx, id);
  if (!hold) throw new NotFound('That hold');
  if (hold.released_at) {
    const ended = await repo.findHold(id, trx);
    throw new Conflict(
      `That hold has already ended (${ended?.release_reason ?? 'released'}); nothing is held by it now.`,
      'hold_ended',
    );
  }
  return hold;
}

export function holdName(row: repo.HoldRow): string {
  return row.unit_label ?? (row.quantity === 1 ? row.sku : `${row.quantity} × ${row.sku}`);
}

/** Throws the shared hold rule's refusal as the API's error. */
export function refuse(r: HoldRefusal | null): void {
  if (!r) return;
  if (r.status === 400)
    throw new BadRequest(`${r.field}: ${r.message}.`, [{ field: r.field, message: r.message }]);
  throw new Conflict(r.message, r.code);
}
