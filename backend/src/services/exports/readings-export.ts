import type { Writable } from 'node:stream';
import { QueryTypes } from 'sequelize';
import type { ReadingsExportQuery } from '@toneledger/common/schemas/exports';
import { SPOT_PURPOSE_LABELS } from '@toneledger/common/schemas/measurements';
import { printLinkedData } from '@toneledger/common/fields/linked-data';
import type { SpotPoint } from '@toneledger/common/domain/spot-analysis';
import { db } from '../../db';
import { MeasurementSpot, type MeasurementSession, type SpotReading } from '../../models';
import { notFound } from '../../errors';
import { analyseSpot, getMeasurementSettings, voidedSessions } from '../measurement.service';
import { isoCell, streamCsv, streamJsonArray, yesNo, type ExportColumn } from './columns';

/**
 * Measurement readings out: one row per spot per session, with the change against the spot's
 * baseline computed by the same analysis the measurements page shows (spot-analysis.ts, CIEDE2000
 * from colour.ts). Prints are read a chunk at a time in accession order, so the export of a large
 * collection never holds more than one chunk's readings.
 */
const CHUNK = 100;

interface PrintHead { id: string; accession_number: string; title: string; process: string; accession_sort: string }

export interface ReadingRow {
  print: PrintHead;
  spot: MeasurementSpot;
  session: Pick<MeasurementSession, 'id' | 'measuredOn' | 'measuredByName' | 'instrument' | 'serial' | 'illuminant' | 'observer' | 'geometry' | 'condition'>;
  reading: Pick<SpotReading, 'meanL' | 'meanA' | 'meanB' | 'n' | 'density' | 'densityType' | 'reflectance'>;
  point: SpotPoint | undefined;
  /** Set when the session was voided: kept in the export, left out of the analysis. */
  voided: { at: string; by: string; reason: string } | null;
  baselineSessionId: string | null;
  baselineChosen: boolean;
}

const num = (v: number | null | undefined) => (v === null || v === undefined ? null : Number(v.toFixed(4)));
/** A CIEDE2000 component of a point (ΔL′, ΔC′, ΔH′), read loosely: older analyses carried only CIELAB's ΔL*, ΔC*, ΔH*. */
const prime = (p: SpotPoint | undefined, key: 'dLPrime' | 'dCPrime' | 'dHPrime') => {
  const v = (p as Partial<Record<typeof key, number | null>> | undefined)?.[key];
  return typeof v === 'number' ? v : null;
};
const SRC = 'Measurement session';

