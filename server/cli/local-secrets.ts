import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { DATA_DIR } from '../config';

export interface LocalSecrets {
  superuserPassword: string;
  appPassword: string;
  sessionSecret: string;
}

const SECRETS_FILE = path.join(DATA_DIR, 'secrets.json');

/** Passwords of the local cluster and the session secret, made once per checkout and kept private. */
export function loadLocalSecrets(): LocalSecrets {
  if (existsSync(SECRETS_FILE)) return JSON.parse(readFileSync(SECRETS_FILE, 'utf8')) as LocalSecrets;
  const fresh = (): string => randomBytes(24).toString('base64url');
  const secrets: LocalSecrets = { superuserPassword: fresh(), appPassword: fresh(), sessionSecret: fresh() };
  mkdirSync(DATA_DIR, { recursive: true });
  writeFileSync(SECRETS_FILE, JSON.stringify(secrets, null, 2), { mode: 0o600 });
  return secrets;
}
