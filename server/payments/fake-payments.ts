// A local stand-in for the hosted payment service, on loopback, for the demo and the tests (like the
// local SMTP server): the few calls Stepstock makes through the service's own SDK (create, read and
// end a checkout session; refund a paid one), a hosted pay page at each session's url (a POST to
// that same url pays it), and the signed event it then sends to Stepstock, signed the way the real
// service signs (t=<seconds>,v1=<HMAC-SHA256 of "<t>.<payload>" under the webhook secret>).
// Everything it knows lives in memory: it forgets its sessions when it stops.
import { randomBytes } from 'node:crypto';
import http, { type IncomingMessage, type ServerResponse } from 'node:http';
import { logger } from '../logger';
import { currencyDecimals, formatMoney } from '../../shared/money';
import { parseForm, textAt, textMap } from './fake-form';
import { payPage, unknownPage } from './fake-pay-page';
import { eventSender, type SentEvent } from './fake-events';
import {
  ApiError,
  newId as id,
  nowSeconds as now,
  positiveInt,
  readBody,
  sendHtml,
  sendJson,
} from './fake-http';

export { signEvent, type SentEvent } from './fake-events';

export interface FakeSession {
  id: string;
  object: 'checkout.session';
  mode: 'payment';
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  amount_total: number;
  currency: string;
  url: string | null;
  success_url: string | null;
  cancel_url: string | null;
  client_reference_id: string | null;
  customer_email: string | null;
  metadata: Record<string, string>;
  payment_intent: string | null;
  created: number;
  expires_at: number;
  livemode: false;
  /** The line's name and the payee, shown on the pay page. */
  line: { name: string; description: string | null };
}

export interface FakeRefund {
  id: string;
  object: 'refund';
  amount: number;
  currency: string;
  payment_intent: string;
  status: 'succeeded';
  reason: string | null;
  metadata: Record<string, string>;
  created: number;
}

export interface FakePayments {
  /** http://127.0.0.1:<port> */
  url: string;
  port: number;
  /** The key the SDK must present, and the secret events are signed with. */
  secretKey: string;
  webhookSecret: string;
  sessions: Map<string, FakeSession>;
  refunds: FakeRefund[];
  sent: SentEvent[];
  /** Where events go (Stepstock's /api/payments/webhook); null keeps them unsent. */
  sendEventsTo(url: string | null): void;
  stop(): Promise<void>;
}

