import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { readdirSync } from 'node:fs';
import { Umzug, SequelizeStorage, type MigrationParams } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';

const here = path.dirname(fileURLToPath(import.meta.url));
export const MIGRATIONS_DIR = path.resolve(here, '../../migrations');

export interface Migration {
  up(ctx: { context: QueryInterface }): Promise<void>;
  down(ctx: { context: QueryInterface }): Promise<void>;
}

/** Umzug over migrations/*.ts, imported by our own code so any TS loader (tsx, vitest) works. */
export function migrator(sequelize: Sequelize, log: (msg: string) => void = () => {}) {
  const files = readdirSync(MIGRATIONS_DIR)
    .filter((f) => /^\d{14}-[a-z0-9-]+\.ts$/.test(f))
    .sort();
  return new Umzug({
    migrations: files.map((file) => {
      const name = file.replace(/\.ts$/, '');
      const load = async () => (await import(pathToFileURL(path.join(MIGRATIONS_DIR, file)).href)) as Migration;
      return {
        name,
        up: async ({ context }: MigrationParams<QueryInterface>) => (await load()).up({ context }),
        down: async ({ context }: MigrationParams<QueryInterface>) => (await load()).down({ context }),
      };
    }),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: {
      info: (m: Record<string, unknown>) => log(`${String(m.event ?? '')} ${String(m.name ?? '')}`.trim()),
      warn: (m: Record<string, unknown>) => log(JSON.stringify(m)),
      error: (m: Record<string, unknown>) => log(JSON.stringify(m)),
      debug: () => {},
    },
  });
}

/** The advisory lock migrations run under (pg_advisory_xact_lock key; the others live beside their use). */
const MIGRATION_LOCK = 727000;

/**
 * Applies every pending migration. Servers started together (several behind a load balancer) migrate
 * one at a time: a transaction of its own holds an advisory lock while the migrations run on other
 * connections, so a second server waits, then finds nothing left to do.
 */
export async function migrateUp(sequelize: Sequelize, log?: (msg: string) => void): Promise<string[]> {
  return sequelize.transaction(async (lock) => {
    await sequelize.query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: MIGRATION_LOCK }, transaction: lock });
    const done = await migrator(sequelize, log).up();
    return done.map((m) => m.name);
  });
}
