import { parse } from 'csv-parse/sync';
import { Op, type Transaction } from 'sequelize';
import type { z } from 'zod';
import {
  averageReadings, classifyChange, comparable, densityChange, densityFromReflectance, type Lab, type MeasurementConditions,
} from '@toneledger/common/domain/colour';
import { DEFAULT_NOTICEABLE_DELTA_E, NOTICEABLE_DELTA_E_GUIDANCE, fadingRate, projectThreshold } from '@toneledger/common/domain/fading';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import type {
  SessionInput, baselineChoiceSchema, csvMappingSchema, csvPreviewSchema, leaderSchema, leadersQuerySchema, measurementSettingsSchema,
  spotInputSchema, spotReadingInputSchema, spotUpdateSchema, PrintMeasurements,
} from '@toneledger/common/schemas/measurements';
import { db } from '../db';
import { Image, MeasurementSession, MeasurementSpot, Print, Setting, SpotReading, type StoredPoint } from '../models';
import { notFound, validationFailed } from '../errors';
import {
  presentAnalysis, presentProjection, presentSession, presentSpot, projectedDateOf, type SpotAnalysisResult,
} from '../presenters/measurement.presenter';
import { recordAudit } from './audit.service';
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
type CsvMapping = z.infer<typeof csvMappingSchema>;
type CsvPreview = z.infer<typeof csvPreviewSchema>;
type SpotReadingInput = z.infer<typeof spotReadingInputSchema>;
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
    await recordAudit({ actor, action: 'measurement_session.recorded', entityType: SESSION, entityId: session.id, after: presented, requestId }, t);
    return presented;
  });
}

// ── Analysis ──

interface History {
  session: MeasurementSession;
  reading: SpotReading;
}

function conditionsOf(s: MeasurementSession): MeasurementConditions {
  return { illuminant: s.illuminant, observer: s.observer as MeasurementConditions['observer'], geometry: s.geometry, condition: s.condition as MeasurementConditions['condition'] };
}

const meanOf = (r: SpotReading): Lab => ({ L: r.meanL, a: r.meanA, b: r.meanB });

/** The density recorded, or the one its reflectance gives (D = −log10 R). */
function densityOf(r: SpotReading): number | null {
  if (r.density !== null) return r.density;
  return r.reflectance !== null ? densityFromReflectance(r.reflectance) : null;
}

const chronological = (x: History, y: History) =>
  x.session.measuredOn.localeCompare(y.session.measuredOn) || x.session.createdAt.getTime() - y.session.createdAt.getTime();

/**
 * One spot's change, session by session, against its baseline: the chosen session, or else the
 * first session (by date) that measured the spot.
 *
 * - Each point is judged with `comparable()` on the conditions of its session and the baseline
 *   session. A point that is not comparable keeps its reading and density but gets no differences,
 *   carries the reason, and is left out of the rates.
 * - ΔD and % loss need a density at both; they are also left empty when both say what kind of
 *   density they are (visual, status A) and the kinds differ.
 * - The rates fit the comparable points from the baseline date on: a baseline chosen after a
 *   treatment restarts the clock, and earlier points are shown but not fitted.
 * - The projection is that of the ΔE00 rate, with the observed points deciding whether the
 *   threshold has already been reached.
 */
