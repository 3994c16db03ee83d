// Job rules: intake, the list and the board, state changes, notes, handing back (collect) and
// calling off (cancel). One transaction per use case; holds are ended with the job.
import type { Knex } from 'knex';
import { DateTime } from 'luxon';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, Forbidden, NotFound } from '../errors';
import { faultPoint } from '../testing-faults';
import { getSettings } from '../settings/settings-service';
import { issueAtCost } from '../../shared/average-cost';
import type { LengthUnit } from '../../shared/lengths';
import type { Role } from '../../shared/session-types';
import {
  isOpenState,
  JOB_STATE_LABELS,
  type JobInput,
  type JobJson,
  type JobListItemJson,
  type JobPatch,
  type JobState,
} from '../../shared/api/jobs';
import * as repo from './jobs-repository';
import { findOrCreateForJob, requireLiveCustomer } from '../customers/customers-service';
import { updateCustomer as updateCustomerFields } from '../customers/customers-repository';
import { checkLink } from '../customers/cylinders-service';
import * as holdsRepo from './holds-repository';
import { releaseInTransaction } from './hold-release';
import { whyNotReadyToCut } from './job-state';
import { whyNotApproved } from '../money/approval-service';
import { issueInvoice } from '../money/invoice-service';
import { settleCalledOff } from '../money/refund-service';
import {
  cylinderJson,
  eventJson,
  holdJson,
  jobFamilyJson,
  jobListItemJson,
  photoJson,
} from './jobs-json';
import * as moves from '../stock/stock-movements';
import type { Page } from '../../shared/api/common';
import { allows } from '../../shared/access';

type Conn = Knex;

/** The shop's calendar date now, for "overdue". */
export async function shopToday(k: Conn = db): Promise<string> {
  const { timeZone } = await getSettings(k);
  const now = DateTime.now().setZone(timeZone);
  return (now.isValid ? now : DateTime.utc()).toISODate() as string;
}

export async function requireOpenJob(trx: Conn, id: string, mode: 'change' | 'share') {
  const job = await repo.lockJob(trx, id, mode);
  if (!job) throw new NotFound('That job');
  if (!isOpenState(job.state)) {
    throw new Conflict(
      `Job ${job.number} is ${JOB_STATE_LABELS[job.state].toLowerCase()}; it can no longer change.`,
      'job_closed',
    );
  }
  return job;
}

export function requireCylinder(job: { number: string; cylinders: number }, n: number): void {
  if (n > job.cylinders) {
    throw new NotFound(`Cylinder ${n} of job ${job.number} (it has ${job.cylinders})`);
  }
}

/**
 * Locks an open job and one of its cylinders for a change: not found when either is missing, a
 * conflict when the job is closed.
 */
export async function lockOpenCylinder(trx: Conn, jobId: string, n: number) {
  const job = await requireOpenJob(trx, jobId, 'change');
  requireCylinder(job, n);
  const cylinder = await repo.lockCylinder(trx, jobId, n);
  if (!cylinder) throw new NotFound(`Cylinder ${n} of job ${job.number}`);
  return { job, cylinder };
}

// ---- Intake -----------------------------------------------------------------------------------