export const READING_COLUMNS: ExportColumn<ReadingRow>[] = [
  { name: 'accession_number', meaning: "The print's accession number.", type: 'text', source: 'Print: accession number', cell: (r) => r.print.accession_number },
  { name: 'print_id', meaning: "The print's id in this collection.", type: 'id', source: 'Print: id', cell: (r) => r.print.id },
  { name: 'spot_id', meaning: "The measurement spot's id.", type: 'id', source: 'Measurement spot: id', cell: (r) => r.spot.id },
  { name: 'spot_name', meaning: 'The name the spot was registered under.', type: 'text', source: 'Measurement spot: name', cell: (r) => r.spot.name },
  { name: 'spot_purpose', meaning: 'What the spot measures (maximum density area, mid-tone, highlight, paper base).', type: 'text', source: 'Measurement spot: purpose', cell: (r) => SPOT_PURPOSE_LABELS[r.spot.purpose as keyof typeof SPOT_PURPOSE_LABELS] ?? r.spot.purpose },
  { name: 'session_id', meaning: "The session's id.", type: 'id', source: `${SRC}: id`, cell: (r) => r.session.id },
  { name: 'measured_on', meaning: 'The day the spot was measured (ISO 8601).', type: 'date', source: `${SRC}: measured on`, cell: (r) => isoCell(r.session.measuredOn) },
  { name: 'measured_by', meaning: 'Who measured it.', type: 'text', source: `${SRC}: measured by`, cell: (r) => r.session.measuredByName },
  { name: 'instrument', meaning: 'The instrument (make and model).', type: 'text', source: `${SRC}: instrument`, cell: (r) => r.session.instrument },
  { name: 'serial', meaning: "The instrument's serial number.", type: 'text', source: `${SRC}: serial`, cell: (r) => r.session.serial },
  { name: 'illuminant', meaning: 'CIE illuminant of the L*a*b* values.', type: 'code', source: `${SRC}: illuminant`, cell: (r) => r.session.illuminant },
  { name: 'observer', meaning: 'CIE standard observer, in degrees.', type: 'code', unit: '°', source: `${SRC}: observer`, cell: (r) => r.session.observer },
  { name: 'geometry', meaning: 'Measuring geometry (45/0, 0/45, d/8).', type: 'code', source: `${SRC}: geometry`, cell: (r) => r.session.geometry },
  { name: 'measurement_condition', meaning: 'ISO 13655 measurement condition (M0–M3), when given.', type: 'code', source: `${SRC}: condition`, cell: (r) => r.session.condition },
  { name: 'l_star', meaning: 'CIELAB L* (mean of the readings at the spot in this session).', type: 'number', source: 'Spot reading: mean L*', cell: (r) => num(r.reading.meanL) },
  { name: 'a_star', meaning: 'CIELAB a* (mean).', type: 'number', source: 'Spot reading: mean a*', cell: (r) => num(r.reading.meanA) },
  { name: 'b_star', meaning: 'CIELAB b* (mean).', type: 'number', source: 'Spot reading: mean b*', cell: (r) => num(r.reading.meanB) },
  { name: 'readings', meaning: 'How many readings the mean is of.', type: 'integer', source: 'Spot reading: n', cell: (r) => r.reading.n },
  { name: 'density', meaning: 'Reflection density, when given or computed from reflectance.', type: 'number', unit: 'D', source: 'Spot reading: density', cell: (r) => num(r.reading.density) },
  { name: 'density_type', meaning: 'The kind of density (visual, status A).', type: 'code', source: 'Spot reading: density type', cell: (r) => r.reading.densityType },
  { name: 'reflectance', meaning: 'Reflectance factor as a fraction (0–1].', type: 'number', source: 'Spot reading: reflectance', cell: (r) => num(r.reading.reflectance) },
  { name: 'voided', meaning: 'Yes when the session was voided (recorded by mistake): kept here, left out of every change and rate.', type: 'yes/no', source: 'Measurement session void', cell: (r) => yesNo(r.voided !== null) },
  { name: 'void_reason', meaning: 'Why the session was voided.', type: 'text', source: 'Measurement session void: reason', cell: (r) => r.voided?.reason ?? null },
  { name: 'is_baseline', meaning: "Yes on the session that is the spot's baseline.", type: 'yes/no', source: 'Computed: the chosen baseline session, otherwise the first comparable session', cell: (r) => yesNo(r.baselineSessionId === r.session.id) },
  { name: 'baseline_chosen', meaning: 'Yes when a person chose the baseline; no when it is the first session by default.', type: 'yes/no', source: 'Measurement spot: baseline choice', cell: (r) => yesNo(r.baselineSessionId ? r.baselineChosen : null) },
  { name: 'comparable', meaning: 'Yes when measured under the same conditions as the baseline (illuminant, observer, geometry, M-condition).', type: 'yes/no', source: 'Computed (spot-analysis)', cell: (r) => yesNo(r.point ? r.point.comparable : null) },
  { name: 'not_comparable_reason', meaning: 'Why the session cannot be compared with the baseline.', type: 'text', source: 'Computed (spot-analysis)', cell: (r) => r.point?.reason ?? null },
  { name: 'delta_e00', meaning: 'CIEDE2000 colour difference from the baseline (CIE 015:2018).', type: 'number', unit: 'ΔE00', source: 'Computed: CIEDE2000 of this mean against the baseline mean (colour.ts)', cell: (r) => num(r.point?.dE00) },
  { name: 'delta_l_prime', meaning: 'CIEDE2000 lightness component ΔL′ (not ΔL*).', type: 'number', source: 'Computed (ciede2000-parts)', cell: (r) => num(prime(r.point, 'dLPrime')) },
  { name: 'delta_c_prime', meaning: 'CIEDE2000 chroma component ΔC′.', type: 'number', source: 'Computed (ciede2000-parts)', cell: (r) => num(prime(r.point, 'dCPrime')) },
  { name: 'delta_h_prime', meaning: 'CIEDE2000 hue component ΔH′.', type: 'number', source: 'Computed (ciede2000-parts)', cell: (r) => num(prime(r.point, 'dHPrime')) },
  { name: 'delta_e_ab', meaning: 'CIE 1976 colour difference ΔE*ab from the baseline.', type: 'number', unit: 'ΔE*ab', source: 'Computed: Euclidean distance in CIELAB (colour.ts)', cell: (r) => num(r.point?.dE76) },
  { name: 'density_change', meaning: 'ΔD = D − D0 against the baseline density (negative while the density falls).', type: 'number', unit: 'D', source: 'Computed (spot-analysis)', cell: (r) => num(r.point?.dD) },
];