export function analyseSpot(spot: MeasurementSpot, history: History[], threshold: number): SpotAnalysisResult {
  const ordered = [...history].sort(chronological);
  const chosen = spot.baselineSessionId ? ordered.find((h) => h.session.id === spot.baselineSessionId) : undefined;
  const base = chosen ?? ordered[0];
  if (!base) return { spot, baseline: null, points: [], rate: null, densityRate: null, projection: null };

  const baseLab = meanOf(base.reading);
  const baseDensity = densityOf(base.reading);
  const baseConditions = conditionsOf(base.session);
  const points = ordered.map((h) => {
    const lab = meanOf(h.reading);
    const density = densityOf(h.reading);
    const common = { sessionId: h.session.id, measuredOn: h.session.measuredOn, lab, density };
    const verdict = comparable(baseConditions, conditionsOf(h.session));
    if (!verdict.ok) {
      return { ...common, comparable: false, reason: verdict.reason, dE00: null, dE76: null, dL: null, dC: null, dH: null, dominant: null, dD: null, densityLossPercent: null };
    }
    const change = classifyChange(baseLab, lab);
    const d = change.difference;
    const kindsDiffer = base.reading.densityType !== null && h.reading.densityType !== null && base.reading.densityType !== h.reading.densityType;
    const dc = baseDensity !== null && density !== null && !kindsDiffer ? densityChange(baseDensity, density) : null;
    return {
      ...common, comparable: true, reason: null, dE00: d.dE00, dE76: d.dE76, dL: d.dL, dC: d.dC, dH: d.dH, dominant: change.dominant,
      dD: dc ? dc.deltaD : null, densityLossPercent: dc ? dc.percentLoss : null,
    };
  });

  const fitted = points.filter((p) => p.comparable && p.measuredOn >= base.session.measuredOn);
  const colourSeries = fitted.map((p) => ({ t: p.measuredOn, value: p.dE00 as number }));
  const rate = fadingRate(colourSeries);
  const densitySeries = fitted.flatMap((p) => (p.densityLossPercent !== null ? [{ t: p.measuredOn, value: p.densityLossPercent }] : []));
  const densityRate = baseDensity !== null && densitySeries.length > 0 ? fadingRate(densitySeries) : null;
  const projection = rate.ok ? projectThreshold(rate, { t: base.session.measuredOn }, threshold, colourSeries) : null;
  return {
    spot,
    baseline: { sessionId: base.session.id, measuredOn: base.session.measuredOn, lab: baseLab, density: baseDensity, chosen: chosen !== undefined },
    points, rate, densityRate, projection,
  };
}

