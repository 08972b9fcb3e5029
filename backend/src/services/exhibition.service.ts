import { QueryTypes, Transaction } from 'sequelize';
import type { z } from 'zod';
import type {
  Exhibition as ExhibitionDto, ExhibitionDetail, approvalInputSchema, exhibitionInputSchema, exhibitionListQuerySchema, exhibitionObjectInputSchema,
  exhibitionUpdateSchema,
} from '@toneledger/common/schemas/exhibitions';
import { Exhibition, ExhibitionObject, ExhibitionVenue } from '../models';
import { db } from '../db';
import { conflict, notFound, validationFailed } from '../errors';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import { presentExhibition } from '../presenters/exhibition.presenter';
import { recordAudit } from './audit.service';
import { assertPrintEditable, assertPrintsEditable } from './print-lock';
import { todayIso } from './display-rows';
import { exhibitionDetail } from './exhibition-detail.service';
import { refreshLightWarnings } from './light.service';
import type { Actor } from './print.service';
import { staleEdit } from './versioning';

type ExhibitionInput = z.infer<typeof exhibitionInputSchema>;
type ExhibitionUpdate = z.infer<typeof exhibitionUpdateSchema>;
type ListQuery = z.infer<typeof exhibitionListQuerySchema>;
type ObjectsInput = z.infer<typeof exhibitionObjectInputSchema>;
type ApprovalInput = z.infer<typeof approvalInputSchema>;

const ENTITY = 'exhibition';

export { exhibitionDetail, exhibitionChecklistCsv } from './exhibition-detail.service';

// ── The list ──

export async function listExhibitions(query: ListQuery): Promise<{ rows: ExhibitionDto[]; total: number }> {
  const bind: unknown[] = [];
  const where: string[] = [];
  if (query.q) {
    bind.push(`%${query.q.replace(/[\\%_]/g, (x) => `\\${x}`)}%`);
    where.push(`(e.title ILIKE $${bind.length} OR e.organiser ILIKE $${bind.length} OR EXISTS (SELECT 1 FROM exhibition_venues v WHERE v.exhibition_id = e.id AND (v.name ILIKE $${bind.length} OR v.place ILIKE $${bind.length})))`);
  }
  if (query.when) {
    bind.push(todayIso());
    const today = `$${bind.length}::date`;
    where.push({ current: `s.opens <= ${today} AND s.closes >= ${today}`, coming: `s.opens > ${today}`, past: `s.closes < ${today}` }[query.when]);
  }
  const from = `FROM exhibitions e JOIN LATERAL (SELECT min(opens_on) AS opens, max(closes_on) AS closes FROM exhibition_venues v WHERE v.exhibition_id = e.id) s ON true
    ${where.length ? `WHERE ${where.join(' AND ')}` : ''}`;
  // One snapshot for the count, the page and its venues: an exhibition deleted by someone else between
  // two of these reads would otherwise come back without its venues (and without dates).
  return db().transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ }, async (t) => {
  const [{ n }] = await db().query<{ n: number }>(`SELECT count(*)::int AS n ${from}`, { bind, type: QueryTypes.SELECT, transaction: t });
  bind.push(query.pageSize, (query.page - 1) * query.pageSize);
  const ids = (await db().query<{ id: string }>(
    `SELECT e.id ${from} ORDER BY s.opens DESC NULLS LAST, e.title, e.id LIMIT $${bind.length - 1} OFFSET $${bind.length}`,
    { bind, type: QueryTypes.SELECT, transaction: t },
  )).map((r) => r.id);
  if (!ids.length) return { rows: [], total: n };
  const exhibitions = await Exhibition.findAll({ where: { id: ids }, transaction: t });
  const venues = await ExhibitionVenue.findAll({ where: { exhibitionId: ids }, transaction: t });
  const counts = await db().query<{ id: string; n: number }>(
    `SELECT exhibition_id AS id, count(*)::int AS n FROM exhibition_objects WHERE exhibition_id = ANY ($1::uuid[]) GROUP BY exhibition_id`,
    { bind: [ids], type: QueryTypes.SELECT, transaction: t },
  );
  const byId = new Map(exhibitions.map((e) => [e.id, e]));
  const count = new Map(counts.map((c) => [c.id, c.n]));
  return { rows: ids.map((id) => presentExhibition(byId.get(id)!, venues.filter((v) => v.exhibitionId === id), count.get(id) ?? 0)), total: n };
  });
}

// ── Create, edit, delete ──

async function lockExhibition(id: string, version: number | null, t: Transaction): Promise<Exhibition> {
  const e = await Exhibition.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
  if (!e) throw notFound('The exhibition');
  if (version !== null && e.version !== version) throw await staleEdit(ENTITY, id, await exhibitionDetail(id, t), t);
  return e;
}