/**
 * The prints with spots that the query names, a chunk at a time, in accession order. Each chunk
 * starts after the last one's (accession_sort, id), written as a plain row comparison (no
 * `$n IS NULL OR …`) so PostgreSQL can walk the accession index instead of sorting every print again.
 */
async function* printChunks(query: ReadingsExportQuery): AsyncGenerator<PrintHead[]> {
  let after: [string, string] | null = null;
  for (;;) {
    const where = ['EXISTS (SELECT 1 FROM measurement_spots s WHERE s.print_id = p.id)'];
    const bind: unknown[] = [];
    const add = (sql: string, ...values: unknown[]) => {
      where.push(sql.replace(/\$(\d)/g, (_m, n: string) => `$${bind.length + Number(n)}`));
      bind.push(...values);
    };
    if (query.printId) add('p.id = $1::uuid', query.printId);
    if (query.process) add('p.process = $1::text', query.process);
    if (query.tonerClass) add('p.toner_classes @> ARRAY[$1::text]', query.tonerClass);
    if (after) add('(p.accession_sort, p.id) > ($1::text, $2::uuid)', after[0], after[1]);
    const rows: PrintHead[] = await db().query<PrintHead>(
      `SELECT p.id, p.accession_number, p.title, p.process, p.accession_sort FROM prints p WHERE ${where.join(' AND ')} ORDER BY p.accession_sort, p.id LIMIT ${CHUNK}`,
      { bind, type: QueryTypes.SELECT },
    );
    if (!rows.length) return;
    yield rows;
    if (rows.length < CHUNK) return;
    const last = rows.at(-1)!;
    after = [last.accession_sort, last.id];
  }
}

interface PrintReadings { print: PrintHead; spots: { spot: MeasurementSpot; rows: ReadingRow[] }[] }

/** A session as the export and the analysis read it (the columns `analyseSpot` uses, and what the CSV writes). */
type SessionRow = Pick<MeasurementSession, 'id' | 'printId' | 'measuredOn' | 'measuredByName' | 'instrument' | 'serial' | 'illuminant' | 'observer' | 'geometry' | 'condition' | 'createdAt'>;
type ReadingRowDb = Pick<SpotReading, 'sessionId' | 'spotId' | 'meanL' | 'meanA' | 'meanB' | 'n' | 'density' | 'densityType' | 'reflectance'>;

/**
 * One chunk of prints with every reading analysed against its spot's baseline. Sessions and readings
 * are read with plain SQL (only the columns used; Sequelize's nested include cost more than the
 * analysis). A voided session is written with its reason and left out of the analysis, as on the
 * measurements page.
 */
