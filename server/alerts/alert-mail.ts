// The words of alert e-mail: one message when a part reaches its reorder point, and the daily
// digest for buyers who prefer one message a day.
import type { Knex } from 'knex';
import { config } from '../config';
import { composeMail, type MailContent } from '../mail/mail-layout';
import { registerMailTemplate, TemplateError } from '../mail/mail-templates';
import { getSettings } from '../settings/settings-service';
import { findAlert, type AlertRow } from './alerts-repository';

const MODE_NOTE =
  'You receive this because your account is set to instant stock alerts; you can choose a daily summary or none on the stock alerts page.';

function partName(a: AlertRow): string {
  const where = [a.family_code, a.step_label].filter(Boolean).join(' ');
  return where ? `${a.description} (${where})` : a.description;
}

export async function reorderAlertMail(k: Knex, alertId: string): Promise<MailContent> {
  const alert = await findAlert(alertId, k);
  if (!alert) throw new TemplateError(`The alert ${alertId} no longer exists.`);
  const settings = await getSettings(k);
  return composeMail({
    shopName: settings.shopName,
    appUrl: config.appUrl,
    subject: `Running low: ${alert.sku} is down to ${alert.free_at_raise} free (reorder point ${alert.reorder_point})`,
    heading: `${alert.sku} has reached its reorder point`,
    paragraphs: [
      `Free stock of ${partName(alert)} fell to ${alert.free_at_raise}, at or below its reorder point of ${alert.reorder_point}.`,
      alert.on_order > 0
        ? `${alert.on_order} are already on order.`
        : 'Nothing is on order for it yet.',
    ],
    facts: [
      ['Part', alert.sku],
      ['Free when raised', String(alert.free_at_raise)],
      ['Reorder point', String(alert.reorder_point)],
      ['Order up to', alert.order_up_to === null ? 'not set' : String(alert.order_up_to)],
      ['On order', String(alert.on_order)],
    ],
    link: { label: 'Open the stock alerts', path: '/alerts' },
    closing: MODE_NOTE,
  });
}

registerMailTemplate('reorder-alert', (k, data) => {
  const alertId = data['alertId'];
  if (typeof alertId !== 'string') throw new TemplateError('The alert e-mail needs an alertId.');
  return reorderAlertMail(k, alertId);
});

export function digestMail(shopName: string, day: string, alerts: AlertRow[]): MailContent {
  const n = alerts.length;
  return composeMail({
    shopName,
    appUrl: config.appUrl,
    subject: `Stock alerts for ${day}: ${n} ${n === 1 ? 'part' : 'parts'} at or below the reorder point`,
    heading: `${n} ${n === 1 ? 'part has' : 'parts have'} reached the reorder point`,
    paragraphs: [
      'Since your last summary these parts fell to their reorder point or below:',
      ...alerts.map(
        (a) =>
          `${a.sku} — ${partName(a)}: ${a.free_at_raise} free when raised (point ${a.reorder_point}), ${a.free} free now, ${a.on_order} on order.`,
      ),
    ],
    link: { label: 'Open the stock alerts', path: '/alerts' },
    closing:
      'You receive one summary a day because you chose a daily summary; change it on the stock alerts page.',
  });
}
