import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { MIN_PASSWORD_LENGTH } from '../auth/passwords';
import { changeOwnPassword, changeOwnPreferences } from '../users/users-service';

export function registerAccountRoutes(router: Router): void {
  route(router, {
    method: 'patch',
    path: '/api/account',
    access: 'signed-in',
    body: z.strictObject({
      unit: z.optional(z.enum(['mm', 'in'])),
      mailMode: z.optional(z.enum(['instant', 'digest', 'none'])),
    }),
    handler: ({ body, user }) => changeOwnPreferences(user.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/account/password',
    access: 'signed-in',
    body: z.strictObject({
      currentPassword: z
        .string()
        .check(z.minLength(1, 'enter your current password'), z.maxLength(200)),
      newPassword: z
        .string()
        .check(
          z.minLength(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`),
          z.maxLength(200),
        ),
    }),
    handler: async ({ body, user, req }) => {
      await changeOwnPassword(user.id, req.sessionID, body.currentPassword, body.newPassword);
      return undefined;
    },
  });
}
