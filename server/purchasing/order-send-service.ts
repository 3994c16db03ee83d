// Sending a drafted purchase order: the supplier's e-mail (lines as CSV) goes into the outbox in
// the same transaction that marks the order sent, so the order is never "sent" without its
// message. An address that cannot carry exactly one recipient is refused here with the reason and
// the order left as it was; a message the supplier's mail server later refuses for good puts the
// order back to drafting with that reason (a trigger on the outbox, see its migration).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { AppError, Conflict } from '../errors';
import { enqueueMail } from '../mail/outbox';
import { getSettings } from '../settings/settings-service';
import { isOneEmailAddress } from '../../shared/text-rules';
import type { OrderJson } from '../../shared/api/purchasing';
import { orderMail } from './order-mail';
import * as repo from './orders-repository';
import { getOrder, lockDrafting } from './orders-service';
import { shopToday } from './sourcing-service';

export async function sendOrder(actorId: string, id: string, k: Knex = db): Promise<OrderJson> {
  const settings = await getSettings(k);
  const today = await shopToday(k);
  await k.transaction(async (trx) => {
    const order = await lockDrafting(trx, id, 'sent');
    if (!order.supplier_email) {
      throw new Conflict(
        `${order.supplier_name} has no ordering e-mail address: add one to the supplier first.`,
        'no_supplier_email',
      );
    }
    // An address stored before addresses were checked (a list, a bracket) would reach the wrong
    // people or none: refuse before anything is written, and say where to correct it.
    if (!isOneEmailAddress(order.supplier_email)) {
      const message = `${order.supplier_name}'s ordering e-mail "${order.supplier_email}" is not one address (like orders@example.test): correct it on the supplier, then send again. ${order.number} is still being drafted.`;
      throw new AppError(422, 'bad_supplier_email', message, [
        { field: 'supplierEmail', message: 'is not one e-mail address' },
      ]);
    }
    const lines = await repo.orderLines([id], trx);
    if (lines.length === 0) throw new Conflict(`${order.number} has no lines to send.`, 'no_lines');
    const expectedOn =
      order.expected_on ?? today.plus({ days: order.supplier_lead_days }).toISODate() ?? null;
    const mail = orderMail(settings.shopName, order, lines, expectedOn, {
      locale: settings.locale,
      timeZone: settings.timeZone,
    });
    const outboxId = await enqueueMail(trx, { to: order.supplier_email, ...mail });
    await repo.updateOrder(trx, id, {
      state: 'sent_out',
      sent_at: trx.fn.now(),
      sent_by: actorId,
      expected_on: expectedOn,
      // The message this sending queued, so a refusal can find its order; an earlier failure's
      // reason is cleared by the new attempt.
      send_outbox_id: outboxId,
      send_error: null,
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'purchase_order.send',
      entity: 'purchase_order',
      entityId: id,
      after: { to: order.supplier_email, expectedOn },
    });
  });
  return getOrder(id, k);
}
