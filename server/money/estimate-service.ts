// The job's estimate: proposed from the job while it is being priced, changed by staff line by line,
// with a discount that needs a reason. Any change after it was sent, approved or declined makes it
// a draft again (a new version that needs a new approval); the approved copy is kept.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import type {
  DiscountInput,
  EstimateJson,
  EstimateLineJson,
  LineInput,
  LinePatch,
} from '../../shared/api/money';
import { compareMoney, fixedMoney } from '../../shared/estimate-math';
import { proposeLines } from '../../shared/estimate-proposal';
import { isOpenState } from '../../shared/api/jobs';
import { getSettings } from '../settings/settings-service';
import * as labourRepo from './labour-repository';
import * as repo from './estimate-repository';
import { estimateJson, lineJson } from './estimate-json';
import type { ShopSettings } from '../../shared/settings-schema';

type Conn = Knex;

interface JobHead {
  id: string;
  number: string;
  state: string;
}

async function jobHead(k: Conn, jobId: string, lock: boolean): Promise<JobHead> {
  const q = k('jobs').where({ id: jobId }).first('id', 'number', 'state');
  const job = (await (lock ? q.forShare() : q)) as JobHead | undefined;
  if (!job) throw new NotFound('That job');
  return job;
}

/** The job, locked against closing, and refused once it is closed. */
export async function requirePricedJob(trx: Conn, jobId: string): Promise<JobHead> {
  const job = await jobHead(trx, jobId, true);
  if (!isOpenState(job.state)) {
    throw new Conflict(
      `Job ${job.number} is closed; its estimate can no longer change.`,
      'job_closed',
    );
  }
  return job;
}

/** Brings the proposed lines of a draft in line with the job (labour for its bores, its holds). */
export async function syncProposal(
  trx: Conn,
  jobId: string,
  est: repo.EstimateRow,
  settings: ShopSettings,
): Promise<void> {
  if (est.state !== 'draft') return;
  const facts = await repo.jobFacts(jobId, trx);
  if (!facts) return;
  const operations = (await labourRepo.listLabour(trx, { activeOnly: true })).map((o) => ({
    id: o.id,
    name: o.name,
    per: o.per,
    price: o.price,
    proposeFor: o.propose_for,
  }));
  const holds = (await repo.activeHolds(jobId, trx)).map((h) => ({
    id: h.id,
    cylinder: h.cylinder,
    partId: h.part_id,
    sku: h.sku,
    description: h.description,
    salePrice: h.sale_price,
    quantity: h.quantity,
  }));
  const dismissed = new Set(est.dismissed_keys);
  const wanted = proposeLines(
    { strokeType: facts.stroke_type, cylinders: facts.cylinders, bored: facts.bored },
    operations,
    holds,
    settings.homeCurrency,
  ).filter((l) => !dismissed.has(l.key));
  const lines = await repo.linesOf(jobId, trx);
  const byKey = new Map(lines.filter((l) => l.auto_key).map((l) => [l.auto_key as string, l]));
  const wantedKeys = new Set(wanted.map((w) => w.key));
  await repo.deleteLines(
    trx,
    lines.filter((l) => l.auto_key && !wantedKeys.has(l.auto_key)).map((l) => l.id),
  );
  for (const [i, w] of wanted.entries()) {
    const have = byKey.get(w.key);
    if (!have) {
      await repo.insertLine(trx, {
        job_id: jobId,
        kind: w.kind,
        description: w.description,
        quantity: w.quantity,
        unit_price: w.unitPrice,
        auto_key: w.key,
        labour_operation_id: w.labourOperationId,
        part_id: w.partId,
        position: i + 1,
      });
    } else if (
      have.description !== w.description ||
      compareMoney(have.quantity, w.quantity) !== 0 ||
      compareMoney(have.unit_price, w.unitPrice) !== 0
    ) {
      await repo.updateLine(trx, have.id, {
        description: w.description,
        quantity: w.quantity,
        unit_price: w.unitPrice,
      });
    }
  }
}

/** The estimate as it stands; a draft of an open job is first brought in line with the job. */
export async function getEstimate(jobId: string, k: Conn = db): Promise<EstimateJson> {
  const settings = await getSettings(k);
  return k.transaction(async (trx) => {
    const job = await jobHead(trx, jobId, true);
    if (!isOpenState(job.state)) {
      const est = await repo.findEstimate(jobId, trx);
      return estimateJson(est ?? null, est ? await repo.linesOf(jobId, trx) : [], settings);
    }
    const est = await repo.lockEstimate(trx, jobId);
    await syncProposal(trx, jobId, est, settings);
    return estimateJson(est, await repo.linesOf(jobId, trx), settings);
  });
}

