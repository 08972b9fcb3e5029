import { QueryTypes, type Transaction } from 'sequelize';
import type { Round, RoundDetail } from '@toneledger/common/schemas/inspections';
import type { RiskFactor } from '@toneledger/common/schemas/inspections';
import { db } from '../db';
import { notFound } from '../errors';

/** Reading rounds: the list, one round with its prints in shelf order, and what to look at on each print. */

const SEVERITY_WORD: Record<string, string> = { slight: 'slight', moderate: 'moderate', severe: 'severe' };

interface RoundRow {
  id: string; title: string; planned_on: string; status: Round['status']; assignee_id: string; assignee_name: string; assignee_email: string | null;
  notes: string | null; created_by: string; created_by_name: string; created_at: Date; version: number; print_count: number; checked_count: number;
}

const ROUND_SELECT = `SELECT r.id, r.title, r.planned_on::text AS planned_on, r.status, r.assignee_id, a.name AS assignee_name, a.email AS assignee_email,
    r.notes, r.created_by, c.name AS created_by_name, r.created_at, r.version,
    (SELECT count(*)::int FROM inspection_round_items i WHERE i.round_id = r.id) AS print_count,
    (SELECT count(*)::int FROM inspection_round_items i WHERE i.round_id = r.id AND i.checked_on IS NOT NULL) AS checked_count
  FROM inspection_rounds r JOIN users a ON a.id = r.assignee_id JOIN users c ON c.id = r.created_by`;

/** The deepest place holding every print: the common leading part of their location paths (null if one has no place). */
export function commonPlace(labels: (string | null)[]): string | null {
  if (!labels.length || labels.some((l) => l === null)) return null;
  const parts = labels.map((l) => l!.split(' › '));
  const common: string[] = [];
  for (let i = 0; i < parts[0].length; i++) {
    if (parts.every((p) => p[i] === parts[0][i])) common.push(parts[0][i]);
    else break;
  }
  return common.length ? common.join(' › ') : null;
}

async function placesOf(roundIds: string[], t?: Transaction): Promise<Map<string, (string | null)[]>> {
  const rows = roundIds.length
    ? await db().query<{ round_id: string; path_label: string | null }>(
        `SELECT i.round_id, l.path_label FROM inspection_round_items i JOIN prints p ON p.id = i.print_id LEFT JOIN locations l ON l.id = p.location_id
          WHERE i.round_id = ANY($1::uuid[])`,
        { bind: [roundIds], type: QueryTypes.SELECT, transaction: t },
      )
    : [];
  const out = new Map<string, (string | null)[]>();
  for (const r of rows) out.set(r.round_id, [...(out.get(r.round_id) ?? []), r.path_label]);
  return out;
}

function presentRound(r: RoundRow, places: (string | null)[]): Round {
  return {
    id: r.id, title: r.title, plannedOn: r.planned_on, status: r.status,
    assignee: { id: r.assignee_id, name: r.assignee_name, email: r.assignee_email }, notes: r.notes,
    printCount: r.print_count, checkedCount: r.checked_count, locationLabel: commonPlace(places),
    createdBy: { id: r.created_by, name: r.created_by_name }, createdAt: new Date(r.created_at).toISOString(), version: r.version,
  };
}

export async function listRounds(query: { page: number; pageSize: number; status?: Round['status']; assigneeId?: string }) {
  const where: string[] = [];
  const bind: unknown[] = [];
  if (query.status) where.push(`r.status = $${bind.push(query.status)}`);
  if (query.assigneeId) where.push(`r.assignee_id = $${bind.push(query.assigneeId)}`);
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [{ total }] = await db().query<{ total: number }>(`SELECT count(*)::int AS total FROM inspection_rounds r ${whereSql}`, { bind, type: QueryTypes.SELECT });
  const rows = await db().query<RoundRow>(
    `${ROUND_SELECT} ${whereSql} ORDER BY r.planned_on ASC, r.created_at ASC, r.id ASC LIMIT $${bind.length + 1} OFFSET $${bind.length + 2}`,
    { bind: [...bind, query.pageSize, (query.page - 1) * query.pageSize], type: QueryTypes.SELECT },
  );
  const places = await placesOf(rows.map((r) => r.id));
  return { data: rows.map((r) => presentRound(r, places.get(r.id) ?? [])), total };
}