async function analyseChunk(prints: PrintHead[], threshold: number): Promise<PrintReadings[]> {
  const ids = prints.map((p) => p.id);
  const spots = await MeasurementSpot.findAll({ where: { printId: ids }, order: [['createdAt', 'ASC'], ['name', 'ASC']] });
  const sessions = await db().query<SessionRow>(
    `SELECT id, print_id AS "printId", measured_on::text AS "measuredOn", measured_by_name AS "measuredByName", instrument, serial,
            illuminant, observer, geometry, condition, created_at AS "createdAt"
       FROM measurement_sessions WHERE print_id = ANY($1::uuid[]) ORDER BY measured_on, created_at`,
    { bind: [ids], type: QueryTypes.SELECT },
  );
  const readings = await db().query<ReadingRowDb>(
    `SELECT session_id AS "sessionId", spot_id AS "spotId", mean_l::float8 AS "meanL", mean_a::float8 AS "meanA", mean_b::float8 AS "meanB", n,
            density::float8 AS density, density_type AS "densityType", reflectance::float8 AS reflectance
       FROM spot_readings WHERE print_id = ANY($1::uuid[])`,
    { bind: [ids], type: QueryTypes.SELECT },
  );
  const voided = await voidedSessions(ids);
  const sessionById = new Map(sessions.map((x) => [x.id, x]));
  const order = new Map(sessions.map((x, i) => [x.id, i]));
  readings.sort((x, y) => order.get(x.sessionId)! - order.get(y.sessionId)!);
  const bySpot = new Map<string, { session: SessionRow; reading: ReadingRowDb }[]>();
  for (const reading of readings) {
    const list = bySpot.get(reading.spotId) ?? [];
    list.push({ session: sessionById.get(reading.sessionId)!, reading });
    bySpot.set(reading.spotId, list);
  }
  return prints.map((print) => ({
    print,
    spots: spots.filter((s) => s.printId === print.id).map((spot) => {
      const history = bySpot.get(spot.id) ?? [];
      const analysed = history.filter((h) => !voided.has(h.session.id));
      const analysis = analyseSpot(spot, analysed as unknown as Parameters<typeof analyseSpot>[1], threshold);
      const points = new Map(analysis.points.map((p) => [p.sessionId, p]));
      return {
        spot,
        rows: history.map(({ session, reading }) => ({
          print, spot, session, reading, point: points.get(session.id), voided: voided.get(session.id) ?? null,
          baselineSessionId: analysis.baseline?.sessionId ?? null, baselineChosen: analysis.baseline?.chosen ?? false,
        })),
      };
    }),
  }));
}

async function* analysedChunks(query: ReadingsExportQuery): AsyncGenerator<PrintReadings[]> {
  const { noticeableDeltaE } = await getMeasurementSettings();
  for await (const prints of printChunks(query)) yield await analyseChunk(prints, noticeableDeltaE);
}

/** Checked before the response starts, so a missing print is a 404 and not a cut-off file. */
export async function checkReadingsQuery(query: ReadingsExportQuery): Promise<void> {
  if (query.printId && (await db().query('SELECT 1 FROM prints WHERE id = $1', { bind: [query.printId], type: QueryTypes.SELECT })).length === 0) {
    throw notFound('The print');
  }
}

export async function writeReadingsCsv(query: ReadingsExportQuery, out: Writable): Promise<number> {
  async function* rows() {
    for await (const chunk of analysedChunks(query)) yield chunk.flatMap((p) => p.spots.flatMap((s) => s.rows));
  }
  return streamCsv(out, READING_COLUMNS, rows());
}

export async function writeReadingsJson(query: ReadingsExportQuery, out: Writable): Promise<number> {
  async function* prints() {
    for await (const chunk of analysedChunks(query)) {
      yield chunk.map(({ print, spots }) => ({
        id: print.id, accessionNumber: print.accession_number, title: print.title, process: print.process,
        linkedData: printLinkedData(print.process),
        spots: spots.map(({ spot, rows }) => ({
          id: spot.id, name: spot.name, purpose: spot.purpose,
          baselineSessionId: rows[0]?.baselineSessionId ?? null,
          readings: rows.map((r) => ({
            sessionId: r.session.id, measuredOn: r.session.measuredOn, measuredBy: r.session.measuredByName, instrument: r.session.instrument,
            illuminant: r.session.illuminant, observer: r.session.observer, geometry: r.session.geometry, condition: r.session.condition,
            lab: { L: r.reading.meanL, a: r.reading.meanA, b: r.reading.meanB }, n: r.reading.n,
            density: r.reading.density, densityType: r.reading.densityType, reflectance: r.reading.reflectance,
            voided: r.voided, comparable: r.point?.comparable ?? null, reason: r.point?.reason ?? null,
            deltaE00: r.point?.dE00 ?? null, deltaLPrime: prime(r.point, 'dLPrime'), deltaCPrime: prime(r.point, 'dCPrime'), deltaHPrime: prime(r.point, 'dHPrime'),
            deltaEab: r.point?.dE76 ?? null, densityChange: r.point?.dD ?? null,
          })),
        })),
      }));
    }
  }
  return streamJsonArray(out, { exportedAt: new Date().toISOString(), query, note: 'ΔE00 against each spot\'s baseline (CIEDE2000).' }, 'prints', prints());
}
