// The audit trail keeps ids; people know jobs by number, parts by SKU, pistons by label, everyone
// else by name. For one page of the trail this finds every id it names (the record itself and
// the ...Id fields of its before and after) and reads each as a label with a link to its page.
import { AUDIT_ID_FIELDS, auditRefKey, type AuditRefJson } from '../../shared/api/audit';
import { REF_KINDS, refLabels, type AuditRow } from './audit-repository';

function linkTo(
  kind: string,
  id: string,
  row: { job_id?: string; order_id?: string },
): string | null {
  switch (kind) {
    case 'job':
      return `/jobs/${id}`;
    case 'hold':
      return row.job_id ? `/jobs/${row.job_id}` : null;
    case 'order_line':
      return row.order_id ? `/purchasing/orders/${row.order_id}` : null;
    case 'part':
      return `/catalog/parts/${id}`;
    case 'piston_unit':
      return '/stock/ledger';
    case 'supplier':
      return `/suppliers/${id}`;
    case 'purchase_order':
      return `/purchasing/orders/${id}`;
    case 'engine_family':
      return `/catalog/families/${id}/ladder`;
    case 'bin':
      return '/stock/bins';
    case 'user':
      return '/admin/users';
    default:
      return null;
  }
}

function wanted(rows: AuditRow[]): Map<string, Set<string>> {
  const byKind = new Map<string, Set<string>>();
  const add = (kind: string | undefined, id: unknown) => {
    if (!kind || !REF_KINDS.includes(kind) || typeof id !== 'string' || id === '') return;
    const set = byKind.get(kind) ?? new Set<string>();
    set.add(id);
    byKind.set(kind, set);
  };
  for (const row of rows) {
    add(row.entity, row.entity_id);
    for (const side of [row.before, row.after]) {
      if (!side || typeof side !== 'object' || Array.isArray(side)) continue;
      for (const [field, value] of Object.entries(side as Record<string, unknown>)) {
        add(AUDIT_ID_FIELDS[field], value);
        // One level of lists too: an order's lines name their parts and order lines.
        if (!Array.isArray(value)) continue;
        for (const item of value) {
          if (!item || typeof item !== 'object') continue;
          for (const [inner, id] of Object.entries(item as Record<string, unknown>)) {
            add(AUDIT_ID_FIELDS[inner], id);
          }
        }
      }
    }
  }
  return byKind;
}

/** Every record one page of the trail names, keyed by auditRefKey, with its label and link. */
export async function auditReferences(rows: AuditRow[]): Promise<Record<string, AuditRefJson>> {
  const refs: Record<string, AuditRefJson> = {};
  for (const [kind, ids] of wanted(rows)) {
    for (const row of await refLabels(kind, [...ids])) {
      const label =
        kind === 'hold' ? `job ${row.label}, cylinder ${row.cylinder ?? '?'}` : row.label;
      refs[auditRefKey(kind, row.id)] = {
        kind,
        id: row.id,
        label,
        link: linkTo(kind, row.id, row),
        ...(kind === 'piston_unit' ? { query: { unitId: row.id } } : {}),
      };
    }
  }
  return refs;
}
