// Customer rules: the record, search, finding the customer an old-style job names, merging two
// records of one person, and erasing a customer's personal data on request while their jobs, the
// stock ledger and invoices stay whole. One transaction per use case; merge and erase are audited
// with ids and counts only, so the audit trail never keeps what erasure removes.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import {
  ERASED_NAME_PREFIX,
  type CustomerInput,
  type CustomerJobJson,
  type CustomerJson,
  type CustomerListItemJson,
  type CustomerPatch,
} from '../../shared/api/customers';
import * as repo from './customers-repository';
import { jobTotals } from './customer-money';
import { forgetAddress } from '../mail/outbox';
import type { Page } from '../../shared/api/common';

type Conn = Knex;

export function listItemJson(c: repo.CustomerRow): CustomerListItemJson {
  return {
    id: c.id,
    name: c.name,
    phone: c.phone,
    email: c.email,
    acceptsEmail: c.accepts_email,
  };
}

export function jobItemJson(
  j: repo.CustomerJobRow,
  money: CustomerJobJson['money'] = null,
): CustomerJobJson {
  return {
    id: j.id,
    number: j.number,
    state: j.state,
    familyCode: j.family_code,
    cylinders: j.cylinders,
    askedFor: j.asked_for,
    dueDate: j.due_date,
    createdAt: j.created_at.toISOString(),
    closedAt: j.closed_at ? j.closed_at.toISOString() : null,
    money,
  };
}

export async function searchCustomers(
  query: { q?: string; page: number; pageSize: number },
  k: Conn = db,
): Promise<Page<CustomerListItemJson>> {
  const { rows, total } = await repo.searchCustomers(query, k);
  return { items: rows.map(listItemJson), total };
}

export async function getCustomer(id: string, k: Conn = db): Promise<CustomerJson> {
  const c = await repo.findCustomer(id, k);
  if (!c) throw new NotFound('That customer');
  const jobs = await repo.jobsOfCustomer(id, k);
  const totals = await jobTotals(
    jobs.map((j) => j.id),
    k,
  );
  return {
    ...listItemJson(c),
    notes: c.notes,
    erasedAt: c.erased_at ? c.erased_at.toISOString() : null,
    createdAt: c.created_at.toISOString(),
    updatedAt: c.updated_at.toISOString(),
    jobs: jobs.map((j) => jobItemJson(j, totals.get(j.id) ?? null)),
  };
}

export async function insertCustomerInTransaction(
  trx: Conn,
  input: CustomerInput,
): Promise<string> {
  return repo.insertCustomer(trx, {
    name: input.name,
    phone: input.phone ?? null,
    email: input.email ?? null,
    accepts_email: input.acceptsEmail ?? true,
    notes: input.notes ?? '',
  });
}

export async function createCustomer(
  actorId: string,
  input: CustomerInput,
  k: Conn = db,
): Promise<CustomerJson> {
  const id = await k.transaction(async (trx) => {
    const created = await insertCustomerInTransaction(trx, input);
    await recordAudit(trx, {
      userId: actorId,
      action: 'customer.create',
      entity: 'customer',
      entityId: created,
    });
    return created;
  });
  return getCustomer(id, k);
}

/** A job typed the old way: the customer of that name and contact, or a new one. */
export async function findOrCreateForJob(
  trx: Conn,
  c: { name: string; phone: string | null; email: string | null },
): Promise<string> {
  const found = await repo.findByContact(c, trx);
  if (found) {
    // A detail the customer did not have yet is added; one they had stays.
    const add: Record<string, unknown> = {};
    if (found.phone === null && c.phone !== null) add.phone = c.phone;
    if (found.email === null && c.email !== null) add.email = c.email.toLowerCase();
    if (Object.keys(add).length > 0) await repo.updateCustomer(trx, found.id, add);
    return found.id;
  }
  return insertCustomerInTransaction(trx, {
    name: c.name,
    phone: c.phone,
    email: c.email === null ? null : c.email.toLowerCase(),
  });
}

export async function requireLiveCustomer(
  trx: Conn,
  id: string,
  field?: string,
): Promise<repo.CustomerRow> {
  const c = await repo.lockCustomer(trx, id);
  if (!c) {
    if (field) {
      throw new BadRequest(`${field}: no customer has this id.`, [
        { field, message: 'no customer has this id' },
      ]);
    }
    throw new NotFound('That customer');
  }
  if (c.erased_at) {
    throw new Conflict(
      `This customer's personal data was erased on ${c.erased_at.toISOString().slice(0, 10)}; it cannot be changed or used for new work. Start a new customer.`,
      'erased',
    );
  }
  return c;
}

