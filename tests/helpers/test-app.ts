import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import { createApp } from '../../server/app';
import { configFromEnv, type ServerConfig } from '../../server/config';
import { createKnex } from '../../server/db/knex';
import { createMailer } from '../../server/mail/mailer';
import { readCapturedMail, startMailSink } from '../../server/mail/mail-sink';

/** The API test database, made fresh by `npm test` (see server/cli/test.ts). */
export function testDatabaseUrl(): string {
  const url = process.env.TEST_DATABASE_URL;
  if (!url) throw new Error('TEST_DATABASE_URL is not set: run the suites through `npm test`.');
  return url;
}

export function testConfig(overrides: Partial<ServerConfig> = {}): ServerConfig {
  return {
    ...configFromEnv({
      DATABASE_URL: testDatabaseUrl(),
      SESSION_SECRET: 'test-session-secret',
      PUBLIC_BASE_URL: 'http://flakeline.test',
      WEB_DIST_DIR: path.join(os.tmpdir(), 'flakeline-no-web-build'),
    }),
    ...overrides,
  };
}

export interface TestApp {
  app: ReturnType<typeof createApp>['app'];
  specs: ReturnType<typeof createApp>['specs'];
  knex: Knex;
  config: ServerConfig;
  /** Messages the local mail sink has caught so far, newest first. */
  mail: () => ReturnType<typeof readCapturedMail>;
  close: () => Promise<void>;
}

/**
 * The real app on the real test database, with a real SMTP sink on a free port. Passing the
 * same `knex` to a second app simulates a server restart against the same database.
 */
export async function startTestApp(options: { config?: Partial<ServerConfig>; knex?: Knex } = {}): Promise<TestApp> {
  const mailDir = mkdtempSync(path.join(os.tmpdir(), 'flakeline-mail-'));
  const sink = await startMailSink({ host: '127.0.0.1', port: 0, dir: mailDir });
  // Uploaded files go to a folder of this app's own, never the checkout's storage/.
  const blobDir = mkdtempSync(path.join(os.tmpdir(), 'flakeline-blobs-'));
  const config = testConfig({
    mailSinkDir: mailDir,
    storage: { backend: 'local', dir: blobDir },
    smtp: { host: '127.0.0.1', port: sink.port, from: 'Flakeline <flakeline@flakeline.test>' },
    ...options.config,
  });
  const knex = options.knex ?? createKnex(config.databaseUrl, 4);
  const mailer = createMailer(config.smtp);
  const { app, specs, close } = createApp({ config, knex, mailer });
  return {
    app,
    specs,
    knex,
    config,
    mail: () => readCapturedMail(mailDir),
    close: async () => {
      await close();
      mailer.close();
      await sink.close();
      if (!options.knex) await knex.destroy();
      rmSync(mailDir, { recursive: true, force: true });
      rmSync(blobDir, { recursive: true, force: true });
    },
  };
}

let adminKnex: Knex | undefined;

/**
 * The cluster superuser on the test database. Only tests use it: to empty tables between tests
 * (the app's role may not truncate, and nobody may truncate the history without disabling its
 * triggers) and to play a tamperer who edits the history behind the app's back.
 */
export function testAdminKnex(): Knex {
  const url = process.env.TEST_ADMIN_DATABASE_URL;
  if (!url) throw new Error('TEST_ADMIN_DATABASE_URL is not set: run the suites through `npm test`.');
  adminKnex ??= createKnex(url, 1);
  return adminKnex;
}

afterAll(async () => {
  await adminKnex?.destroy();
  adminKnex = undefined;
});

const APP_TABLES = [
  'step_submissions',
  'step_templates',
  'history_events',
  'sample_locations',
  'boxes',
  'storage_places',
  'lineage_links',
  'step_samples',
  'steps',
  'samples',
  'link_tokens',
  'session',
  'users',
];

/** Empties every table the app writes, between tests. */
export async function resetDatabase(): Promise<void> {
  await testAdminKnex().transaction(async (trx) => {
    await trx.raw('set local session_replication_role = replica');
    // Built-in label templates come with the schema: kept; those added by tests go.
    const builtInTemplates = await trx('label_templates').where('built_in', true);
    await trx.raw(`truncate table ${APP_TABLES.join(', ')}, label_templates restart identity cascade`);
    await trx.raw('alter sequence history_events_id_seq restart');
    await trx('label_templates').insert(builtInTemplates);
    await trx.raw("select setval('label_templates_id_seq', (select max(id) from label_templates))");
  });
}
