// Sending the estimate and the customer's answer: agreed or turned down from the e-mailed link, or
// agreed by phone or at the counter as recorded by staff. The approval is for one version of the
// estimate: a copy of it is kept, and a cut waits for it when the shop's setting says so.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { Conflict } from '../errors';
import { enqueueMail } from '../mail/outbox';
import { formatMoney } from '../../shared/money';
import type { ApprovalInput, EstimateJson } from '../../shared/api/money';
import { getSettings } from '../settings/settings-service';
import { insertEvent } from '../jobs/jobs-repository';
import * as repo from './estimate-repository';
import { estimateJson, snapshotOf } from './estimate-json';
import { requirePricedJob, syncProposal } from './estimate-service';
import { customerContact } from './customer-contact';
import { estimateMail } from './estimate-mail';
import { newPublicLink, publicPath } from './public-links';
import type { ShopSettings } from '../../shared/settings-schema';

type Conn = Knex;

async function current(trx: Conn, jobId: string, settings: ShopSettings) {
  const est = await repo.lockEstimate(trx, jobId);
  await syncProposal(trx, jobId, est, settings);
  const lines = await repo.linesOf(jobId, trx);
  return { est, lines, json: estimateJson(est, lines, settings) };
}

function refuseEmpty(json: EstimateJson, jobNumber: string): void {
  if (json.lines.length === 0) {
    throw new Conflict(`The estimate of job ${jobNumber} has no lines yet.`, 'estimate_empty');
  }
}

export async function sendEstimate(
  actorId: string,
  jobId: string,
  k: Conn = db,
): Promise<{ state: 'sent' }> {
  const settings = await getSettings(k);
  await k.transaction(async (trx) => {
    const job = await requirePricedJob(trx, jobId);
    const contact = await customerContact(jobId, trx);
    if (!contact?.email) {
      throw new Conflict(
        `Job ${job.number} has no customer e-mail address: add one to the job, or take the approval by phone or at the counter.`,
        'no_email',
      );
    }
    const { est, json } = await current(trx, jobId, settings);
    refuseEmpty(json, job.number);
    if (est.state === 'approved') {
      throw new Conflict(
        `The customer already agreed to this version of the estimate of job ${job.number}.`,
        'already_approved',
      );
    }
    const token = await newPublicLink(trx, jobId);
    const mail = estimateMail({
      shopName: settings.shopName,
      shopHours: settings.shopHours,
      customerName: contact.name,
      jobNumber: job.number,
      estimate: { ...json, state: 'sent' },
      linkPath: publicPath(token),
    });
    await enqueueMail(trx, { to: contact.email, ...mail });
    await repo.updateEstimate(trx, jobId, {
      state: 'sent',
      sent_at: trx.fn.now(),
      decided_at: null,
    });
    await insertEvent(trx, {
      jobId,
      userId: actorId,
      kind: 'system',
      text: `Estimate sent to ${contact.email}: ${formatMoney(json.total, json.currency)} (version ${est.version}).`,
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'estimate.send',
      entity: 'job',
      entityId: jobId,
      after: { version: est.version, total: json.total, to: contact.email },
    });
  });
  return { state: 'sent' };
}

async function approve(
  trx: Conn,
  jobId: string,
  settings: ShopSettings,
  how: 'link' | 'counter' | 'phone',
  by: string | null,
  note: string | null,
): Promise<void> {
  const job = await requirePricedJob(trx, jobId);
  const { est, lines, json } = await current(trx, jobId, settings);
  refuseEmpty(json, job.number);
  await repo.updateEstimate(trx, jobId, {
    state: 'approved',
    decided_at: trx.fn.now(),
    approval_how: how,
    approval_by: by,
    approval_note: note,
    approved_version: est.version,
    approved_snapshot: JSON.stringify(snapshotOf(json, lines)),
    approved_at: trx.fn.now(),
  });
  const where = how === 'link' ? 'from the link' : how === 'phone' ? 'by phone' : 'at the counter';
  await insertEvent(trx, {
    jobId,
    userId: by,
    kind: 'system',
    text: `The customer agreed to the estimate ${where}: ${formatMoney(json.total, json.currency)} (version ${est.version})${note ? `. ${note}` : '.'}`,
  });
  await recordAudit(trx, {
    userId: by,
    action: 'estimate.approve',
    entity: 'job',
    entityId: jobId,
    after: { version: est.version, total: json.total, how, note },
  });
}

/** Staff record an approval the customer gave by phone or at the counter. */
export async function approveAtCounter(
  actorId: string,
  jobId: string,
  input: ApprovalInput,
  k: Conn = db,
): Promise<{ state: 'approved' }> {
  const settings = await getSettings(k);
  await k.transaction((trx) =>
    approve(trx, jobId, settings, input.how ?? 'counter', actorId, input.note ?? null),
  );
  return { state: 'approved' };
}

/** The customer's answer from the link; the same answer twice is answered the same way. */
export async function answerByLink(
  jobId: string,
  answer: 'approve' | 'decline',
  k: Conn = db,
): Promise<{ state: 'approved' | 'declined' }> {
  const settings = await getSettings(k);
  return k.transaction(async (trx) => {
    const job = await requirePricedJob(trx, jobId);
    const est = await repo.lockEstimate(trx, jobId);
    const wanted = answer === 'approve' ? 'approved' : 'declined';
    if (est.state === wanted) return { state: wanted };
    if (est.state === 'draft') {
      throw new Conflict(
        `The shop changed the estimate of job ${job.number} since it was sent; they will send the new one.`,
        'estimate_changed',
      );
    }
    if (answer === 'approve') {
      await approve(trx, jobId, settings, 'link', null, null);
      return { state: 'approved' as const };
    }
    if (est.state === 'approved') {
      throw new Conflict(
        `You already agreed to the estimate of job ${job.number}; please call the shop to change it.`,
        'already_approved',
      );
    }
    await repo.updateEstimate(trx, jobId, { state: 'declined', decided_at: trx.fn.now() });
    await insertEvent(trx, {
      jobId,
      userId: null,
      kind: 'system',
      text: `The customer turned the estimate down from the link (version ${est.version}).`,
    });
    await recordAudit(trx, {
      userId: null,
      action: 'estimate.decline',
      entity: 'job',
      entityId: jobId,
      after: { version: est.version },
    });
    return { state: 'declined' as const };
  });
}

/**
 * Why a cylinder of this job may not be cut yet for want of the customer's approval, or null.
 * Called inside the cut's transaction, after the job row is locked.
 */
export async function whyNotApproved(trx: Conn, jobId: string, jobNumber: string) {
  const settings = await getSettings(trx);
  if (!settings.cutOnlyAfterApproval) return null;
  const est = await repo.findEstimate(jobId, trx);
  if (est?.state === 'approved') return null;
  const where =
    est?.state === 'sent'
      ? 'it was sent and the customer has not answered yet'
      : est?.state === 'declined'
        ? 'the customer turned it down'
        : est && est.version > 1
          ? 'it changed since the last approval'
          : 'it has not been sent yet';
  return `Job ${jobNumber} waits for the customer's approval of the estimate (${where}): nothing is cut before the customer agrees to the price. Send the estimate or record an approval taken by phone or at the counter.`;
}
