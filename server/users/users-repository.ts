import type { Knex } from 'knex';
import { db } from '../db/knex';
import { pageOf } from '../db/paging';
import { containsPattern } from '../db/like-pattern';
import type { Role, SessionUser, LengthUnit } from '../../shared/session-types';

export interface UserRow {
  id: string;
  email: string;
  name: string;
  role: Role;
  password_hash: string;
  active: boolean;
  unit: LengthUnit;
  mail_mode: 'instant' | 'digest' | 'none';
  created_at: Date;
  updated_at: Date;
}

export function toSessionUser(
  row: Pick<UserRow, 'id' | 'email' | 'name' | 'role' | 'unit'>,
): SessionUser {
  return { id: row.id, email: row.email, name: row.name, role: row.role, unit: row.unit };
}

export function toUserJson(row: UserRow) {
  return {
    ...toSessionUser(row),
    active: row.active,
    mailMode: row.mail_mode,
    createdAt: row.created_at.toISOString(),
  };
}

export function findUserByEmail(email: string, q: Knex = db): Promise<UserRow | undefined> {
  return q<UserRow>('users').where({ email: email.trim().toLowerCase() }).first();
}

export function findUserById(id: string, q: Knex = db): Promise<UserRow | undefined> {
  return q<UserRow>('users').where({ id }).first();
}

const SORTABLE = {
  name: 'name',
  email: 'email',
  role: 'role',
  createdAt: 'created_at',
  active: 'active',
} as const;
export type UserSort = keyof typeof SORTABLE;

export async function listUsers(
  opts: {
    sort?: UserSort;
    dir?: 'asc' | 'desc';
    page?: number;
    pageSize?: number;
    q?: string;
  } = {},
  q: Knex = db,
): Promise<{ rows: UserRow[]; total: number }> {
  const base = q<UserRow>('users').modify((b) => {
    if (opts.q) {
      // Typed text, not a pattern: % and _ match only themselves.
      const like = containsPattern(opts.q);
      b.where((w) => w.whereILike('name', like).orWhereILike('email', like));
    }
  });
  const column = SORTABLE[opts.sort ?? 'name'];
  return pageOf<UserRow>(base, { page: opts.page ?? 1, pageSize: opts.pageSize ?? 100 }, (list) =>
    list.orderBy([{ column, order: opts.dir ?? 'asc' }, { column: 'id' }]),
  );
}

export async function insertUser(
  q: Knex,
  u: { email: string; name: string; role: Role; password_hash: string; unit?: LengthUnit },
): Promise<UserRow> {
  const [row] = await q<UserRow>('users').insert(u).returning('*');
  return row;
}

export async function updateUser(
  q: Knex,
  id: string,
  patch: Partial<
    Pick<UserRow, 'name' | 'role' | 'active' | 'password_hash' | 'unit' | 'mail_mode'>
  >,
): Promise<UserRow | undefined> {
  const [row] = await q<UserRow>('users')
    .where({ id })
    .update({ ...patch, updated_at: q.fn.now() })
    .returning('*');
  return row;
}

/** Ends every open session of a user (deactivation, password reset). */
export async function deleteSessionsOf(
  q: Knex,
  userId: string,
  exceptSid?: string,
): Promise<number> {
  const query = q('sessions').whereRaw(`sess -> 'passport' ->> 'user' = ?`, [userId]);
  if (exceptSid) query.andWhereNot({ sid: exceptSid });
  return query.delete();
}
