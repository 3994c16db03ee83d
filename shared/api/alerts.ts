// What the alerts API accepts and answers: reorder alerts raised when a part's free stock falls to
// its reorder point, and their acknowledgement.
import * as z from '../zod';
import { idField, pageNumber, pageSizeField } from './common';

export const ALERT_KINDS = ['reorder_point'] as const;
export type AlertKind = (typeof ALERT_KINDS)[number];

export const ALERT_STATES = ['open', 'acknowledged', 'all'] as const;
export type AlertState = (typeof ALERT_STATES)[number];

export const alertsQuery = z.object({
  state: z._default(z.enum(ALERT_STATES, { error: 'must be open, acknowledged or all' }), 'open'),
  partId: z.optional(idField),
  page: pageNumber,
  pageSize: pageSizeField(),
});
export type AlertsQuery = z.output<typeof alertsQuery>;

export interface AlertJson {
  id: string;
  partId: string;
  kind: AlertKind;
  raisedAt: string;
  sku: string;
  description: string;
  partKind: string;
  familyId: string | null;
  familyCode: string | null;
  stepLabel: string | null;
  /** Free quantity when the alert was raised, and the point it reached. */
  freeAtRaise: number;
  reorderPoint: number;
  /** Free quantity now. */
  free: number;
  onOrder: number;
  /** When the part was back above its point (the watch re-armed); null while still low. */
  recoveredAt: string | null;
  acknowledgedAt: string | null;
  acknowledgedBy: string | null;
}

export interface AlertsPageJson {
  items: AlertJson[];
  total: number;
}
