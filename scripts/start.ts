import { startLocalServices } from './services';
import { buildFrontend } from './frontend-build';
import { DEMO_ACCOUNTS, DEMO_INSTITUTION } from '../backend/src/seed/demo-accounts';
import { ROLE_LABELS } from '../common/src/domain/roles';

const log = (m: string) => console.log(`[toneledger] ${m}`);

const production = process.env.NODE_ENV === 'production';
let stopServices: () => Promise<void> = async () => {};
let closeServer: () => Promise<void> = async () => {};
let stopping = false;
// Ctrl-C during the first start's demo seed stops the seed at its next record; the server and the
// services close only once the seed has stopped (the next start carries the seed on).
const seedStop = new AbortController();
let seeding: Promise<unknown> = Promise.resolve();

async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  log('Stopping…');
  seedStop.abort();
  await seeding.catch(() => {});
  await closeServer().catch(() => {});
  await stopServices();
  log('Stopped.');
  process.exit(code);
}
process.on('SIGINT', () => void shutdown(0));
process.on('SIGTERM', () => void shutdown(0));

try {
  if (!production) {
    const services = await startLocalServices('development', log);
    stopServices = services.stop;
    for (const [k, v] of Object.entries(services.env)) process.env[k] ??= v;
  } else {
    log('Production: using the services named by the environment; no local service is started.');
  }
  buildFrontend(log);
  const { startServer } = await import('../backend/src/server');
  const { db } = await import('../backend/src/db');
  const running = await startServer({ migrate: true });
  closeServer = running.close;
  if (!production && !stopping) {
    const { seedDemoIfEmpty } = await import('../backend/src/seed/demo');
    const { isAbort } = await import('../backend/src/seed/pool');
    const seeded = seedDemoIfEmpty(db(), { store: running.deps.store, signal: seedStop.signal });
    seeding = seeded;
    try {
      if (await seeded) log(`Seeded the demo collection of the ${DEMO_INSTITUTION}.`);
    } catch (err) {
      if (!isAbort(err)) throw err;
      log('Demo seed stopped; the next start carries it on.');
    }
  }
  // A Ctrl-C during the start: shutdown() is closing everything and ends the process.
  if (stopping) await new Promise(() => {});
  const url = process.env.PUBLIC_URL ?? running.url;
  console.log('');
  console.log(`  Toneledger is running at ${url}`);
  if (!production) {
    console.log('');
    console.log('  Demo sign-ins (local identity provider):');
    for (const a of DEMO_ACCOUNTS) console.log(`    ${ROLE_LABELS[a.role].padEnd(14)} ${a.email.padEnd(34)} ${a.password}`);
    console.log('');
    console.log('  Press Ctrl-C to stop everything this started.');
  }
} catch (err) {
  console.error(err instanceof Error ? err.message : err);
  await shutdown(1);
}