function historiesBySpot(sessions: (MeasurementSession & { readings?: SpotReading[] })[]): Map<string, History[]> {
  const out = new Map<string, History[]>();
  for (const session of sessions) {
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
  const histories = historiesBySpot(sessions);
  const newestFirst = [...sessions].sort((a, b) => b.measuredOn.localeCompare(a.measuredOn) || b.createdAt.getTime() - a.createdAt.getTime());
  return {
    threshold: settings.noticeableDeltaE,
    thresholdGuidance: NOTICEABLE_DELTA_E_GUIDANCE,
    spots: spots.map((s) => presentAnalysis(analyseSpot(s, histories.get(s.id) ?? [], settings.noticeableDeltaE))),
    sessions: newestFirst.map((s) => presentSession(s, s.readings ?? [], spots)),
  };
}

// ── CSV from an instrument: preview only ──

export const MAX_CSV_BYTES = 5 * 1024 * 1024;
const SAMPLE_ROWS = 10;
const MAX_READINGS_PER_SPOT = 20;
const MAX_SPOTS_PER_SESSION = 50;
const MAX_REPORTED_ERRORS = 500;

/** The delimiter the header line uses most: instruments write commas, semicolons or tabs. */
function delimiterOf(text: string): string {
  const firstLine = text.slice(0, text.search(/\r?\n|$/));
  const counts = [',', ';', '\t'].map((d) => [d, firstLine.split(d).length - 1] as const);
  return counts.reduce((best, c) => (c[1] > best[1] ? c : best))[0];
}

/**
 * Reads an instrument's CSV and, with a mapping, turns it into the readings of one session:
 * rows naming the same spot are several readings of that spot (the server averages them when
 * the session is recorded; densities and reflectances given on those rows are averaged here).
 * Spot names are matched to the print's spots ignoring case and surrounding spaces. Row numbers
 * count the header as row 1. Rows with a problem are reported and left out of `readings`; the
 * client shows the problems and sends the session only when there are none. Nothing is written.
 */
export async function previewCsv(printId: string, text: string, mapping: CsvMapping | null): Promise<CsvPreview> {
  await requirePrint(printId);
  const delimiter = delimiterOf(text);
  let records: string[][];
  try {
    records = parse(text, { bom: true, delimiter, relax_column_count: true, skip_empty_lines: false, trim: false }) as string[][];
  } catch (err) {
    throw validationFailed([{ path: 'file', message: `The file is not readable as CSV: ${(err as Error).message}`, code: 'csv' }]);
  }
  if (!records.length) throw validationFailed([{ path: 'file', message: 'The file is empty', code: 'empty' }]);

  // Column names as the header gives them; blank ones get a name, repeated ones a number.
  const columns: string[] = [];
  records[0].forEach((raw, i) => {
    let name = raw.trim() || `column ${i + 1}`;
    for (let k = 2; columns.includes(name); k++) name = `${raw.trim() || `column ${i + 1}`} (${k})`;
    columns.push(name);
  });
  const rows = records
    .map((r, i) => ({ row: i + 1, cells: Object.fromEntries(columns.map((c, j) => [c, r[j] ?? ''])) as Record<string, string> }))
    .slice(1)
    .filter((r) => Object.values(r.cells).some((v) => v.trim() !== ''));
  const base = { columns, rowCount: rows.length, sample: rows.slice(0, SAMPLE_ROWS).map((r) => r.cells) };
  if (!mapping) return { ...base, readings: null, errors: [] };

  // Every mapped column must exist in the file (matched ignoring case when not exact).
  const resolve = (name: string) => columns.find((c) => c === name.trim()) ?? columns.find((c) => c.toLowerCase() === name.trim().toLowerCase());
  const mappingIssues: FieldIssue[] = [];
  const col = {} as Record<'spot' | 'L' | 'a' | 'b' | 'density' | 'reflectance', string | undefined>;
  for (const key of ['spot', 'L', 'a', 'b', 'density', 'reflectance'] as const) {
    const wanted = mapping[key];
    if (wanted === undefined || wanted === '') continue;
    col[key] = resolve(wanted);
    if (!col[key]) mappingIssues.push({ path: `mapping.${key}`, message: `The file has no column "${wanted}"`, code: 'no_column' });
  }
  if (mappingIssues.length) throw validationFailed(mappingIssues, 'The mapping names columns the file does not have.');

  const spots = await printSpots(printId);
  const byName = new Map(spots.map((s) => [s.name.trim().toLowerCase(), s]));
  // Numbers as instruments write them; a decimal comma is read when the file is not comma-separated.
  const number = (raw: string) => {
    const v = raw.trim();
    const normal = delimiter !== ',' && /^[+-]?\d+,\d+$/.test(v) ? v.replace(',', '.') : v;
    return /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(normal) ? Number(normal) : NaN;
  };

  const errors: CsvPreview['errors'] = [];
  const groups = new Map<string, { spotId: string; readings: Lab[]; densities: number[]; reflectances: number[]; firstRow: number }>();
  for (const { row, cells } of rows) {
    const rowErrors: CsvPreview['errors'] = [];
    const problem = (column: string, message: string) => rowErrors.push({ row, column, value: cells[column] ?? null, message });
    const required = (key: 'spot' | 'L' | 'a' | 'b', label: string) => {
      const c = col[key]!;
      if ((cells[c] ?? '').trim() === '') problem(c, `${label} is empty`);
      return (cells[c] ?? '').trim();
    };
    const spotName = required('spot', 'The spot name');
    const spot = spotName ? byName.get(spotName.toLowerCase()) : undefined;
    if (spotName && !spot) problem(col.spot!, `"${spotName}" is not a measurement spot of this print (spots: ${spots.map((s) => s.name).join(', ') || 'none yet'})`);
    const lab = {} as Lab;
    for (const [key, label, min, max] of [['L', 'L*', 0, 100], ['a', 'a*', -200, 200], ['b', 'b*', -200, 200]] as const) {
      const raw = required(key, label);
      if (!raw) continue;
      const v = number(raw);
      if (Number.isNaN(v)) problem(col[key]!, `${label} must be a number`);
      else if (v < min || v > max) problem(col[key]!, `${label} is between ${min} and ${max}`);
      else lab[key] = v;
    }
    let density: number | null = null;
    if (col.density && (cells[col.density] ?? '').trim() !== '') {
      const v = number(cells[col.density]);
      if (Number.isNaN(v)) problem(col.density, 'Density must be a number');
      else if (v < 0 || v > 5) problem(col.density, 'Density is between 0 and 5');
      else density = v;
    }
    let reflectance: number | null = null;
    if (col.reflectance && (cells[col.reflectance] ?? '').trim() !== '') {
      const v = number(cells[col.reflectance]);
      const top = mapping.reflectanceIsPercent ? 100 : 1;
      if (Number.isNaN(v)) problem(col.reflectance, 'Reflectance must be a number');
      else if (!(v > 0) || v > top) problem(col.reflectance, mapping.reflectanceIsPercent ? 'Reflectance is a percentage above 0 and up to 100' : 'Reflectance is a fraction above 0 and up to 1');
      else reflectance = mapping.reflectanceIsPercent ? v / 100 : v;
    }
    if (!rowErrors.length && spot) {
      const g = groups.get(spot.id) ?? { spotId: spot.id, readings: [], densities: [], reflectances: [], firstRow: row };
      if (g.readings.length >= MAX_READINGS_PER_SPOT) {
        problem(col.spot!, `At most ${MAX_READINGS_PER_SPOT} readings of one spot per session (from row ${g.firstRow})`);
      } else {
        g.readings.push(lab);
        if (density !== null) g.densities.push(density);
        if (reflectance !== null) g.reflectances.push(reflectance);
        groups.set(spot.id, g);
      }
    }
    errors.push(...rowErrors);
    if (errors.length >= MAX_REPORTED_ERRORS) break;
  }
  if (groups.size > MAX_SPOTS_PER_SESSION) {
    errors.push({ row: 1, column: col.spot!, value: null, message: `At most ${MAX_SPOTS_PER_SESSION} spots per session; the file names ${groups.size}` });
  }
  const mean = (xs: number[]) => (xs.length ? xs.reduce((s, x) => s + x, 0) / xs.length : null);
  const readings: SpotReadingInput[] = [...groups.values()].map((g) => ({
    spotId: g.spotId, readings: g.readings, density: mean(g.densities), densityType: null, reflectance: mean(g.reflectances),
  }));
  return { ...base, readings, errors: errors.slice(0, MAX_REPORTED_ERRORS) };
}

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
  const histories = historiesBySpot(sessions);

  const ranked = spots.flatMap((spot) => {
    const history = histories.get(spot.id) ?? [];
    if (!history.length) return [];
    const a = analyseSpot(spot, history, settings.noticeableDeltaE);
    const fitted = a.points.filter((p) => p.comparable && a.baseline && p.measuredOn >= a.baseline.measuredOn);
    const latest = fitted.at(-1);
    const last = a.points.at(-1)!;
    const leader: Leader = {
      printId: spot.print.id, accessionNumber: spot.print.accessionNumber, title: spot.print.title, process: spot.print.process,
      tonerClasses: spot.print.tonerClasses, spotId: spot.id, spotName: spot.name,
      latestDeltaE00: latest ? latest.dE00 : null,
      ratePerYear: a.rate?.ok ? a.rate.slopePerYear : null,
      rateCi95: a.rate?.ok ? a.rate.ci95 : null,
      sessions: history.length,
      projectedDate: projectedDateOf(presentProjection(a.projection)),
      lastMeasuredOn: last.measuredOn,
    };
    return [{ leader, accessionSort: spot.print.accessionSort }];
  });

  // Larger first, unknowns last; ties by accession number, then spot name.
  const desc = (x: number | null, y: number | null) => (x === null ? (y === null ? 0 : 1) : y === null ? -1 : y - x);
  ranked.sort((x, y) => {
    const [first, second] = query.sort === 'rate' ? (['ratePerYear', 'latestDeltaE00'] as const) : (['latestDeltaE00', 'ratePerYear'] as const);
    return (
      desc(x.leader[first], y.leader[first]) || desc(x.leader[second], y.leader[second]) ||
      x.accessionSort.localeCompare(y.accessionSort) || x.leader.spotName.localeCompare(y.leader.spotName)
    );
  });
  const start = (query.page - 1) * query.pageSize;
  return { rows: ranked.slice(start, start + query.pageSize).map((r) => r.leader), total: ranked.length };
}
