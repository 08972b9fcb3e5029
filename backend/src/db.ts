import { Sequelize } from 'sequelize';
import pg from 'pg';
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

export async function closeDb(): Promise<void> {
  if (sequelize) {
    const s = sequelize;
    sequelize = undefined;
    await s.close();
  }
}
