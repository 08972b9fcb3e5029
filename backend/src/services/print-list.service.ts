import { can, type Role } from '@toneledger/common/domain/roles';
import type { PrintListQuery, PrintListItem } from '@toneledger/common/schemas/catalogue';
import { db } from '../db';

/**
 * The catalogue list: one SQL statement for the page and one for the count, built here and run as
 * they are. The benchmark (scripts/bench.ts) and the CSV export run the same text.
 */

const SORT_SQL: Record<string, string> = {
  accessionNumber: 'p.accession_sort ASC',
  '-accessionNumber': 'p.accession_sort DESC',
  title: 'lower(p.title) ASC, p.accession_sort ASC',
  '-title': 'lower(p.title) DESC, p.accession_sort DESC',
  // Unknown makers and dates go last in both directions (each direction has its own index).
  maker: 'p.maker_name ASC NULLS LAST, p.accession_sort ASC',
  '-maker': 'p.maker_name DESC NULLS LAST, p.accession_sort DESC',
  dateMade: 'p.date_earliest ASC NULLS LAST, p.accession_sort ASC',
  '-dateMade': 'p.date_earliest DESC NULLS LAST, p.accession_sort DESC',
  status: 'p.status ASC, p.accession_sort ASC',
  '-status': 'p.status DESC, p.accession_sort DESC',
  updatedAt: 'p.updated_at ASC, p.id ASC',
  '-updatedAt': 'p.updated_at DESC, p.id DESC',
};

/** Words to a prefix tsquery: "iron blu" → iron & blu:* (only letters and digits survive). */
export function toPrefixQuery(q: string): string | null {
  const words = q.toLowerCase().match(/[\p{L}\p{N}]+/gu) ?? [];
  if (!words.length) return null;
  return words.map((w, i) => (i === words.length - 1 ? `${w}:*` : w)).join(' & ');
}

/** The statements of one list request, each with its own bind values. */
export interface ListSql {
  /** The WHERE clause of the filters (empty without filters); its parameters are `countParams`. */
  where: string;
  /** The page's rows. */
  select: string;
  /** Bind values of `select`: the filters' values, then the page size and offset at the positions `select` names. */
  params: unknown[];
  /** The number of matches, exact up to EXACT_COUNT_CAP + 1. */
  count: string;
  /** The planner's estimate of the number of matches (EXPLAIN, JSON). */
  estimate: string;
  /** Bind values of `count` and `estimate`: the filters' values alone. */
  countParams: unknown[];
}

/** Results up to this size are counted exactly; larger ones get the planner's estimate. */
export const EXACT_COUNT_CAP = 10_000;

/**
 * The collection's own prints: borrowed prints are few, so leaving them out through their partial
 * index (a hashed anti-join) keeps the sort indexes' index-only scans, which `NOT p.borrowed` would not.
 */
const COLLECTION_ONLY = 'p.id NOT IN (SELECT b.id FROM prints b WHERE b.borrowed)';

