import type { Router } from 'express';
import { z } from 'zod';
import { route } from '../http/route';
import { MIN_PASSWORD_LENGTH } from '../auth/passwords';
import { changeOwnPassword, changeOwnPreferences } from '../users/users-service';

export function registerAccountRoutes(router: Router): void {
  route(router, {
    method: 'patch',
    path: '/api/account',
    access: 'signed-in',
    body: z
      .object({
        unit: z.enum(['mm', 'in']).optional(),
        mailMode: z.enum(['instant', 'digest', 'none']).optional(),
      })
      .strict(),
    handler: ({ body, user }) => changeOwnPreferences(user.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/account/password',
    access: 'signed-in',
    body: z
      .object({
        currentPassword: z.string().min(1, 'enter your current password').max(200),
        newPassword: z
          .string()
          .min(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`)
          .max(200),
      })
      .strict(),
    handler: async ({ body, user, req }) => {
      await changeOwnPassword(user.id, req.sessionID, body.currentPassword, body.newPassword);
      return undefined;
    },
  });
}
