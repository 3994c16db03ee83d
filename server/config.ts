// Reads the environment once, validates it and fails fast with a clear message. Defaults make
// `npm start` work with nothing set.
import * as z from '../shared/zod';

const schema = z.object({
  NODE_ENV: z._default(z.enum(['development', 'production', 'test']), 'development'),
  PORT: z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(65535)), 4280),
  HOST: z._default(z.string(), '127.0.0.1'),
  DATABASE_URL: z.optional(z.string().check(z.minLength(1))),
  SESSION_SECRET: z.optional(z.string().check(z.minLength(16))),
  SESSION_IDLE_MINUTES: z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(24 * 60)), 120),
  TRUST_PROXY: z._default(z.enum(['0', '1']), '0'),
  /** PEM files: with both set, Stepstock serves HTTPS itself (tablets need it for offline use). */
  TLS_CERT: z.optional(z.string().check(z.minLength(1))),
  TLS_KEY: z.optional(z.string().check(z.minLength(1))),
  SMTP_URL: z.optional(z.string()),
  MAIL_FROM: z._default(z.string(), 'Stepstock <no-reply@stepstock.test>'),
  APP_URL: z.optional(z.string()),
  /**
   * The hosted payment service's secret API key and the signing secret of Stepstock's webhook
   * endpoint there: with both set the SDK talks to the real service; with neither, each server
   * process starts a local stand-in on loopback.
   */
  PAYMENTS_SECRET_KEY: z.optional(z.string().check(z.minLength(1))),
  PAYMENTS_WEBHOOK_SECRET: z.optional(z.string().check(z.minLength(1))),
  LOG_LEVEL: z._default(
    z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']),
    'info',
  ),
  PHOTO_DIR: z.optional(z.string()),
  DIST_DIR: z.optional(z.string()),
  /** Connections in the request pool; PostgreSQL's max_connections must cover every process. */
  DB_POOL_SIZE: z._default(z.coerce.number().check(z.int(), z.gte(2), z.lte(200)), 10),
  /** Failed sign-ins allowed from one address (across all e-mails) in 15 minutes. */
  SIGN_IN_FAILURES_PER_ADDRESS: z._default(
    z.coerce.number().check(z.int(), z.gte(1), z.lte(10000)),
    30,
  ),
  /** Seconds a price-list import waits for its turn (two at once, one per supplier) before a 503. */
  IMPORT_WAIT_SECONDS: z._default(z.coerce.number().check(z.gte(0), z.lte(600)), 20),
  /** How far the JavaScript heap may grow past the last full collection (%; 0: V8's own choice). */
  HEAP_GROWING_PERCENT: z._default(z.coerce.number().check(z.int(), z.gte(0), z.lte(300)), 50),
  /** Hours an uncommitted price-list preview (and its staged rows) is kept before it is swept. */
  PRICE_LIST_PREVIEW_HOURS: z._default(z.coerce.number().check(z.gte(0.01), z.lte(24 * 365)), 24),
});

export type Config = Readonly<z.infer<typeof schema>> & {
  readonly databaseUrl: string;
  readonly sessionSecret: string;
  readonly appUrl: string;
  /** Serving HTTPS itself (TLS_CERT and TLS_KEY given). */
  readonly tls: boolean;
};

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = schema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Stepstock cannot start: bad configuration\n${lines}`);
  }
  const c = parsed.data;
  if (Boolean(c.TLS_CERT) !== Boolean(c.TLS_KEY)) {
    throw new Error(
      'Stepstock cannot start: bad configuration\n  TLS_CERT and TLS_KEY: give both (the certificate and its private key) or neither',
    );
  }
  if (Boolean(c.PAYMENTS_SECRET_KEY) !== Boolean(c.PAYMENTS_WEBHOOK_SECRET)) {
    throw new Error(
      'Stepstock cannot start: bad configuration\n  PAYMENTS_SECRET_KEY and PAYMENTS_WEBHOOK_SECRET: give both (the API key and the webhook signing secret) or neither',
    );
  }
  const tls = Boolean(c.TLS_CERT && c.TLS_KEY);
  const databaseUrl = c.DATABASE_URL ?? 'postgres://stepstock@127.0.0.1:5488/stepstock';
  return Object.freeze({
    ...c,
    databaseUrl,
    // A fixed fallback secret is only acceptable for the local demo; production sets SESSION_SECRET.
    sessionSecret: c.SESSION_SECRET ?? 'stepstock-local-demo-session-secret',
    appUrl: c.APP_URL ?? `${tls ? 'https' : 'http'}://${c.HOST}:${c.PORT}`,
    tls,
  });
}

export const config = loadConfig();
