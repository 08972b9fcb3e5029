import { Sequelize } from 'sequelize';
import pg from 'pg';
import type { Logger } from 'pino';
import { env } from './config/env';
import { initModels } from './models';

// Return BIGINT (int8) as a JS number when safe; ids stay strings elsewhere.
pg.types.setTypeParser(20, (v: string) => {
  const n = Number(v);
  return Number.isSafeInteger(n) ? n : v;
});

let sequelize: Sequelize | undefined;

export function db(): Sequelize {
  if (!sequelize) {
    const e = env();
    sequelize = new Sequelize(e.DATABASE_URL, {
      dialect: 'postgres',
      logging: false,
      pool: { max: e.DATABASE_POOL_MAX, idle: 10_000 },
      define: { underscored: true },
    });
    initModels(sequelize);
  }
  return sequelize;
}

type ErrorLog = Pick<Logger, 'warn'>;

/**
 * A connection the database server ends (a restart, a failover, an administrator's
 * pg_terminate_backend) makes its pg client emit 'error'; without a listener Node ends the process.
 * Every client the pool opens gets a listener that logs, idle or checked out (a checked-out client
 * has no other); the pool gets one too, for the copy pg-pool forwards when it drops an idle client.
 * The next query opens a new connection once the server is back.
 */
export function logConnectionErrors<P extends pg.Pool>(pool: P, logger: ErrorLog, name: string): P {
  pool.on('connect', (client) => client.on('error', (err) => logLost(logger, name, err)));
  // pg-pool forwards an idle client's error here too; the client's own listener has logged it.
  pool.on('error', () => {});
  return pool;
}

function logLost(logger: ErrorLog, pool: string, err: Error & { code?: string }) {
  logger.warn({ pool, code: err.code, error: err.message }, 'database connection lost; the next query reconnects');
}

/** The same for Sequelize's connections (they already drop themselves on error): the error is logged. */
export function logSequelizeConnectionErrors(s: Sequelize, logger: ErrorLog): void {
  const hook = 'log-connection-errors';
  s.removeHook('afterConnect', hook);
  s.addHook('afterConnect', hook, (connection) => {
    (connection as pg.Client).on('error', (err: Error) => logLost(logger, 'sequelize', err));
  });
}

export async function closeDb(): Promise<void> {
  if (sequelize) {
    const s = sequelize;
    sequelize = undefined;
    await s.close();
  }
}
