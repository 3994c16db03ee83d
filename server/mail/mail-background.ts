// The outbox worker, started in every server process. Without SMTP_URL (and when `npm start` has
// not already started one) the process runs its own local mailbox on loopback, so e-mail is never
// stuck: the owner reads it on the Mailbox page.
import type { Background } from '../background-work';
import { logger } from '../logger';
import { startLocalSmtp, type LocalSmtp } from './fake-smtp';
import { createMailWorker } from './mail-worker';
import { smtpUrl, useLocalSmtp } from './smtp-target';

export async function startMailBackground(): Promise<Background> {
  let local: LocalSmtp | null = null;
  if (!smtpUrl()) {
    local = await startLocalSmtp();
    useLocalSmtp(local.url);
    logger.warn({ url: local.url }, 'SMTP_URL is not set: e-mail goes to the local Mailbox page');
  }
  const worker = createMailWorker();
  worker.start();
  return {
    stop: async () => {
      await worker.stop();
      if (local) {
        useLocalSmtp(null);
        await local.stop();
      }
    },
  };
}
