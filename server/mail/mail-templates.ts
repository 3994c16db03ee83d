// Outbox rows written by database triggers name a template instead of carrying finished text; the
// worker renders them here, with the shop's current name and the app's address.
import type { Knex } from 'knex';
import type { MailContent } from './mail-layout';

export type MailTemplate = (k: Knex, data: Record<string, unknown>) => Promise<MailContent>;

export class TemplateError extends Error {}

const templates = new Map<string, MailTemplate>();

/** A feature registers each template its triggers name, once, when its module loads. */
export function registerMailTemplate(name: string, render: MailTemplate): void {
  templates.set(name, render);
}

export async function renderTemplate(
  k: Knex,
  name: string,
  data: Record<string, unknown>,
): Promise<MailContent> {
  const render = templates.get(name);
  if (!render) throw new TemplateError(`No e-mail template named "${name}".`);
  return render(k, data);
}
