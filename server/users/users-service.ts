import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { BadRequest, Conflict, NotFound, Unauthorized } from '../errors';
import { liftSignInLocks } from '../session/sign-in-service';
import type { Role, LengthUnit } from '../../shared/session-types';
import {
  deleteSessionsOf,
  findUserById,
  insertUser,
  listUsers,
  toUserJson,
  updateUser,
  type UserRow,
} from './users-repository';
import { isUniqueViolation } from '../db/pg-errors';
import { allows } from '../../shared/access';

function auditView(u: UserRow) {
  return { email: u.email, name: u.name, role: u.role, active: u.active, unit: u.unit };
}

export async function getUsers(opts: Parameters<typeof listUsers>[0] = {}) {
  const { rows, total } = await listUsers(opts);
  return { items: rows.map(toUserJson), total };
}

export async function createUser(
  actorId: string,
  input: { email: string; name: string; role: Role; password: string },
) {
  const password_hash = await hashPassword(input.password);
  try {
    return await db.transaction(async (trx) => {
      const row = await insertUser(trx, {
        email: input.email.trim().toLowerCase(),
        name: input.name.trim(),
        role: input.role,
        password_hash,
      });
      await recordAudit(trx, {
        userId: actorId,
        action: 'user.create',
        entity: 'user',
        entityId: row.id,
        after: auditView(row),
      });
      return { user: toUserJson(row) };
    });
  } catch (e) {
    if (isUniqueViolation(e))
      throw new Conflict(`A user with the e-mail ${input.email} already exists.`);
    throw e;
  }
}

export async function changeUser(
  actorId: string,
  id: string,
  patch: { name?: string; role?: Role; active?: boolean; password?: string },
) {
  // A password is changed for oneself only with the current one (the account page): an
  // unattended signed-in screen must not be enough to take the account.
  if (id === actorId && patch.password !== undefined) {
    throw new BadRequest(
      'Change your own password on your account page, with your current password.',
      [{ field: 'password', message: 'not allowed on yourself here' }],
    );
  }
  const password_hash = patch.password ? await hashPassword(patch.password) : undefined;
  const result = await db.transaction(async (trx) => {
    const before = await findUserById(id, trx);
    if (!before) throw new NotFound('That user');
    // Whoever administers the shop may not take that away from themselves: the shop would be left
    // with nobody to put it back.
    if (
      id === actorId &&
      (patch.active === false || (patch.role && !allows(patch.role, 'administer')))
    ) {
      throw new BadRequest('You cannot deactivate yourself or give up your own owner role.', [
        { field: patch.active === false ? 'active' : 'role', message: 'not allowed on yourself' },
      ]);
    }
    const after = await updateUser(trx, id, {
      ...(patch.name !== undefined ? { name: patch.name.trim() } : {}),
      ...(patch.role !== undefined ? { role: patch.role } : {}),
      ...(patch.active !== undefined ? { active: patch.active } : {}),
      ...(password_hash ? { password_hash } : {}),
    });
    if (!after) throw new NotFound('That user');
    // A deactivated user, or one whose password was reset, is signed out everywhere.
    if (patch.active === false || password_hash) await deleteSessionsOf(trx, id);
    await recordAudit(trx, {
      userId: actorId,
      action: password_hash ? 'user.password-reset' : 'user.update',
      entity: 'user',
      entityId: id,
      before: auditView(before),
      after: auditView(after),
    });
    return { user: toUserJson(after) };
  });
  // The reset is what the locked-out person was told to ask for: it lifts their sign-in locks.
  if (password_hash) await liftSignInLocks(result.user.email);
  return result;
}

export async function changeOwnPassword(
  userId: string,
  sid: string,
  currentPassword: string,
  newPassword: string,
): Promise<void> {
  const user = await findUserById(userId);
  if (!user) throw new Unauthorized();
  if (!(await verifyPassword(currentPassword, user.password_hash))) {
    throw new BadRequest('The current password is wrong.', [
      { field: 'currentPassword', message: 'does not match' },
    ]);
  }
  const password_hash = await hashPassword(newPassword);
  await db.transaction(async (trx) => {
    await updateUser(trx, userId, { password_hash });
    // Other sessions of this user end; the one that changed the password stays.
    await deleteSessionsOf(trx, userId, sid);
    await recordAudit(trx, {
      userId,
      action: 'user.password-change',
      entity: 'user',
      entityId: userId,
    });
  });
  await liftSignInLocks(user.email);
}

export async function changeOwnPreferences(
  userId: string,
  prefs: { unit?: LengthUnit; mailMode?: 'instant' | 'digest' | 'none' },
) {
  const row = await updateUser(db, userId, {
    ...(prefs.unit ? { unit: prefs.unit } : {}),
    ...(prefs.mailMode ? { mail_mode: prefs.mailMode } : {}),
  });
  if (!row) throw new Unauthorized();
  return { user: toUserJson(row) };
}
