// Browsing the audit trail: filters in the shop's own calendar (a day runs midnight to midnight
// where the shop is), newest first, one page at a time.
import { DateTime, IANAZone } from 'luxon';
import { getSettings } from '../settings/settings-service';
import type { AuditPageJson, AuditQuery } from '../../shared/api/audit';
import { auditActors, auditEntities, listAudit, type AuditRow } from './audit-repository';
import { auditReferences } from './audit-references';

function json(row: AuditRow) {
  return {
    id: Number(row.id),
    at: row.at.toISOString(),
    user:
      row.user_id === null
        ? null
        : { id: row.user_id, name: row.user_name ?? '', email: row.user_email ?? '' },
    action: row.action,
    entity: row.entity,
    entityId: row.entity_id,
    before: row.before ?? null,
    after: row.after ?? null,
  };
}

export async function browseAudit(query: AuditQuery): Promise<AuditPageJson> {
  const settings = await getSettings();
  const zone = IANAZone.isValidZone(settings.timeZone) ? settings.timeZone : 'UTC';
  const dayStart = (d: string) => DateTime.fromISO(d, { zone }).startOf('day');
  const [page, entities, users] = await Promise.all([
    listAudit(
      {
        entity: query.entity,
        entityId: query.entityId,
        action: query.action,
        userId: query.user,
        from: query.from ? dayStart(query.from).toJSDate() : undefined,
        until: query.to ? dayStart(query.to).plus({ days: 1 }).toJSDate() : undefined,
      },
      { offset: (query.page - 1) * query.pageSize, limit: query.pageSize, dir: query.dir },
    ),
    auditEntities(),
    auditActors(),
  ]);
  return {
    items: page.rows.map(json),
    total: page.total,
    refs: await auditReferences(page.rows),
    facets: { entities, users },
  };
}
