import { QueryTypes } from 'sequelize';
import type { AuditRecord } from '@toneledger/common/schemas/audit';
import { recordKindLabel, SETTINGS_SECTION_NAMES, type RecordPage } from '@toneledger/common/fields/audit-records';
import { db } from '../db';

/**
 * The records a page of audit events is about, named as people know them and linked to their page:
 * one query for the whole page (a UNION ALL with one branch per kind present, each reading its ids
 * with `= ANY`), never a query per event. A record since deleted keeps the name its snapshot holds
 * and has no link.
 */

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** "1987.14.3, 2025-02-03": a print's accession number with a detail of the record on it. */
const onPrint = (detail: string) => `p.accession_number || coalesce(', ' || ${detail}, '')`;
const day = (col: string) => `to_char(${col}, 'YYYY-MM-DD')`;

/**
 * Per kind: the rows it names, as `SELECT id, name, page, page_id FROM … WHERE x.id = ANY($n)`.
 * `$ids` is replaced by the bind parameter of that kind's ids.
 */
const BRANCHES: Record<string, { idType: 'uuid' | 'text'; sql: string }> = {
  print: { idType: 'uuid', sql: `SELECT p.id::text, p.accession_number, 'print', p.id::text FROM prints p WHERE p.id = ANY($ids)` },
  print_schedule: { idType: 'uuid', sql: `SELECT p.id::text, p.accession_number, 'print', p.id::text FROM prints p WHERE p.id = ANY($ids)` },
  user: { idType: 'uuid', sql: `SELECT u.id::text, u.name, NULL, NULL FROM users u WHERE u.id = ANY($ids)` },
  exhibition: { idType: 'uuid', sql: `SELECT e.id::text, e.title, 'exhibition', e.id::text FROM exhibitions e WHERE e.id = ANY($ids)` },
  loan: { idType: 'uuid', sql: `SELECT l.id::text, l.reference, 'loan', l.id::text FROM loans l WHERE l.id = ANY($ids)` },
  object_entry: { idType: 'uuid', sql: `SELECT o.id::text, o.entry_number, 'object_entry', o.id::text FROM object_entries o WHERE o.id = ANY($ids)` },
  acquisition: {
    idType: 'uuid',
    sql: `SELECT a.id::text, o.entry_number, CASE WHEN o.id IS NULL THEN NULL ELSE 'object_entry' END, o.id::text
          FROM acquisitions a LEFT JOIN object_entries o ON o.id = a.entry_id WHERE a.id = ANY($ids)`,
  },
  deaccession: { idType: 'uuid', sql: `SELECT d.id::text, p.accession_number, 'print', p.id::text FROM deaccessions d JOIN prints p ON p.id = d.print_id WHERE d.id = ANY($ids)` },
  treatment: {
    idType: 'uuid',
    sql: `SELECT x.id::text, ${onPrint(day('x.proposed_on'))}, 'treatment', x.id::text FROM treatments x JOIN prints p ON p.id = x.print_id WHERE x.id = ANY($ids)`,
  },
  condition_report: {
    idType: 'uuid',
    sql: `SELECT r.id::text, ${onPrint(day('r.examined_on'))}, 'condition_report', r.id::text FROM condition_reports r JOIN prints p ON p.id = r.print_id WHERE r.id = ANY($ids)`,
  },
  measurement_session: {
    idType: 'uuid',
    sql: `SELECT s.id::text, ${onPrint(day('s.measured_on'))}, 'print_measurements', p.id::text FROM measurement_sessions s JOIN prints p ON p.id = s.print_id WHERE s.id = ANY($ids)`,
  },
  measurement_spot: {
    idType: 'uuid',
    sql: `SELECT s.id::text, ${onPrint('s.name')}, 'print_measurements', p.id::text FROM measurement_spots s JOIN prints p ON p.id = s.print_id WHERE s.id = ANY($ids)`,
  },
  image: {
    idType: 'uuid',
    sql: `SELECT i.id::text, ${onPrint('i.file_name')}, 'print', p.id::text FROM images i JOIN prints p ON p.id = i.print_id WHERE i.id = ANY($ids)`,
  },
  display: {
    idType: 'uuid',
    sql: `SELECT d.id::text, ${onPrint('e.title')}, CASE WHEN e.id IS NULL THEN 'print' ELSE 'exhibition' END, coalesce(e.id, p.id)::text
          FROM display_periods d JOIN prints p ON p.id = d.print_id LEFT JOIN exhibitions e ON e.id = d.exhibition_id WHERE d.id = ANY($ids)`,
  },
  maker: { idType: 'uuid', sql: `SELECT m.id::text, m.name, NULL, NULL FROM makers m WHERE m.id = ANY($ids)` },
  paper: { idType: 'uuid', sql: `SELECT x.id::text, concat_ws(' ', x.manufacturer, x.product), NULL, NULL FROM papers x WHERE x.id = ANY($ids)` },
  recipe: { idType: 'uuid', sql: `SELECT r.id::text, r.name, 'recipe', r.id::text FROM bath_recipes r WHERE r.id = ANY($ids)` },
  enclosure: { idType: 'uuid', sql: `SELECT x.id::text, x.name, NULL, NULL FROM enclosure_types x WHERE x.id = ANY($ids)` },
  location: { idType: 'uuid', sql: `SELECT x.id::text, coalesce(x.path_label, x.name), 'location', x.id::text FROM locations x WHERE x.id = ANY($ids)` },
  condition_term: { idType: 'text', sql: `SELECT c.code, c.label, NULL, NULL FROM condition_terms c WHERE c.code = ANY($ids)` },
  inspection_round: { idType: 'uuid', sql: `SELECT r.id::text, r.title, 'inspection_round', r.id::text FROM inspection_rounds r WHERE r.id = ANY($ids)` },
  research_query: { idType: 'uuid', sql: `SELECT q.id::text, q.name, NULL, NULL FROM research_queries q WHERE q.id = ANY($ids)` },
  saved_search: { idType: 'uuid', sql: `SELECT s.id::text, s.name, NULL, NULL FROM saved_searches s WHERE s.id = ANY($ids)` },
  climate_file: {
    idType: 'uuid',
    sql: `SELECT f.id::text, f.file_name, CASE WHEN f.location_id IS NULL THEN NULL ELSE 'location' END, f.location_id::text FROM climate_files f WHERE f.id = ANY($ids)`,
  },
  bag: { idType: 'uuid', sql: `SELECT b.id::text, 'made ' || ${day('b.created_at')}, NULL, NULL FROM bag_jobs b WHERE b.id = ANY($ids)` },
};