export async function createJob(
  actorId: string,
  input: JobInput,
  unit: LengthUnit,
  k: Conn = db,
): Promise<JobJson> {
  const family = await repo.findFamily(input.familyId, k);
  if (!family) {
    throw new BadRequest('familyId: no engine family has this id.', [
      { field: 'familyId', message: 'no engine family has this id' },
    ]);
  }
  if (!family.active) {
    throw new BadRequest(`familyId: ${family.code} is no longer in use; choose another family.`, [
      { field: 'familyId', message: `${family.code} is no longer in use` },
    ]);
  }
  if (input.cylinders > family.cylinders) {
    const message = `${family.code} has ${family.cylinders} cylinder${family.cylinders === 1 ? '' : 's'}; a job cannot bring more`;
    throw new BadRequest(`cylinders: ${message}.`, [{ field: 'cylinders', message }]);
  }
  const id = await k.transaction(async (trx) => {
    const customerId =
      input.customerId !== undefined
        ? (await requireLiveCustomer(trx, input.customerId, 'customerId')).id
        : await findOrCreateForJob(trx, {
            name: input.customerName ?? '',
            phone: input.customerPhone ?? null,
            email: input.customerEmail ?? null,
          });
    const cylinderIds = input.cylinderIds ?? [];
    const marks: string[] = [];
    for (const [i, cylinderId] of cylinderIds.entries()) {
      if (cylinderId === null) continue;
      if (cylinderIds.indexOf(cylinderId) !== i) {
        const message = `the same cylinder is listed as cylinder ${cylinderIds.indexOf(cylinderId) + 1} and ${i + 1}`;
        throw new BadRequest(`cylinderIds.${i}: ${message}.`, [
          { field: `cylinderIds.${i}`, message },
        ]);
      }
      const job = { id: null, number: 'this job', customer_id: customerId, family_id: family.id };
      marks.push(await checkLink(trx, job, i + 1, cylinderId, `cylinderIds.${i}`));
    }
    const created = await repo.insertJob(
      trx,
      {
        customer_id: customerId,
        family_id: family.id,
        cylinders: input.cylinders,
        asked_for: input.askedFor ?? '',
        due_date: input.dueDate ?? null,
        notes: input.notes ?? '',
        notify_customer: input.notifyCustomer ?? true,
        created_by: actorId,
      },
      cylinderIds,
    );
    await repo.insertEvent(trx, {
      jobId: created.id,
      userId: actorId,
      kind: 'state',
      text: `Booked in: ${input.cylinders} cylinder${input.cylinders === 1 ? '' : 's'} of ${family.code}${marks.length > 0 ? ` (marked ${marks.join(', ')})` : ''}.`,
    });
    return created.id;
  });
  return getJob(id, unit, k);
}

// ---- Reading jobs -----------------------------------------------------------------------------

export type JobListQuery = Omit<repo.JobFilter, 'today'>;

export async function listJobs(query: JobListQuery, k: Conn = db): Promise<Page<JobListItemJson>> {
  const today = await shopToday(k);
  const { rows, total } = await repo.listJobs({ ...query, today }, k);
  return { items: rows.map(jobListItemJson), total };
}

export async function getJob(id: string, unit: LengthUnit, k: Conn = db): Promise<JobJson> {
  const job = await repo.findJob(id, k);
  if (!job) throw new NotFound('That job');
  const today = await shopToday(k);
  const [family, cylinders, readings, allHolds, photos, events, flags] = await Promise.all([
    repo.findFamily(job.family_id, k),
    repo.cylindersOf(id, k),
    repo.readingsOf(id, k),
    holdsRepo.holdsOfJob(id, { activeOnly: false }, k),
    repo.photosOf(id, k),
    repo.eventsOf(id, k),
    repo.jobListRow(id, today, k),
  ]);
  if (!family) throw new NotFound("That job's engine family");
  // What the job holds now, or what went out with it once handed back.
  const holds = allHolds.filter((h) => h.released_at === null || h.release_reason === 'issued');
  return {
    id: job.id,
    number: job.number,
    state: job.state,
    customerId: job.customer_id,
    customerName: job.customer_name,
    customerPhone: job.customer_phone,
    customerEmail: job.customer_email,
    family: jobFamilyJson(family),
    cylinders: job.cylinders,
    askedFor: job.asked_for,
    dueDate: job.due_date,
    overdue: flags.overdue,
    waitingForParts: flags.waiting_for_parts,
    waitingFor: flags.waiting_for,
    pistonsHeld: flags.pistons_held,
    cylindersCut: flags.cylinders_cut,
    awaitingApproval: flags.awaiting_approval,
    notes: job.notes,
    notifyCustomer: job.notify_customer,
    createdBy: job.created_by_name,
    createdAt: job.created_at.toISOString(),
    updatedAt: job.updated_at.toISOString(),
    stateChangedAt: job.state_changed_at.toISOString(),
    closedAt: job.closed_at ? job.closed_at.toISOString() : null,
    cylinderDetails: cylinders.map((c) => cylinderJson(c, family, readings, holds, unit)),
    holds: holds.map(holdJson),
    photos: photos.map(photoJson),
    events: events.map(eventJson),
  };
}

