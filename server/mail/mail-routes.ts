// The Mailbox route, for the owner: what the local SMTP server received.
import type { Router } from 'express';
import { route } from '../http/route';
import * as z from '../../shared/zod';
import { pageQuery } from '../../shared/api/common';
import type { MailboxPageJson } from '../../shared/api/mail';
import { mailboxPage } from './mailbox-service';
import { may } from '../../shared/access';

export function registerMailRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/mailbox',
    access: may.administer,
    query: z.omit(pageQuery, { sort: true, dir: true }),
    handler: ({ query }): Promise<MailboxPageJson> => mailboxPage(query),
  });
}
