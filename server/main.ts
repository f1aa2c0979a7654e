import type { Server } from 'node:http';
import { createApp } from './app';
import type { ServerConfig } from './config';
import { createKnex } from './db/knex';
import { logLine } from './log';
import { createMailer } from './mail/mailer';

/** Starts the API and web app on one origin; resolves once it listens. */
export async function startServer(config: ServerConfig) {
  const knex = createKnex(config.databaseUrl);
  const mailer = createMailer(config.smtp);
  const { app, close: closeSessions } = createApp({ config, knex, mailer });
  const server: Server = await new Promise((resolve, reject) => {
    const listening = app.listen(config.port, config.host, (error?: Error) => (error ? reject(error) : resolve(listening)));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  logLine(`Flakeline is serving on http://${config.host}:${port}`);
  return {
    port,
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      mailer.close();
      await closeSessions();
      await knex.destroy();
    },
  };
}
