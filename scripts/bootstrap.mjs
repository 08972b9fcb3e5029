#!/usr/bin/env node
// Entry for npm start / test / dev: installs npm packages when they are missing or out of date,
// then runs the TypeScript script for the command. Plain JavaScript: it runs before anything is installed.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const command = process.argv[2] ?? 'start';
const scripts = { start: 'start.ts', test: 'test.ts', dev: 'dev.ts', migrate: 'migrate.ts', bench: 'bench.ts', 'seed-scale': 'seed-scale.ts' };
if (!scripts[command]) {
  console.error(`Unknown command "${command}". Use one of: ${Object.keys(scripts).join(', ')}`);
  process.exit(2);
}

const marker = path.join(root, 'node_modules', '.package-lock.json');
const lock = path.join(root, 'package-lock.json');
const stale = !existsSync(marker) || (existsSync(lock) && statSync(lock).mtimeMs > statSync(marker).mtimeMs + 1000);
if (stale) {
  console.log('Installing npm packages (npm ci)…');
  const r = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

const tsx = path.join(root, 'node_modules', '.bin', 'tsx');
const child = spawn(tsx, [path.join(root, 'scripts', scripts[command]), ...process.argv.slice(3)], { cwd: root, stdio: 'inherit' });
// Ctrl-C reaches the child through the terminal's process group; wait for it to shut down cleanly.
for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
  process.on(sig, () => {
    if (sig !== 'SIGINT') child.kill(sig);
  });
}
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
