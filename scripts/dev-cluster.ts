import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { startPostgres } from './postgres';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
/** The development cluster's port (`npm start`'s PostgreSQL), where `toneledger_scale` lives. */
export const DEV_PG_PORT = Number(process.env.TONELEDGER_PG_PORT ?? 54329);

async function reachable(port: number): Promise<boolean> {
  const c = new pg.Client({ host: '127.0.0.1', port, user: 'app', database: 'postgres', connectionTimeoutMillis: 1500 });
  try {
    await c.connect();
    await c.end();
    return true;
  } catch {
    return false;
  }
}

/**
 * The development cluster for a bench: used as it is when already running (`npm start` open in
 * another terminal), otherwise started here from its data folder; `stop()` stops only a cluster
 * started here.
 */
export async function openDevCluster(log: (m: string) => void): Promise<{ port: number; stop(): Promise<void> }> {
  if (await reachable(DEV_PG_PORT)) return { port: DEV_PG_PORT, stop: async () => {} };
  const cluster = await startPostgres({
    baseDir: path.resolve(ROOT, process.env.TONELEDGER_DATA_DIR ?? '.data', 'pg'), port: DEV_PG_PORT, database: 'postgres', log, fallbackKey: 'dev',
  });
  return { port: DEV_PG_PORT, stop: () => cluster.stop() };
}
