import path from 'node:path';
import { configFromEnv, DATA_DIR } from '../config';
import { createKnex } from '../db/knex';
import { prepareDatabase } from '../db/prepare-database';
import { startMailSink } from '../mail/mail-sink';
import { startServer } from '../main';
import { isEmptyLab, seedDemoLab } from '../../seeds/demo-lab';
import { createFileStore } from '../files/file-store';
import { ensureClusterRunning, ensureDatabase } from './local-postgres';
import { loadLocalSecrets } from './local-secrets';
import { progress } from './progress';
import { buildWebAppIfChanged } from './web-build';

const DATABASE = 'flakeline';
const SMTP_SINK_PORT = 2526;

/**
 * `npm start`: the local cluster, the database, migrations, demo data on first run, the web
 * build when its sources changed, the local mail sink, then the server. With DATABASE_URL (the
 * app's role) and MIGRATION_DATABASE_URL (the owner's) or SMTP_HOST set, it uses those instead of
 * the local cluster and the sink.
 */
const roleOf = (url: string) => decodeURIComponent(new URL(url).username);

async function main() {
  const secrets = loadLocalSecrets();
  const env = { ...process.env };
  if (!env.DATABASE_URL) {
    ensureClusterRunning(secrets.superuserPassword);
    const urls = await ensureDatabase({ ...secrets, database: DATABASE });
    env.DATABASE_URL = urls.app;
    env.MIGRATION_DATABASE_URL ??= urls.owner;
  }
  env.SESSION_SECRET ??= secrets.sessionSecret;
  const useSink = !env.SMTP_HOST;
  if (useSink) {
    env.SMTP_PORT ??= String(SMTP_SINK_PORT);
    env.MAIL_SINK_DIR ??= path.join(DATA_DIR, 'mail-sink');
  }
  const config = configFromEnv(env);

  const ownerUrl = env.MIGRATION_DATABASE_URL ?? config.databaseUrl;
  const applied = await prepareDatabase({ ownerUrl, appRole: roleOf(config.databaseUrl) });
  if (applied.length) progress(`Applied ${applied.length} migration(s)`);
  const knex = createKnex(config.databaseUrl, 2);
  if (await isEmptyLab(knex)) {
    progress('Loading the demo lab (first run)');
    await seedDemoLab(knex, createFileStore(config.storage));
  }
  await knex.destroy();

  buildWebAppIfChanged();
  const sink =
    useSink && config.mailSinkDir
      ? await startMailSink({ host: '127.0.0.1', port: config.smtp.port, dir: config.mailSinkDir })
      : null;
  const server = await startServer(config);
  progress(
    `Open ${config.publicBaseUrl} — demo accounts are listed in README.md. Ctrl-C stops the server; \`npm run db:stop\` stops PostgreSQL.`,
  );

  const stop = async () => {
    await server.close();
    await sink?.close();
    process.exit(0);
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}

main().catch((error: unknown) => {
  process.stderr.write(`flakeline: could not start: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
