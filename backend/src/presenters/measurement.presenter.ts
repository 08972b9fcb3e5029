import type { z } from 'zod';
import type {
  MeasurementSession as SessionDto, Spot as SpotDto, SpotAnalysis as SpotAnalysisDto, projectionSchema,
} from '@toneledger/common/schemas/measurements';
import type { FadingRateResult, ThresholdProjection } from '@toneledger/common/domain/fading';
import type { SpotChange } from '@toneledger/common/domain/spot-analysis';
import type { MeasurementSession, MeasurementSpot, SpotReading } from '../models';

type ProjectionDto = z.infer<typeof projectionSchema>;
type RateDto = NonNullable<SpotAnalysisDto['rate']>;

const iso = (d: Date) => d.toISOString();

export function presentSpot(s: MeasurementSpot): SpotDto {
  return {
    id: s.id, printId: s.printId, name: s.name, purpose: s.purpose as SpotDto['purpose'],
    point: s.point ? { imageId: s.point.imageId, x: s.point.x, y: s.point.y } : null,
    notes: s.notes,
    baseline: s.baselineSessionId && s.baselineChosenAt
      ? { sessionId: s.baselineSessionId, chosenBy: s.baselineChosenByName, chosenAt: iso(s.baselineChosenAt), reason: s.baselineReason ?? '' }
      : null,
    version: s.version,
  };
}

/**
 * A session with its readings, in the order of `spots` (the print's spots as registered); the
 * spot names come from that list.
 */
export function presentSession(s: MeasurementSession, readings: SpotReading[], spots: MeasurementSpot[]): SessionDto {
  const order = new Map(spots.map((spot, i) => [spot.id, i]));
  const names = new Map(spots.map((spot) => [spot.id, spot.name]));
  const sorted = [...readings].sort((a, b) => (order.get(a.spotId) ?? Infinity) - (order.get(b.spotId) ?? Infinity));
  return {
    id: s.id, printId: s.printId, measuredOn: s.measuredOn, measuredBy: s.measuredByName, instrument: s.instrument, serial: s.serial,
    illuminant: s.illuminant as SessionDto['illuminant'], observer: s.observer as SessionDto['observer'],
    geometry: s.geometry as SessionDto['geometry'], condition: s.condition as SessionDto['condition'],
    aperture: s.aperture, backing: s.backing, notes: s.notes,
    readings: sorted.map((r) => ({
      spotId: r.spotId, spotName: names.get(r.spotId) ?? '', mean: { L: r.meanL, a: r.meanA, b: r.meanB }, n: r.n,
      sd: r.sd, maxPairwiseDeltaE00: r.maxPairwiseDe, density: r.density, densityType: r.densityType as SessionDto['readings'][number]['densityType'],
      reflectance: r.reflectance,
    })),
    createdAt: iso(s.createdAt),
  };
}

export function presentRate(r: FadingRateResult | null): RateDto | null {
  if (!r) return null;
  if (!r.ok) return { ok: false, reason: r.reason, message: r.message };
  return { ok: true, slopePerYear: r.slopePerYear, intercept: r.intercept, standardError: r.standardError, ci95: r.ci95, n: r.n, spanYears: r.spanYears, r2: r.r2 };
}

/** ISO 8601 needs a four-digit year: a trend that reaches a threshold outside 0000–9999 has no date to give. */
function isoInRange(d: Date): string | null {
  const y = d.getUTCFullYear();
  return Number.isFinite(d.getTime()) && y >= 0 && y <= 9999 ? iso(d) : null;
}

export function presentProjection(p: ThresholdProjection | null): ProjectionDto | null {
  if (!p) return null;
  if (!p.reached) return { reached: false, threshold: p.threshold, reason: p.reason };
  if (p.alreadyReached) {
    const firstDate = isoInRange(p.firstDate);
    if (firstDate) return { reached: true, alreadyReached: true, threshold: p.threshold, firstDate };
    return { reached: false, threshold: p.threshold, reason: 'no representable date on current trend' };
  }
  const date = isoInRange(p.date);
  if (!date) return { reached: false, threshold: p.threshold, reason: 'not reached before the year 10000 on current trend' };
  const earliest = isoInRange(p.interval.earliest) ?? date;
  return {
    reached: true, alreadyReached: false, threshold: p.threshold, date,
    // A latest date beyond the representable range is as open-ended as a slope interval reaching zero.
    interval: { earliest, latest: p.interval.latest ? isoInRange(p.interval.latest) : null },
  };
}

/** One spot with its analysis (common/src/domain/spot-analysis.ts; dates still as Date objects inside rate and projection). */
export type SpotAnalysisResult = SpotChange & { spot: MeasurementSpot };

export function presentAnalysis(a: SpotAnalysisResult): SpotAnalysisDto {
  return {
    spot: presentSpot(a.spot), baseline: a.baseline, points: a.points,
    rate: presentRate(a.rate), densityChangeRate: presentRate(a.densityChangeRate), densityLossRate: presentRate(a.densityLossRate), projection: presentProjection(a.projection),
  };
}

/** The date a leader row shows: when the trend reaches the threshold, or when it was first reached. */
export function projectedDateOf(p: ProjectionDto | null): string | null {
  if (!p || !p.reached) return null;
  return p.alreadyReached ? p.firstDate : p.date;
}
