import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { testApp } from '../../test/app';
import { exhibitionClient } from '../../test/exhibition-helpers';
import { db } from '../db';
import { seedDemoSchedules } from './demo-schedule';

const t = testApp();
afterAll(() => t.close());

const n = async (sql: string) => (await db().query<{ n: number }>(sql, { type: QueryTypes.SELECT }))[0]!.n;

describe('the demo seed part for inspection dates', () => {
  it('dates every print, clears the marks, and gives the same rows when run again (a stopped seed carries on)', async () => {
    const h = await exhibitionClient(t);
    for (let i = 0; i < 3; i++) await h.newPrint();
    const lines: string[] = [];
    const done = await seedDemoSchedules((m) => lines.push(m));
    const prints = await n('SELECT count(*)::int AS n FROM prints');
    expect(done).toBe(prints);
    expect(lines).toEqual([`Next-inspection dates and research outcomes computed for ${prints} demo prints.`]);
    // Every print has its date but a deaccessioned one (no longer inspected).
    expect(await n('SELECT count(*)::int AS n FROM print_schedules')).toBe(await n("SELECT count(*)::int AS n FROM prints WHERE status <> 'deaccessioned'"));
    expect(await n("SELECT count(*)::int AS n FROM print_schedules s JOIN prints p ON p.id = s.print_id WHERE p.status = 'deaccessioned'")).toBe(0);
    expect(await n('SELECT count(*)::int AS n FROM schedule_stale')).toBe(0);
    const before = await db().query('SELECT print_id, due_on::text, version FROM print_schedules ORDER BY print_id', { type: QueryTypes.SELECT });
    await seedDemoSchedules(() => {});
    expect(await db().query('SELECT print_id, due_on::text, version FROM print_schedules ORDER BY print_id', { type: QueryTypes.SELECT })).toEqual(before);
  });

  it('stops at the next batch when asked', async () => {
    const stop = new AbortController();
    stop.abort(new Error('stopped'));
    await expect(seedDemoSchedules(() => {}, { signal: stop.signal })).rejects.toThrow('stopped');
  });
});
