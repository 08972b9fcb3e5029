import { spawn, type ChildProcess } from 'node:child_process';
import { startLocalServices, ROOT } from './services';

// Working on the client: the local services and the API on :4010, Vite with hot reload on :5173
// proxying /api and /auth. Sign-in comes back through Vite, so the public URL is Vite's.
// Ctrl-C at any moment, the first demo seed included, stops the seed at its next record and then
// closes Vite, the API and the services (the next start carries the seed on), as `npm start` does.
const log = (m: string) => console.log(`[dev] ${m}`);
const vitePort = Number(process.env.VITE_PORT ?? 5173);
process.env.PUBLIC_URL ??= `http://localhost:${vitePort}`;

const seedStop = new AbortController();
let seeding: Promise<unknown> = Promise.resolve();
let vite: ChildProcess | null = null;
let closeServer: () => Promise<void> = async () => {};
let stopServices: () => Promise<void> = async () => {};
let stopping = false;
const stop = async () => {
  if (stopping) return;
  stopping = true;
  seedStop.abort();
  await seeding.catch(() => {});
  vite?.kill('SIGTERM');
  await closeServer().catch(() => {});
  await stopServices();
  process.exit(0);
};
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());

const services = await startLocalServices('development', log);
stopServices = services.stop;
for (const [k, v] of Object.entries(services.env)) process.env[k] ??= v;
process.env.TONELEDGER_API_PORT = process.env.PORT;

const { startServer } = await import('../backend/src/server');
const { db } = await import('../backend/src/db');
const { seedDemoIfEmpty } = await import('../backend/src/seed/demo');
const { isAbort } = await import('../backend/src/seed/pool');
const running = await startServer({ migrate: true });
closeServer = running.close;
if (!stopping) {
  seeding = seedDemoIfEmpty(db(), { store: running.deps.store, signal: seedStop.signal });
  try {
    await seeding;
  } catch (err) {
    if (!isAbort(err)) throw err;
    log('Demo seed stopped; the next start carries it on.');
  }
}
// A Ctrl-C during the start: stop() is closing everything and ends the process.
if (stopping) await new Promise(() => {});
log(`API on ${running.url}`);

vite = spawn(`${ROOT}/node_modules/.bin/vite`, ['--port', String(vitePort), '--strictPort'], { cwd: `${ROOT}/frontend`, stdio: 'inherit', env: process.env });
vite.on('exit', () => void stop());
log(`Open ${process.env.PUBLIC_URL}`);