export async function patchCustomer(
  actorId: string,
  id: string,
  patch: CustomerPatch,
  k: Conn = db,
): Promise<CustomerJson> {
  await k.transaction(async (trx) => {
    await requireLiveCustomer(trx, id);
    const changes: Record<string, unknown> = {};
    if (patch.name !== undefined) changes.name = patch.name;
    if (patch.phone !== undefined) changes.phone = patch.phone;
    if (patch.email !== undefined) changes.email = patch.email;
    if (patch.acceptsEmail !== undefined) changes.accepts_email = patch.acceptsEmail;
    if (patch.notes !== undefined) changes.notes = patch.notes;
    await repo.updateCustomer(trx, id, changes);
    await recordAudit(trx, {
      userId: actorId,
      action: 'customer.update',
      entity: 'customer',
      entityId: id,
      after: {
        fields: Object.keys(patch).filter((f) => patch[f as keyof CustomerPatch] !== undefined),
      },
    });
  });
  return getCustomer(id, k);
}

/**
 * Merges fromId into id: every job and cylinder moves, a phone or e-mail the kept record lacks is
 * taken over, one it has that differs is written into its notes (the same person with two
 * numbers), and fromId is deleted, so it answers 404 from then on.
 */
export async function mergeCustomers(
  actorId: string,
  id: string,
  fromId: string,
  k: Conn = db,
): Promise<CustomerJson> {
  if (id === fromId) {
    throw new BadRequest('fromId: a customer cannot be merged into itself.', [
      { field: 'fromId', message: 'is the same customer as the one kept' },
    ]);
  }
  await k.transaction(async (trx) => {
    // Lock both in id order, so two merges of the same pair cannot deadlock.
    const [first, second] = [id, fromId].sort();
    const a = await requireLiveCustomer(trx, first, first === fromId ? 'fromId' : undefined);
    const b = await requireLiveCustomer(trx, second, second === fromId ? 'fromId' : undefined);
    const keep = a.id === id ? a : b;
    const from = a.id === id ? b : a;
    const moved = await repo.moveBelongings(trx, from.id, keep.id);
    const changes: Record<string, unknown> = {};
    const extra: string[] = [];
    if (from.phone !== null) {
      if (keep.phone === null) changes.phone = from.phone;
      else if (from.phone.replace(/\D/g, '') !== keep.phone.replace(/\D/g, '')) {
        extra.push(`Other phone: ${from.phone}`);
      }
    }
    if (from.email !== null) {
      if (keep.email === null) changes.email = from.email;
      else if (from.email.toLowerCase() !== keep.email.toLowerCase()) {
        extra.push(`Other e-mail: ${from.email}`);
      }
    }
    if (from.notes.trim() !== '') extra.push(from.notes.trim());
    if (!from.accepts_email) changes.accepts_email = false;
    if (extra.length > 0) {
      changes.notes = [keep.notes.trim(), ...extra]
        .filter((t) => t !== '')
        .join('\n')
        .slice(0, 2000);
    }
    await repo.deleteCustomer(trx, from.id);
    if (Object.keys(changes).length > 0) await repo.updateCustomer(trx, keep.id, changes);
    await recordAudit(trx, {
      userId: actorId,
      action: 'customer.merge',
      entity: 'customer',
      entityId: keep.id,
      before: { fromId: from.id },
      after: { movedJobs: moved.jobs, movedCylinders: moved.cylinders },
    });
  });
  return getCustomer(id, k);
}

/**
 * Erases the customer's personal data: the name becomes a placeholder, phone, e-mail and notes go,
 * e-mail is refused from then on. Their jobs (which read the name through the customer), the
 * ledger rows and invoices stay. Erasing twice is refused, so the audit shows one erasure.
 */
export async function eraseCustomer(
  actorId: string,
  id: string,
  k: Conn = db,
): Promise<CustomerJson> {
  await k.transaction(async (trx) => {
    const c = await repo.lockCustomer(trx, id);
    if (!c) throw new NotFound('That customer');
    if (c.erased_at) {
      throw new Conflict(
        `This customer's personal data was already erased on ${c.erased_at.toISOString().slice(0, 10)}.`,
        'already_erased',
      );
    }
    await repo.updateCustomer(trx, id, {
      name: `${ERASED_NAME_PREFIX} ${id.slice(0, 8)}`,
      phone: null,
      email: null,
      notes: '',
      accepts_email: false,
      erased_at: trx.fn.now(),
    });
    // Mail still queued for them is not sent, and the copies kept lose the address and the text.
    const mails = c.email ? await forgetAddress(trx, c.email) : 0;
    const jobs = await repo.jobsOfCustomer(id, trx);
    await recordAudit(trx, {
      userId: actorId,
      action: 'customer.erase',
      entity: 'customer',
      entityId: id,
      after: { keptJobs: jobs.length, mailsForgotten: mails },
    });
  });
  return getCustomer(id, k);
}
