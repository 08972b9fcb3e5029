import { readFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { pino, type Logger } from 'pino';
import { S3ObjectStore } from '@toneledger/storage/s3-store';
import type { Env } from './config/env';
import type { AppDeps } from './deps';
import { OidcClient } from './auth/oidc-client';
import { Mailer } from './services/mail.service';
import { closeDb, db, logConnectionErrors, logSequelizeConnectionErrors } from './db';

export function readVersion(): string {
  const pkg = JSON.parse(readFileSync(path.resolve(import.meta.dirname, '../../package.json'), 'utf8')) as { version: string };
  return pkg.version;
}

export function createLogger(e: Env): Logger {
  return pino({ level: e.LOG_LEVEL, redact: ['req.headers.cookie', 'res.headers["set-cookie"]'] });
}

/**
 * Assembles the app's collaborators from the environment. Every database connection logs its
 * errors (a restart of PostgreSQL cuts them) instead of ending the process.
 */
export function composeDeps(e: Env, queue: AppDeps['queue'] = null, logger: Logger = createLogger(e)): AppDeps {
  logSequelizeConnectionErrors(db(), logger);
  const pool = logConnectionErrors(new pg.Pool({ connectionString: e.DATABASE_URL, max: 5 }), logger, 'app');
  return {
    env: e,
    pool,
    store: new S3ObjectStore({
      endpoint: e.S3_ENDPOINT,
      region: e.S3_REGION,
      bucket: e.S3_BUCKET,
      accessKeyId: e.S3_ACCESS_KEY_ID,
      secretAccessKey: e.S3_SECRET_ACCESS_KEY,
      forcePathStyle: e.S3_FORCE_PATH_STYLE,
    }),
    oidc: new OidcClient(e),
    mailer: new Mailer(e.SMTP_URL, e.MAIL_FROM, e.MAIL_SINK_API),
    version: readVersion(),
    queue,
  };
}

export async function disposeDeps(deps: AppDeps, options: { closeDatabase?: boolean } = {}): Promise<void> {
  deps.mailer.close();
  await deps.pool.end();
  if (options.closeDatabase ?? true) await closeDb();
}
