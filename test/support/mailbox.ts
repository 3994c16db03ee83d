// A real SMTP server on loopback for one API test file, and the outbox worker run once against it:
// the mail a test checks is what a mail server received, not what the outbox table says.
import { startLocalSmtp, type LocalSmtp, type ReceivedMail } from '../../server/mail/fake-smtp';
import { createMailWorker } from '../../server/mail/mail-worker';

export interface TestMailbox extends LocalSmtp {
  /** Sends everything the outbox holds now, once, to this mailbox. */
  deliver(): Promise<void>;
  /** Sends the outbox, then the last message that reached `to`; none at all fails. */
  deliveredTo(to: string): Promise<ReceivedMail>;
}

/**
 * Starts the mailbox in a `beforeAll` and stops it in an `afterAll` this registers; the object
 * returned is filled in place once it listens, so a file names it at the top. Its `afterAll` runs
 * before the file's own (hooks run in the order they are declared), so the file may close the app.
 */
export function localMailbox(): TestMailbox {
  const box = {
    async deliver() {
      const worker = createMailWorker({ smtpUrl: () => box.url });
      await worker.runOnce();
      await worker.stop();
    },
    async deliveredTo(to: string) {
      await box.deliver();
      const mail = box.received.filter((m) => m.to.includes(to)).at(-1);
      if (!mail) throw new Error(`no mail reached ${to}`);
      return mail;
    },
  } as TestMailbox;
  beforeAll(async () => {
    Object.assign(box, await startLocalSmtp());
  });
  afterAll(async () => {
    await box.stop?.();
  });
  return box;
}
