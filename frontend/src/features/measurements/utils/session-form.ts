import { ciede2000Parts } from '@toneledger/common/domain/ciede2000-parts';
import { averageReadings, classifyChange, comparable, densityChange, densityFromReflectance, type Lab, type MeasurementConditions, type ReadingSummary } from '@toneledger/common/domain/colour';
import {
  labReadingSchema,
  sessionInputSchema,
  type MeasurementSession,
  type SessionInput,
  type SpotAnalysis,
} from '@toneledger/common/schemas/measurements';
import { issuesToFieldErrors, type FieldErrors } from '@/lib/forms/field-errors';

/** One reading as typed: L*, a*, b*. */
export interface ReadingRow {
  L: string;
  a: string;
  b: string;
}

export interface SpotEntry {
  readings: ReadingRow[];
  density: string;
  densityType: string;
  reflectance: string;
}

/** What the session form holds: every field as the text in its control. */
export interface SessionFormValues {
  measuredOn: string;
  instrument: string;
  serial: string;
  illuminant: string;
  observer: string;
  geometry: string;
  condition: string;
  aperture: string;
  backing: string;
  notes: string;
  /** One entry per spot of the print, by spot id (form fields `spots.<spot id>.readings.<row>.L`). */
  spots: Record<string, SpotEntry>;
}

export const SESSION_FIELDS = ['measuredOn', 'instrument', 'serial', 'illuminant', 'observer', 'geometry', 'condition', 'aperture', 'backing', 'notes'] as const;
export type SessionField = (typeof SESSION_FIELDS)[number];

export function newRow(values: Partial<ReadingRow> = {}): ReadingRow {
  return { L: '', a: '', b: '', ...values };
}

export function emptySpotEntry(): SpotEntry {
  return { readings: [newRow()], density: '', densityType: '', reflectance: '' };
}