export function buildListSql(query: PrintListQuery, role: Role | null): ListSql {
  const params: unknown[] = [];
  /** Binds a value and answers the `$n` that names it in the text. */
  const p = (v: unknown) => {
    params.push(v);
    return `$${params.length}`;
  };
  const where: string[] = [];
  for (const [key, col] of [
    ['process', 'process'], ['support', 'support'], ['status', 'status'], ['lightResponsivity', 'light_responsivity'],
    ['makerId', 'maker_id'], ['paperId', 'paper_id'], ['enclosureId', 'enclosure_id'],
  ] as const) {
    const v = query[key];
    if (v) where.push(`p.${col} = ${p(v)}`);
  }
  if (query.tonerClass) where.push(`p.toner_classes @> ARRAY[${p(query.tonerClass)}]::text[]`);
  if (query.hasWarnings === 'true') where.push(`p.warning_codes <> '{}'`);
  if (query.hasWarnings === 'false') where.push(`p.warning_codes = '{}'`);
  if (query.madeFrom) where.push(`p.date_latest >= make_date(${p(query.madeFrom)}, 1, 1)`);
  if ((query.holding ?? 'collection') === 'collection') where.push(COLLECTION_ONLY);
  if (query.holding === 'borrowed') where.push('p.borrowed');
  if (query.madeTo) where.push(`p.date_earliest <= make_date(${p(query.madeTo)}, 12, 31)`);
  const restricted = can(role, 'catalogue.read_restricted');
  if (query.locationId && restricted) {
    where.push(`p.location_id IN (WITH RECURSIVE sub AS (SELECT id FROM locations WHERE id = ${p(query.locationId)} UNION ALL SELECT l.id FROM locations l JOIN sub ON l.parent_id = sub.id) SELECT id FROM sub)`);
  }
  if (query.q) {
    const tsq = toPrefixQuery(query.q);
    const prefix = `${query.q.trim().toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    const parts = [`lower(p.accession_number) LIKE ${p(prefix)}`];
    if (tsq) {
      const ref = p(tsq);
      parts.push(`p.search @@ to_tsquery('simple', ${ref})`);
      if (restricted) parts.push(`p.search_notes @@ to_tsquery('simple', ${ref})`);
    }
    where.push(`(${parts.join(' OR ')})`);
  }
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  // `count` and `estimate` use the filters alone; the page's size and offset are bound for `select`
  // only, and the text names them by the positions they were given.
  const countParams = [...params];
  const limit = p(query.pageSize);
  const offset = p((query.page - 1) * query.pageSize);

  const order = SORT_SQL[query.sort] ?? SORT_SQL.accessionNumber;
  // The page's ids first (an index-only walk to any depth), then only those rows are read and joined.
  const select = `SELECT p.id, p.accession_number, p.title, p.maker_name, p.date_made, p.date_display, p.process, p.support, p.status,
      p.toner_classes, p.paper_label, e.name AS enclosure_name, p.warning_codes, p.updated_at${restricted ? ', l.path_label AS location_label' : ''},
      (SELECT i.id FROM images i WHERE i.print_id = p.id AND i.view_type = 'recto' AND i.withdrawn_at IS NULL AND i.thumb_key IS NOT NULL
        ORDER BY i.captured_on DESC NULLS LAST, i.uploaded_at DESC LIMIT 1) AS thumb_image_id
    FROM (SELECT p.id FROM prints p ${whereSql} ORDER BY ${order} LIMIT ${limit} OFFSET ${offset}) page
    JOIN prints p ON p.id = page.id
    LEFT JOIN enclosure_types e ON e.id = p.enclosure_id
    ${restricted ? 'LEFT JOIN locations l ON l.id = p.location_id' : ''}
    ORDER BY ${order}`;
  // Counting is exact up to a cap; past it the planner's estimate is used (and said to be one).
  const count = `SELECT count(*)::int AS total FROM (SELECT 1 FROM prints p ${whereSql} LIMIT ${EXACT_COUNT_CAP + 1}) capped`;
  // The planner guesses half the rows for NOT IN; the plain column (same rows) gives it its statistics.
  const estimate = `EXPLAIN (FORMAT JSON) SELECT 1 FROM prints p ${whereSql.replace(COLLECTION_ONLY, 'NOT p.borrowed')}`;
  return { where: whereSql, select, params, count, estimate, countParams };
}

interface ListRow {
  id: string; accession_number: string; title: string; maker_name: string | null; date_made: string | null; date_display: string | null;
  process: string; support: string | null; status: string; toner_classes: string[]; paper_label: string | null; enclosure_name: string | null;
  warning_codes: string[]; updated_at: Date; location_label?: string | null; thumb_image_id?: string | null;
}

export function presentListRow(r: ListRow, restricted: boolean): PrintListItem {
  const item: PrintListItem = {
    id: r.id, accessionNumber: r.accession_number, title: r.title, makerName: r.maker_name, dateMade: r.date_made, dateDisplay: r.date_display,
    process: r.process as PrintListItem['process'], support: r.support as PrintListItem['support'], status: r.status as PrintListItem['status'],
    tonerClasses: r.toner_classes as PrintListItem['tonerClasses'], paperLabel: r.paper_label, enclosureName: r.enclosure_name,
    warningCodes: r.warning_codes, updatedAt: new Date(r.updated_at).toISOString(), thumbImageId: r.thumb_image_id ?? null,
  };
  if (restricted) item.locationLabel = r.location_label ?? null;
  return item;
}

/**
 * Runs one statement with pg's own query on a connection of Sequelize's pool (same type parsers,
 * same pool). Sequelize's handling of a raw SELECT's rows costs a few milliseconds on a page of 50
 * wide rows, more than the fixed cost of the whole request; the rows are the same plain objects.
 */
export async function pgRows<T>(text: string, values: unknown[]): Promise<T[]> {
  const manager = db().connectionManager as unknown as {
    getConnection(): Promise<{ query(text: string, values: unknown[]): Promise<{ rows: T[] }> }>;
    releaseConnection(connection: unknown): Promise<void>;
  };
  const connection = await manager.getConnection();
  try {
    return (await connection.query(text, values)).rows;
  } finally {
    await manager.releaseConnection(connection);
  }
}

export async function listPrints(query: PrintListQuery, role: Role | null) {
  const sql = buildListSql(query, role);
  const [rows, count] = await Promise.all([
    pgRows<ListRow>(sql.select, sql.params),
    pgRows<{ total: number }>(sql.count, sql.countParams),
  ]);
  const restricted = can(role, 'catalogue.read_restricted');
  let total = count[0].total;
  let estimated = false;
  if (total > EXACT_COUNT_CAP) {
    const [plan] = await pgRows<{ 'QUERY PLAN': [{ Plan: { 'Plan Rows': number } }] }>(sql.estimate, sql.countParams);
    total = Math.max(EXACT_COUNT_CAP + 1, Math.round(plan['QUERY PLAN'][0].Plan['Plan Rows']));
    estimated = true;
  }
  return { rows: rows.map((r) => presentListRow(r, restricted)), total, estimated };
}
