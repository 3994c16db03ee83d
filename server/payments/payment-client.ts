// The one door to the hosted payment service: its own SDK, pointed at the real service when
// PAYMENTS_SECRET_KEY and PAYMENTS_WEBHOOK_SECRET are set, else at the local stand-in this process
// started. The key and the signing secret stay here: never in an answer, a log line or an error
// message (a refusal is logged by its type and code only).
import Stripe from 'stripe';
import { config } from '../config';
import { logger } from '../logger';
import { BadGateway, BadRequest, ServiceUnavailable } from '../errors';

export interface LocalPayments {
  port: number;
  secretKey: string;
  webhookSecret: string;
  sendEventsTo(url: string | null): void;
}

let local: LocalPayments | null = null;
let sdk: Stripe | null = null;

/** True when the shop configured the real service: no local stand-in is started then. */
export function realPaymentsConfigured(): boolean {
  return Boolean(config.PAYMENTS_SECRET_KEY && config.PAYMENTS_WEBHOOK_SECRET);
}

/** Called once the local stand-in listens (null when it stops); ignored with real keys. */
export function useLocalPayments(p: LocalPayments | null): void {
  local = p;
  sdk = null;
}

export function localPayments(): LocalPayments | null {
  return realPaymentsConfigured() ? null : local;
}

/** Tells the local stand-in where this process takes events (the real service is set up on its dashboard). */
export function takeEventsAt(appUrl: string | null): void {
  localPayments()?.sendEventsTo(
    appUrl ? `${appUrl.replace(/\/+$/, '')}/api/payments/webhook` : null,
  );
}

const NOT_SET_UP =
  'Online payments are not set up on this server: set PAYMENTS_SECRET_KEY and PAYMENTS_WEBHOOK_SECRET, or take the payment at the counter.';

function client(): Stripe {
  if (sdk) return sdk;
  const common = { maxNetworkRetries: 2, timeout: 15_000, telemetry: false } as const;
  if (realPaymentsConfigured()) {
    sdk = new Stripe(config.PAYMENTS_SECRET_KEY as string, common);
  } else if (local) {
    sdk = new Stripe(local.secretKey, {
      ...common,
      host: '127.0.0.1',
      port: local.port,
      protocol: 'http',
    });
  } else {
    throw new ServiceUnavailable(NOT_SET_UP, 30);
  }
  return sdk;
}

function webhookSecret(): string {
  if (realPaymentsConfigured()) return config.PAYMENTS_WEBHOOK_SECRET as string;
  if (local) return local.webhookSecret;
  throw new ServiceUnavailable(NOT_SET_UP, 30);
}

/**
 * One call to the service. A refusal or no answer becomes a 502 that says what could not be done
 * (the caller's transaction then writes nothing); what the service said is logged, without keys.
 */
export async function callPayments<T>(what: string, call: (s: Stripe) => Promise<T>): Promise<T> {
  const s = client();
  try {
    return await call(s);
  } catch (e) {
    const err = e as { type?: string; code?: string; statusCode?: number; requestId?: string };
    logger.warn(
      { type: err.type, code: err.code, status: err.statusCode, requestId: err.requestId },
      `payment service: could not ${what}`,
    );
    throw new BadGateway(
      `The payment service could not ${what} just now${err.statusCode ? ` (it answered ${err.statusCode})` : ''}; nothing was changed. Try again in a moment.`,
      'payment_service',
    );
  }
}

/** The event in a webhook request, checked against its signature by the SDK; else 400. */
export function readEvent(raw: unknown, signature: string | undefined): Stripe.Event {
  if (!Buffer.isBuffer(raw) || raw.length === 0) {
    throw new BadRequest(
      'The event has no body.',
      [{ field: 'body', message: 'is empty' }],
      'bad_event',
    );
  }
  if (!signature) {
    throw new BadRequest(
      'The event carries no Stripe-Signature header.',
      [{ field: 'Stripe-Signature', message: 'is missing' }],
      'bad_signature',
    );
  }
  const secret = webhookSecret();
  try {
    return client().webhooks.constructEvent(raw, signature, secret);
  } catch {
    throw new BadRequest(
      'The event signature does not match: it was not sent by the payment service, or it was changed on the way.',
      [{ field: 'Stripe-Signature', message: 'does not match the body' }],
      'bad_signature',
    );
  }
}
