// Alerts: the list, acknowledging one, and the reorder check other features may call after a
// movement. The check itself runs in the database (reorder_check), where triggers on part_levels
// and parts also call it, so a movement written by any code is watched.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { Conflict, NotFound } from '../errors';
import type { AlertJson, AlertsPageJson, AlertsQuery } from '../../shared/api/alerts';
import * as repo from './alerts-repository';
import './alert-mail';

export function alertJson(r: repo.AlertRow): AlertJson {
  return {
    id: r.id,
    partId: r.part_id,
    kind: r.kind,
    raisedAt: r.raised_at.toISOString(),
    sku: r.sku,
    description: r.description,
    partKind: r.part_kind,
    familyId: r.family_id,
    familyCode: r.family_code,
    stepLabel: r.step_label,
    freeAtRaise: r.free_at_raise,
    reorderPoint: r.reorder_point,
    free: r.free,
    onOrder: r.on_order,
    recoveredAt: r.recovered_at?.toISOString() ?? null,
    acknowledgedAt: r.acknowledged_at?.toISOString() ?? null,
    acknowledgedBy: r.acknowledged_by_name,
  };
}

export async function listAlerts(q: AlertsQuery, k: Knex = db): Promise<AlertsPageJson> {
  const { rows, total } = await repo.listAlerts(q, k);
  return { items: rows.map(alertJson), total };
}

export async function acknowledgeAlert(
  actorId: string,
  id: string,
  k: Knex = db,
): Promise<AlertJson> {
  await k.transaction(async (trx) => {
    const done = await repo.acknowledge(trx, id, actorId);
    if (!done) {
      if (!(await repo.alertExists(id, trx))) throw new NotFound('That alert');
      throw new Conflict('This alert was already acknowledged.', 'already_acknowledged');
    }
    await recordAudit(trx, {
      userId: actorId,
      action: 'alert.acknowledge',
      entity: 'alert',
      entityId: id,
    });
  });
  const row = await repo.findAlert(id, k);
  if (!row) throw new NotFound('That alert');
  return alertJson(row);
}

export async function mailModeOf(
  userId: string,
  k: Knex = db,
): Promise<{ mailMode: 'instant' | 'digest' | 'none'; alertsByMail: boolean }> {
  const row = await repo.userMailMode(userId, k);
  if (!row) throw new NotFound('Your account');
  // Alert e-mail goes to buyers; the owner reads alerts on the page.
  return { mailMode: row.mail_mode, alertsByMail: row.role === 'buyer' };
}

/**
 * Checks a part against its reorder point inside the caller's transaction, after a movement that
 * may have lowered its free stock: raises one alert (and queues the buyers' mail) when it is at or
 * below the point and no alert is open for this crossing. The triggers already do this for every
 * change of part_levels; calling it again is harmless. Returns the new alert's id, if any.
 */
export function checkReorderCrossing(trx: Knex, partId: string): Promise<string | null> {
  return repo.reorderCheck(trx, partId, true);
}
