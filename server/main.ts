// Starts the HTTP server. `npm start` reaches this through server/start.ts, which first makes
// sure the database exists; a shop on a managed PostgreSQL runs it with DATABASE_URL set.
import { readFileSync } from 'node:fs';
import type { Server } from 'node:http';
import https from 'node:https';
import { config } from './config';
import { logger } from './logger';
import { createApp } from './app';
import { db } from './db/knex';
import { startBackgroundWork } from './background';
import { limitHeapGrowth } from './heap-growth';
import { takeEventsAt } from './payments/payment-client';

export interface RunningServer {
  server: Server;
  url: string;
  stop(): Promise<void>;
}

function listen(
  app: ReturnType<typeof createApp>['app'],
  port: number,
  host: string,
): Promise<Server> {
  const failed = (err: Error) =>
    (err as NodeJS.ErrnoException).code === 'EADDRINUSE'
      ? new Error(`Port ${port} on ${host} is already in use. Stop the other program or set PORT.`)
      : err;
  if (config.TLS_CERT && config.TLS_KEY) {
    // Node's own TLS: a shop's server on its local network, reached by tablets over HTTPS.
    const secure = https.createServer(
      { cert: readTls(config.TLS_CERT, 'TLS_CERT'), key: readTls(config.TLS_KEY, 'TLS_KEY') },
      app,
    );
    return new Promise<Server>((resolve, reject) => {
      secure.once('error', (err) => reject(failed(err)));
      secure.listen(port, host, () => resolve(secure));
    });
  }
  return new Promise<Server>((resolve, reject) => {
    // Express 5 hands a listen error (a port already taken) to this callback instead of throwing.
    const s = app.listen(port, host, (err?: Error) => {
      if (!err) return resolve(s);
      reject(failed(err));
    });
  });
}

function readTls(file: string, name: string): Buffer {
  try {
    return readFileSync(file);
  } catch (e) {
    throw new Error(`${name}: cannot read ${file} (${(e as Error).message})`);
  }
}

export async function startServer(port = config.PORT, host = config.HOST): Promise<RunningServer> {
  limitHeapGrowth(config.HEAP_GROWING_PERCENT);
  const created = createApp();
  const background = await startBackgroundWork();
  let server: Server;
  try {
    server = await listen(created.app, port, host);
  } catch (e) {
    await background.stop();
    await created.close();
    throw e;
  }
  const addr = server.address();
  const actualPort = typeof addr === 'object' && addr ? addr.port : port;
  const url = `${config.tls ? 'https' : 'http'}://${host}:${actualPort}`;
  takeEventsAt(url);
  logger.info({ url }, 'Stepstock is listening');
  return {
    server,
    url,
    stop: async () => {
      takeEventsAt(null);
      await background.stop();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections?.();
      await created.close();
      await db.destroy();
    },
  };
}

if (require.main === module) {
  startServer()
    .then((running) => {
      process.stdout.write(`Stepstock: ${running.url}\n`);
      const stop = () => {
        running.stop().then(
          () => process.exit(0),
          () => process.exit(1),
        );
      };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    })
    .catch((e: Error) => {
      logger.fatal({ err: e }, 'could not start');
      process.exit(1);
    });
}
