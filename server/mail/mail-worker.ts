// Sends what the outbox holds. Each message is claimed with SELECT … FOR UPDATE SKIP LOCKED and
// marked sent in that same transaction, so while one worker holds a message every other worker (in
// this process or another) skips it, and once it commits the row is no longer pending. A failed
// send stays pending with a later next_attempt_at (exponential backoff); an SMTP outage therefore
// loses nothing. The only way to send twice is a crash between the SMTP server accepting the
// message and our commit; the stable Message-ID lets a receiving server spot that duplicate.
import type { Knex } from 'knex';
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';
import { db as defaultDb } from '../db/knex';
import { logger } from '../logger';
import { renderTemplate } from './mail-templates';
import type { MailAttachment } from './outbox';
import { smtpUrl as defaultSmtpUrl, transportOptions } from './smtp-target';
import './templates';

/** After this many failed attempts a message is given up (about a day with the default backoff). */
export const MAX_ATTEMPTS = 30;

export interface MailWorkerOptions {
  db?: Knex;
  smtpUrl?: () => string | null;
  /** How often to look for due messages. */
  pollMs?: number;
  /** Delay after the first failure; doubled after each further failure up to maxRetryMs. */
  baseRetryMs?: number;
  maxRetryMs?: number;
  from?: string;
}

export interface RunResult {
  sent: number;
  retried: number;
  failed: number;
}

export interface MailWorker {
  /** Sends every message due now; resolves when none is left (or the worker is stopping). */
  runOnce(): Promise<RunResult>;
  start(): void;
  stop(): Promise<void>;
}

interface OutboxRow {
  id: string;
  to_address: string;
  subject: string | null;
  body_text: string | null;
  body_html: string | null;
  attachments: MailAttachment[];
  template: string | null;
  data: Record<string, unknown>;
  attempts: number;
}

type Outcome = 'sent' | 'retried' | 'failed' | null;

export function retryDelayMs(attempts: number, baseMs: number, maxMs: number): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, attempts - 1));
}

/** SMTP 5xx answers are permanent (bad address, refused): retrying cannot help. */
function isPermanent(e: unknown): boolean {
  const code = (e as { responseCode?: unknown }).responseCode;
  return typeof code === 'number' && code >= 500 && code < 600;
}

function messageDomain(from: string): string {
  const m = /@([^>\s]+)/.exec(from);
  return m ? m[1] : 'stepstock.local';
}

export function createMailWorker(opts: MailWorkerOptions = {}): MailWorker {
  const db = opts.db ?? defaultDb;
  const target = opts.smtpUrl ?? defaultSmtpUrl;
  const pollMs = opts.pollMs ?? 2000;
  const baseRetryMs = opts.baseRetryMs ?? 30_000;
  const maxRetryMs = opts.maxRetryMs ?? 60 * 60_000;
  const from = opts.from ?? config.MAIL_FROM;
  const domain = messageDomain(from);

  let transport: Transporter | null = null;
  let transportUrl: string | null = null;
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<RunResult> | null = null;
  let stopping = false;

  function transportFor(url: string): Transporter {
    if (!transport || transportUrl !== url) {
      transport?.close();
      transport = nodemailer.createTransport({
        ...transportOptions(url),
        connectionTimeout: 10_000,
        greetingTimeout: 10_000,
        socketTimeout: 30_000,
      });
      transportUrl = url;
    }
    return transport;
  }

  /** Tries the oldest due message not yet tried in this run (a retry waits for the next run). */
  async function sendOne(triedThisRun: string[]): Promise<Outcome> {
    return db.transaction(async (trx) => {
      const { rows } = (await trx.raw(
        `SELECT id, to_address, subject, body_text, body_html, attachments, template, data, attempts
           FROM outbox
          WHERE status = 'pending' AND next_attempt_at <= now() AND NOT (id = ANY(?::uuid[]))
          ORDER BY next_attempt_at, created_at
          LIMIT 1
          FOR UPDATE SKIP LOCKED`,
        [triedThisRun],
      )) as { rows: OutboxRow[] };
      const row = rows[0];
      if (!row) return null;
      triedThisRun.push(row.id);
      const attempts = row.attempts + 1;

      const giveUp = async (error: string): Promise<Outcome> => {
        await trx('outbox')
          .where({ id: row.id })
          .update({ status: 'failed', attempts, last_error: error });
        logger.error({ outboxId: row.id, error }, 'e-mail given up');
        return 'failed';
      };
      const later = async (error: string): Promise<Outcome> => {
        if (attempts >= MAX_ATTEMPTS) return giveUp(error);
        const delay = retryDelayMs(attempts, baseRetryMs, maxRetryMs);
        await trx('outbox')
          .where({ id: row.id })
          .update({
            attempts,
            last_error: error,
            next_attempt_at: trx.raw(`now() + ? * interval '1 millisecond'`, [delay]),
          });
        logger.warn({ outboxId: row.id, attempts, retryInMs: delay, error }, 'e-mail not sent yet');
        return 'retried';
      };

      let subject = row.subject;
      let text = row.body_text;
      let html = row.body_html;
      if (subject === null || text === null) {
        try {
          const content = await renderTemplate(trx, row.template ?? '', row.data);
          ({ subject, text, html } = content);
          await trx('outbox')
            .where({ id: row.id })
            .update({ subject, body_text: text, body_html: html });
        } catch (e) {
          return giveUp(`could not write the message: ${(e as Error).message}`);
        }
      }

      const url = target();
      if (!url) return later('no SMTP server is configured');
      const messageId = `<${row.id}@${domain}>`;
      try {
        await transportFor(url).sendMail({
          from,
          to: row.to_address,
          subject: subject ?? '',
          text: text ?? '',
          ...(html ? { html } : {}),
          messageId,
          attachments: row.attachments.map((a) => ({
            filename: a.filename,
            contentType: a.contentType,
            content: a.content,
            ...(a.encoding ? { encoding: a.encoding } : {}),
          })),
        });
      } catch (e) {
        const error = (e as Error).message.slice(0, 500);
        return isPermanent(e) ? giveUp(error) : later(error);
      }
      await trx('outbox').where({ id: row.id }).update({
        status: 'sent',
        attempts,
        sent_at: trx.fn.now(),
        last_error: null,
        message_id: messageId,
      });
      return 'sent';
    });
  }

  async function drain(): Promise<RunResult> {
    const result: RunResult = { sent: 0, retried: 0, failed: 0 };
    const tried: string[] = [];
    // Bounded so one run leaves time for the next poll and for stopping.
    for (let i = 0; i < 500 && !stopping; i++) {
      const outcome = await sendOne(tried);
      if (outcome === null) break;
      result[outcome]++;
    }
    return result;
  }

  function runOnce(): Promise<RunResult> {
    running ??= drain().finally(() => {
      running = null;
    });
    return running;
  }

  function schedule() {
    if (stopping) return;
    timer = setTimeout(() => {
      runOnce()
        .catch((e: Error) => logger.error({ err: e }, 'outbox worker run failed'))
        .finally(schedule);
    }, pollMs);
  }

  return {
    runOnce,
    start() {
      stopping = false;
      schedule();
    },
    async stop() {
      stopping = true;
      if (timer) clearTimeout(timer);
      await running?.catch(() => undefined);
      transport?.close();
      transport = null;
    },
  };
}