/** Today as YYYY-MM-DD in the person's own time zone. */
export function todayIso(now = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

/**
 * A new session: today, D50 and the 2° observer unless the print's latest session says otherwise;
 * instrument, geometry and the other conditions are carried over from that latest session, so a
 * series stays comparable unless someone changes them on purpose.
 */
export function emptySessionValues(spotIds: string[], latest: MeasurementSession | null, today = todayIso()): SessionFormValues {
  return {
    measuredOn: today,
    instrument: latest?.instrument ?? '',
    serial: latest?.serial ?? '',
    illuminant: latest?.illuminant ?? 'D50',
    observer: latest?.observer ?? '2',
    geometry: latest?.geometry ?? '',
    condition: latest?.condition ?? '',
    aperture: latest?.aperture ?? '',
    backing: latest?.backing ?? '',
    notes: '',
    spots: Object.fromEntries(spotIds.map((id) => [id, emptySpotEntry()])),
  };
}

const blank = (text: string) => text.trim() === '';
const isBlankRow = (row: ReadingRow) => blank(row.L) && blank(row.a) && blank(row.b);
const isBlankEntry = (entry: SpotEntry) => entry.readings.every(isBlankRow) && blank(entry.density) && blank(entry.reflectance);

/** A typed figure, or undefined when the box is empty (so the schema says what is missing). */
function figure(text: string): string | undefined {
  return blank(text) ? undefined : text.trim();
}

/** Which spot, and which of its rows (by their place in the form), each entry of the sent `readings` came from. */
export type SentOrder = { spotId: string; rows: number[] }[];

/**
 * The request body as typed (before the schema): only spots with something typed, and of those
 * only the rows with something typed; an empty box is left out, never read as zero. With it, the
 * order its readings were taken from the form, to put the schema's and the server's problems back.
 */
export function rawSessionBody(values: SessionFormValues, spotOrder: string[]): { body: Record<string, unknown>; order: SentOrder } {
  const order: SentOrder = [];
  const readings: Record<string, unknown>[] = [];
  for (const spotId of spotOrder) {
    const entry = values.spots[spotId];
    if (!entry || isBlankEntry(entry)) continue;
    const rows = entry.readings.flatMap((row, index) => (isBlankRow(row) ? [] : [index]));
    order.push({ spotId, rows });
    readings.push({
      spotId,
      readings: rows.map((index) => {
        const row = entry.readings[index]!;
        return { L: figure(row.L), a: figure(row.a), b: figure(row.b) };
      }),
      density: figure(entry.density) ?? null,
      densityType: entry.densityType === '' ? null : entry.densityType,
      reflectance: figure(entry.reflectance) ?? null,
    });
  }
  const { spots: _spots, ...session } = values;
  return {
    body: { ...session, geometry: values.geometry === '' ? undefined : values.geometry, condition: values.condition === '' ? null : values.condition, readings },
    order,
  };
}

/**
 * The form field that shows a problem at a path of the request body: a session field by its name,
 * a reading at its row (`spots.<id>.readings.<row>.L`), a spot's own fields at the spot, and the
 * list of spots as a whole at `spots`.
 */
export function errorKey(path: string, order: SentOrder): string {
  const parts = path.split('.');
  if (parts[0] !== 'readings') return path;
  const sent = parts.length > 1 ? order[Number(parts[1])] : undefined;
  if (!sent) return 'spots';
  const spot = `spots.${sent.spotId}`;
  if (parts[2] === 'readings' && parts.length >= 5) {
    const row = sent.rows[Number(parts[3])];
    if (row !== undefined) return `${spot}.readings.${row}.${parts[4]}`;
  }
  if (parts[2] === 'density' || parts[2] === 'reflectance' || parts[2] === 'densityType') return `${spot}.${parts[2]}`;
  return spot;
}

/** The form checked with the schema the server uses, problems at the fields that show them. */
export function checkSession(values: SessionFormValues, spotOrder: string[]): Checked {
  const { body, order } = rawSessionBody(values, spotOrder);
  const result = sessionInputSchema.safeParse(body);
  if (result.success) return { ok: true, data: result.data, order };
  return { ok: false, errors: issuesToFieldErrors(result.error.issues, (path) => errorKey(path, order)), order };
}

export type Checked = { ok: true; data: SessionInput; order: SentOrder } | { ok: false; errors: FieldErrors; order: SentOrder };

/** The rows of a spot that are complete, valid readings. */
export function validReadings(entry: SpotEntry): Lab[] {
  const out: Lab[] = [];
  for (const row of entry.readings) {
    if (isBlankRow(row)) continue;
    const parsed = labReadingSchema.safeParse({ L: figure(row.L), a: figure(row.a), b: figure(row.b) });
    if (parsed.success) out.push(parsed.data);
  }
  return out;
}

/** Density as typed, or computed from the reflectance when only that is given; null when neither reads. */
export function entryDensity(entry: SpotEntry): number | null {
  if (!blank(entry.density)) {
    const d = Number(entry.density.trim());
    return Number.isFinite(d) && d >= 0 ? d : null;
  }
  if (!blank(entry.reflectance)) {
    const r = Number(entry.reflectance.trim());
    return Number.isFinite(r) && r > 0 && r <= 1 ? densityFromReflectance(r) : null;
  }
  return null;
}

export type SpotPreview =
  | { kind: 'empty' }
  | {
      kind: 'readings';
      summary: ReadingSummary;
      density: number | null;
      against:
        | { kind: 'no_baseline' }
        | { kind: 'not_comparable'; reason: string }
        | {
            kind: 'compared';
            baselineOn: string;
            dE00: number;
            dL: number;
            dC: number;
            dH: number;
            dLPrime: number;
            dCPrime: number;
            dHPrime: number;
            dominant: string | null;
            atOrBeyondThreshold: boolean;
            densityLossPercent: number | null;
          };
    };

export function sessionConditions(values: Pick<SessionFormValues, 'illuminant' | 'observer' | 'geometry' | 'condition'>): MeasurementConditions {
  return {
    illuminant: values.illuminant,
    observer: values.observer as MeasurementConditions['observer'],
    geometry: values.geometry,
    condition: values.condition === '' ? null : (values.condition as MeasurementConditions['condition']),
  };
}

/**
 * What this session's readings at a spot would show before anything is saved: their mean and
 * spread, and the change against the spot's baseline (when the conditions allow a comparison).
 */
export function previewSpot(
  entry: SpotEntry,
  baseline: SpotAnalysis['baseline'],
  baselineSession: Pick<MeasurementSession, 'illuminant' | 'observer' | 'geometry' | 'condition'> | null,
  conditions: MeasurementConditions,
  threshold: number,
): SpotPreview {
  const readings = validReadings(entry);
  if (readings.length === 0) return { kind: 'empty' };
  const summary = averageReadings(readings);
  const density = entryDensity(entry);
  if (!baseline || !baselineSession) return { kind: 'readings', summary, density, against: { kind: 'no_baseline' } };
  if (conditions.geometry.trim() !== '') {
    const { illuminant, observer, geometry, condition } = baselineSession;
    const verdict = comparable({ illuminant, observer, geometry, condition }, conditions);
    if (!verdict.ok) return { kind: 'readings', summary, density, against: { kind: 'not_comparable', reason: verdict.reason } };
  } else {
    return { kind: 'readings', summary, density, against: { kind: 'not_comparable', reason: 'Choose the geometry to compare with the baseline.' } };
  }
  const change = classifyChange(baseline.lab, summary.mean);
  return {
    kind: 'readings',
    summary,
    density,
    against: {
      kind: 'compared',
      baselineOn: baseline.measuredOn,
      dE00: change.difference.dE00,
      dL: change.difference.dL,
      dC: change.difference.dC,
      dH: change.difference.dH,
      ...ciede2000Parts(baseline.lab, summary.mean),
      dominant: change.dominant,
      atOrBeyondThreshold: change.difference.dE00 >= threshold,
      densityLossPercent: density !== null && baseline.density !== null ? densityChange(baseline.density, density).percentLoss : null,
    },
  };
}
