import { Op, QueryTypes, type Transaction } from 'sequelize';
import type { z } from 'zod';
import { averageReadings, densityFromReflectance, type MeasurementConditions } from '@toneledger/common/domain/colour';
import { DEFAULT_NOTICEABLE_DELTA_E, NOTICEABLE_DELTA_E_GUIDANCE } from '@toneledger/common/domain/fading';
import { analyseSpotHistory, compareRankedSpots, latestDeltaE00, type SpotObservation } from '@toneledger/common/domain/spot-analysis';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import type {
  SessionInput, baselineChoiceSchema, leaderSchema, leadersQuerySchema, measurementSettingsSchema,
  spotInputSchema, spotUpdateSchema, PrintMeasurements,
} from '@toneledger/common/schemas/measurements';
import { db } from '../db';
import { Image, MeasurementSession, MeasurementSpot, Print, Setting, SpotReading, type StoredPoint } from '../models';
import { notFound, validationFailed } from '../errors';
import {
  presentAnalysis, presentProjection, presentSession, presentSpot, projectedDateOf, type SpotAnalysisResult,
} from '../presenters/measurement.presenter';
import { recordAudit } from './audit.service';
import { markScheduleStale } from './schedule-stale';
import { assertPrintEditable } from './print-lock';
import { changedFields, rethrowUnique, staleEdit } from './versioning';

/** Who is acting: every measurement write is attributed to a signed-in person. */
export interface Actor {
  id: string;
  name: string;
}

type SpotInput = z.infer<typeof spotInputSchema>;
type SpotUpdate = z.infer<typeof spotUpdateSchema>;
type BaselineChoice = z.infer<typeof baselineChoiceSchema>;
type MeasurementSettings = z.infer<typeof measurementSettingsSchema>;
type LeadersQuery = z.infer<typeof leadersQuerySchema>;
type Leader = z.infer<typeof leaderSchema>;

const SPOT = 'measurement_spot';
const SESSION = 'measurement_session';

// ── Settings: the ΔE00 taken as "a change someone would notice" ──

const SETTINGS_KEY = 'measurements';

export async function getMeasurementSettings(transaction?: Transaction): Promise<MeasurementSettings> {
  const row = await Setting.findByPk(SETTINGS_KEY, { transaction });
  return { noticeableDeltaE: DEFAULT_NOTICEABLE_DELTA_E, ...((row?.value as Partial<MeasurementSettings> | undefined) ?? {}) };
}

export async function putMeasurementSettings(next: MeasurementSettings, actor: Actor, requestId: string | null): Promise<MeasurementSettings> {
  return db().transaction(async (t) => {
    const before = await getMeasurementSettings(t);
    await Setting.upsert({ key: SETTINGS_KEY, value: next }, { transaction: t });
    await recordAudit({ actor, action: 'settings.updated', entityType: 'settings', entityId: SETTINGS_KEY, before, after: next, requestId }, t);
    // The noticeable-change threshold moves every measured print's projection, hence its inspection date.
    if (before.noticeableDeltaE !== next.noticeableDeltaE) await markScheduleStale(t, { measured: true });
    return next;
  });
}

// ── Spots ──

async function requirePrint(printId: string, t?: Transaction) {
  if ((await Print.count({ where: { id: printId }, transaction: t })) === 0) throw notFound('The print');
}

/** A spot's point is placed on a current image of the same print. */
async function pointIssues(printId: string, point: StoredPoint | null | undefined, t: Transaction): Promise<FieldIssue[]> {
  if (!point) return [];
  const image = await Image.findByPk(point.imageId, { attributes: ['id', 'printId', 'withdrawnAt'], transaction: t });
  const path = 'point.imageId';
  if (!image) return [{ path, message: 'No such image', code: 'not_found' }];
  if (image.printId !== printId) return [{ path, message: 'The image is of another print', code: 'other_print' }];
  if (image.withdrawnAt) return [{ path, message: 'The image has been withdrawn', code: 'withdrawn' }];
  return [];
}

