// A real SMTP server on loopback that keeps every message it receives in mailbox_messages, so the
// demo shows each e-mail on the Mailbox page and the tests read what was actually delivered. It
// offers no STARTTLS (nodemailer would try it and fail on the library's test certificate) and
// accepts mail without sign-in; it listens on 127.0.0.1 only.
import type { Knex } from 'knex';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { db as defaultDb } from '../db/knex';
import { logger } from '../logger';

export interface ReceivedMail {
  to: string[];
  from: string;
  subject: string;
  text: string;
  html: string | null;
  messageId: string | null;
  attachments: Array<{ filename: string | null; contentType: string; content: string }>;
}

export interface LocalSmtp {
  url: string;
  port: number;
  /** Everything received by this server since it started, in order (duplicates included). */
  received: ReceivedMail[];
  stop(): Promise<void>;
}

function addressText(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

export interface LocalSmtpOptions {
  db?: Knex;
  port?: number;
  /**
   * Recipients to refuse for good (SMTP 550), the way a supplier's mail server answers an address
   * it does not know; the tests use it to show what a permanent refusal does.
   */
  refuseRecipient?: (address: string) => boolean;
}

export async function startLocalSmtp(opts: LocalSmtpOptions = {}): Promise<LocalSmtp> {
  const db = opts.db ?? defaultDb;
  const received: ReceivedMail[] = [];
  const server = new SMTPServer({
    name: 'stepstock-local-mailbox',
    banner: 'Stepstock local mailbox',
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    logger: false,
    size: 10 * 1024 * 1024,
    onRcptTo(address, _session, callback) {
      if (opts.refuseRecipient?.(address.address)) {
        return callback(
          Object.assign(new Error(`Mailbox ${address.address} does not exist`), {
            responseCode: 550,
          }),
        );
      }
      callback();
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
          const mailFrom = session.envelope.mailFrom;
          const mail: ReceivedMail = {
            to: envelopeTo,
            from: addressText(parsed.from) || (mailFrom ? mailFrom.address : ''),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            messageId: parsed.messageId ?? null,
            attachments: parsed.attachments.map((a) => ({
              filename: a.filename ?? null,
              contentType: a.contentType,
              content: a.content.toString('utf8'),
            })),
          };
          await db('mailbox_messages').insert({
            to_address: envelopeTo.join(', ') || addressText(parsed.to),
            from_address: mail.from,
            subject: mail.subject,
            body_text: mail.text,
            body_html: mail.html,
            message_id: mail.messageId,
          });
          received.push(mail);
          callback();
        })
        .catch((e: Error) => {
          // A temporary refusal: the sender keeps the message and tries again later.
          logger.error({ err: e }, 'local mailbox could not store a message');
          callback(
            Object.assign(new Error('Mailbox unavailable, try again later'), { responseCode: 451 }),
          );
        });
    },
  });
  server.on('error', (e) => logger.error({ err: e }, 'local mailbox error'));

  const port = await new Promise<number>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => {
      server.off('error', reject);
      const address = server.server.address();
      resolve(typeof address === 'object' && address ? address.port : 0);
    });
  });

  return {
    url: `smtp://127.0.0.1:${port}`,
    port,
    received,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
