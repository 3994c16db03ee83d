import type { Router } from 'express';
import { route } from '../http/route';
import * as z from '../../shared/zod';
import { getSettings, saveSettings } from './settings-service';
import { may } from '../../shared/access';
import { shopSettingsSchema } from '../../shared/settings-schema';

export function registerSettingsRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/settings',
    access: 'signed-in',
    handler: () => getSettings(),
  });
  route(router, {
    method: 'patch',
    path: '/api/settings',
    access: may.administer,
    body: z.partial(shopSettingsSchema),
    handler: ({ body, user }) => saveSettings(user.id, body),
  });
}
