import { spawn } from 'node:child_process';
import { startLocalServices, ROOT } from './services';

// Working on the client: the local services and the API on :4010, Vite with hot reload on :5173
// proxying /api and /auth. Sign-in comes back through Vite, so the public URL is Vite's.
const log = (m: string) => console.log(`[dev] ${m}`);
const vitePort = Number(process.env.VITE_PORT ?? 5173);
process.env.PUBLIC_URL ??= `http://localhost:${vitePort}`;
const services = await startLocalServices('development', log);
for (const [k, v] of Object.entries(services.env)) process.env[k] ??= v;
process.env.TONELEDGER_API_PORT = process.env.PORT;

const { startServer } = await import('../backend/src/server');
const { db } = await import('../backend/src/db');
const { seedDemoIfEmpty } = await import('../backend/src/seed/demo');
const running = await startServer({ migrate: true });
await seedDemoIfEmpty(db(), { store: running.deps.store });
log(`API on ${running.url}`);

const vite = spawn(`${ROOT}/node_modules/.bin/vite`, ['--port', String(vitePort), '--strictPort'], { cwd: `${ROOT}/frontend`, stdio: 'inherit', env: process.env });
let stopping = false;
const stop = async () => {
  if (stopping) return;
  stopping = true;
  vite.kill('SIGTERM');
  await running.close();
  await services.stop();
  process.exit(0);
};
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());
vite.on('exit', () => void stop());
log(`Open ${process.env.PUBLIC_URL}`);
