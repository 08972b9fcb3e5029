import { Op, QueryTypes, type ModelStatic, type Transaction, type Model } from 'sequelize';
import { db } from '../db';
import { BathRecipe, EnclosureType, Location, Maker, Paper, Print } from '../models';
import { conflict, notFound, validationFailed } from '../errors';
import { recordAudit, type AuditActor } from './audit.service';
import { changedFields, rethrowUnique, staleEdit } from './versioning';
import { deriveDate, } from './print-derive';
import { recomputeWarningsFor } from './print.service';
import { markScheduleStale } from './schedule-stale';
import { paperLabel, presentEnclosure, presentLocation, presentMaker, presentPaper, presentRecipe } from '../presenters/catalogue.presenter';

/**
 * Makers, papers, bath recipes, locations and enclosure types: the records prints point to.
 * One generic flow (list, create, read, versioned update, audit) with per-kind rules in hooks.
 */
interface Versioned extends Model {
  id: string;
  version: number;
}

export interface ReferenceKind<M extends Versioned, Dto> {
  entityType: string;
  noun: string;
  model: ModelStatic<M>;
  /** SQL giving each record's usage count, with `$ids` bound to the ids on the page. */
  countSql: string;
  searchColumns: string[];
  order: [string, string][];
  present(m: M, count: number): Dto;
  uniqueField: string;
  uniqueMessage: string;
  /** Derived columns and checks before a write. */
  prepare?(values: Record<string, unknown>, existing: M | null, t: Transaction): Promise<Record<string, unknown>>;
  /** Follow-up writes after an update (denormalised names, warnings, paths). */
  afterUpdate?(row: M, before: M, t: Transaction): Promise<void>;
}

async function counts(kind: ReferenceKind<Versioned, unknown>, ids: string[], t?: Transaction): Promise<Map<string, number>> {
  if (!ids.length) return new Map();
  const rows = await db().query<{ id: string; n: number }>(kind.countSql, { bind: [ids], type: QueryTypes.SELECT, transaction: t });
  return new Map(rows.map((r) => [r.id, Number(r.n)]));
}

