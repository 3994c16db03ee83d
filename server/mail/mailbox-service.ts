// The Mailbox page's answer: what the local SMTP server received, newest first. With a real SMTP
// server configured the mail went out to the world and there is no mailbox to show.
import { NotFound } from '../errors';
import type { MailboxItemJson, MailboxPageJson } from '../../shared/api/mail';
import { listMailbox } from './mailbox-repository';
import { realSmtpConfigured } from './smtp-target';

export async function mailboxPage(query: {
  q?: string;
  page: number;
  pageSize: number;
}): Promise<MailboxPageJson> {
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
}
