import type { Knex } from 'knex';
import { db } from '../db/knex';
import { pageOf } from '../db/paging';

export interface MailboxRow {
  id: string;
  to_address: string;
  from_address: string;
  subject: string;
  body_text: string;
  body_html: string | null;
  message_id: string | null;
  received_at: Date;
}

export async function listMailbox(
  opts: { q?: string; page: number; pageSize: number },
  k: Knex = db,
): Promise<{ rows: MailboxRow[]; total: number }> {
  const base = k<MailboxRow>('mailbox_messages').modify((qb) => {
    if (opts.q) {
      const like = `%${opts.q.replace(/[\\%_]/g, '\\$&')}%`;
      qb.where((w) => w.whereILike('subject', like).orWhereILike('to_address', like));
    }
  });
  return pageOf<MailboxRow>(base, opts, (list) =>
    list.orderBy([
      { column: 'received_at', order: 'desc' },
      { column: 'id', order: 'desc' },
    ]),
  );
}
