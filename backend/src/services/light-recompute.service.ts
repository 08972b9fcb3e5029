import { QueryTypes, type Transaction } from 'sequelize';
import type { LightRecompute, LightSettings } from '@toneledger/common/schemas/light';
import { QUEUES, type JobQueue } from '../jobs/queue';
import { Setting } from '../models';
import { db } from '../db';
import { getLightSettings, recomputeCategories } from './light-settings.service';
import { recordAudit } from './audit.service';
import { refreshLightWarnings } from './light.service';
import type { Actor } from './print.service';

/**
 * A change of the light settings rewrites every print's effective category and stored light
 * warning, but not inside the request: the change records a new generation on the progress row
 * (settings key `light-recompute`) and a job carrying only that generation walks the prints in id
 * order, BATCH at a time, each batch its own transaction reading the settings afresh.
 *
 * The rule for a change made while a recompute runs: each batch locks the progress row and goes on
 * only while the row's generation is the job's; the newer change (which waits for a running batch to
 * end) bumps the generation and sets the cursor back to the first print, so the older job stops at its
 * next batch and the newer one recomputes every print from the latest settings. A job run twice
 * continues from the stored cursor or finds its generation done, so it works once.
 */

const KEY = 'light-recompute';
export const RECOMPUTE_BATCH = 5_000;

interface RecomputeRow extends LightRecompute {
  generation: number;
  /** The last print id done; null: from the first. */
  cursor: string | null;
}

/** Where the recompute runs: a pg-boss job, or in this process when the app has no queue. */
export interface RecomputeRunner {
  queue: JobQueue | null;
}

async function progressRow(t: Transaction) {
  return Setting.findByPk(KEY, { transaction: t, lock: t.LOCK.UPDATE });
}

/** Inside the settings change's transaction: a new generation, from the first print. Returns it. */
export async function beginLightRecompute(t: Transaction): Promise<number> {
  const row = await progressRow(t);
  const generation = ((row?.value as RecomputeRow | undefined)?.generation ?? 0) + 1;
  // The planner's estimate here (a count of every row takes seconds just after a full rewrite); the first batch counts.
  const [{ n }] = await db().query<{ n: number }>("SELECT greatest(reltuples, 0)::int AS n FROM pg_class WHERE oid = 'prints'::regclass", { transaction: t, type: QueryTypes.SELECT });
  const value: RecomputeRow = { generation, status: 'running', done: 0, total: n, cursor: null, startedAt: new Date().toISOString(), finishedAt: null };
  await Setting.upsert({ key: KEY, value }, { transaction: t });
  return generation;
}

/**
 * The administrators' change of the light settings: stored and audited with a new recompute
 * generation in one short transaction; the recompute itself is queued once that has committed
 * (a server stopped in between leaves it running, and `startWorkers` queues it again).
 */
export async function saveLightSettings(next: LightSettings, actor: Actor, requestId: string | null, runner: RecomputeRunner): Promise<LightSettings> {
  const generation = await db().transaction(async (t) => {
    const before = await getLightSettings(t);
    await Setting.upsert({ key: 'light', value: next }, { transaction: t });
    await recordAudit({ actor, action: 'settings.updated', entityType: 'settings', entityId: 'light', before, after: next, requestId }, t);
    return beginLightRecompute(t);
  });
  await runLightRecompute(runner, generation);
  return next;
}

/** Jobs running in this process, so tests and shutdown can wait for them. */
const running = new Set<Promise<void>>();
export async function settleLightRecompute(): Promise<void> {
  while (running.size) await Promise.all([...running]);
}

/** After the change committed: the job, queued or run here. */
export async function runLightRecompute(runner: RecomputeRunner, generation: number): Promise<void> {
  if (runner.queue) {
    await runner.queue.send(QUEUES.lightRecompute, { generation });
    return;
  }
  const work = recomputeJob(generation);
  running.add(work);
  void work.finally(() => running.delete(work)).catch(() => {});
}

/** One batch: false when the work of this generation is over (done, or a newer change took over). */
export async function recomputeBatch(generation: number, size = RECOMPUTE_BATCH): Promise<boolean> {
  return db().transaction(async (t) => {
    const row = await progressRow(t);
    const p = row?.value as RecomputeRow | undefined;
    if (!row || !p || p.generation !== generation || p.status !== 'running') return false;
    const settings = await getLightSettings(t);
    const ids = (await db().query<{ id: string }>(
      `SELECT id FROM prints WHERE $1::uuid IS NULL OR id > $1::uuid ORDER BY id LIMIT $2`,
      { bind: [p.cursor, size], transaction: t, type: QueryTypes.SELECT },
    )).map((r) => r.id);
    if (ids.length) {
      await recomputeCategories(t, ids, settings);
      const withWarning = (await db().query<{ id: string }>(
        `SELECT p.id FROM prints p WHERE p.id = ANY ($1::uuid[])
            AND (p.over_light_budget OR EXISTS (SELECT 1 FROM display_periods d WHERE d.print_id = p.id))`,
        { bind: [ids], transaction: t, type: QueryTypes.SELECT },
      )).map((r) => r.id);
      await refreshLightWarnings(t, withWarning, settings);
    }
    const total = p.cursor === null ? (await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints', { transaction: t, type: QueryTypes.SELECT }))[0]!.n : p.total;
    const done = p.done + ids.length;
    const finished = ids.length < size;
    const next: RecomputeRow = finished
      ? { ...p, status: 'done', done, total: done, cursor: null, finishedAt: new Date().toISOString() }
      : { ...p, done, total, cursor: ids[ids.length - 1]! };
    await Setting.update({ value: next }, { where: { key: KEY }, transaction: t });
    return !finished;
  });
}

/** The job: batches until this generation is done or superseded. */
export async function recomputeJob(generation: number, size = RECOMPUTE_BATCH): Promise<void> {
  while (await recomputeBatch(generation, size));
}

/** The progress for the settings page; null when the settings never changed. */
export async function lightRecomputeProgress(): Promise<LightRecompute | null> {
  const row = await Setting.findByPk(KEY);
  if (!row) return null;
  const { status, done, total, startedAt, finishedAt } = row.value as RecomputeRow;
  return { status, done, total, startedAt, finishedAt };
}

/** When the workers start: a recompute a stopped server left running is queued again. Returns whether one was. */
export async function resumeLightRecompute(queue: JobQueue): Promise<boolean> {
  const row = await Setting.findByPk(KEY);
  const p = row?.value as RecomputeRow | undefined;
  if (!p || p.status !== 'running') return false;
  await queue.send(QUEUES.lightRecompute, { generation: p.generation });
  return true;
}
