import { QueryTypes, type Transaction } from 'sequelize';
import type { ScheduleRecompute } from '@toneledger/common/schemas/inspections';
import { QUEUES, type JobQueue } from '../jobs/queue';
import { Setting } from '../models';
import { db } from '../db';
import { conflict } from '../errors';
import { onScheduleWake } from './schedule-stale';
import { recomputeSchedules } from './schedule.service';
import { recomputeOutcomes } from './print-outcomes';
import { analysePrintSpots } from './spot-histories';

/**
 * Keeping every print's date current.
 *
 * - **Marks**: a change of an input marks its prints in `schedule_stale` inside its own transaction
 *   and wakes the schedule work after the commit (`schedule-stale.ts`). The work takes the marks
 *   BATCH at a time (read without a lock), recomputes those prints and deletes in the same transaction
 *   each mark whose number is still the one read (a print marked again meanwhile keeps its mark), until
 *   none is left. With a queue, waking sends
 *   the pg-boss job `schedule-update`, one per 2 s at most (singletonKey, next slot when throttled);
 *   without one (testApp) the work runs in this process and `settleSchedules()` waits for it.
 * - **Full recompute** (`POST /api/inspections/recompute`): the pg-boss job `schedule-recompute` walks
 *   every print in id order, BATCH per transaction, with its progress and cursor in the settings row
 *   `schedule-recompute`; a server stopped mid-way leaves it running and `startWorkers` queues it again.
 */

export const SCHEDULE_BATCH = 5_000;
const KEY = 'schedule-recompute';

/**
 * Deletes the marks read before a batch was computed, each only while its number is still the one
 * read: a print marked again meanwhile (its change committed after the batch read its inputs) keeps
 * its renewed mark and is computed again.
 */
export async function clearMarks(marks: { print_id: string; seq: string }[], t: Transaction): Promise<void> {
  if (!marks.length) return;
  await db().query(
    'DELETE FROM schedule_stale s USING unnest($1::uuid[], $2::bigint[]) AS m(print_id, seq) WHERE s.print_id = m.print_id AND s.seq = m.seq',
    { bind: [marks.map((m) => m.print_id), marks.map((m) => m.seq)], transaction: t },
  );
}

/**
 * A batch's schedule dates and research outcomes, in the caller's transaction: the spots are read and
 * analysed once for both (`spot-histories.ts`).
 */
export async function recomputePrints(ids: readonly string[], t: Transaction): Promise<void> {
  const spots = await analysePrintSpots(ids, t);
  await recomputeSchedules(ids, t, undefined, spots);
  await recomputeOutcomes(ids, t, spots);
}

/**
 * One batch of marks: recomputed and cleared in one transaction. Returns how many marks it took (0:
 * none was left). The marks are read without a lock, so a change marking one of these prints never
 * waits for the batch; two servers may now and then compute the same print twice, which is harmless.
 */
export async function processStaleBatch(size = SCHEDULE_BATCH): Promise<number> {
  return db().transaction(async (t) => {
    const marks = await db().query<{ print_id: string; seq: string }>(
      'SELECT print_id, seq FROM schedule_stale ORDER BY since, print_id LIMIT $1',
      { bind: [size], transaction: t, type: QueryTypes.SELECT },
    );
    if (!marks.length) return 0;
    const ids = marks.map((m) => m.print_id);
    await recomputePrints(ids, t);
    await clearMarks(marks, t);
    return ids.length;
  });
}

/** Every mark, batch after batch, until none is left. */
export async function processStale(size = SCHEDULE_BATCH): Promise<number> {
  let total = 0;
  for (let n = await processStaleBatch(size); n > 0; n = await processStaleBatch(size)) total += n;
  return total;
}

// ── Waking ──

let inProcess: Promise<void> | null = null;
let again = false;

function runHere(): void {
  if (inProcess) {
    again = true;
    return;
  }
  inProcess = (async () => {
    do {
      again = false;
      await processStale();
    } while (again);
  })().finally(() => { inProcess = null; });
  inProcess.catch(() => {});
}

/** Waits for the in-process schedule work (tests; no queue). */
export async function settleSchedules(): Promise<void> {
  while (inProcess) await inProcess.catch(() => {});
}

/** What waking does: the queued job, or the work in this process when the app has no queue. */
export function installScheduleWake(queue: JobQueue | null): void {
  onScheduleWake(queue
    ? () => { void queue.boss.send(QUEUES.scheduleUpdate, {}, { singletonKey: 'schedule-update', singletonSeconds: 2, singletonNextSlot: true }).catch(() => {}); }
    : runHere);
}

/** When the workers start: every print without a schedule row or without an outcomes row (research) is marked, and the marks are worked off. Returns how many were marked. */
export async function markUnscheduled(queue: JobQueue): Promise<number> {
  const [, count] = await db().query(
    `INSERT INTO schedule_stale (print_id) SELECT p.id FROM prints p
      WHERE (p.status <> 'deaccessioned' AND NOT EXISTS (SELECT 1 FROM print_schedules s WHERE s.print_id = p.id))
         OR NOT EXISTS (SELECT 1 FROM print_outcomes o WHERE o.print_id = p.id)
     ON CONFLICT (print_id) DO NOTHING`,
  ) as [unknown, { rowCount?: number } | number];
  await queue.boss.send(QUEUES.scheduleUpdate, {}, { singletonKey: 'schedule-update', singletonSeconds: 2, singletonNextSlot: true });
  return typeof count === 'number' ? count : count?.rowCount ?? 0;
}

