// Reads the environment once, validates it and fails fast with a clear message. Defaults make
// `npm start` work with nothing set.
import { z } from 'zod';

const schema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(4280),
  HOST: z.string().default('127.0.0.1'),
  DATABASE_URL: z.string().min(1).optional(),
  SESSION_SECRET: z.string().min(16).optional(),
  SESSION_IDLE_MINUTES: z.coerce
    .number()
    .int()
    .min(1)
    .max(24 * 60)
    .default(120),
  TRUST_PROXY: z.enum(['0', '1']).default('0'),
  /** PEM files: with both set, Stepstock serves HTTPS itself (tablets need it for offline use). */
  TLS_CERT: z.string().min(1).optional(),
  TLS_KEY: z.string().min(1).optional(),
  SMTP_URL: z.string().optional(),
  MAIL_FROM: z.string().default('Stepstock <no-reply@stepstock.test>'),
  APP_URL: z.string().optional(),
  /**
   * The hosted payment service's secret API key and the signing secret of Stepstock's webhook
   * endpoint there: with both set the SDK talks to the real service; with neither, each server
   * process starts a local stand-in on loopback.
   */
  PAYMENTS_SECRET_KEY: z.string().min(1).optional(),
  PAYMENTS_WEBHOOK_SECRET: z.string().min(1).optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  PHOTO_DIR: z.string().optional(),
  DIST_DIR: z.string().optional(),
  /** Connections in the request pool; PostgreSQL's max_connections must cover every process. */
  DB_POOL_SIZE: z.coerce.number().int().min(2).max(200).default(10),
  /** Failed sign-ins allowed from one address (across all e-mails) in 15 minutes. */
  SIGN_IN_FAILURES_PER_ADDRESS: z.coerce.number().int().min(1).max(10000).default(30),
  /** Seconds a price-list import waits for its turn (two at once, one per supplier) before a 503. */
  IMPORT_WAIT_SECONDS: z.coerce.number().min(0).max(600).default(20),
  /** How far the JavaScript heap may grow past the last full collection (%; 0: V8's own choice). */
  HEAP_GROWING_PERCENT: z.coerce.number().int().min(0).max(300).default(50),
  /** Hours an uncommitted price-list preview (and its staged rows) is kept before it is swept. */
  PRICE_LIST_PREVIEW_HOURS: z.coerce
    .number()
    .min(0.01)
    .max(24 * 365)
    .default(24),
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