/** A print's display periods must lie within the dates of the venue they name. */
async function displaysOutsideVenues(id: string, t: Transaction): Promise<{ accession_number: string; name: string }[]> {
  return db().query(
    `SELECT p.accession_number, v.name FROM display_periods d JOIN exhibition_venues v ON v.id = d.venue_id JOIN prints p ON p.id = d.print_id
      WHERE d.exhibition_id = $1 AND (d.starts_on < v.opens_on OR d.ends_on > v.closes_on) ORDER BY p.accession_sort`,
    { bind: [id], transaction: t, type: QueryTypes.SELECT },
  );
}

async function writeVenues(id: string, venues: ExhibitionInput['venues'], t: Transaction): Promise<void> {
  const existing = await ExhibitionVenue.findAll({ where: { exhibitionId: id }, transaction: t });
  const known = new Set(existing.map((v) => v.id));
  const issues: FieldIssue[] = venues.flatMap((v, i) =>
    v.id && !known.has(v.id) ? [{ path: `venues.${i}.id`, message: 'This venue is not one of this exhibition’s', code: 'not_found' }] : []);
  if (issues.length) throw validationFailed(issues);
  const kept = new Set(venues.map((v) => v.id).filter(Boolean));
  const gone = existing.filter((v) => !kept.has(v.id));
  if (gone.length) {
    const used = await db().query<{ name: string }>(
      `SELECT DISTINCT v.name FROM display_periods d JOIN exhibition_venues v ON v.id = d.venue_id WHERE d.venue_id = ANY ($1::uuid[])`,
      { bind: [gone.map((v) => v.id)], transaction: t, type: QueryTypes.SELECT },
    );
    if (used.length) throw conflict(`Display periods are planned at ${used.map((u) => u.name).join(', ')}; move or delete them before removing the venue.`);
    await ExhibitionVenue.destroy({ where: { id: gone.map((v) => v.id) }, transaction: t });
  }
  for (const [position, v] of venues.entries()) {
    const values = { name: v.name, place: v.place ?? null, opensOn: v.opensOn, closesOn: v.closesOn, position };
    if (v.id) await ExhibitionVenue.update(values, { where: { id: v.id }, transaction: t });
    else await ExhibitionVenue.create({ ...values, exhibitionId: id }, { transaction: t });
  }
  const outside = await displaysOutsideVenues(id, t);
  if (outside.length) {
    throw conflict(`The new dates leave display periods outside their venue's dates (${outside.map((o) => `${o.accession_number} at ${o.name}`).join(', ')}); change those periods first.`);
  }
}

function snapshot(d: ExhibitionDetail) {
  return { title: d.title, organiser: d.organiser, summary: d.summary, venues: d.venues };
}

export async function createExhibition(input: ExhibitionInput, actor: Actor, requestId: string | null): Promise<ExhibitionDetail> {
  return db().transaction(async (t) => {
    const e = await Exhibition.create({ title: input.title, organiser: input.organiser ?? null, summary: input.summary ?? null }, { transaction: t });
    await writeVenues(e.id, input.venues.map(({ id: _id, ...v }) => v), t);
    const after = await exhibitionDetail(e.id, t);
    await recordAudit({ actor, action: 'exhibition.created', entityType: ENTITY, entityId: e.id, after: snapshot(after), requestId }, t);
    return after;
  });
}

export async function updateExhibition(id: string, update: ExhibitionUpdate, actor: Actor, requestId: string | null): Promise<ExhibitionDetail> {
  return db().transaction(async (t) => {
    const e = await lockExhibition(id, update.version, t);
    const before = snapshot(await exhibitionDetail(id, t));
    if (update.venues) await writeVenues(id, update.venues, t);
    await e.update({
      ...(update.title !== undefined ? { title: update.title } : {}),
      ...(update.organiser !== undefined ? { organiser: update.organiser } : {}),
      ...(update.summary !== undefined ? { summary: update.summary } : {}),
      version: e.version + 1,
    }, { transaction: t });
    const after = await exhibitionDetail(id, t);
    await recordAudit({ actor, action: 'exhibition.updated', entityType: ENTITY, entityId: id, before, after: snapshot(after), requestId }, t);
    return after;
  });
}

