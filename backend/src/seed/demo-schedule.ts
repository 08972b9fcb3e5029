import { QueryTypes } from 'sequelize';
import { db } from '../db';
import { SCHEDULE_BATCH, clearMarks } from '../services/schedule-jobs';
import { recomputeOutcomes } from '../services/print-outcomes';
import { recomputeSchedules } from '../services/schedule.service';

/**
 * Every demo print's next-inspection date and research outcomes, after the other demo parts (reports, measurements, loans
 * and displays are its inputs): the prints in id order, a batch per transaction, each batch's marks
 * cleared with it. Running it again recomputes what is there, so a stopped seed simply carries on.
 */
export async function seedDemoSchedules(log: (m: string) => void, options: { signal?: AbortSignal } = {}): Promise<number> {
  let cursor: string | null = null;
  let done = 0;
  for (;;) {
    options.signal?.throwIfAborted();
    const n: number = await db().transaction(async (t) => {
      const ids = (await db().query<{ id: string }>(
        'SELECT id FROM prints WHERE $1::uuid IS NULL OR id > $1::uuid ORDER BY id LIMIT $2',
        { bind: [cursor, SCHEDULE_BATCH], transaction: t, type: QueryTypes.SELECT },
      )).map((r) => r.id);
      const marks = ids.length
        ? await db().query<{ print_id: string; seq: string }>('SELECT print_id, seq FROM schedule_stale WHERE print_id = ANY ($1::uuid[])', { bind: [ids], transaction: t, type: QueryTypes.SELECT })
        : [];
      await recomputeSchedules(ids, t);
      await recomputeOutcomes(ids, t);
      await clearMarks(marks, t);
      cursor = ids.at(-1) ?? cursor;
      return ids.length;
    });
    done += n;
    if (n < SCHEDULE_BATCH) break;
  }
  log(`Next-inspection dates and research outcomes computed for ${done} demo prints.`);
  return done;
}
