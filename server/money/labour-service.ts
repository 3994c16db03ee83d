// The labour price list (owner): add, change, retire an operation. A retired one stays on the
// estimates that already carry it and is proposed no more.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { Conflict, NotFound } from '../errors';
import type { LabourInput, LabourOperationJson, LabourPatch } from '../../shared/api/money';
import { fixedMoney } from '../../shared/estimate-math';
import { getSettings } from '../settings/settings-service';
import * as repo from './labour-repository';

export function labourJson(row: repo.LabourRow, currency: string): LabourOperationJson {
  return {
    id: row.id,
    name: row.name,
    per: row.per,
    price: fixedMoney(row.price, currency),
    active: row.active,
    proposeFor: row.propose_for,
  };
}

export async function listLabour(k: Knex = db): Promise<{ items: LabourOperationJson[] }> {
  const { homeCurrency } = await getSettings(k);
  return { items: (await repo.listLabour(k)).map((r) => labourJson(r, homeCurrency)) };
}

async function refuseTakenName(trx: Knex, name: string, exceptId?: string): Promise<void> {
  if (await repo.nameTaken(trx, name, exceptId)) {
    throw new Conflict(`An operation named "${name}" is already on the price list.`, 'duplicate');
  }
}

export async function createLabour(
  actorId: string,
  input: LabourInput,
  k: Knex = db,
): Promise<LabourOperationJson> {
  const { homeCurrency } = await getSettings(k);
  return k.transaction(async (trx) => {
    await refuseTakenName(trx, input.name);
    const row = await repo.insertLabour(trx, {
      name: input.name,
      per: input.per,
      price: fixedMoney(input.price, homeCurrency),
      active: input.active ?? true,
      propose_for: input.proposeFor ?? 'never',
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'labour.create',
      entity: 'labour_operation',
      entityId: row.id,
      after: row,
    });
    return labourJson(row, homeCurrency);
  });
}

export async function patchLabour(
  actorId: string,
  id: string,
  patch: LabourPatch,
  k: Knex = db,
): Promise<LabourOperationJson> {
  const { homeCurrency } = await getSettings(k);
  return k.transaction(async (trx) => {
    const before = await repo.lockLabour(trx, id);
    if (!before) throw new NotFound('That labour operation');
    if (patch.name !== undefined) await refuseTakenName(trx, patch.name, id);
    const row = await repo.updateLabour(trx, id, {
      ...(patch.name !== undefined ? { name: patch.name } : {}),
      ...(patch.per !== undefined ? { per: patch.per } : {}),
      ...(patch.price !== undefined ? { price: fixedMoney(patch.price, homeCurrency) } : {}),
      ...(patch.active !== undefined ? { active: patch.active } : {}),
      ...(patch.proposeFor !== undefined ? { propose_for: patch.proposeFor } : {}),
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'labour.update',
      entity: 'labour_operation',
      entityId: id,
      before,
      after: row,
    });
    return labourJson(row, homeCurrency);
  });
}
