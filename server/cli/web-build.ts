import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { REPO_ROOT } from '../config';
import { progress } from './progress';

/** Everything the exported web app is built from. */
const SOURCES = [
  'app',
  'components',
  'hooks',
  'shared',
  'assets',
  'app.json',
  'babel.config.js',
  'metro.config.js',
  'package-lock.json',
  'tsconfig.json',
];
const DIST_DIR = path.join(REPO_ROOT, 'dist');
const STAMP_FILE = path.join(DIST_DIR, '.source-hash');

function hashTree(hash: ReturnType<typeof createHash>, target: string) {
  if (!existsSync(target)) return;
  if (statSync(target).isDirectory()) {
    for (const name of readdirSync(target).sort()) hashTree(hash, path.join(target, name));
    return;
  }
  hash.update(path.relative(REPO_ROOT, target));
  hash.update(readFileSync(target));
}

export function webSourceHash(): string {
  const hash = createHash('sha256');
  for (const source of SOURCES) hashTree(hash, path.join(REPO_ROOT, source));
  return hash.digest('hex');
}

/** Exports the web app with Expo when its sources changed since the last export. */
export function buildWebAppIfChanged(): void {
  const wanted = webSourceHash();
  if (existsSync(STAMP_FILE) && readFileSync(STAMP_FILE, 'utf8').trim() === wanted) return;
  progress('Building the web app (expo export, about a minute)');
  const result = spawnSync(
    path.join(REPO_ROOT, 'node_modules', '.bin', 'expo'),
    ['export', '--platform', 'web', '--output-dir', 'dist', '--clear'],
    { cwd: REPO_ROOT, stdio: 'inherit', env: { ...process.env, CI: '1', EXPO_NO_TELEMETRY: '1' } },
  );
  if (result.status !== 0) throw new Error('The web app did not build; see the output above.');
  writeFileSync(STAMP_FILE, wanted);
}
