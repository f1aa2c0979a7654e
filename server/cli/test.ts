import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { configFromEnv, DATA_DIR, REPO_ROOT } from '../config';
import { createKnex } from '../db/knex';
import { prepareDatabase } from '../db/prepare-database';
import { createFileStore, type FileStore } from '../files/file-store';
import { startMailSink } from '../mail/mail-sink';
import { startServer } from '../main';
import { seedDemoLab } from '../../seeds/demo-lab';
import { startFakeS3 } from './fake-s3';
import { APP_ROLE, ensureClusterRunning, ensureDatabase, type DatabaseUrls } from './local-postgres';
import { loadLocalSecrets } from './local-secrets';
import { progress } from './progress';
import { buildWebAppIfChanged } from './web-build';

const API_DATABASE = 'flakeline_test';
const E2E_DATABASE = 'flakeline_e2e';
const CHROMIUM = '/usr/bin/chromium';
const RESULTS_FILE = path.join(DATA_DIR, 'jest-results.json');

function ensureChromium() {
  if (existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) throw new Error('Chromium is needed for the end-to-end suite: sudo apt-get install -y chromium');
  progress("Installing Chromium from Debian's packages (end-to-end suite)");
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '-qq', 'chromium'], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
}

/** A fresh, migrated database; with `demoFiles`, the demo lab is loaded and its files stored there. */
async function freshDatabase(
  name: string,
  secrets: ReturnType<typeof loadLocalSecrets>,
  demoFiles?: FileStore,
): Promise<DatabaseUrls> {
  const urls = await ensureDatabase({ ...secrets, database: name, fresh: true });
  await prepareDatabase({ ownerUrl: urls.owner, appRole: APP_ROLE });
  if (demoFiles) {
    const knex = createKnex(urls.app, 2);
    await seedDemoLab(knex, demoFiles);
    await knex.destroy();
  }
  return urls;
}

function typecheck(): boolean {
  progress('Type-checking (tsc --noEmit)');
  const result = spawnSync(path.join(REPO_ROOT, 'node_modules', '.bin', 'tsc'), ['--noEmit', '-p', '.'], {
    cwd: REPO_ROOT,
    stdio: 'inherit',
  });
  return result.status === 0;
}

/**
 * `npm test`: the same set-up as `npm start`, fresh test databases, the web build, a real
 * server with demo data for the browser suite, then every suite. Extra arguments go to jest.
 */
async function main() {
  const secrets = loadLocalSecrets();
  ensureClusterRunning(secrets.superuserPassword);
  // One after the other: both (re)set the same roles, which PostgreSQL will not do concurrently.
  const apiUrls = await freshDatabase(API_DATABASE, secrets);
  // Uploaded files of the browser suite (the demo lab's too) go to a throwaway folder.
  const e2eBlobDir = mkdtempSync(path.join(os.tmpdir(), 'flakeline-e2e-blobs-'));
  const e2eUrls = await freshDatabase(E2E_DATABASE, secrets, createFileStore({ backend: 'local', dir: e2eBlobDir }));
  buildWebAppIfChanged();
  ensureChromium();
  const typesOk = typecheck();

  const mailDir = mkdtempSync(path.join(os.tmpdir(), 'flakeline-e2e-mail-'));
  const sink = await startMailSink({ host: '127.0.0.1', port: 0, dir: mailDir });
  // The S3 path is tested against a local fake.
  const fakeS3 = await startFakeS3();
  const server = await startServer(
    configFromEnv({
      DATABASE_URL: e2eUrls.app,
      SESSION_SECRET: secrets.sessionSecret,
      PORT: '0',
      SMTP_PORT: String(sink.port),
      MAIL_SINK_DIR: mailDir,
      STORAGE_DIR: e2eBlobDir,
    }),
  );

  progress('Running the unit, API and end-to-end suites');
  rmSync(RESULTS_FILE, { force: true });
  // Jest runs as a child so this process keeps serving the browser suite meanwhile.
  const exitCode = await new Promise<number>((resolve) => {
    const jest = spawn(
      path.join(REPO_ROOT, 'node_modules', '.bin', 'jest'),
      ['--runInBand', '--json', `--outputFile=${RESULTS_FILE}`, ...process.argv.slice(2)],
      {
        cwd: REPO_ROOT,
        stdio: 'inherit',
        env: {
          ...process.env,
          TEST_DATABASE_URL: apiUrls.app,
          TEST_ADMIN_DATABASE_URL: apiUrls.admin,
          E2E_BASE_URL: `http://127.0.0.1:${server.port}`,
          E2E_SCREENSHOT_DIR: path.join(DATA_DIR, 'screenshots'),
          CHROMIUM_PATH: CHROMIUM,
          TEST_S3_ENDPOINT: fakeS3.env.S3_ENDPOINT,
          TEST_S3_BUCKET: fakeS3.env.S3_BUCKET,
          TEST_S3_REGION: fakeS3.env.S3_REGION,
          TEST_S3_ACCESS_KEY_ID: fakeS3.env.S3_ACCESS_KEY_ID,
          TEST_S3_SECRET_ACCESS_KEY: fakeS3.env.S3_SECRET_ACCESS_KEY,
        },
      },
    );
    jest.on('exit', (code) => resolve(code ?? 1));
  });
  await server.close();
  await sink.close();
  await fakeS3.close();
  rmSync(mailDir, { recursive: true, force: true });
  rmSync(e2eBlobDir, { recursive: true, force: true });

  let passed = 0;
  let failed = 0;
  if (existsSync(RESULTS_FILE)) {
    const results = JSON.parse(readFileSync(RESULTS_FILE, 'utf8')) as { numPassedTests: number; numFailedTests: number };
    passed = results.numPassedTests;
    failed = results.numFailedTests;
  }
  // The type check counts as one more check, so a type error fails the run visibly.
  if (typesOk) passed += 1;
  else failed += 1;
  process.stdout.write(`\nTests: ${passed} passed, ${failed} failed\n`);
  process.exit(exitCode === 0 && typesOk && passed > 0 ? 0 : 1);
}

main().catch((error: unknown) => {
  process.stderr.write(
    `flakeline: tests could not run: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`,
  );
  process.exit(1);
});
