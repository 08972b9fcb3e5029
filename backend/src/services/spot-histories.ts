import type { Transaction } from 'sequelize';
import type { MeasurementConditions } from '@toneledger/common/domain/colour';
import { analyseSpotHistory, type SpotChange, type SpotObservation } from '@toneledger/common/domain/spot-analysis';
import { db } from '../db';
import { getMeasurementSettings } from './measurement.service';

/**
 * Every measured spot of a batch of prints, read in one statement and analysed once
 * (`spot-analysis.ts`, with the spot's chosen baseline and the settings' noticeable threshold).
 * The schedule's fading factor (`printFading`: the fastest-fading spot) and the research outcomes
 * (`print-outcomes.ts`: the maximum-density spot) both read these analyses, so a batch that
 * recomputes both (`schedule-jobs.ts`) reads and analyses each spot once.
 */

export interface AnalysedSpot {
  printId: string;
  spotId: string;
  purpose: string;
  baselineSessionId: string | null;
  /** The spot's sessions as read (not sorted). */
  observations: SpotObservation[];
  analysis: SpotChange;
}

/** Per print, its analysed spots; `threshold` is the settings' noticeable ΔE00 they were analysed with. */
export interface SpotAnalyses { threshold: number; byPrint: Map<string, AnalysedSpot[]> }

interface ReadingRow {
  print_id: string; spot_id: string; purpose: string; baseline_session_id: string | null; session_id: string;
  measured_on: string; created_at: Date; illuminant: string; observer: string; geometry: string; condition: string | null;
  mean_l: number; mean_a: number; mean_b: number; density: number | null; density_type: string | null; reflectance: number | null;
}

/**
 * Raw pg rows on the transaction's own connection (or a pool connection): a batch holds some
 * 150,000 readings, and Sequelize's handling of each row cost more than the statement.
 */
async function rawRows<T>(text: string, values: unknown[], t?: Transaction): Promise<T[]> {
  const connection = (t as unknown as { connection?: { query(text: string, values: unknown[]): Promise<{ rows: T[] }> } } | undefined)?.connection;
  if (connection) return (await connection.query(text, values)).rows;
  const manager = db().connectionManager as unknown as {
    getConnection(): Promise<{ query(text: string, values: unknown[]): Promise<{ rows: T[] }> }>;
    releaseConnection(connection: unknown): Promise<void>;
  };
  const c = await manager.getConnection();
  try {
    return (await c.query(text, values)).rows;
  } finally {
    await manager.releaseConnection(c);
  }
}

export async function analysePrintSpots(ids: readonly string[], t?: Transaction): Promise<SpotAnalyses> {
  const { noticeableDeltaE: threshold } = await getMeasurementSettings(t);
  const byPrint = new Map<string, AnalysedSpot[]>();
  if (!ids.length) return { threshold, byPrint };
  const rows = await rawRows<ReadingRow>(
    `SELECT r.print_id, r.spot_id, sp.purpose, sp.baseline_session_id, s.id AS session_id, s.measured_on::text AS measured_on, s.created_at,
            s.illuminant, s.observer, s.geometry, s.condition, r.mean_l::float8 AS mean_l, r.mean_a::float8 AS mean_a, r.mean_b::float8 AS mean_b,
            r.density::float8 AS density, r.density_type, r.reflectance::float8 AS reflectance
       FROM spot_readings r JOIN measurement_sessions s ON s.id = r.session_id JOIN measurement_spots sp ON sp.id = r.spot_id
      WHERE r.print_id = ANY ($1::uuid[])
        AND NOT EXISTS (SELECT 1 FROM measurement_session_voids v WHERE v.session_id = s.id) -- a voided session is never analysed`,
    [ids], t,
  );
  const spots = new Map<string, ReadingRow[]>();
  for (const r of rows) {
    const list = spots.get(r.spot_id);
    if (list) list.push(r); else spots.set(r.spot_id, [r]);
  }
  for (const list of spots.values()) {
    const first = list[0]!;
    const observations: SpotObservation[] = list.map((r) => ({
      sessionId: r.session_id, measuredOn: r.measured_on, recordedAt: r.created_at,
      conditions: { illuminant: r.illuminant, observer: r.observer as MeasurementConditions['observer'], geometry: r.geometry, condition: r.condition as MeasurementConditions['condition'] },
      lab: { L: r.mean_l, a: r.mean_a, b: r.mean_b }, density: r.density, densityType: r.density_type, reflectance: r.reflectance,
    }));
    const analysis = analyseSpotHistory(observations, { baselineSessionId: first.baseline_session_id, threshold });
    const spot: AnalysedSpot = { printId: first.print_id, spotId: first.spot_id, purpose: first.purpose, baselineSessionId: first.baseline_session_id, observations, analysis };
    const of = byPrint.get(first.print_id);
    if (of) of.push(spot); else byPrint.set(first.print_id, [spot]);
  }
  return { threshold, byPrint };
}
