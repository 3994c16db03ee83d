import type { Router } from 'express';
import * as z from '../../shared/zod';
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
  .check(
    z.minLength(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`),
    z.maxLength(200),
  );

const newUser = z.strictObject({
  email: emailAddress(),
  name: z.pipe(singleLine(120), z.string().check(z.minLength(1, 'enter a name'))),
  role,
  password,
});

const userPatch = z
  .strictObject({
    name: z.optional(z.pipe(singleLine(120), z.string().check(z.minLength(1, 'enter a name')))),
    role: z.optional(role),
    active: z.optional(z.boolean()),
    password: z.optional(password),
  })
  .check(z.refine((p) => Object.keys(p).length > 0, 'nothing to change'));

export function registerUsersRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/users',
    access: may.administer,
    query: z.extend(pageQuery, {
      sort: z.optional(z.enum(['name', 'email', 'role', 'createdAt', 'active'])),
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