const DUPLICATE_SPOT = 'This print already has a spot with this name.';

export async function createSpot(printId: string, input: SpotInput, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    await requirePrint(printId, t);
    await assertPrintEditable(printId, t);
    const issues = await pointIssues(printId, input.point, t);
    if (issues.length) throw validationFailed(issues);
    let spot: MeasurementSpot;
    try {
      spot = await MeasurementSpot.create(
        {
          printId, name: input.name, purpose: input.purpose, point: input.point ?? null, notes: input.notes ?? null,
          baselineSessionId: null, baselineChosenBy: null, baselineChosenByName: null, baselineChosenAt: null, baselineReason: null,
        },
        { transaction: t },
      );
    } catch (err) {
      rethrowUnique(err, 'name', DUPLICATE_SPOT);
    }
    const after = presentSpot(spot);
    await recordAudit({ actor, action: 'measurement_spot.created', entityType: SPOT, entityId: spot.id, after, requestId }, t);
    return after;
  });
}

async function lockSpot(id: string, version: number, t: Transaction): Promise<MeasurementSpot> {
  const spot = await MeasurementSpot.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
  if (!spot) throw notFound('The measurement spot');
  await assertPrintEditable(spot.printId, t);
  if (spot.version !== version) throw await staleEdit(SPOT, id, presentSpot(spot), t);
  return spot;
}

export async function updateSpot(id: string, update: SpotUpdate, actor: Actor, requestId: string | null) {
  const { version, ...changes } = update;
  return db().transaction(async (t) => {
    const spot = await lockSpot(id, version, t);
    const before = presentSpot(spot);
    const issues = changes.point !== undefined ? await pointIssues(spot.printId, changes.point, t) : [];
    if (issues.length) throw validationFailed(issues);
    const values: Partial<Pick<MeasurementSpot, 'name' | 'purpose' | 'point' | 'notes'>> = {};
    if (changes.name !== undefined) values.name = changes.name;
    if (changes.purpose !== undefined) values.purpose = changes.purpose;
    if (changes.point !== undefined) values.point = changes.point;
    if (changes.notes !== undefined) values.notes = changes.notes;
    try {
      await spot.update({ ...values, version: spot.version + 1 }, { transaction: t });
    } catch (err) {
      rethrowUnique(err, 'name', DUPLICATE_SPOT);
    }
    const after = presentSpot(spot);
    const { version: _b, ...b } = before;
    const { version: _a, ...a } = after;
    if (changedFields(b, a).length) {
      await recordAudit({ actor, action: 'measurement_spot.updated', entityType: SPOT, entityId: id, before, after, requestId }, t);
    }
    return after;
  });
}

/**
 * Chooses the session every later reading of this spot is compared with (say, the first session
 * after a treatment), or with `sessionId: null` returns to the default: the first session that
 * measured the spot. Who chose, when and why is kept on the spot and in the audit trail.
 */
export async function chooseBaseline(id: string, choice: BaselineChoice, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const spot = await lockSpot(id, choice.version, t);
    const before = presentSpot(spot);
    if (choice.sessionId) {
      const reading = await SpotReading.findOne({ where: { sessionId: choice.sessionId, spotId: id }, attributes: ['id'], transaction: t });
      if (!reading) throw validationFailed([{ path: 'sessionId', message: 'This session has no reading for this spot', code: 'no_reading' }]);
      if ((await voidedSessions([spot.printId], t)).has(choice.sessionId)) throw validationFailed([{ path: 'sessionId', message: 'This session was voided', code: 'voided' }]);
    }
    const chosen = choice.sessionId !== null;
    await spot.update(
      {
        baselineSessionId: choice.sessionId,
        baselineChosenBy: chosen ? actor.id : null,
        baselineChosenByName: chosen ? actor.name : null,
        baselineChosenAt: chosen ? new Date() : null,
        baselineReason: chosen ? choice.reason : null,
        version: spot.version + 1,
      },
      { transaction: t },
    );
    const after = presentSpot(spot);
    await markScheduleStale(t, { printIds: [spot.printId] });
    await recordAudit(
      {
        actor, action: chosen ? 'measurement_spot.baseline_chosen' : 'measurement_spot.baseline_reset', entityType: SPOT, entityId: id,
        before: { printId: spot.printId, baseline: before.baseline },
        after: { printId: spot.printId, baseline: after.baseline, reason: choice.reason },
        requestId,
      },
      t,
    );
    return after;
  });
}

