// What the home page asks for: the day's work of the signed-in person's role, in a few short lists.
import type { Role } from '../session-types';
import type { JobState } from './jobs';
import type { OrderState } from './purchasing';

/** The sections of the home page, in the order they are shown. */
export const HOME_SECTIONS = [
  'dueToday',
  'waitingForParts',
  'waitingForApproval',
  'alerts',
  'ordersArriving',
] as const;
export type HomeSection = (typeof HOME_SECTIONS)[number];

/**
 * Which sections each role's day starts with. Each is also limited by the role's access to the
 * page behind it: stock alerts are for the people who reorder, as their page is.
 */
export const HOME_SECTIONS_BY_ROLE: Record<Role, readonly HomeSection[]> = {
  owner: HOME_SECTIONS,
  buyer: ['waitingForParts', 'alerts', 'ordersArriving'],
  machinist: ['dueToday', 'waitingForParts', 'waitingForApproval'],
  staff: ['dueToday', 'waitingForApproval', 'ordersArriving'],
};

/** How many entries each section lists; its total says how many there are in all. */
export const HOME_LIST_LENGTH = 5;

export interface HomeJobJson {
  id: string;
  number: string;
  state: JobState;
  customerName: string;
  familyCode: string;
  dueDate: string | null;
  overdue: boolean;
}

export interface HomeAlertJson {
  id: string;
  partId: string;
  sku: string;
  description: string;
  free: number;
  reorderPoint: number;
  raisedAt: string;
}

export interface HomeOrderJson {
  id: string;
  number: string;
  supplierName: string;
  state: OrderState;
  expectedOn: string | null;
  /** Expected before today and not all in. */
  late: boolean;
  /** Pieces still to come. */
  outstanding: number;
}

export interface HomeListJson<T> {
  total: number;
  items: T[];
}

export interface HomeJson {
  /** The shop's calendar date, for "today" and "late". */
  today: string;
  /** Open jobs due today or already overdue, the oldest due date first. */
  dueToday?: HomeListJson<HomeJobJson>;
  /** Open jobs with a chosen step that has no piston held and none free. */
  waitingForParts?: HomeListJson<HomeJobJson>;
  /** Open jobs whose estimate was sent and the customer has not answered. */
  waitingForApproval?: HomeListJson<HomeJobJson>;
  /** Stock alerts nobody has marked as seen, the newest first. */
  alerts?: HomeListJson<HomeAlertJson>;
  /** Orders sent out and not all in, the soonest expected first. */
  ordersArriving?: HomeListJson<HomeOrderJson>;
}