export async function listReference<M extends Versioned, Dto>(kind: ReferenceKind<M, Dto>, query: { q?: string; page: number; pageSize: number }) {
  const where = query.q
    ? { [Op.or]: kind.searchColumns.map((c) => ({ [c]: { [Op.iLike]: `%${query.q!.replace(/[\\%_]/g, (x) => `\\${x}`)}%` } })) }
    : {};
  const { rows, count } = await kind.model.findAndCountAll({
    where: where as never,
    order: kind.order as never,
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  const n = await counts(kind as never, rows.map((r) => r.id));
  return { rows: rows.map((r) => kind.present(r, n.get(r.id) ?? 0)), total: count };
}

export async function getReference<M extends Versioned, Dto>(kind: ReferenceKind<M, Dto>, id: string) {
  const row = await kind.model.findByPk(id);
  if (!row) throw notFound(`The ${kind.noun}`);
  const n = await counts(kind as never, [id]);
  return kind.present(row, n.get(id) ?? 0);
}

function plain(m: Model): Record<string, unknown> {
  const { createdAt: _c, updatedAt: _u, ...rest } = m.get({ plain: true }) as Record<string, unknown>;
  return rest;
}

export async function createReference<M extends Versioned, Dto>(kind: ReferenceKind<M, Dto>, input: Record<string, unknown>, actor: AuditActor, requestId: string | null) {
  return db().transaction(async (t) => {
    const values = { ...input, ...(await kind.prepare?.(input, null, t)) };
    let row: M;
    try {
      row = await kind.model.create(values as never, { transaction: t });
    } catch (err) {
      rethrowUnique(err, kind.uniqueField, kind.uniqueMessage);
    }
    await recordAudit({ actor, action: `${kind.entityType}.created`, entityType: kind.entityType, entityId: row.id, after: plain(row), requestId }, t);
    return kind.present(row, 0);
  });
}

export async function updateReference<M extends Versioned, Dto>(
  kind: ReferenceKind<M, Dto>, id: string, input: Record<string, unknown> & { version: number }, actor: AuditActor, requestId: string | null,
) {
  return db().transaction(async (t) => {
    const before = await kind.model.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
    if (!before) throw notFound(`The ${kind.noun}`);
    const n = await counts(kind as never, [id], t);
    if (before.version !== input.version) throw await staleEdit(kind.entityType, id, kind.present(before, n.get(id) ?? 0), t);
    const { version: _v, ...changes } = input;
    const snapshotBefore = plain(before);
    const values = { ...changes, ...(await kind.prepare?.(changes, before, t)), version: before.version + 1 };
    const beforeCopy = kind.model.build(before.get({ plain: true }) as never, { isNewRecord: false });
    try {
      await before.update(values as never, { transaction: t });
    } catch (err) {
      rethrowUnique(err, kind.uniqueField, kind.uniqueMessage);
    }
    await kind.afterUpdate?.(before, beforeCopy, t);
    const after = plain(before);
    if (changedFields(snapshotBefore, after).filter((c) => c.field !== 'version').length) {
      await recordAudit({ actor, action: `${kind.entityType}.updated`, entityType: kind.entityType, entityId: id, before: snapshotBefore, after, requestId }, t);
    }
    return kind.present(before, n.get(id) ?? 0);
  });
}

// ── The five kinds ───────────────────────────────────────────────────────────

export const makers: ReferenceKind<Maker, ReturnType<typeof presentMaker>> = {
  entityType: 'maker', noun: 'maker', model: Maker,
  countSql: 'SELECT maker_id AS id, count(*) AS n FROM prints WHERE maker_id = ANY($1) GROUP BY maker_id',
  searchColumns: ['name'], order: [['name', 'ASC']], present: presentMaker,
  uniqueField: 'name', uniqueMessage: 'A maker with this name exists already.',
  async afterUpdate(row, before, t) {
    if (row.name !== before.name) await Print.update({ makerName: row.name }, { where: { makerId: row.id }, transaction: t, silent: true });
  },
};

export const papers: ReferenceKind<Paper, ReturnType<typeof presentPaper>> = {
  entityType: 'paper', noun: 'paper', model: Paper,
  countSql: 'SELECT paper_id AS id, count(*) AS n FROM prints WHERE paper_id = ANY($1) GROUP BY paper_id',
  searchColumns: ['manufacturer', 'product', 'surface'], order: [['manufacturer', 'ASC'], ['product', 'ASC']], present: presentPaper,
  uniqueField: 'product', uniqueMessage: 'This paper (manufacturer, product and surface) is recorded already.',
  async prepare(values) {
    if (values.madeDates === undefined) return {};
    const d = deriveDate(values.madeDates as string | null, 'madeDates');
    return { madeDates: d.dateMade, madeEarliest: d.dateEarliest, madeLatest: d.dateLatest };
  },
  async afterUpdate(row, before, t) {
    if (paperLabel(row) !== paperLabel(before)) await Print.update({ paperLabel: paperLabel(row) }, { where: { paperId: row.id }, transaction: t, silent: true });
  },
};

export const recipes: ReferenceKind<BathRecipe, ReturnType<typeof presentRecipe>> = {
  entityType: 'recipe', noun: 'recipe', model: BathRecipe,
  countSql: 'SELECT recipe_id AS id, count(*) AS n FROM process_steps WHERE recipe_id = ANY($1) GROUP BY recipe_id',
  searchColumns: ['name'], order: [['name', 'ASC']], present: presentRecipe,
  uniqueField: 'name', uniqueMessage: 'A recipe with this name exists already.',
};

export const enclosures: ReferenceKind<EnclosureType, ReturnType<typeof presentEnclosure>> = {
  entityType: 'enclosure', noun: 'enclosure type', model: EnclosureType,
  countSql: 'SELECT enclosure_id AS id, count(*) AS n FROM prints WHERE enclosure_id = ANY($1) GROUP BY enclosure_id',
  searchColumns: ['name', 'material'], order: [['name', 'ASC']], present: presentEnclosure,
  uniqueField: 'name', uniqueMessage: 'An enclosure type with this name exists already.',
  async afterUpdate(row, before, t) {
    if (row.alkalineBuffered !== before.alkalineBuffered || row.patResult !== before.patResult || row.name !== before.name) {
      await recomputeWarningsFor('enclosure_id', row.id, t);
      await markScheduleStale(t, { enclosureId: row.id });
    }
  },
};

async function pathOf(parentId: string | null, name: string, t: Transaction): Promise<string> {
  if (!parentId) return name;
  const parent = await Location.findByPk(parentId, { transaction: t });
  if (!parent) throw validationFailed([{ path: 'parentId', message: 'No such parent place', code: 'not_found' }]);
  return `${parent.pathLabel} › ${name}`;
}

export const locations: ReferenceKind<Location, ReturnType<typeof presentLocation>> = {
  entityType: 'location', noun: 'location', model: Location,
  // Counts add up: a place's count is its own prints and those of every place inside it (drawers into cabinets, rooms, buildings).
  // Each place's own count is carried up its chain of parents, so the walk is one row per place that holds prints, not per print.
  countSql: `WITH RECURSIVE own AS (SELECT location_id AS id, count(*) AS n FROM prints WHERE location_id IS NOT NULL GROUP BY location_id),
    up AS (SELECT id, n FROM own UNION ALL SELECT l.parent_id, up.n FROM up JOIN locations l ON l.id = up.id WHERE l.parent_id IS NOT NULL)
    SELECT id, sum(n)::int AS n FROM up WHERE id = ANY($1) GROUP BY id`,
  searchColumns: ['path_label', 'code'], order: [['pathLabel', 'ASC']], present: presentLocation,
  uniqueField: 'name', uniqueMessage: 'A place with this name exists already at that level.',
  async prepare(values, existing, t) {
    const name = (values.name as string | undefined) ?? existing?.name ?? '';
    if (name.includes('›')) throw validationFailed([{ path: 'name', message: 'A place name cannot contain ›', code: 'custom' }]);
    const parentId = values.parentId !== undefined ? (values.parentId as string | null) : existing?.parentId ?? null;
    if (existing && parentId) {
      // A place cannot move inside itself.
      const inside = await db().query<{ id: string }>(
        'WITH RECURSIVE sub AS (SELECT id FROM locations WHERE id = $1 UNION ALL SELECT l.id FROM locations l JOIN sub ON l.parent_id = sub.id) SELECT id FROM sub WHERE id = $2',
        { bind: [existing.id, parentId], type: QueryTypes.SELECT, transaction: t },
      );
      if (inside.length) throw conflict('A place cannot be moved inside itself.', [{ path: 'parentId', message: 'A place cannot be moved inside itself.', code: 'cycle' }]);
    }
    return { pathLabel: await pathOf(parentId, name, t) };
  },
  async afterUpdate(row, before, t) {
    if (row.pathLabel === before.pathLabel) return;
    // Rewrite the path of every place below, in one statement.
    await db().query(
      `WITH RECURSIVE sub AS (
         SELECT id, path_label FROM locations WHERE id = $1
         UNION ALL SELECT l.id, sub.path_label || ' › ' || l.name FROM locations l JOIN sub ON l.parent_id = sub.id)
       UPDATE locations SET path_label = sub.path_label FROM sub WHERE locations.id = sub.id AND locations.id <> $1`,
      { bind: [row.id], transaction: t },
    );
  },
};
