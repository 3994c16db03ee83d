// What the audit-trail API accepts and answers: every recorded change (stock, prices, reorder rules,
// users, settings…) with who made it, when, and the record before and after. The owner browses it;
// the query schema is shared so the page and the server refuse the same filters with the same words.
import * as z from '../zod';
import { atMost } from '../text-rules';
import { calendarDay, pageNumber, pageSizeField, sortDir } from './common';

/** A recorded entity or action name: lower-case words joined by _ . or - ("part", "stock.receipt"). */
const NAME = /^[a-z][a-z0-9_.-]{0,59}$/;

export const AUDIT_PAGE_SIZES = [25, 50, 100, 200] as const;

export const auditQuery = z
  .strictObject({
    entity: z.optional(
      z
        .string()
        .check(
          z.trim(),
          z.maxLength(60, atMost(60)),
          z.regex(NAME, 'must be an entity name such as part or user'),
        ),
    ),
    entityId: z.optional(
      z.string().check(z.trim(), z.minLength(1), z.maxLength(100, 'at most 100 characters')),
    ),
    action: z.optional(
      z
        .string()
        .check(
          z.trim(),
          z.maxLength(60, atMost(60)),
          z.regex(NAME, 'must be an action name such as stock.receipt'),
        ),
    ),
    /** Who made the change. */
    user: z.optional(z.string().check(z.uuid('must be a valid user id'))),
    /** First and last calendar day shown, in the shop's time zone, both included. */
    from: z.optional(calendarDay),
    to: z.optional(calendarDay),
    dir: z._default(sortDir, 'desc'),
    page: pageNumber,
    pageSize: pageSizeField(200),
  })
  .check(
    z.refine((q) => !q.from || !q.to || q.from <= q.to, {
      message: 'must not be before the first day',
      path: ['to'],
    }),
  );
export type AuditQuery = z.output<typeof auditQuery>;

export interface AuditActorJson {
  id: string;
  name: string;
  email: string;
}

export interface AuditEventJson {
  id: number;
  /** ISO 8601 timestamp. */
  at: string;
  /** Null for changes Stepstock made by itself (an expired hold, a database watch). */
  user: AuditActorJson | null;
  action: string;
  entity: string;
  entityId: string | null;
  before: unknown;
  after: unknown;
}

/** Fields of a recorded before/after that name another record, and the kind of record. */
export const AUDIT_ID_FIELDS: Record<string, string> = {
  jobId: 'job',
  partId: 'part',
  unitId: 'piston_unit',
  customerId: 'customer',
  supplierId: 'supplier',
  orderId: 'purchase_order',
  familyId: 'engine_family',
  binId: 'bin',
  toBinId: 'bin',
  fromBinId: 'bin',
  userId: 'user',
  holdId: 'hold',
  lineId: 'order_line',
  stepSeriesId: 'step_series',
};

/** A record the trail names, as people know it, with the page that shows it (if any). */
export interface AuditRefJson {
  kind: string;
  id: string;
  /** Job number, SKU, piston label, code or name. */
  label: string;
  /** The app page that shows it, and its query (a piston's movements), or null for none. */
  link: string | null;
  query?: Record<string, string>;
}

/** The key of a record in AuditPageJson.refs. */
export function auditRefKey(kind: string, id: string): string {
  return `${kind}:${id}`;
}

export interface AuditPageJson {
  items: AuditEventJson[];
  total: number;
  /** Every record this page names (the record changed and the ids in its fields), by auditRefKey. */
  refs: Record<string, AuditRefJson>;
  /** What the filters can offer: every entity and every person that appears in the trail. */
  facets: { entities: string[]; users: AuditActorJson[] };
}
