import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { DATA_DIR } from '../config';

export interface LocalSecrets {
  superuserPassword: string;
  /** The role that owns the databases and runs migrations. */
  ownerPassword: string;
  /** The role the server runs as: reads and writes rows, cannot change the schema or the history. */
  appPassword: string;
  sessionSecret: string;
}

const SECRETS_FILE = path.join(DATA_DIR, 'secrets.json');

/** Passwords of the local cluster and the session secret, made once per checkout and kept private. */
export function loadLocalSecrets(): LocalSecrets {
  const stored = existsSync(SECRETS_FILE) ? (JSON.parse(readFileSync(SECRETS_FILE, 'utf8')) as Partial<LocalSecrets>) : {};
  const fresh = (): string => randomBytes(24).toString('base64url');
  const secrets: LocalSecrets = {
    superuserPassword: stored.superuserPassword ?? fresh(),
    ownerPassword: stored.ownerPassword ?? fresh(),
    appPassword: stored.appPassword ?? fresh(),
    sessionSecret: stored.sessionSecret ?? fresh(),
  };
  if (Object.keys(stored).length !== Object.keys(secrets).length) {
    mkdirSync(DATA_DIR, { recursive: true });
    writeFileSync(SECRETS_FILE, JSON.stringify(secrets, null, 2), { mode: 0o600 });
  }
  return secrets;
}
