// Starts the HTTP server. `npm start` reaches this through server/setup/start.ts, which first makes
// sure the database exists; a shop on a managed PostgreSQL runs it with DATABASE_URL set.
import type { Server } from 'node:http';
import { config } from './config';
import { logger } from './logger';
import { createApp } from './app';
import { db } from './db/knex';
import { startBackgroundWork } from './background';

export interface RunningServer {
  server: Server;
  url: string;
  stop(): Promise<void>;
}

export async function startServer(port = config.PORT, host = config.HOST): Promise<RunningServer> {
  const created = createApp();
  const background = await startBackgroundWork();
  const server = await new Promise<Server>((resolve, reject) => {
    const s = created.app.listen(port, host, () => resolve(s));
    s.once('error', reject);
  });
  const addr = server.address();
  const actualPort = typeof addr === 'object' && addr ? addr.port : port;
  const url = `http://${host}:${actualPort}`;
  logger.info({ url }, 'Stepstock is listening');
  return {
    server,
    url,
    stop: async () => {
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
