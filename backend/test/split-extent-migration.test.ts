import { readdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { onServer } from './scratch-database';

/**
 * The migration that takes 'split' out of the toning extents converts the steps already recorded:
 * each becomes 'partial' with "Split effect." at the head of its notes, and the column refuses 'split'
 * afterwards. Run on a database of its own, migrated to the step before, with two split steps in it.
 */
const NAME = `toneledger_split_${process.pid}`;
const MIGRATION = '20261203160000-convert-split-toning-extent';

function urlOf(name: string) {
  const url = new URL(process.env.DATABASE_URL!);
  url.pathname = `/${name}`;
  return url.toString();
}

let closeDb: () => Promise<void>;
let db: () => import('sequelize').Sequelize;
let migrator: typeof import('../src/migrate').migrator;

beforeAll(async () => {
  await onServer(`DROP DATABASE IF EXISTS ${NAME}`);
  await onServer(`CREATE DATABASE ${NAME}`);
  vi.resetModules();
  vi.stubEnv('DATABASE_URL', urlOf(NAME));
  ({ migrator } = await import('../src/migrate'));
  ({ db, closeDb } = await import('../src/db'));
}, 60_000);

afterAll(async () => {
  await closeDb?.();
  vi.unstubAllEnvs();
  await onServer(`DROP DATABASE IF EXISTS ${NAME}`);
});

describe(MIGRATION, () => {
  it('turns split steps into partial ones with the effect in their notes, and refuses split afterwards', async () => {
    const files = readdirSync(new URL('../../migrations/', import.meta.url)).map((f) => f.replace(/\.ts$/, '')).sort();
    const before = files[files.indexOf(MIGRATION) - 1];
    await migrator(db()).up({ to: before });

    const [[print]] = (await db().query(
      `INSERT INTO prints (accession_number, accession_sort, title, process) VALUES ('1990.1.1', '1990.1.1', 'Split test', 'gelatin_silver_developing_out') RETURNING id`,
    )) as [Array<{ id: string }>, unknown];
    await db().query(
      `INSERT INTO process_steps (print_id, position, type, extent, notes) VALUES
        ($1, 1, 'toning', 'split', NULL), ($1, 2, 'toning', 'split', 'Pulled early.'), ($1, 3, 'toning', 'full', 'Left to finish.')`,
      { bind: [print.id] },
    );

    await migrator(db()).up({ to: MIGRATION });

    const [rows] = (await db().query(`SELECT position, extent, notes FROM process_steps WHERE print_id = $1 ORDER BY position`, { bind: [print.id] })) as [
      Array<{ position: number; extent: string; notes: string | null }>, unknown,
    ];
    expect(rows).toEqual([
      { position: 1, extent: 'partial', notes: 'Split effect.' },
      { position: 2, extent: 'partial', notes: 'Split effect. Pulled early.' },
      { position: 3, extent: 'full', notes: 'Left to finish.' },
    ]);
    await expect(db().query(`UPDATE process_steps SET extent = 'split' WHERE print_id = $1 AND position = 3`, { bind: [print.id] })).rejects.toThrow(
      /process_steps_extent_check/,
    );
  }, 120_000);
});