interface Found { type: string; id: string; name: string | null; page: RecordPage | null; page_id: string | null }

type Snapshot = Record<string, unknown>;
const isObject = (v: unknown): v is Snapshot => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The name a snapshot holds, for a record no longer in its table (a print or an exhibition deleted). */
function snapshotName(before: unknown, after: unknown): string | null {
  for (const s of [after, before]) {
    if (!isObject(s)) continue;
    for (const k of ['accessionNumber', 'reference', 'entryNumber', 'title', 'name', 'label']) {
      const v = s[k];
      if (typeof v === 'string' && v.trim()) return v;
    }
  }
  return null;
}

export interface EventRef { entityType: string; entityId: string | null; before: unknown; after: unknown }

/** Each event's record, in the order given; one query in all. */
export async function auditRecords(events: EventRef[]): Promise<AuditRecord[]> {
  const idsByType = new Map<string, Set<string>>();
  for (const e of events) {
    const branch = BRANCHES[e.entityType];
    if (!branch || !e.entityId || (branch.idType === 'uuid' && !UUID.test(e.entityId))) continue;
    (idsByType.get(e.entityType) ?? idsByType.set(e.entityType, new Set()).get(e.entityType)!).add(e.entityId);
  }
  const parts: string[] = [];
  const bind: string[][] = [];
  for (const [type, ids] of idsByType) {
    const branch = BRANCHES[type]!;
    bind.push([...ids]);
    const param = `$${bind.length}::${branch.idType}[]`;
    parts.push(`SELECT '${type}' AS type, t.* FROM (${branch.sql.replace('$ids', param)}) AS t(id, name, page, page_id)`);
  }
  const found = new Map<string, Found>();
  if (parts.length) {
    const rows = await db().query<Found>(parts.join('\nUNION ALL\n'), { bind, type: QueryTypes.SELECT });
    for (const r of rows) found.set(`${r.type}\u0000${r.id}`, r);
  }
  return events.map((e) => {
    const kind = recordKindLabel(e.entityType);
    if (e.entityType === 'settings') return { kind, name: e.entityId ? (SETTINGS_SECTION_NAMES[e.entityId] ?? null) : null, link: null };
    const row = e.entityId ? found.get(`${e.entityType}\u0000${e.entityId}`) : undefined;
    if (row) return { kind, name: row.name ?? null, link: row.page && row.page_id ? { page: row.page, id: row.page_id } : null };
    return { kind, name: snapshotName(e.before, e.after), link: null };
  });
}