interface ItemRow {
  print_id: string; accession_number: string; title: string | null; location_label: string | null; last_grade: RoundDetail['items'][number]['lastGrade'];
  last_checked_on: string | null; due_on: string | null; factors: RiskFactor[] | null; checked_on: string | null; condition_report_id: string | null;
  last_report_id: string | null;
}

/** "Silver mirroring, moderate, in the image (recto)": one line per observation of the last signed report. */
function observationLine(o: { label: string; severity: string; area: string; side: string }): string {
  return `${o.label}, ${SEVERITY_WORD[o.severity] ?? o.severity}, ${o.area === 'overall' ? 'overall' : `at the ${o.area}`} (${o.side})`;
}

export async function roundDetail(id: string, t?: Transaction): Promise<RoundDetail> {
  const [row] = await db().query<RoundRow>(`${ROUND_SELECT} WHERE r.id = $1`, { bind: [id], type: QueryTypes.SELECT, transaction: t });
  if (!row) throw notFound('The round');
  // Shelf order: the place's full path, then the accession number's sort key.
  const items = await db().query<ItemRow>(
    `SELECT i.print_id, p.accession_number, p.title, l.path_label AS location_label, lr.grade AS last_grade,
            coalesce(s.last_checked_on, lr.examined_on)::text AS last_checked_on, s.due_on::text AS due_on, s.factors,
            i.checked_on::text AS checked_on, i.condition_report_id, lr.id AS last_report_id
       FROM inspection_round_items i
       JOIN prints p ON p.id = i.print_id
       LEFT JOIN locations l ON l.id = p.location_id
       LEFT JOIN print_schedules s ON s.print_id = i.print_id
       LEFT JOIN LATERAL (SELECT c.id, c.grade, c.examined_on FROM condition_reports c WHERE c.print_id = i.print_id AND c.status = 'signed'
                          ORDER BY c.examined_on DESC, c.signed_at DESC LIMIT 1) lr ON true
      WHERE i.round_id = $1
      ORDER BY l.path_label ASC NULLS LAST, p.accession_sort ASC`,
    { bind: [id], type: QueryTypes.SELECT, transaction: t },
  );
  const reportIds = items.map((i) => i.last_report_id).filter((x): x is string => !!x);
  const observations = reportIds.length
    ? await db().query<{ report_id: string; label: string; severity: string; area: string; side: string }>(
        `SELECT o.report_id, t.label, o.severity, o.area, o.side FROM observations o JOIN condition_terms t ON t.code = o.term_code
          WHERE o.report_id = ANY($1::uuid[]) ORDER BY o.report_id, o.position`,
        { bind: [reportIds], type: QueryTypes.SELECT, transaction: t },
      )
    : [];
  const byReport = new Map<string, string[]>();
  for (const o of observations) byReport.set(o.report_id, [...(byReport.get(o.report_id) ?? []), observationLine(o)]);
  return {
    ...presentRound(row, items.map((i) => i.location_label)),
    items: items.map((i) => ({
      printId: i.print_id, accessionNumber: i.accession_number, title: i.title, locationLabel: i.location_label, lastGrade: i.last_grade,
      lastCheckedOn: i.last_checked_on, dueOn: i.due_on,
      lookAt: [...(i.factors ?? []).map((f) => f.text), ...(i.last_report_id ? byReport.get(i.last_report_id) ?? [] : [])],
      checkedOn: i.checked_on, conditionReportId: i.condition_report_id,
    })),
  };
}
