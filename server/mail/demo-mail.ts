// The demo sends e-mail to a local SMTP server on a free loopback port unless SMTP_URL names a real
// one; the owner reads what it received on the Mailbox page.
import { startLocalSmtp } from './fake-smtp';
import { realSmtpConfigured, useLocalSmtp } from './smtp-target';

export interface DemoMail {
  stop(): Promise<void>;
}

export async function startMailForDemo(): Promise<DemoMail | null> {
  if (realSmtpConfigured()) return null;
  const local = await startLocalSmtp();
  useLocalSmtp(local.url);
  return {
    stop: async () => {
      useLocalSmtp(null);
      await local.stop();
    },
  };
}
