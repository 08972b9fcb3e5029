import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { QueryTypes } from 'sequelize';
import { sessionFor, testApp } from '../../test/app';
import { accession } from '../../test/factories';
import { db } from '../db';
import { clearMarks, installScheduleWake, processStaleBatch, settleSchedules } from './schedule-jobs';
import { markScheduleStale, onScheduleWake } from './schedule-stale';

const t = testApp();
let printId: string;
beforeAll(async () => {
  const registrar = await sessionFor(t.app, 'registrar');
  const res = await supertest(t.app).post('/api/prints').set('Cookie', registrar).set('Origin', t.origin)
    .send({ accessionNumber: accession(), title: 'Marked twice', process: 'gelatin_silver_developing_out' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  printId = res.body.data.id;
  await settleSchedules();
});
afterAll(async () => {
  installScheduleWake(null);
  await t.close();
});

const markOf = async (id: string) =>
  (await db().query<{ seq: string }>('SELECT seq FROM schedule_stale WHERE print_id = $1', { bind: [id], type: QueryTypes.SELECT }))[0] ?? null;

describe('stale marks', () => {
  it('a print marked again while its batch is computed keeps its mark; the next batch takes it', async () => {
    // The work is run by hand here: waking does nothing while the steps of a batch are played out in order.
    onScheduleWake(() => {});
    try {
      await db().transaction((tx) => markScheduleStale(tx, { printIds: [printId] }));
      const first = await markOf(printId);
      expect(first).not.toBeNull();
      // A batch reads its marks, then (before it clears them) a change marks the print again and commits.
      const read = await db().query<{ print_id: string; seq: string }>('SELECT print_id, seq FROM schedule_stale WHERE print_id = $1', { bind: [printId], type: QueryTypes.SELECT });
      await db().transaction((tx) => markScheduleStale(tx, { printIds: [printId] }));
      const renewed = await markOf(printId);
      expect(BigInt(renewed!.seq)).toBeGreaterThan(BigInt(first!.seq));
      // The batch clears what it read: the renewed mark stays, so the change is not lost.
      await db().transaction((tx) => clearMarks(read, tx));
      expect(await markOf(printId)).toEqual(renewed);
      // The next batch computes the print again and clears its mark.
      const before = (await db().query<{ at: Date }>('SELECT computed_at AS at FROM print_schedules WHERE print_id = $1', { bind: [printId], type: QueryTypes.SELECT }))[0]!.at;
      while ((await processStaleBatch()) > 0);
      expect(await markOf(printId)).toBeNull();
      const after = (await db().query<{ at: Date }>('SELECT computed_at AS at FROM print_schedules WHERE print_id = $1', { bind: [printId], type: QueryTypes.SELECT }))[0]!.at;
      expect(after.getTime()).toBeGreaterThan(before.getTime());
    } finally {
      installScheduleWake(null);
    }
  });

  it('a mark cleared with the number it was read with is gone', async () => {
    onScheduleWake(() => {});
    try {
      await db().transaction((tx) => markScheduleStale(tx, { printIds: [printId] }));
      const read = await db().query<{ print_id: string; seq: string }>('SELECT print_id, seq FROM schedule_stale WHERE print_id = $1', { bind: [printId], type: QueryTypes.SELECT });
      expect(read).toHaveLength(1);
      await db().transaction((tx) => clearMarks(read, tx));
      expect(await markOf(printId)).toBeNull();
    } finally {
      installScheduleWake(null);
    }
  });
});
