import { spawn, spawnSync, execFileSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { startLocalServices, ROOT } from './services';
import { buildFrontend } from './frontend-build';

const log = (m: string) => console.log(`[test] ${m}`);
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

function ensureChromium() {
  if (existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) throw new Error(`Browser tests need Chromium at ${CHROMIUM}: sudo apt-get install -y chromium`);
  log("Chromium is missing: installing Debian's chromium package with apt…");
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '-qq', 'chromium'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
}

/** The run's own temporary folders are all named toneledger-*; those present before it are not its own. */
const tempFolders = () => new Set(readdirSync(os.tmpdir()).filter((n) => n.startsWith('toneledger-')));
const tempBefore = tempFolders();

const extra = process.argv.slice(2);
let code = 1;
if (extra.length === 0) {
  // Types first: the whole project (server, client, browser tests) must compile.
  log('Type-checking…');
  const tc = spawnSync('npm', ['run', 'typecheck', '--silent'], { cwd: ROOT, stdio: 'inherit' });
  if (tc.status !== 0) {
    console.error('[test] Type errors: fix them first.');
    process.exit(1);
  }
}
ensureChromium();
const services = await startLocalServices('test', log);
let closeServer = async () => {};
try {
  Object.assign(process.env, services.env, { LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn' });
  // The browser tests need the built client; a run of other projects alone does not.
  if (extra.length === 0 || extra.includes('e2e')) buildFrontend(log);
  const { startServer } = await import('../backend/src/server');
  const { db } = await import('../backend/src/db');
  const { seedDemoIfEmpty } = await import('../backend/src/seed/demo');
  const running = await startServer({ migrate: true });
  closeServer = running.close;
  await seedDemoIfEmpty(db());
  const env = { ...process.env, E2E_BASE_URL: process.env.PUBLIC_URL!, CHROMIUM_PATH: CHROMIUM };
  // Asynchronous on purpose: the local S3, identity provider and mail sink live in this process.
  const vitest = (args: string[]) =>
    new Promise<number>((resolve) => {
      const child = spawn(process.execPath, [`${ROOT}/node_modules/vitest/vitest.mjs`, 'run', ...args], { cwd: ROOT, stdio: 'inherit', env });
      child.on('exit', (c) => resolve(c ?? 1));
    });
  if (extra.length) {
    code = await vitest(extra);
  } else {
    // Unit, API and component tests first; the browser flows after, on a database they no longer change.
    code = await vitest(['--project', 'common', '--project', 'backend', '--project', 'frontend']);
    if (code === 0) code = await vitest(['--project', 'e2e']);
  }
} catch (err) {
  console.error(err);
  code = 1;
} finally {
  await closeServer().catch(() => {});
  await services.stop();
}
// Another run on the same machine may make folders of the same names meanwhile: this lists, it does not fail.
const left = [...tempFolders()].filter((n) => !tempBefore.has(n));
if (left.length) console.error(`[test] Temporary folders made during this run and left behind (remove them, and fix whoever made them):\n${left.map((n) => `  ${path.join(os.tmpdir(), n)}`).join('\n')}`);
else log('No temporary folders left behind.');
process.exit(code);
