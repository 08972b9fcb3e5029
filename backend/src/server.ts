import type { Server } from 'node:http';
import { env } from './config/env';
import { buildApp } from './app';
import { composeDeps, createLogger, disposeDeps } from './compose';
import { migrateUp } from './migrate';
import { db } from './db';
import { startQueue } from './jobs/queue';
import { startWorkers } from './jobs/workers';
import type { AppDeps } from './deps';

export interface RunningServer {
  url: string;
  server: Server;
  /** The collaborators the app was built from (the demo seed stores its photographs in `deps.store`). */
  deps: AppDeps;
  close(): Promise<void>;
}

/** Listens with the validated environment; `close` drains connections and releases the pools. */
export async function startServer(options: { migrate?: boolean } = {}): Promise<RunningServer> {
  const e = env();
  const logger = createLogger(e);
  if (options.migrate) {
    const done = await migrateUp(db(), (m) => logger.debug(m));
    if (done.length) logger.info({ migrations: done }, 'migrations applied');
  }
  const queue = await startQueue(e.DATABASE_URL, logger);
  const deps = composeDeps(e, queue, logger);
  await startWorkers(queue, deps.store, logger, {
    fixityCron: e.TONELEDGER_FIXITY_CRON, retentionDays: e.IMAGE_RETENTION_DAYS,
    digest: { mailer: deps.mailer, publicUrl: e.PUBLIC_URL, now: () => new Date() },
  });
  const app = buildApp(deps, logger);
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(e.PORT, e.HOST, () => resolve(s));
    s.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : e.PORT;
  return {
    url: `http://${e.HOST}:${port}`,
    server,
    deps,
    close: async () => {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await queue.stop();
      await disposeDeps(deps);
    },
  };
}

// Production entry: `tsx backend/src/server.ts` with every service configured by environment.
if (import.meta.url === `file://${process.argv[1]}`) {
  const running = await startServer({ migrate: true });
  console.log(`Toneledger listening on ${running.url}`);
  const stop = async () => {
    await running.close();
    process.exit(0);
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}
