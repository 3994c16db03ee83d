import type { Knex } from 'knex';

export interface AuditEntry {
  userId: string | null;
  action: string;
  entity: string;
  entityId: string | null;
  before?: unknown;
  after?: unknown;
}

/** Writes one audit row inside the caller's transaction, so the trail and the change land together. */
export async function recordAudit(trx: Knex | Knex.Transaction, e: AuditEntry): Promise<void> {
  await trx('audit_events').insert({
    user_id: e.userId,
    action: e.action,
    entity: e.entity,
    entity_id: e.entityId,
    before: e.before === undefined ? null : JSON.stringify(e.before),
    after: e.after === undefined ? null : JSON.stringify(e.after),
  });
}
