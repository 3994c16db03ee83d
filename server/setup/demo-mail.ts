// The demo and the tests send e-mail to a fake SMTP server on loopback unless SMTP_URL names a real
// one. Filled in by the mail feature; until then no mail server is started.
export interface DemoMail {
  stop(): Promise<void>;
}

export async function startMailForDemo(): Promise<DemoMail | null> {
  return null;
}