// ---- Changing a job ---------------------------------------------------------------------------

export async function patchJob(
  actor: { id: string; role: Role },
  id: string,
  patch: JobPatch,
  unit: LengthUnit,
  k: Conn = db,
): Promise<JobJson> {
  if (patch.state !== undefined && !allows(actor.role, 'moveJobs')) {
    throw new Forbidden('Only a machinist or the owner moves a job through the workshop.');
  }
  await k.transaction(async (trx) => {
    const job = await requireOpenJob(trx, id, 'change');
    const changes: Record<string, unknown> = {};
    // The job's customer fields are the customer's: changing them here changes the record (and
    // so every job of that customer reads the new details).
    const customer: Record<string, unknown> = {};
    if (patch.customerName !== undefined) customer.name = patch.customerName;
    if (patch.customerPhone !== undefined) customer.phone = patch.customerPhone;
    if (patch.customerEmail !== undefined) {
      customer.email = patch.customerEmail === null ? null : patch.customerEmail.toLowerCase();
    }
    if (Object.keys(customer).length > 0) {
      await requireLiveCustomer(trx, job.customer_id);
      await updateCustomerFields(trx, job.customer_id, customer);
    }
    if (patch.askedFor !== undefined) changes.asked_for = patch.askedFor;
    if (patch.dueDate !== undefined) changes.due_date = patch.dueDate;
    if (patch.notes !== undefined) changes.notes = patch.notes;
    if (patch.notifyCustomer !== undefined) changes.notify_customer = patch.notifyCustomer;
    if (Object.keys(changes).length > 0) await repo.updateJob(trx, id, changes);

    if (patch.state !== undefined && patch.state !== job.state) {
      if (patch.state === 'parts_set_aside' || patch.state === 'on_the_bar') {
        const why = await whyNotReadyToCut(trx, id);
        if (why) throw new Conflict(why, 'not_held');
      }
      if (patch.state === 'on_the_bar') {
        const why = await whyNotApproved(trx, id, job.number);
        if (why) throw new Conflict(why, 'not_approved');
      }
      await repo.setJobState(trx, id, patch.state);
      await repo.insertEvent(trx, {
        jobId: id,
        userId: actor.id,
        kind: 'state',
        text: `${JOB_STATE_LABELS[job.state]} → ${JOB_STATE_LABELS[patch.state]}.`,
      });
    }
    if (patch.notifyCustomer !== undefined && patch.notifyCustomer !== job.notify_customer) {
      await repo.insertEvent(trx, {
        jobId: id,
        userId: actor.id,
        kind: 'note',
        text: patch.notifyCustomer
          ? 'The customer will be told when the job is ready.'
          : 'The customer asked not to be contacted about this job.',
      });
    }
  });
  return getJob(id, unit, k);
}

export async function addNote(
  actorId: string,
  id: string,
  text: string,
  unit: LengthUnit,
  k: Conn = db,
): Promise<JobJson> {
  await k.transaction(async (trx) => {
    const job = await repo.lockJob(trx, id, 'share');
    if (!job) throw new NotFound('That job');
    await repo.insertEvent(trx, { jobId: id, userId: actorId, kind: 'note', text });
  });
  return getJob(id, unit, k);
}

// ---- Closing a job ----------------------------------------------------------------------------

/** The last step of handing back or calling off: the state, the job's event and the audit row. */
async function closeJob(
  trx: Conn,
  actorId: string,
  job: { id: string; state: JobState },
  close: {
    action: string;
    state: 'handed_back' | 'called_off';
    text: string;
    after: Record<string, unknown>;
  },
): Promise<void> {
  await repo.setJobState(trx, job.id, close.state);
  await repo.insertEvent(trx, { jobId: job.id, userId: actorId, kind: 'state', text: close.text });
  await recordAudit(trx, {
    userId: actorId,
    action: close.action,
    entity: 'job',
    entityId: job.id,
    before: { state: job.state },
    after: { state: close.state, ...close.after },
  });
}

