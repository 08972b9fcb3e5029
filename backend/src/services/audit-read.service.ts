import type { Writable } from 'node:stream';
import { Op, QueryTypes, type WhereOptions } from 'sequelize';
import type { AuditEvent, AuditExportQuery, AuditListQuery } from '@toneledger/common/schemas/audit';
import { actionLabel } from '@toneledger/common/fields/audit-words';
import { recordKindChoices } from '@toneledger/common/fields/audit-records';
import { db } from '../db';
import { AuditEventModel } from '../models';
import { validationFailed } from '../errors';
import { presentAuditEvent } from '../presenters/audit.presenter';
import { auditRecords } from './audit-records.service';
import { isoCell, streamCsv, type ExportColumn } from './exports/columns';

/**
 * Reading the audit trail: the filters of the audit screen (person, action, record, days), each event
 * presented as a sentence with readable changes, the pickers' choices, and the CSV export.
 */

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function nextDay(day: string): Date {
  const d = new Date(`${day}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d;
}

/** The filters as a where clause; days are UTC calendar days, both ends included. */
function whereOf(query: AuditExportQuery): WhereOptions<AuditEventModel> {
  if (query.from && query.to && query.from > query.to) {
    throw validationFailed([{ path: 'query.to', message: 'The last day comes on or after the first', code: 'date_order' }]);
  }
  const where: Record<string | symbol, unknown> = {};
  if (query.action) where.action = query.action;
  if (query.entityType) where.entityType = query.entityType;
  if (query.entityId) where.entityId = query.entityId;
  if (query.actorId) where.actorId = query.actorId;
  const at: Record<symbol, Date> = {};
  if (query.from) at[Op.gte] = new Date(`${query.from}T00:00:00Z`);
  if (query.to) at[Op.lt] = nextDay(query.to);
  if (query.from || query.to) where.at = at;
  return where as WhereOptions<AuditEventModel>;
}

/** The page of events presented, each with its record named and linked (one query for the page, audit-records.service.ts). */
async function present(events: AuditEventModel[]): Promise<AuditEvent[]> {
  const records = await auditRecords(events);
  return events.map((e, i) => {
    const record = records[i]!;
    // A print's sentence names it by accession number even when the snapshot holds only a place (a move).
    const printName = e.entityType === 'print' && record.name ? `print ${record.name}` : null;
    return presentAuditEvent(e, printName, record);
  });
}

export async function listAudit(query: AuditListQuery) {
  const { rows, count } = await AuditEventModel.findAndCountAll({
    where: whereOf(query),
    order: [['at', 'DESC'], ['id', 'DESC']],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  return { rows: await present(rows), total: count };
}

/**
 * What the pickers offer: every person (people are never deleted, so every actor is among them) and
 * every action recorded so far, found one action at a time along the (action, at) index.
 */
export async function auditChoices() {
  const people = await db().query<{ id: string; name: string }>('SELECT id::text AS id, name FROM users ORDER BY lower(name), id', { type: QueryTypes.SELECT });
  const actions = await db().query<{ action: string }>(
    `WITH RECURSIVE a AS (
       (SELECT action FROM audit_events ORDER BY action LIMIT 1)
       UNION ALL
       SELECT (SELECT e.action FROM audit_events e WHERE e.action > a.action ORDER BY e.action LIMIT 1) FROM a WHERE a.action IS NOT NULL
     ) SELECT action FROM a WHERE action IS NOT NULL`,
    { type: QueryTypes.SELECT },
  );
  return {
    people,
    actions: actions.map((a) => ({ code: a.action, label: actionLabel(a.action) })).sort((x, y) => x.label.localeCompare(y.label)),
    recordKinds: recordKindChoices(),
  };
}

// ── CSV export: one row per changed field (one row for an event without changes), newest first ──

interface AuditRow { event: AuditEvent; change: AuditEvent['changes'][number] | null }

const A = 'Audit event';
export const AUDIT_COLUMNS: ExportColumn<AuditRow>[] = [
  { name: 'at', meaning: 'When it happened (ISO 8601, UTC).', type: 'date-time', source: `${A}: at`, cell: (r) => isoCell(r.event.at) },
  { name: 'person', meaning: 'Who did it; empty for the system.', type: 'text', source: `${A}: actor name (kept as it was at the time)`, cell: (r) => r.event.actorName },
  { name: 'action', meaning: 'What was done, in a few words.', type: 'text', source: `${A}: action, as its label`, cell: (r) => r.event.actionLabel },
  { name: 'sentence', meaning: 'The event as a sentence.', type: 'text', source: 'Computed from the action, the person and the record', cell: (r) => r.event.sentence },
  { name: 'record_type', meaning: 'The kind of record changed (Print, Loan, Person…).', type: 'text', source: `${A}: record type, as its label (common/src/fields/audit-records.ts)`, cell: (r) => r.event.record.kind },
  { name: 'record', meaning: "The record by its name (a print's accession number, a person's name, a loan's reference…); empty when it has none.", type: 'text', source: 'The record as it is now, or its snapshot when it was deleted', cell: (r) => r.event.record.name },
  { name: 'record_id', meaning: "The changed record's id.", type: 'id', source: `${A}: record id`, cell: (r) => r.event.entityId },
  { name: 'field', meaning: 'The field that changed, by its label; empty for an event without field changes.', type: 'text', source: 'Field tables (common/src/fields), otherwise the key in words', cell: (r) => r.change?.label ?? null },
  { name: 'before', meaning: 'Its value before, as the screens show it.', type: 'text', source: `${A}: before`, cell: (r) => r.change?.before ?? null },
  { name: 'after', meaning: 'Its value after, as the screens show it.', type: 'text', source: `${A}: after`, cell: (r) => r.change?.after ?? null },
  { name: 'request_id', meaning: 'The request that made the change (matches the server log).', type: 'text', source: `${A}: request id`, cell: (r) => r.event.requestId },
];

const AUDIT_CHUNK = 1000;

/** The filtered trail, newest first, read a chunk at a time by (at, id) so memory stays flat. */
async function* auditChunks(query: AuditExportQuery): AsyncGenerator<AuditRow[]> {
  const where = whereOf(query);
  let after: { at: Date; id: string } | null = null;
  for (;;) {
    const page: AuditEventModel[] = await AuditEventModel.findAll({
      where: after
        ? { [Op.and]: [where, { [Op.or]: [{ at: { [Op.lt]: after.at } }, { at: after.at, id: { [Op.lt]: after.id } }] }] }
        : where,
      order: [['at', 'DESC'], ['id', 'DESC']],
      limit: AUDIT_CHUNK,
    });
    if (!page.length) return;
    const events = await present(page);
    yield events.flatMap((event): AuditRow[] => (event.changes.length ? event.changes.map((change) => ({ event, change })) : [{ event, change: null }]));
    if (page.length < AUDIT_CHUNK) return;
    const last = page.at(-1)!;
    after = { at: last.at, id: String(last.id) };
  }
}

/** Checks the filters before the file starts (a bad range is a 400, not a cut-off file). */
export function checkAuditQuery(query: AuditExportQuery): void {
  whereOf(query);
}

export function writeAuditCsv(query: AuditExportQuery, out: Writable): Promise<number> {
  return streamCsv(out, AUDIT_COLUMNS, auditChunks(query));
}
