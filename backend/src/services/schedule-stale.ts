import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';

/**
 * Marking prints whose next-inspection date an input change has made stale. Every service that
 * changes an input of the risk model (a report signed, a measurement added, a move, a loan or display
 * planned, a climate file accepted, an enclosure type changed) calls `markScheduleStale` inside its
 * own transaction: the marks commit with the change or not at all, so a stopped server misses
 * nothing. After the commit the schedule job is woken (`wakeScheduleUpdate`) and recomputes the
 * marked prints; the job empties the marks it has done. Marking a print already marked renews the
 * mark's number (`seq`): the job deletes a mark only when its number is the one it read before
 * computing, so a change made while its print's batch runs is never lost.
 */
export type StaleTarget =
  | { printIds: readonly string[] }
  /** Every print stored at this place or anywhere inside it. */
  | { locationId: string }
  /** Every print housed in this enclosure type. */
  | { enclosureId: string }
  /** Every print with a measurement session (the noticeable-change threshold changed). */
  | { measured: true }
  /** Every print stored where logger readings are held, or inside such a place (the climate settings changed). */
  | { climateStores: true };

const LOCATION_SUBTREE = `WITH RECURSIVE sub AS (SELECT id FROM locations WHERE id = :id UNION ALL SELECT l.id FROM locations l JOIN sub ON l.parent_id = sub.id)`;

export async function markScheduleStale(t: Transaction, target: StaleTarget): Promise<void> {
  if ('printIds' in target) {
    if (target.printIds.length === 0) return;
    await db().query(
      `INSERT INTO schedule_stale (print_id) SELECT unnest(ARRAY[:ids]::uuid[]) ON CONFLICT (print_id) DO UPDATE SET seq = nextval('schedule_stale_seq')`,
      { replacements: { ids: [...target.printIds] }, transaction: t, type: QueryTypes.INSERT },
    );
  } else if ('locationId' in target) {
    await db().query(
      `${LOCATION_SUBTREE} INSERT INTO schedule_stale (print_id) SELECT p.id FROM prints p WHERE p.location_id IN (SELECT id FROM sub) ON CONFLICT (print_id) DO UPDATE SET seq = nextval('schedule_stale_seq')`,
      { replacements: { id: target.locationId }, transaction: t, type: QueryTypes.INSERT },
    );
  } else if ('enclosureId' in target) {
    await db().query(
      `INSERT INTO schedule_stale (print_id) SELECT p.id FROM prints p WHERE p.enclosure_id = :id ON CONFLICT (print_id) DO UPDATE SET seq = nextval('schedule_stale_seq')`,
      { replacements: { id: target.enclosureId }, transaction: t, type: QueryTypes.INSERT },
    );
  } else if ('measured' in target) {
    await db().query(
      `INSERT INTO schedule_stale (print_id) SELECT DISTINCT print_id FROM measurement_sessions ON CONFLICT (print_id) DO UPDATE SET seq = nextval('schedule_stale_seq')`,
      { transaction: t, type: QueryTypes.INSERT },
    );
  } else {
    await db().query(
      `WITH RECURSIVE sub AS (SELECT DISTINCT location_id AS id FROM climate_files WHERE status = 'accepted'
         UNION SELECT l.id FROM locations l JOIN sub ON l.parent_id = sub.id)
       INSERT INTO schedule_stale (print_id) SELECT p.id FROM prints p WHERE p.location_id IN (SELECT id FROM sub) ON CONFLICT (print_id) DO UPDATE SET seq = nextval('schedule_stale_seq')`,
      { transaction: t, type: QueryTypes.INSERT },
    );
  }
  t.afterCommit(() => wakeScheduleUpdate());
}

let wake: () => void = () => {};

/** Wakes the schedule job after a change has committed. The schedule service installs what waking does (a queued job, or the work in this process). */
export function wakeScheduleUpdate(): void {
  wake();
}

export function onScheduleWake(fn: () => void): void {
  wake = fn;
}