/**
 * Hands the job back: every part held for it is issued (a ledger 'issue' row at the part's sale
 * price and its current moving average cost), the pistons leave the shelf, and the job closes.
 */
export async function collectJob(
  actorId: string,
  id: string,
  unit: LengthUnit,
  k: Conn = db,
): Promise<JobJson> {
  await k.transaction(async (trx) => {
    const job = await requireOpenJob(trx, id, 'change');
    const holds = await holdsRepo.lockActiveHoldsOfJob(trx, id);
    const parts = await holdsRepo.partsByIds([...new Set(holds.map((h) => h.part_id))], trx);
    const issued: string[] = [];
    for (const hold of holds) {
      const part = parts.find((p) => p.id === hold.part_id);
      if (!part) throw new Error(`part ${hold.part_id} of hold ${hold.id} is missing`);
      if (hold.unit_id && !(await holdsRepo.issueUnit(trx, hold.unit_id))) {
        throw new Error(`piston unit ${hold.unit_id} of hold ${hold.id} is not held`);
      }
      // The levels row is locked by this update, so the average cost read next is the one the
      // part has at the moment of issue (a receipt changes it only under the same lock).
      const after = await moves.changeLevels(trx, part.id, {
        onHand: -hold.quantity,
        held: -hold.quantity,
      });
      const { average_cost: averageCost } = (await holdsRepo.holdPart(part.id, trx)) ?? part;
      const cost = issueAtCost(
        { quantity: after.on_hand + hold.quantity, averageCost },
        hold.quantity,
      );
      await moves.insertLedger(trx, [
        {
          user_id: actorId,
          part_id: part.id,
          unit_id: hold.unit_id,
          kind: 'issue',
          quantity: -hold.quantity,
          held_delta: -hold.quantity,
          unit_cost: cost.averageCost,
          sale_price: part.sale_price,
          job_id: id,
          reason: `handed back with job ${job.number}, cylinder ${hold.cylinder}`,
          ref: hold.id,
        },
      ]);
      await holdsRepo.endHold(trx, hold.id, 'issued', actorId);
      issued.push(hold.quantity === 1 ? part.sku : `${part.sku} ×${hold.quantity}`);
    }
    faultPoint('jobs.collect.afterIssue');
    // The invoice charges what was just issued; a balance still owed does not stop the hand-back.
    const invoice = await issueInvoice(trx, actorId, id);
    await closeJob(trx, actorId, job, {
      action: 'job.collect',
      state: 'handed_back',
      text:
        issued.length > 0
          ? `Handed back. Issued: ${issued.join(', ')}.`
          : 'Handed back. No parts were held, so none were issued.',
      after: { issuedHolds: holds.map((h) => h.id), invoice: invoice.number },
    });
  });
  return getJob(id, unit, k);
}

/**
 * Calls the job off: every hold is released back to the shelf, paid deposits are refunded and unpaid
 * payment links withdrawn, then the job closes.
 */
export async function cancelJob(
  actorId: string,
  id: string,
  unit: LengthUnit,
  k: Conn = db,
): Promise<JobJson> {
  await k.transaction(async (trx) => {
    const job = await requireOpenJob(trx, id, 'change');
    const holds = await holdsRepo.lockActiveHoldsOfJob(trx, id);
    for (const hold of holds) {
      await releaseInTransaction(trx, hold, {
        reason: 'cancelled',
        userId: actorId,
        jobId: id,
        ledgerReason: `job ${job.number} called off`,
      });
    }
    const settled = await settleCalledOff(trx, actorId, job);
    await closeJob(trx, actorId, job, {
      action: 'job.cancel',
      state: 'called_off',
      text: [
        holds.length > 0
          ? `Called off. Released ${holds.length} hold${holds.length === 1 ? '' : 's'} back to the shelf.`
          : 'Called off.',
        ...settled.map((t) => `${t}.`),
      ].join(' '),
      after: { releasedHolds: holds.map((h) => h.id) },
    });
  });
  return getJob(id, unit, k);
}
