// Who is signed in, as the server answers GET /api/session and the client keeps it.
// Pure types and one constant: shared by the Express server and the Angular client.
import type { LabelStock } from './label-stock';
import type { LengthUnit } from './lengths';

export type { LengthUnit };

/** What a person may do in the shop; every API route and every menu entry names the roles it allows. */
export type Role = 'owner' | 'buyer' | 'machinist' | 'staff';

/** Every role, in the order the user admin screen lists them. */
export const ROLES: Role[] = ['owner', 'buyer', 'machinist', 'staff'];

/** The units a person may read lengths in; values are stored exactly and only shown in this unit. */
export const LENGTH_UNITS: LengthUnit[] = ['mm', 'in'];

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  unit: LengthUnit;
}

/** Body of a 200 from GET /api/session and POST /api/session. */
export interface SessionResponse {
  user: SessionUser;
  shop?: {
    name: string;
    timeZone?: string;
    locale?: string;
    currency?: string;
    labelStock?: LabelStock;
  };
}

/** Shortest password a person may set; long passphrases beat clever symbols. */
export const PASSWORD_MIN_LENGTH = 12;

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as string[]).includes(value);
}
