import type { WorklistItem, WorklistQuery } from '@toneledger/common/schemas/inspections';
import { pgRows } from './print-list.service';

/**
 * The conservators' work list: one statement over `print_schedules` joined to prints and their
 * places for the page, one for the header's counts. The benchmark (scripts/bench.ts) runs the same
 * text. `today` is bound, never read by the database, so the windows are the server's calendar day.
 */

const SORT_SQL: Record<WorklistQuery['sort'], string> = {
  dueOn: 's.due_on ASC, s.print_id ASC',
  '-dueOn': 's.due_on DESC, s.print_id DESC',
  location: 'l.path_label ASC NULLS LAST, p.accession_sort ASC',
  risk: 's.risk_rank DESC, s.due_on ASC, s.print_id ASC',
  accessionNumber: 'p.accession_sort ASC',
};

/** A round still to be walked. */
const OPEN_ROUND = `SELECT 1 FROM inspection_round_items ri JOIN inspection_rounds r ON r.id = ri.round_id AND r.status = 'planned' WHERE ri.print_id = s.print_id`;

export interface WorklistSql {
  select: string;
  params: unknown[];
  counts: string;
  countParams: unknown[];
}

/** Today as a calendar day (UTC), the reference of the windows. */
export function todayIso(now = new Date()): string {
  return now.toISOString().slice(0, 10);
}

export function buildWorklistSql(query: WorklistQuery, today: string): WorklistSql {
  const params: unknown[] = [];
  const p = (v: unknown) => {
    params.push(v);
    return `$${params.length}`;
  };
  const where: string[] = [];
  // The place is kept on the schedule row (migration 20261202174500). The subtree is gathered once into an
  // array, so each of its places is an index range of (location_id, due_on, print_id); as a subquery the
  // planner walked the whole date index instead, testing each row against the subtree.
  if (query.locationId) {
    where.push(`s.location_id = ANY (ARRAY(WITH RECURSIVE sub AS (SELECT id FROM locations WHERE id = ${p(query.locationId)} UNION ALL SELECT c.id FROM locations c JOIN sub ON c.parent_id = sub.id) SELECT id FROM sub))`);
  }
  if (query.risk) where.push(`s.risk = ${p(query.risk)}`);
  if (query.reason) where.push(`s.reasons @> ARRAY[${p(query.reason)}]::text[]`);
  if (query.assigneeId === 'none') where.push(`NOT EXISTS (${OPEN_ROUND})`);
  else if (query.assigneeId) where.push(`EXISTS (${OPEN_ROUND} AND r.assignee_id = ${p(query.assigneeId)})`);
  const filters = [...where];
  const countParams = [...params];
  const day = p(today);
  if (query.window === 'overdue') where.push(`s.due_on < ${day}::date`);
  else if (query.window !== 'all') where.push(`s.due_on <= ${day}::date + ${Number(query.window)}`);
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const order = SORT_SQL[query.sort];
  const limit = p(query.pageSize);
  const offset = p((query.page - 1) * query.pageSize);
  // The page first, reading prints and places only when the sort needs them; then its rows' details.
  const needsPrint = query.sort === 'location' || query.sort === 'accessionNumber';
  const pageFrom = `print_schedules s${needsPrint ? ' JOIN prints p ON p.id = s.print_id' : ''}${query.sort === 'location' ? ' LEFT JOIN locations l ON l.id = p.location_id' : ''}`;
  const select = `SELECT s.print_id, p.accession_number, p.title, s.due_on::text AS due_on, (${day}::date - s.due_on) AS overdue_days, s.risk,
      s.override_due_on IS NOT NULL AS overridden, s.main_reason, s.reasons, p.location_id, l.path_label AS location_label,
      lr.grade AS last_grade, coalesce(s.last_checked_on, lr.examined_on)::text AS last_checked_on,
      rd.id AS round_id, rd.title AS round_title, rd.planned_on::text AS round_planned_on, rd.assignee_name
    FROM (SELECT s.print_id FROM ${pageFrom} ${whereSql} ORDER BY ${order} LIMIT ${limit} OFFSET ${offset}) page
    JOIN print_schedules s ON s.print_id = page.print_id
    JOIN prints p ON p.id = s.print_id
    LEFT JOIN locations l ON l.id = p.location_id
    LEFT JOIN LATERAL (SELECT c.grade, c.examined_on FROM condition_reports c WHERE c.print_id = s.print_id AND c.status = 'signed'
                       ORDER BY c.examined_on DESC, c.signed_at DESC LIMIT 1) lr ON true
    LEFT JOIN LATERAL (SELECT r.id, r.title, r.planned_on, u.name AS assignee_name FROM inspection_round_items ri
                       JOIN inspection_rounds r ON r.id = ri.round_id AND r.status = 'planned' JOIN users u ON u.id = r.assignee_id
                       WHERE ri.print_id = s.print_id ORDER BY r.planned_on, r.id LIMIT 1) rd ON true
    ORDER BY ${order}`;
  // Every schedule row belongs to a print (the foreign key cascades), so the counts need no join.
  const cday = `$${countParams.length + 1}::date`;
  const counts = `SELECT count(*) FILTER (WHERE s.due_on < ${cday})::int AS overdue,
      count(*) FILTER (WHERE s.due_on <= ${cday} + 30)::int AS within30,
      count(*) FILTER (WHERE s.due_on <= ${cday} + 90)::int AS within90, count(*)::int AS total
    FROM print_schedules s ${filters.length ? `WHERE ${filters.join(' AND ')}` : ''}`;
  return { select, params, counts, countParams: [...countParams, today] };
}

interface Row {
  print_id: string; accession_number: string; title: string | null; due_on: string; overdue_days: number; risk: WorklistItem['risk'];
  overridden: boolean; main_reason: string; reasons: WorklistItem['reasons']; location_id: string | null; location_label: string | null;
  last_grade: WorklistItem['lastGrade']; last_checked_on: string | null; round_id: string | null; round_title: string | null;
  round_planned_on: string | null; assignee_name: string | null;
}

function present(r: Row): WorklistItem {
  return {
    printId: r.print_id, accessionNumber: r.accession_number, title: r.title, dueOn: r.due_on, overdueDays: r.overdue_days, risk: r.risk,
    overridden: r.overridden, mainReason: r.main_reason, reasons: r.reasons, locationId: r.location_id, locationLabel: r.location_label,
    lastGrade: r.last_grade, lastCheckedOn: r.last_checked_on,
    round: r.round_id ? { id: r.round_id, title: r.round_title!, plannedOn: r.round_planned_on!, assigneeName: r.assignee_name ?? '' } : null,
  };
}

export async function worklist(query: WorklistQuery, today = todayIso()) {
  const sql = buildWorklistSql(query, today);
  const [rows, [counts]] = await Promise.all([
    pgRows<Row>(sql.select, sql.params),
    pgRows<{ overdue: number; within30: number; within90: number; total: number }>(sql.counts, sql.countParams),
  ]);
  const total = { overdue: counts.overdue, '30': counts.within30, '90': counts.within90, all: counts.total }[query.window];
  return { data: rows.map(present), pagination: { page: query.page, pageSize: query.pageSize, total }, counts };
}
