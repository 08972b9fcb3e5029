import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { printInputSchema, printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { LIGHT_RESPONSIVITY, PROCESS, STATUS, SUPPORT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import type { Role } from '@toneledger/common/domain/roles';
import { closeDb, db } from '../db';
import { accession, createEnclosure, createLocation, createMaker, createPaper, createUser } from '../../test/factories';
import { buildListSql, listPrints } from './print-list.service';
import { createPrint } from './print.service';

/** The `$n` a statement names. */
const placeholders = (text: string) => new Set([...text.matchAll(/\$(\d+)/g)].map((m) => Number(m[1])));
const oneTo = (n: number) => new Set(Array.from({ length: n }, (_, i) => i + 1));

let makerId: string;
beforeAll(async () => {
  db(); // connects and sets up the models
  const user = await createUser({ role: 'registrar' });
  const actor = { id: user.id, name: user.name, role: 'registrar' as Role };
  makerId = (await createMaker()).id;
  for (let i = 0; i < 3; i++) {
    await createPrint(printInputSchema.parse({ accessionNumber: accession(), title: `Harbour wall ${i}`, process: 'gelatin_silver_developing_out', makerId }), actor, null);
  }
});
afterAll(() => closeDb());

describe('buildListSql', () => {
  const everyFilter = async () =>
    printListQuerySchema.parse({
      q: 'harb', process: PROCESS.codes[0], support: SUPPORT.codes[0], status: STATUS.codes[0], tonerClass: TONER_CLASS.codes[0],
      lightResponsivity: LIGHT_RESPONSIVITY.codes[0], makerId, paperId: (await createPaper()).id, enclosureId: (await createEnclosure()).id,
      locationId: (await createLocation()).id, hasWarnings: 'true', madeFrom: '1900', madeTo: '1990', page: '3', pageSize: '7',
    });

  it.each(['admin', 'viewer', null] as const)('each statement names exactly the values bound for it (%s)', async (role) => {
    const sql = buildListSql(await everyFilter(), role);
    expect(placeholders(sql.count)).toEqual(oneTo(sql.countParams.length));
    expect(placeholders(sql.estimate)).toEqual(oneTo(sql.countParams.length));
    expect(placeholders(sql.select)).toEqual(oneTo(sql.params.length));
    // The page size and offset are the values at the positions LIMIT and OFFSET name.
    const [, limit, offset] = /LIMIT \$(\d+) OFFSET \$(\d+)/.exec(sql.select)!;
    expect(sql.params[Number(limit) - 1]).toBe(7);
    expect(sql.params[Number(offset) - 1]).toBe(14);
    expect(sql.countParams).not.toContain(7);
  });

  it('PostgreSQL runs the three statements with their own values, every filter set', async () => {
    for (const role of ['admin', 'viewer'] as const) {
      const sql = buildListSql(await everyFilter(), role);
      await expect(db().query(sql.select, { bind: sql.params, type: QueryTypes.SELECT })).resolves.toEqual([]);
      await expect(db().query(sql.count, { bind: sql.countParams, type: QueryTypes.SELECT })).resolves.toEqual([{ total: 0 }]);
      await expect(db().query(sql.estimate, { bind: sql.countParams, type: QueryTypes.SELECT })).resolves.toHaveLength(1);
    }
  });

  it('pages by the bound size and offset, and counts every match', async () => {
    const query = (page: number) => printListQuerySchema.parse({ makerId, q: 'harbour', pageSize: '2', page: String(page) });
    const first = await listPrints(query(1), 'viewer');
    const second = await listPrints(query(2), 'viewer');
    expect(first.rows.map((r) => r.title)).toHaveLength(2);
    expect(second.rows).toHaveLength(1);
    expect(new Set([...first.rows, ...second.rows].map((r) => r.title))).toEqual(new Set(['Harbour wall 0', 'Harbour wall 1', 'Harbour wall 2']));
    expect([first.total, second.total, first.estimated]).toEqual([3, 3, false]);
  });
});