// ── Full recompute ──

interface RecomputeRow {
  status: ScheduleRecompute['status'];
  done: number;
  total: number;
  startedAt: string;
  finishedAt: string | null;
  /** The last print id done; null: from the first. */
  cursor: string | null;
}

function present(p: RecomputeRow): ScheduleRecompute {
  const end = p.finishedAt ? Date.parse(p.finishedAt) : Date.now();
  const seconds = (end - Date.parse(p.startedAt)) / 1000;
  return { status: p.status, done: p.done, total: p.total, startedAt: p.startedAt, finishedAt: p.finishedAt, rate: seconds > 0 && p.done > 0 ? Math.round((p.done / seconds) * 10) / 10 : null };
}

async function progressRow(t: Transaction) {
  return Setting.findByPk(KEY, { transaction: t, lock: t.LOCK.UPDATE });
}

export async function scheduleRecomputeProgress(): Promise<ScheduleRecompute | null> {
  const row = await Setting.findByPk(KEY);
  return row ? present(row.value as RecomputeRow) : null;
}

const running = new Set<Promise<void>>();
export async function settleScheduleRecompute(): Promise<void> {
  while (running.size) await Promise.all([...running]);
}

/** Starts a full recompute: 409 while one runs. The job is queued (or run here) once the start has committed. */
export async function startScheduleRecompute(queue: JobQueue | null): Promise<ScheduleRecompute> {
  const value = await db().transaction(async (t) => {
    // A first start has no row to lock: the advisory lock makes two first starts take turns.
    await db().query('SELECT pg_advisory_xact_lock(727101)', { transaction: t });
    const row = await progressRow(t);
    if ((row?.value as RecomputeRow | undefined)?.status === 'running') throw conflict('A full recompute of the inspection dates is already running.', { recompute: present(row!.value as RecomputeRow) });
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints', { transaction: t, type: QueryTypes.SELECT });
    const next: RecomputeRow = { status: 'running', done: 0, total: n, startedAt: new Date().toISOString(), finishedAt: null, cursor: null };
    await Setting.upsert({ key: KEY, value: next }, { transaction: t });
    return next;
  });
  if (queue) await queue.send(QUEUES.scheduleRecompute, {});
  else {
    const work = scheduleRecomputeJob();
    running.add(work);
    void work.finally(() => running.delete(work)).catch(() => {});
  }
  return present(value);
}

/** One batch of the full recompute: false when it is over. */
export async function scheduleRecomputeBatch(size = SCHEDULE_BATCH): Promise<boolean> {
  return db().transaction(async (t) => {
    const row = await progressRow(t);
    const p = row?.value as RecomputeRow | undefined;
    if (!row || !p || p.status !== 'running') return false;
    const ids = (await db().query<{ id: string }>(
      'SELECT id FROM prints WHERE $1::uuid IS NULL OR id > $1::uuid ORDER BY id LIMIT $2',
      { bind: [p.cursor, size], transaction: t, type: QueryTypes.SELECT },
    )).map((r) => r.id);
    // The marks these prints hold now: done by this batch (a print marked again while it runs keeps its renewed mark).
    const marks = ids.length
      ? await db().query<{ print_id: string; seq: string }>('SELECT print_id, seq FROM schedule_stale WHERE print_id = ANY ($1::uuid[])', { bind: [ids], transaction: t, type: QueryTypes.SELECT })
      : [];
    await recomputePrints(ids, t);
    await clearMarks(marks, t);
    const done = p.done + ids.length;
    const finished = ids.length < size;
    const next: RecomputeRow = finished
      ? { ...p, status: 'done', done, total: done, cursor: null, finishedAt: new Date().toISOString() }
      : { ...p, done, total: Math.max(p.total, done), cursor: ids[ids.length - 1]! };
    await Setting.update({ value: next }, { where: { key: KEY }, transaction: t });
    return !finished;
  });
}

/** The job: batches until done; a failure marks the progress failed (so a new start is allowed) and is thrown for the queue's retry. */
export async function scheduleRecomputeJob(size = SCHEDULE_BATCH): Promise<void> {
  try {
    while (await scheduleRecomputeBatch(size));
  } catch (err) {
    await db().transaction(async (t) => {
      const row = await progressRow(t);
      const p = row?.value as RecomputeRow | undefined;
      if (p?.status === 'running') await Setting.update({ value: { ...p, status: 'failed', finishedAt: new Date().toISOString() } }, { where: { key: KEY }, transaction: t });
    }).catch(() => {});
    throw err;
  }
}

/** When the workers start: a full recompute a stopped server left running is queued again (it continues from its cursor). */
export async function resumeScheduleRecompute(queue: JobQueue): Promise<boolean> {
  const row = await Setting.findByPk(KEY);
  if ((row?.value as RecomputeRow | undefined)?.status !== 'running') return false;
  await queue.send(QUEUES.scheduleRecompute, {});
  return true;
}
