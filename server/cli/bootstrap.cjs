#!/usr/bin/env node
// Runs before the project's packages may exist, so it uses Node's own modules only: it installs
// dependencies when package-lock.json changed, then hands over to the TypeScript command.
'use strict';
const { spawnSync, spawn } = require('node:child_process');
const { createHash } = require('node:crypto');
const { existsSync, readFileSync, writeFileSync } = require('node:fs');
const path = require('node:path');

const root = path.resolve(__dirname, '..', '..');
const command = process.argv[2];
const commands = { start: 'start.ts', test: 'test.ts', 'db-stop': 'db-stop.ts', bench: 'bench.ts', 'verify-audit': 'verify-audit.ts', 'bench-evidence': 'bench-evidence.ts' };
if (!commands[command]) {
  process.stderr.write(`Usage: node server/cli/bootstrap.cjs ${Object.keys(commands).join('|')}\n`);
  process.exit(2);
}

const lockHash = createHash('sha256')
  .update(readFileSync(path.join(root, 'package-lock.json')))
  .digest('hex');
const stamp = path.join(root, 'node_modules', '.flakeline-lock-hash');
if (!existsSync(stamp) || readFileSync(stamp, 'utf8').trim() !== lockHash) {
  process.stdout.write('flakeline: Installing dependencies (npm ci)\n');
  const install = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
  if (install.status !== 0) process.exit(install.status ?? 1);
  writeFileSync(stamp, lockHash);
}

const child = spawn(
  path.join(root, 'node_modules', '.bin', 'tsx'),
  [path.join(root, 'server', 'cli', commands[command]), ...process.argv.slice(3)],
  { cwd: root, stdio: 'inherit' },
);
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
