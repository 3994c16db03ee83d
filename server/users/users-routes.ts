import type { Router } from 'express';
import { z } from 'zod';
import { pageQuery, route, uuidParam } from '../http/route';
import { ROLES } from '../../shared/session-types';
import { MIN_PASSWORD_LENGTH } from '../auth/passwords';
import { changeUser, createUser, getUsers } from './users-service';

const role = z.enum(ROLES as ['owner', 'buyer', 'machinist', 'staff']);
const password = z
  .string()
  .min(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`)
  .max(200);

const newUser = z
  .object({
    email: z.string().trim().toLowerCase().email('must be an e-mail address').max(320),
    name: z.string().trim().min(1, 'enter a name').max(120),
    role,
    password,
  })
  .strict();

const userPatch = z
  .object({
    name: z.string().trim().min(1).max(120).optional(),
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
    access: ['owner'],
    query: pageQuery.extend({
      sort: z.enum(['name', 'email', 'role', 'createdAt', 'active']).optional(),
    }),
    handler: ({ query }) => getUsers(query),
  });
  route(router, {
    method: 'post',
    path: '/api/users',
    access: ['owner'],
    body: newUser,
    status: 201,
    handler: ({ body, user }) => createUser(user.id, body),
  });
  route(router, {
    method: 'patch',
    path: '/api/users/:id',
    access: ['owner'],
    params: z.object({ id: uuidParam }),
    body: userPatch,
    handler: ({ body, params, user }) => changeUser(user.id, params.id, body),
  });
}