/** A change to the lines: a sent, approved or declined estimate becomes a new draft version. */
export async function markChanged(trx: Conn, est: repo.EstimateRow): Promise<void> {
  if (est.state === 'draft') return;
  await repo.updateEstimate(trx, est.job_id, {
    state: 'draft',
    version: est.version + 1,
    sent_at: null,
    decided_at: null,
    approval_how: null,
    approval_by: null,
    approval_note: null,
  });
}

async function editing<T>(
  k: Conn,
  jobId: string,
  work: (trx: Knex.Transaction, est: repo.EstimateRow, settings: ShopSettings) => Promise<T>,
): Promise<T> {
  const settings = await getSettings(k);
  return k.transaction(async (trx) => {
    await requirePricedJob(trx, jobId);
    const est = await repo.lockEstimate(trx, jobId);
    await syncProposal(trx, jobId, est, settings);
    const result = await work(trx, est, settings);
    await markChanged(trx, est);
    return result;
  });
}

export async function addLine(
  actorId: string,
  jobId: string,
  input: LineInput,
  k: Conn = db,
): Promise<EstimateLineJson> {
  return editing(k, jobId, async (trx, _est, settings) => {
    const line = await repo.insertLine(trx, {
      job_id: jobId,
      kind: 'other',
      description: input.description,
      quantity: input.quantity,
      unit_price: fixedMoney(input.unitPrice, settings.homeCurrency),
      auto_key: null,
      labour_operation_id: null,
      part_id: null,
    });
    await audit(trx, actorId, jobId, 'estimate.line.add', undefined, line);
    return lineJson(line, settings.homeCurrency);
  });
}

export async function patchLine(
  actorId: string,
  jobId: string,
  lineId: string,
  patch: LinePatch,
  k: Conn = db,
): Promise<EstimateLineJson> {
  return editing(k, jobId, async (trx, _est, settings) => {
    const before = await repo.findLine(trx, jobId, lineId);
    if (!before) throw new NotFound('That estimate line');
    if (before.unit_price.startsWith('-')) {
      throw new Conflict('A discount cannot be edited; remove it and give a new one.', 'discount');
    }
    // A proposed line edited by hand is the staff's from now on: never proposed again.
    if (before.auto_key) await repo.dismissKey(trx, jobId, before.auto_key);
    const line = await repo.updateLine(trx, lineId, {
      auto_key: null,
      ...(patch.description !== undefined ? { description: patch.description } : {}),
      ...(patch.quantity !== undefined ? { quantity: patch.quantity } : {}),
      ...(patch.unitPrice !== undefined
        ? { unit_price: fixedMoney(patch.unitPrice, settings.homeCurrency) }
        : {}),
    });
    await audit(trx, actorId, jobId, 'estimate.line.change', before, line);
    return lineJson(line, settings.homeCurrency);
  });
}

export async function removeLine(
  actorId: string,
  jobId: string,
  lineId: string,
  k: Conn = db,
): Promise<void> {
  await editing(k, jobId, async (trx) => {
    const before = await repo.findLine(trx, jobId, lineId);
    if (!before) throw new NotFound('That estimate line');
    if (before.auto_key) await repo.dismissKey(trx, jobId, before.auto_key);
    await repo.deleteLines(trx, [lineId]);
    await audit(trx, actorId, jobId, 'estimate.line.remove', before, undefined);
  });
}

export async function addDiscount(
  actorId: string,
  jobId: string,
  input: DiscountInput,
  k: Conn = db,
): Promise<EstimateLineJson> {
  return editing(k, jobId, async (trx, est, settings) => {
    const current = estimateJson(est, await repo.linesOf(jobId, trx), settings);
    const amount = fixedMoney(input.amount, settings.homeCurrency);
    if (compareMoney(amount, current.subtotal) > 0) {
      throw new BadRequest(
        `amount: a discount of ${amount} is more than the estimate's subtotal of ${current.subtotal}.`,
        [{ field: 'amount', message: `more than the subtotal (${current.subtotal})` }],
      );
    }
    const line = await repo.insertLine(trx, {
      job_id: jobId,
      kind: 'other',
      description: `Discount: ${input.reason}`,
      quantity: '1',
      unit_price: `-${amount}`,
      auto_key: null,
      labour_operation_id: null,
      part_id: null,
      position: 100000,
    });
    await audit(trx, actorId, jobId, 'estimate.discount', undefined, line);
    return lineJson(line, settings.homeCurrency);
  });
}

async function audit(
  trx: Conn,
  userId: string,
  jobId: string,
  action: string,
  before: unknown,
  after: unknown,
): Promise<void> {
  await recordAudit(trx, { userId, action, entity: 'job', entityId: jobId, before, after });
}
