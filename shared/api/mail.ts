// What GET /api/mailbox answers: the messages the local SMTP server received, newest first.
export interface MailboxItemJson {
  id: string;
  to: string;
  from: string;
  subject: string;
  text: string;
  receivedAt: string;
}

export interface MailboxPageJson {
  items: MailboxItemJson[];
  total: number;
}
