// The Mailbox: what the local SMTP server received, for the owner. With a real SMTP server
// configured the mail went out to the world and there is no mailbox to show.
import type { Router } from 'express';
import { NotFound } from '../errors';
import { pageQuery, route } from '../http/route';
import type { MailboxItemJson, MailboxPageJson } from '../../shared/mail-api';
import { listMailbox } from './mailbox-repository';
import { realSmtpConfigured } from './smtp-target';

export function registerMailRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/mailbox',
    access: ['owner'],
    query: pageQuery.omit({ sort: true, dir: true }),
    handler: async ({ query }): Promise<MailboxPageJson> => {
      if (realSmtpConfigured()) {
        throw new NotFound('The mailbox (e-mail goes to the configured SMTP server)');
      }
      const { rows, total } = await listMailbox(query);
      const items: MailboxItemJson[] = rows.map((r) => ({
        id: r.id,
        to: r.to_address,
        from: r.from_address,
        subject: r.subject,
        text: r.body_text,
        receivedAt: r.received_at.toISOString(),
      }));
      return { items, total };
    },
  });
}
