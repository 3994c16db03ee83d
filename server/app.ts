// Builds the Express app: security headers, body parsing, sessions, XSRF, the API routes, the built
// Angular app, and one error handler. Tests import createApp() and drive it with supertest.
import express, { type Express } from 'express';
import helmet from 'helmet';
import compression from 'compression';
import passport from 'passport';
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { pinoHttp } from 'pino-http';
import { config } from './config';
import { logger } from './logger';
import { sessionMiddleware } from './auth/session-middleware';
import { configurePassport } from './auth/passport-setup';
import { xsrfGuard } from './auth/xsrf';
import { errorHandler } from './http/error-handler';
import { registerAllRoutes } from './routes';
import { createHealthProbe, registerHealthRoutes } from './health/health-routes';
import { NotFound } from './errors';
import { assertEveryRouteDeclared } from './http/route';

export interface CreatedApp {
  app: Express;
  /** Every router holding declared routes, for the route matrix and the API description. */
  routers: express.Router[];
  close(): Promise<void>;
}

/** Built files whose names stay the same from one build to the next. */
const UNHASHED = new Set([
  'index.html',
  'ngsw.json',
  'ngsw-worker.js',
  'safety-worker.js',
  'worker-basic.min.js',
  'manifest.webmanifest',
]);

export function distDir(): string {
  return config.DIST_DIR ?? path.resolve(__dirname, '..', 'dist', 'stepstock', 'browser');
}

export function createApp(opts: { databaseUrl?: string; serveClient?: boolean } = {}): CreatedApp {
  const app = express();
  app.disable('x-powered-by');
  if (config.TRUST_PROXY === '1') app.set('trust proxy', 1);

  app.use(
    pinoHttp({
      logger,
      genReqId: (req, res) => {
        const id = (req.headers['x-request-id'] as string | undefined) ?? randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      autoLogging: { ignore: (req) => !req.url?.startsWith('/api/') },
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          // Angular Material sets inline styles; scripts stay strictly same-origin.
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'upgrade-insecure-requests': null,
        },
      },
      crossOriginEmbedderPolicy: false,
      hsts: config.TRUST_PROXY === '1' || config.tls,
    }),
  );
  app.use(compression());
  // The payment service's events are checked against their signature byte for byte: that route
  // keeps its raw body, and the JSON parser below leaves an already-read body alone.
  app.use('/api/payments/webhook', express.raw({ type: () => true, limit: '256kb' }));
  app.use('/api', express.json({ limit: '1mb', strict: true }));
  app.use('/api', (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    // An API answer opened directly in a browser tab downloads instead of rendering (ASVS 14.4.2);
    // CSV exports and photos set their own disposition.
    res.setHeader('Content-Disposition', 'attachment; filename="api.json"');
    next();
  });

  // Health answers before sessions, so it still answers when the session store is down.
  const early = express.Router();
  const health = createHealthProbe(opts.databaseUrl);
  registerHealthRoutes(early, health);
  app.use(early);

  const sessions = sessionMiddleware(opts.databaseUrl);
  app.use(sessions.middleware);
  configurePassport();
  app.use(passport.initialize());
  app.use(passport.session());
  app.use(xsrfGuard);

  const api = express.Router();
  registerAllRoutes(api);
  assertEveryRouteDeclared([early, api]);
  app.use(api);
  app.use('/api', (_req, _res, next) => next(new NotFound('That API route')));

  const dist = distDir();
  if (opts.serveClient !== false && existsSync(dist)) {
    app.use(
      express.static(dist, {
        index: false,
        maxAge: '1h',
        setHeaders: (res, file) => {
          // The service worker, its manifest of files and the app manifest name what the current
          // build is: a browser must ask again each time, or a tablet keeps last week's app.
          if (UNHASHED.has(path.basename(file))) res.setHeader('Cache-Control', 'no-cache');
        },
      }),
    );
    // Every other path is a client route: answer the app shell and let the Angular router decide.
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(dist, 'index.html'));
    });
  }

  app.use(errorHandler);

  return {
    app,
    routers: [early, api],
    close: async () => {
      await Promise.all([sessions.pool.end(), health.close()]);
    },
  };
}