export async function startFakePayments(
  opts: { port?: number; webhookUrl?: string | null } = {},
): Promise<FakePayments> {
  const secretKey = `sk_test_local_${randomBytes(16).toString('hex')}`;
  const webhookSecret = `whsec_local_${randomBytes(16).toString('hex')}`;
  const sessions = new Map<string, FakeSession>();
  const refunds: FakeRefund[] = [];
  const remembered = new Map<string, { status: number; body: unknown }>();
  let webhookUrl = opts.webhookUrl ?? null;
  const events = eventSender(webhookSecret, () => webhookUrl);
  let base = '';

  function createSession(body: string): FakeSession {
    const form = parseForm(body);
    if (textAt(form, 'mode') !== 'payment') {
      throw new ApiError(400, 'Only mode=payment is offered here.', 'parameter_invalid', 'mode');
    }
    const success = textAt(form, 'success_url');
    if (!success || !/^https?:\/\//.test(success)) {
      throw new ApiError(
        400,
        'Missing required param: success_url.',
        'parameter_missing',
        'success_url',
      );
    }
    const price = ['line_items', 0, 'price_data'] as const;
    const currency = textAt(form, ...price, 'currency');
    if (!currency || !/^[a-z]{3}$/.test(currency)) {
      throw new ApiError(
        400,
        'Invalid currency.',
        'parameter_invalid',
        'line_items[0][price_data][currency]',
      );
    }
    const unit = positiveInt(
      textAt(form, ...price, 'unit_amount'),
      'line_items[0][price_data][unit_amount]',
    );
    const quantity = positiveInt(
      textAt(form, 'line_items', 0, 'quantity'),
      'line_items[0][quantity]',
    );
    const name = textAt(form, ...price, 'product_data', 'name');
    if (!name) {
      throw new ApiError(
        400,
        'Missing product name.',
        'parameter_missing',
        'line_items[0][price_data][product_data][name]',
      );
    }
    const sid = id('cs_test');
    const created = now();
    const expires = textAt(form, 'expires_at');
    const session: FakeSession = {
      id: sid,
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: unit * quantity,
      currency,
      url: `${base}/pay/${sid}`,
      success_url: success,
      cancel_url: textAt(form, 'cancel_url') ?? null,
      client_reference_id: textAt(form, 'client_reference_id') ?? null,
      customer_email: textAt(form, 'customer_email') ?? null,
      metadata: textMap(form, 'metadata'),
      payment_intent: null,
      created,
      expires_at: expires ? positiveInt(expires, 'expires_at') : created + 24 * 3600,
      livemode: false,
      line: { name, description: textAt(form, ...price, 'product_data', 'description') ?? null },
    };
    sessions.set(sid, session);
    return session;
  }

  function current(sid: string): FakeSession | undefined {
    const s = sessions.get(sid);
    if (s && s.status === 'open' && s.expires_at <= now()) s.status = 'expired';
    return s;
  }

  function publicSession(s: FakeSession) {
    const { line: _line, ...rest } = s;
    return { ...rest, url: s.status === 'open' ? s.url : null };
  }

  function refund(body: string): FakeRefund {
    const form = parseForm(body);
    const intent = textAt(form, 'payment_intent');
    const paid = [...sessions.values()].find((s) => intent && s.payment_intent === intent);
    if (!paid) {
      throw new ApiError(
        404,
        `No such payment_intent: '${intent ?? ''}'`,
        'resource_missing',
        'payment_intent',
      );
    }
    const already = refunds
      .filter((r) => r.payment_intent === intent)
      .reduce((n, r) => n + r.amount, 0);
    const left = paid.amount_total - already;
    const amountText = textAt(form, 'amount');
    const amount = amountText === undefined ? left : positiveInt(amountText, 'amount');
    if (left <= 0)
      throw new ApiError(
        400,
        'This payment was already refunded in full.',
        'charge_already_refunded',
      );
    if (amount > left) {
      throw new ApiError(
        400,
        `Refund amount is more than the ${left} left to refund.`,
        'amount_too_large',
        'amount',
      );
    }
    const r: FakeRefund = {
      id: id('re'),
      object: 'refund',
      amount,
      currency: paid.currency,
      payment_intent: intent as string,
      status: 'succeeded',
      reason: textAt(form, 'reason') ?? null,
      metadata: textMap(form, 'metadata'),
      created: now(),
    };
    refunds.push(r);
    return r;
  }

  async function pay(s: FakeSession): Promise<void> {
    s.status = 'complete';
    s.payment_status = 'paid';
    s.payment_intent = id('pi');
    await events.send('checkout.session.completed', publicSession(s));
  }

  async function api(req: IncomingMessage, res: ServerResponse, path: string): Promise<void> {
    if (req.headers.authorization !== `Bearer ${secretKey}`) {
      throw new ApiError(401, 'Invalid API key provided.', 'api_key_invalid');
    }
    const body = req.method === 'POST' ? await readBody(req) : '';
    const key = req.headers['idempotency-key'];
    const memo = typeof key === 'string' ? `${req.method} ${path} ${key}` : null;
    const earlier = memo ? remembered.get(memo) : undefined;
    if (earlier) return sendJson(res, earlier.status, earlier.body);
    let answer: unknown;
    // An event this call causes, sent once the call is answered (as the real service does).
    let after: (() => void) | null = null;
    const m = /^\/v1\/checkout\/sessions\/([A-Za-z0-9_]+)(\/expire)?$/.exec(path);
    if (req.method === 'POST' && path === '/v1/checkout/sessions') {
      answer = publicSession(createSession(body));
    } else if (m && req.method === 'GET' && !m[2]) {
      const s = current(m[1]);
      if (!s)
        throw new ApiError(404, `No such checkout.session: '${m[1]}'`, 'resource_missing', 'id');
      answer = publicSession(s);
    } else if (m && req.method === 'POST' && m[2]) {
      const s = current(m[1]);
      if (!s)
        throw new ApiError(404, `No such checkout.session: '${m[1]}'`, 'resource_missing', 'id');
      if (s.status !== 'open') {
        throw new ApiError(
          400,
          `Only an open session can be expired; this one is ${s.status}.`,
          'session_not_open',
        );
      }
      s.status = 'expired';
      answer = publicSession(s);
      after = () => void events.send('checkout.session.expired', publicSession(s));
    } else if (req.method === 'POST' && path === '/v1/refunds') {
      answer = refund(body);
    } else {
      throw new ApiError(404, `Unrecognized request URL (${req.method}: ${path}).`, 'not_offered');
    }
    if (memo) remembered.set(memo, { status: 200, body: answer });
    sendJson(res, 200, answer);
    after?.();
  }

  async function payPageRoute(
    req: IncomingMessage,
    res: ServerResponse,
    sid: string,
  ): Promise<void> {
    const s = current(sid);
    if (!s) return sendHtml(res, 404, unknownPage());
    const view = {
      name: s.line.name,
      payee: s.line.description ?? 'the shop',
      amountText: formatMoney(
        (s.amount_total / 10 ** currencyDecimals(s.currency.toUpperCase())).toFixed(
          currencyDecimals(s.currency.toUpperCase()),
        ),
        s.currency.toUpperCase(),
      ),
      status: s.status,
    };
    if (req.method === 'GET') return sendHtml(res, 200, payPage(view));
    if (s.status === 'expired') return sendHtml(res, 410, payPage(view));
    if (s.status === 'open') await pay(s);
    // Like the real page: back to the shop's page once paid (paying twice pays once).
    res.writeHead(303, {
      location: (s.success_url ?? base).replace('{CHECKOUT_SESSION_ID}', s.id),
    });
    res.end();
  }

  const server = http.createServer((req, res) => {
    const path = new URL(req.url ?? '/', 'http://local').pathname;
    const pay = /^\/pay\/([A-Za-z0-9_]+)$/.exec(path);
    const run = path.startsWith('/v1/')
      ? api(req, res, path)
      : pay && (req.method === 'GET' || req.method === 'POST')
        ? payPageRoute(req, res, pay[1])
        : Promise.resolve(sendHtml(res, 404, unknownPage()));
    run.catch((e: unknown) => {
      if (e instanceof ApiError) {
        return sendJson(res, e.status, {
          error: {
            type: 'invalid_request_error',
            message: e.message,
            code: e.code,
            param: e.param,
          },
        });
      }
      logger.error({ err: e }, 'local payment service failed');
      sendJson(res, 500, { error: { type: 'api_error', message: 'Something went wrong.' } });
    });
  });

  const port = await new Promise<number>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => {
      server.off('error', reject);
      const address = server.address();
      resolve(typeof address === 'object' && address ? address.port : 0);
    });
  });
  base = `http://127.0.0.1:${port}`;

  return {
    url: base,
    port,
    secretKey,
    webhookSecret,
    sessions,
    refunds,
    sent: events.sent,
    sendEventsTo: (url) => {
      webhookUrl = url;
    },
    stop: async () => {
      events.stop();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
    },
  };
}
