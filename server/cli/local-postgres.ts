import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, chownSync, existsSync, mkdirSync, readdirSync, writeFileSync, appendFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { DATA_DIR } from '../config';
import type { LocalSecrets } from './local-secrets';
import { progress } from './progress';

/** The project's own PostgreSQL cluster: loopback only, its own port, data under .data/ (ignored by git). */
export const PG_PORT = Number(process.env.FLAKELINE_PG_PORT ?? 54329);
export const PG_HOST = '127.0.0.1';
const CLUSTER_DIR = path.join(DATA_DIR, 'postgres');
const LOG_FILE = path.join(DATA_DIR, 'postgres.log');
export const APP_ROLE = 'flakeline';
export const OWNER_ROLE = 'flakeline_owner';

const isRoot = () => process.getuid?.() === 0;

function postgresBinDir(): string | null {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((name) => existsSync(path.join(base, name, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

/** Installs Debian's PostgreSQL server when it is missing (as root), or says how to. */
export function ensurePostgresInstalled(): string {
  let bin = postgresBinDir();
  if (bin) return bin;
  if (!isRoot()) {
    throw new Error('PostgreSQL server is not installed. Run: sudo apt-get update && sudo apt-get install -y postgresql');
  }
  progress("Installing PostgreSQL from Debian's packages");
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '-qq', 'postgresql'], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  bin = postgresBinDir();
  if (!bin) throw new Error('PostgreSQL was installed but initdb was not found under /usr/lib/postgresql.');
  return bin;
}

/** initdb refuses to run as root, so as root the cluster belongs to the postgres user. */
function runAsClusterOwner(bin: string, tool: string, args: string[]) {
  const command = isRoot() ? 'runuser' : path.join(bin, tool);
  const fullArgs = isRoot() ? ['-u', 'postgres', '--', path.join(bin, tool), ...args] : args;
  const result = spawnSync(command, fullArgs, { encoding: 'utf8', cwd: os.tmpdir() });
  return result;
}

function initCluster(bin: string, superuserPassword: string) {
  progress('Creating the local PostgreSQL cluster in .data/postgres');
  mkdirSync(DATA_DIR, { recursive: true });
  rmSync(CLUSTER_DIR, { recursive: true, force: true });
  mkdirSync(CLUSTER_DIR, { mode: 0o700 });
  const pwFile = path.join(os.tmpdir(), `flakeline-pg-${process.pid}`);
  writeFileSync(pwFile, `${superuserPassword}\n`, { mode: 0o600 });
  if (isRoot()) {
    const uid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).trim());
    chownSync(CLUSTER_DIR, uid, gid);
    chownSync(pwFile, uid, gid);
  }
  try {
    const result = runAsClusterOwner(bin, 'initdb', [
      '-D',
      CLUSTER_DIR,
      '-U',
      'postgres',
      `--pwfile=${pwFile}`,
      '--auth-local=scram-sha-256',
      '--auth-host=scram-sha-256',
      '-E',
      'UTF8',
      '--locale=C.UTF-8',
    ]);
    if (result.status !== 0) throw new Error(`initdb failed:\n${result.stdout}\n${result.stderr}`);
  } finally {
    rmSync(pwFile, { force: true });
  }
  chmodSync(CLUSTER_DIR, 0o700);
  appendFileSync(
    path.join(CLUSTER_DIR, 'postgresql.conf'),
    [
      '',
      '# Flakeline: loopback only, on its own port, no Unix socket to collide with a system cluster.',
      `listen_addresses = '${PG_HOST}'`,
      `port = ${PG_PORT}`,
      "unix_socket_directories = ''",
      'fsync = on',
      '',
    ].join('\n'),
  );
}

function isRunning(bin: string): boolean {
  return runAsClusterOwner(bin, 'pg_ctl', ['-D', CLUSTER_DIR, 'status']).status === 0;
}

function logFileOwnedByCluster() {
  if (!existsSync(LOG_FILE)) writeFileSync(LOG_FILE, '');
  if (isRoot()) {
    const uid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim());
    chownSync(LOG_FILE, uid, 0);
  }
}

/** Makes sure the cluster exists and runs; a second call with it running is instant. */
export function ensureClusterRunning(superuserPassword: string): void {
  const bin = ensurePostgresInstalled();
  if (!existsSync(path.join(CLUSTER_DIR, 'PG_VERSION'))) initCluster(bin, superuserPassword);
  if (isRunning(bin)) return;
  progress(`Starting PostgreSQL on ${PG_HOST}:${PG_PORT}`);
  logFileOwnedByCluster();
  const result = runAsClusterOwner(bin, 'pg_ctl', ['-D', CLUSTER_DIR, '-l', LOG_FILE, '-w', '-t', '60', 'start']);
  if (result.status !== 0) {
    throw new Error(`PostgreSQL did not start (see ${LOG_FILE}):\n${result.stdout}\n${result.stderr}`);
  }
}

export function stopCluster(): boolean {
  const bin = postgresBinDir();
  if (!bin || !existsSync(path.join(CLUSTER_DIR, 'PG_VERSION')) || !isRunning(bin)) return false;
  const result = runAsClusterOwner(bin, 'pg_ctl', ['-D', CLUSTER_DIR, '-m', 'fast', '-w', 'stop']);
  if (result.status !== 0) throw new Error(`pg_ctl stop failed:\n${result.stderr}`);
  return true;
}

export function databaseUrl(database: string, role: string, password: string): string {
  return `postgres://${encodeURIComponent(role)}:${encodeURIComponent(password)}@${PG_HOST}:${PG_PORT}/${database}`;
}

export interface DatabaseUrls {
  /** The server's connection: rows only. */
  app: string;
  /** The owner's connection: migrations and grants. */
  owner: string;
  /** The cluster superuser on this database: test resets and tamper tests only. */
  admin: string;
}

async function ensureRole(admin: pg.Client, role: string, password: string) {
  const found = await admin.query('select 1 from pg_roles where rolname = $1', [role]);
  const verb = found.rowCount === 0 ? 'create' : 'alter';
  await admin.query(`${verb} role ${role} login password ${admin.escapeLiteral(password)} nosuperuser nocreatedb nocreaterole`);
}

/**
 * Creates the owner and application roles and a database the owner owns. With `fresh`, an
 * existing database of that name is dropped first (test runs start clean).
 */
export async function ensureDatabase(props: LocalSecrets & { database: string; fresh?: boolean }): Promise<DatabaseUrls> {
  const admin = new pg.Client({ connectionString: databaseUrl('postgres', 'postgres', props.superuserPassword) });
  await admin.connect();
  try {
    await ensureRole(admin, OWNER_ROLE, props.ownerPassword);
    await ensureRole(admin, APP_ROLE, props.appPassword);
    const name = admin.escapeIdentifier(props.database);
    if (props.fresh) await admin.query(`drop database if exists ${name} with (force)`);
    const exists = await admin.query('select 1 from pg_database where datname = $1', [props.database]);
    if (exists.rowCount === 0) {
      await admin.query(`create database ${name} owner ${OWNER_ROLE} encoding 'UTF8'`);
      await admin.query(`revoke all on database ${name} from public`);
      await admin.query(`grant connect on database ${name} to ${APP_ROLE}`);
    }
  } finally {
    await admin.end();
  }
  return {
    app: databaseUrl(props.database, APP_ROLE, props.appPassword),
    owner: databaseUrl(props.database, OWNER_ROLE, props.ownerPassword),
    admin: databaseUrl(props.database, 'postgres', props.superuserPassword),
  };
}