export async function deleteExhibition(id: string, version: number, actor: Actor, requestId: string | null): Promise<void> {
  await db().transaction(async (t) => {
    await lockExhibition(id, version, t);
    const [{ n }] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM display_periods WHERE exhibition_id = $1`, {
      bind: [id], transaction: t, type: QueryTypes.SELECT,
    });
    if (n > 0) throw conflict(`The exhibition has ${n} display period${n === 1 ? '' : 's'}; delete them first (they count in the prints' light dose).`);
    const [{ loans }] = await db().query<{ loans: number }>(
      `SELECT CASE WHEN to_regclass('loans') IS NULL THEN 0 ELSE (SELECT count(*)::int FROM loans WHERE exhibition_id = $1) END AS loans`,
      { bind: [id], transaction: t, type: QueryTypes.SELECT },
    );
    if (loans > 0) throw conflict('A loan is recorded for this exhibition; change the loan first.');
    const before = snapshot(await exhibitionDetail(id, t));
    await Exhibition.destroy({ where: { id }, transaction: t });
    await recordAudit({ actor, action: 'exhibition.deleted', entityType: ENTITY, entityId: id, before, requestId }, t);
  });
}

// ── The object list and approval ──

export async function addObjects(id: string, input: ObjectsInput, actor: Actor, requestId: string | null): Promise<ExhibitionDetail> {
  return db().transaction(async (t) => {
    const e = await lockExhibition(id, input.version, t);
    const found = new Set((await db().query<{ id: string }>(`SELECT id FROM prints WHERE id = ANY ($1::uuid[])`, {
      bind: [input.printIds], transaction: t, type: QueryTypes.SELECT,
    })).map((r) => r.id));
    const issues: FieldIssue[] = input.printIds.flatMap((p, i) => (found.has(p) ? [] : [{ path: `printIds.${i}`, message: 'No such print', code: 'not_found' }]));
    if (issues.length) throw validationFailed(issues);
    await assertPrintsEditable(input.printIds, t);
    const added = (await db().query<{ print_id: string }>(
      `INSERT INTO exhibition_objects (exhibition_id, print_id) SELECT $1, unnest($2::uuid[]) ON CONFLICT DO NOTHING RETURNING print_id`,
      { bind: [id, [...new Set(input.printIds)]], transaction: t, type: QueryTypes.SELECT },
    )).map((r) => r.print_id);
    await e.update({ version: e.version + 1 }, { transaction: t });
    await recordAudit({ actor, action: 'exhibition.objects_added', entityType: ENTITY, entityId: id, after: { printIds: added }, requestId }, t);
    return exhibitionDetail(id, t);
  });
}

export async function removeObject(id: string, printId: string, version: number, actor: Actor, requestId: string | null): Promise<ExhibitionDetail> {
  return db().transaction(async (t) => {
    const e = await lockExhibition(id, version, t);
    const o = await ExhibitionObject.findOne({ where: { exhibitionId: id, printId }, transaction: t });
    if (!o) throw notFound('The print on this object list');
    await assertPrintEditable(printId, t);
    const displays = await db().query(`SELECT id, to_char(starts_on, 'YYYY-MM-DD') AS starts_on, to_char(ends_on, 'YYYY-MM-DD') AS ends_on, lux::float8 AS lux
      FROM display_periods WHERE exhibition_id = $1 AND print_id = $2`, { bind: [id, printId], transaction: t, type: QueryTypes.SELECT });
    await ExhibitionObject.destroy({ where: { exhibitionId: id, printId }, transaction: t });
    await e.update({ version: e.version + 1 }, { transaction: t });
    await refreshLightWarnings(t, [printId]);
    await recordAudit({
      actor, action: 'exhibition.object_removed', entityType: ENTITY, entityId: id, before: { printId, approval: o.approval, displays }, requestId,
    }, t);
    return exhibitionDetail(id, t);
  });
}

/**
 * A conservator approves a print for display, or refuses it with a reason. A refused print keeps
 * no display periods: refusing one that has some is a 409 (delete them first).
 */
export async function decideObject(id: string, printId: string, input: ApprovalInput, actor: Actor, requestId: string | null): Promise<ExhibitionDetail> {
  return db().transaction(async (t) => {
    await lockExhibition(id, null, t);
    const o = await ExhibitionObject.findOne({ where: { exhibitionId: id, printId }, transaction: t, lock: t.LOCK.UPDATE });
    if (!o) throw notFound('The print on this object list');
    await assertPrintEditable(printId, t);
    if (input.decision === 'refused') {
      const [{ n }] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM display_periods WHERE exhibition_id = $1 AND print_id = $2`, {
        bind: [id, printId], transaction: t, type: QueryTypes.SELECT,
      });
      if (n > 0) throw conflict(`The print has ${n} display period${n === 1 ? '' : 's'} in this exhibition; delete them before refusing it.`);
    }
    const before = { approval: o.approval, reason: o.reason };
    const reason = input.reason ?? null;
    await o.update({ approval: input.decision, reason, approvedBy: actor.id, approvedAt: new Date() }, { transaction: t });
    await recordAudit({
      actor, action: input.decision === 'approved' ? 'exhibition.object_approved' : 'exhibition.object_refused', entityType: ENTITY, entityId: id,
      before: { printId, ...before }, after: { printId, approval: input.decision, reason }, requestId,
    }, t);
    return exhibitionDetail(id, t);
  });
}
