import type { Router } from 'express';
import { z } from 'zod';
import { route } from '../http/route';
import { idField, pageQuery } from '../../shared/api/common';
import { ROLES } from '../../shared/session-types';
import { MIN_PASSWORD_LENGTH } from '../auth/passwords';
import { emailAddress, singleLine } from '../../shared/text-rules';
import { changeUser, createUser, getUsers } from './users-service';
import { may } from '../../shared/access';

const role = z.enum(ROLES as ['owner', 'buyer', 'machinist', 'staff']);
const password = z
  .string()
  .min(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`)
  .max(200);

const newUser = z
  .object({
    email: emailAddress(),
    name: singleLine(120).pipe(z.string().min(1, 'enter a name')),
    role,
    password,
  })
  .strict();

const userPatch = z
  .object({
    name: singleLine(120).pipe(z.string().min(1, 'enter a name')).optional(),
    role: role.optional(),
    active: z.boolean().optional(),
    password: password.optional(),
  })
  .strict()
  .refine((p) => Object.keys(p).length > 0, 'nothing to change');

export function registerUsersRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/users',
    access: may.administer,
    query: pageQuery.extend({
      sort: z.enum(['name', 'email', 'role', 'createdAt', 'active']).optional(),
    }),
    handler: ({ query }) => getUsers(query),
  });
  route(router, {
    method: 'post',
    path: '/api/users',
    access: may.administer,
    body: newUser,
    status: 201,
    handler: ({ body, user }) => createUser(user.id, body),
  });
  route(router, {
    method: 'patch',
    path: '/api/users/:id',
    access: may.administer,
    params: z.object({ id: idField }),
    body: userPatch,
    handler: ({ body, params, user }) => changeUser(user.id, params.id, body),
  });
}
