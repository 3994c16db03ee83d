// The events the local payment stand-in sends to Stepstock's webhook: signed the way the real
// service signs them, so the SDK's own check verifies them; sent again a few times when Stepstock
// does not answer 2xx, then given up (the real service keeps trying for days).
import { createHmac } from 'node:crypto';
import http from 'node:http';
import https from 'node:https';
import { newId, nowSeconds } from './fake-http';

export interface SentEvent {
  id: string;
  type: string;
  /** Exactly the bytes sent, and the signature header sent with them (tests replay both). */
  payload: string;
  signature: string;
  /** HTTP status of each delivery attempt (0: no answer). */
  answers: number[];
}

/** The signature header: t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<payload>">. */
export function signEvent(payload: string, secret: string, t = nowSeconds()): string {
  const v1 = createHmac('sha256', secret).update(`${t}.${payload}`, 'utf8').digest('hex');
  return `t=${t},v1=${v1}`;
}

export interface EventSender {
  sent: SentEvent[];
  /** Sends a new event; resolves after the first attempt. */
  send(type: string, object: unknown): Promise<SentEvent>;
  stop(): void;
}

export function eventSender(secret: string, target: () => string | null): EventSender {
  const sent: SentEvent[] = [];
  const timers = new Set<NodeJS.Timeout>();

  function attempt(event: SentEvent): Promise<number> {
    const url = target();
    if (!url) return Promise.resolve(0);
    const u = new URL(url);
    const client = u.protocol === 'https:' ? https : http;
    return new Promise((resolve) => {
      const req = client.request(
        u,
        {
          method: 'POST',
          headers: {
            'content-type': 'application/json; charset=utf-8',
            'stripe-signature': event.signature,
            'user-agent': 'stepstock-local-payments',
          },
          // Stepstock's own certificate on loopback is often self-made.
          rejectUnauthorized: false,
          timeout: 10_000,
        },
        (res) => {
          res.resume();
          res.on('end', () => resolve(res.statusCode ?? 0));
        },
      );
      req.on('timeout', () => req.destroy());
      req.on('error', () => resolve(0));
      req.end(event.payload);
    });
  }

  async function deliver(event: SentEvent, waits: number[]): Promise<void> {
    const status = await attempt(event);
    event.answers.push(status);
    if ((status >= 200 && status < 300) || waits.length === 0) return;
    const t = setTimeout(() => {
      timers.delete(t);
      void deliver(event, waits.slice(1));
    }, waits[0]);
    t.unref();
    timers.add(t);
  }

  return {
    sent,
    send: async (type, object) => {
      const evt = {
        id: newId('evt'),
        object: 'event',
        api_version: null,
        created: nowSeconds(),
        type,
        livemode: false,
        pending_webhooks: 1,
        request: { id: null, idempotency_key: null },
        data: { object },
      };
      const payload = JSON.stringify(evt, null, 2);
      const e: SentEvent = {
        id: evt.id,
        type,
        payload,
        signature: signEvent(payload, secret),
        answers: [],
      };
      sent.push(e);
      await deliver(e, [1_000, 5_000, 20_000]);
      return e;
    },
    stop: () => {
      for (const t of timers) clearTimeout(t);
      timers.clear();
    },
  };
}