// ── Sessions ──

/** A YYYY-MM-DD that names a real day. */
function isRealDate(s: string): boolean {
  const d = new Date(`${s}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
}

/** The latest date it is anywhere on Earth now (UTC+14), so a conservator far east of the server is never refused today. */
function latestToday(): string {
  return new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10);
}

async function printSpots(printId: string, t?: Transaction) {
  return MeasurementSpot.findAll({ where: { printId }, order: [['createdAt', 'ASC'], ['name', 'ASC']], transaction: t });
}

/**
 * Records a session and all its readings in one transaction: every reading or none.
 *
 * A session measured under other conditions than a spot's baseline session (another illuminant,
 * observer, geometry or M-condition) is stored all the same: the record is what the instrument
 * said on that day, and refusing it would lose it. Comparability is decided when the spot is
 * analysed, where such points come back with `comparable: false` and the reason, get no colour
 * difference, and are left out of the rate. If the baseline later changes, the same readings may
 * become comparable.
 */
export async function recordSession(printId: string, input: SessionInput, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    await requirePrint(printId, t);
    await assertPrintEditable(printId, t);
    const spots = await printSpots(printId, t);
    const ofPrint = new Set(spots.map((s) => s.id));
    const issues: FieldIssue[] = [];
    if (!isRealDate(input.measuredOn)) issues.push({ path: 'measuredOn', message: 'Not a real date', code: 'invalid_date' });
    else if (input.measuredOn > latestToday()) issues.push({ path: 'measuredOn', message: 'A measurement cannot be in the future', code: 'future' });
    const seen = new Map<string, number>();
    input.readings.forEach((r, i) => {
      const path = `readings.${i}.spotId`;
      if (!ofPrint.has(r.spotId)) issues.push({ path, message: 'Not a measurement spot of this print', code: 'not_found' });
      else if (seen.has(r.spotId)) issues.push({ path, message: `The same spot as readings.${seen.get(r.spotId)}: a spot is measured once per session (give several readings instead)`, code: 'duplicate' });
      else seen.set(r.spotId, i);
    });
    if (issues.length) throw validationFailed(issues);

    const session = await MeasurementSession.create(
      {
        printId, measuredOn: input.measuredOn, measuredBy: actor.id, measuredByName: actor.name, instrument: input.instrument,
        serial: input.serial ?? null, illuminant: input.illuminant, observer: input.observer, geometry: input.geometry,
        condition: input.condition ?? null, aperture: input.aperture ?? null, backing: input.backing ?? null, notes: input.notes ?? null,
      },
      { transaction: t },
    );
    const readings = await SpotReading.bulkCreate(
      input.readings.map((r) => {
        const summary = averageReadings(r.readings);
        const reflectance = r.reflectance ?? null;
        return {
          sessionId: session.id, spotId: r.spotId, printId, readings: r.readings.map(({ L, a, b }) => ({ L, a, b })),
          meanL: summary.mean.L, meanA: summary.mean.a, meanB: summary.mean.b, n: summary.n, sd: summary.sd,
          maxPairwiseDe: summary.maxPairwiseDeltaE00,
          // A density given by the instrument is kept as given; otherwise it is computed from the reflectance.
          density: r.density ?? (reflectance !== null ? densityFromReflectance(reflectance) : null),
          densityType: r.densityType ?? null,
          reflectance,
        };
      }),
      { transaction: t, returning: true },
    );
    const presented = presentSession(session, readings, spots);
    // The measured fading is an input of the inspection schedule.
    await markScheduleStale(t, { printIds: [printId] });
    await recordAudit({ actor, action: 'measurement_session.recorded', entityType: SESSION, entityId: session.id, after: presented, requestId }, t);
    return presented;
  });
}

// ── Analysis (the computation is common/src/domain/spot-analysis.ts) ──

interface History {
  session: MeasurementSession;
  reading: SpotReading;
}

/** A stored session and reading as the analysis reads them. */
function observationOf({ session, reading }: History): SpotObservation {
  return {
    sessionId: session.id, measuredOn: session.measuredOn, recordedAt: session.createdAt,
    conditions: {
      illuminant: session.illuminant, observer: session.observer as MeasurementConditions['observer'], geometry: session.geometry,
      condition: session.condition as MeasurementConditions['condition'],
    },
    lab: { L: reading.meanL, a: reading.meanA, b: reading.meanB },
    density: reading.density, densityType: reading.densityType, reflectance: reading.reflectance,
  };
}

/** One spot's change against its baseline, session by session, with rates and projection (see `analyseSpotHistory`). */
export function analyseSpot(spot: MeasurementSpot, history: History[], threshold: number): SpotAnalysisResult {
  return { spot, ...analyseSpotHistory(history.map(observationOf), { baselineSessionId: spot.baselineSessionId, threshold }) };
}

/** Voided sessions of these prints, by session id: kept and shown, never analysed (`void.service.ts`). */
export async function voidedSessions(printIds: readonly string[], t?: Transaction): Promise<Map<string, { at: string; by: string; reason: string }>> {
  if (!printIds.length) return new Map();
  const rows = await db().query<{ session_id: string; voided_at: Date; voided_by_name: string; reason: string }>(
    'SELECT session_id, voided_at, voided_by_name, reason FROM measurement_session_voids WHERE print_id = ANY($1::uuid[])',
    { bind: [[...printIds]], type: QueryTypes.SELECT, transaction: t },
  );
  return new Map(rows.map((r) => [r.session_id, { at: new Date(r.voided_at).toISOString(), by: r.voided_by_name, reason: r.reason }]));
}

function historiesBySpot(sessions: (MeasurementSession & { readings?: SpotReading[] })[], voided: ReadonlyMap<string, unknown>): Map<string, History[]> {
  const out = new Map<string, History[]>();
  for (const session of sessions) {
    if (voided.has(session.id)) continue;
    for (const reading of session.readings ?? []) {
      const list = out.get(reading.spotId) ?? [];
      list.push({ session, reading });
      out.set(reading.spotId, list);
    }
  }
  return out;
}

/** Every spot of a print with its analysis, the sessions newest first, and the threshold in use. */
export async function printMeasurements(printId: string): Promise<PrintMeasurements> {
  await requirePrint(printId);
  const [spots, sessions, settings] = await Promise.all([
    printSpots(printId),
    MeasurementSession.findAll({ where: { printId }, include: [{ model: SpotReading, as: 'readings' }] }) as Promise<(MeasurementSession & { readings?: SpotReading[] })[]>,
    getMeasurementSettings(),
  ]);
  const voided = await voidedSessions([printId]);
  const histories = historiesBySpot(sessions, voided);
  const newestFirst = [...sessions].sort((a, b) => b.measuredOn.localeCompare(a.measuredOn) || b.createdAt.getTime() - a.createdAt.getTime());
  return {
    threshold: settings.noticeableDeltaE,
    thresholdGuidance: NOTICEABLE_DELTA_E_GUIDANCE,
    spots: spots.map((s) => presentAnalysis(analyseSpot(s, histories.get(s.id) ?? [], settings.noticeableDeltaE))),
    sessions: newestFirst.map((s) => ({ ...presentSession(s, s.readings ?? [], spots), voided: voided.get(s.id) ?? null })),
  };
}

/** Every spot of a print with its change against its baseline (for the light-cost fit in light.service.ts). */
export async function printSpotChanges(printId: string, t?: Transaction) {
  // One after the other: inside a transaction they share its one connection, where overlapping queries are not allowed.
  const spots = await printSpots(printId, t);
  const sessions = (await MeasurementSession.findAll({ where: { printId }, include: [{ model: SpotReading, as: 'readings' }], transaction: t })) as (MeasurementSession & {
    readings?: SpotReading[];
  })[];
  const settings = await getMeasurementSettings(t);
  const histories = historiesBySpot(sessions, await voidedSessions([printId], t));
  return { threshold: settings.noticeableDeltaE, spots: spots.map((s) => analyseSpot(s, histories.get(s.id) ?? [], settings.noticeableDeltaE)) };
}

// ── CSV from an instrument: preview only (measurement-csv.service.ts) ──

export { MAX_CSV_BYTES, previewCsv } from './measurement-csv.service';

// ── Leaders: the spots changing fastest across the collection ──

/**
 * Upper bound of the in-memory pass. Ranking needs each spot's baseline rule, CIEDE2000 and a
 * regression, which live in common/ rather than SQL, so the spots of the filtered prints are
 * loaded with their readings and analysed here. A few hundred prints with four spots and a
 * dozen sessions each is about 10 000 readings, a few tens of milliseconds. Past this many
 * spots the request is refused with a hint to filter; a collection that size needs a stored
 * per-spot summary updated when a session is recorded.
 */
export const LEADERS_MAX_SPOTS = 20_000;

export async function listLeaders(query: LeadersQuery): Promise<{ rows: Leader[]; total: number }> {
  const printWhere: Record<string, unknown> = {};
  if (query.process) printWhere.process = query.process;
  if (query.tonerClass) printWhere.tonerClasses = { [Op.contains]: [query.tonerClass] };
  const spots = (await MeasurementSpot.findAll({
    include: [{ model: Print, as: 'print', where: printWhere, required: true, attributes: ['id', 'accessionNumber', 'accessionSort', 'title', 'process', 'tonerClasses'] }],
  })) as (MeasurementSpot & { print: Print })[];
  if (spots.length > LEADERS_MAX_SPOTS) {
    throw validationFailed(
      [{ path: '', message: `More than ${LEADERS_MAX_SPOTS} spots to rank; filter by process or toner class`, code: 'too_many' }],
      'Too many spots to rank at once.',
    );
  }
  const printIds = [...new Set(spots.map((s) => s.printId))];
  const [sessions, settings] = await Promise.all([
    printIds.length
      ? (MeasurementSession.findAll({ where: { printId: printIds }, include: [{ model: SpotReading, as: 'readings' }] }) as Promise<(MeasurementSession & { readings?: SpotReading[] })[]>)
      : Promise.resolve([]),
    getMeasurementSettings(),
  ]);
  const histories = historiesBySpot(sessions, await voidedSessions(printIds));

  const ranked = spots.flatMap((spot) => {
    const history = histories.get(spot.id) ?? [];
    if (!history.length) return [];
    const a = analyseSpot(spot, history, settings.noticeableDeltaE);
    const last = a.points.at(-1)!;
    const leader: Leader = {
      printId: spot.print.id, accessionNumber: spot.print.accessionNumber, title: spot.print.title, process: spot.print.process,
      tonerClasses: spot.print.tonerClasses, spotId: spot.id, spotName: spot.name,
      latestDeltaE00: latestDeltaE00(a),
      ratePerYear: a.rate?.ok ? a.rate.slopePerYear : null,
      rateCi95: a.rate?.ok ? a.rate.ci95 : null,
      sessions: history.length,
      projectedDate: projectedDateOf(presentProjection(a.projection)),
      lastMeasuredOn: last.measuredOn,
    };
    const rank = { ratePerYear: leader.ratePerYear, latestDeltaE00: leader.latestDeltaE00, accessionSort: spot.print.accessionSort, spotName: spot.name };
    return [{ leader, rank }];
  });

  const order = compareRankedSpots(query.sort);
  ranked.sort((x, y) => order(x.rank, y.rank));
  const start = (query.page - 1) * query.pageSize;
  return { rows: ranked.slice(start, start + query.pageSize).map((r) => r.leader), total: ranked.length };
}
