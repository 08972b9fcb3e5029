/**
 * One measurement spot's change over the years, from the readings of its sessions: the baseline,
 * each session's colour and density change against it, whether the two may be compared at all,
 * the rate of change with its interval, and when the trend reaches a threshold.
 *
 * The server stores readings and answers with this analysis; the client can run the same
 * functions to preview a session before it is recorded. The arithmetic itself lives in
 * `colour.ts` (CIEDE2000, ΔL/ΔC/ΔH, density) and `fading.ts` (rate and projection).
 */
import { ciede2000Parts } from './ciede2000-parts';
import {
  classifyChange, comparable, densityChange, densityFromReflectance, type DominantChange, type Lab, type MeasurementConditions,
} from './colour';
import { fadingRate, projectThreshold, type FadingRateResult, type SeriesPoint, type ThresholdProjection } from './fading';

/** One session's averaged reading of one spot, with what the analysis needs of the session. */
export interface SpotObservation {
  sessionId: string;
  /** The day measured, YYYY-MM-DD. */
  measuredOn: string;
  /** When the session was recorded: orders sessions measured on the same day. */
  recordedAt: Date | string;
  conditions: MeasurementConditions;
  /** The mean of the session's readings at this spot. */
  lab: Lab;
  /** A density given by the instrument, if any. */
  density: number | null;
  /** What kind of density it is (visual, status A…), when known. */
  densityType: string | null;
  /** Reflectance factor in (0, 1], if given. */
  reflectance: number | null;
}

export interface SpotBaseline {
  sessionId: string;
  measuredOn: string;
  lab: Lab;
  density: number | null;
  /** True when someone chose this session; false when it is the first session by default. */
  chosen: boolean;
}

interface PointBase {
  sessionId: string;
  measuredOn: string;
  lab: Lab;
  density: number | null;
}

/** A session measured under other conditions than the baseline: kept and shown, never compared. */
export interface IncomparablePoint extends PointBase {
  comparable: false;
  reason: string;
  dE00: null; dE76: null; dL: null; dC: null; dH: null;
  dLPrime: null; dCPrime: null; dHPrime: null;
  dominant: null;
  dD: null;
  densityLossPercent: null;
}

export interface ComparablePoint extends PointBase {
  comparable: true;
  reason: null;
  dE00: number; dE76: number; dL: number; dC: number; dH: number;
  /** The CIEDE2000 components ΔL′, ΔC′, ΔH′ (ciede2000-parts.ts); dL, dC, dH are CIELAB's ΔL*, ΔC*ab, ΔH*ab. */
  dLPrime: number; dCPrime: number; dHPrime: number;
  dominant: DominantChange | null;
  /** ΔD = D − D0; null without a density at both, or when both name different kinds of density. */
  dD: number | null;
  densityLossPercent: number | null;
}

export type SpotPoint = ComparablePoint | IncomparablePoint;

export interface SpotChange {
  baseline: SpotBaseline | null;
  /** Every session that measured the spot, oldest first. */
  points: SpotPoint[];
  /** ΔE00 per year over the fitted points; null when the spot has no reading. */
  rate: FadingRateResult | null;
  /**
   * Density change per year, in D/year (the fit of ΔD = D − D0): negative while the density falls.
   * Null without a baseline density or without a comparable density after it.
   */
  densityChangeRate: FadingRateResult | null;
  /**
   * Density lost per year, in % of the baseline density per year (the fit of the % loss): positive
   * while the density falls. The same fit as `densityChangeRate` scaled by −100 / D0; null also
   * when the baseline density is 0.
   */
  densityLossRate: FadingRateResult | null;
  /** When the ΔE00 trend reaches the threshold; null without a rate. */
  projection: ThresholdProjection | null;
}

/** The density recorded, or else the one its reflectance gives (D = −log10 R); null with neither. */
export function densityOf(o: Pick<SpotObservation, 'density' | 'reflectance'>): number | null {
  if (o.density !== null) return o.density;
  return o.reflectance !== null ? densityFromReflectance(o.reflectance) : null;
}

const timeOf = (d: Date | string) => (d instanceof Date ? d.getTime() : new Date(d).getTime());

/** Oldest first: by the day measured, then by when the session was recorded. */
export function chronological(x: SpotObservation, y: SpotObservation): number {
  return x.measuredOn.localeCompare(y.measuredOn) || timeOf(x.recordedAt) - timeOf(y.recordedAt);
}

/** Both readings say what kind of density they are, and the kinds differ. */
export function densityKindsDiffer(baseline: Pick<SpotObservation, 'densityType'>, later: Pick<SpotObservation, 'densityType'>): boolean {
  return baseline.densityType !== null && later.densityType !== null && baseline.densityType !== later.densityType;
}

/**
 * One session's change against the baseline. A session whose conditions are not comparable with
 * the baseline's (see `comparable`) keeps its reading and density but gets no differences and
 * carries the reason.
 */
export function pointAgainst(base: SpotObservation, o: SpotObservation): SpotPoint {
  const density = densityOf(o);
  const common = { sessionId: o.sessionId, measuredOn: o.measuredOn, lab: o.lab, density };
  const verdict = comparable(base.conditions, o.conditions);
  if (!verdict.ok) {
    return {
      ...common, comparable: false, reason: verdict.reason,
      dE00: null, dE76: null, dL: null, dC: null, dH: null, dLPrime: null, dCPrime: null, dHPrime: null,
      dominant: null, dD: null, densityLossPercent: null,
    };
  }
  const change = classifyChange(base.lab, o.lab);
  const d = change.difference;
  const parts = ciede2000Parts(base.lab, o.lab);
  const baseDensity = densityOf(base);
  const dc = baseDensity !== null && density !== null && !densityKindsDiffer(base, o) ? densityChange(baseDensity, density) : null;
  return {
    ...common, comparable: true, reason: null,
    dE00: d.dE00, dE76: d.dE76, dL: d.dL, dC: d.dC, dH: d.dH, dominant: change.dominant,
    dLPrime: parts.dLPrime, dCPrime: parts.dCPrime, dHPrime: parts.dHPrime,
    dD: dc ? dc.deltaD : null, densityLossPercent: dc ? dc.percentLoss : null,
  };
}

/** The points a rate is fitted to: the comparable ones from the baseline's date on. */
export function fittedPoints(change: Pick<SpotChange, 'baseline' | 'points'>): ComparablePoint[] {
  const base = change.baseline;
  if (!base) return [];
  return change.points.filter((p): p is ComparablePoint => p.comparable && p.measuredOn >= base.measuredOn);
}

/**
 * One spot's change, session by session, against its baseline: the session chosen as baseline
 * (`baselineSessionId`), or else the first session (by date) that measured the spot.
 *
 * - Each point is judged with `comparable()` on its session's conditions and the baseline's.
 *   A point that is not comparable gets no differences, carries the reason, and is not fitted.
 * - ΔD and % loss need a density at both; they are also left empty when both say what kind of
 *   density they are and the kinds differ.
 * - The rates (ΔE00/year, D/year, % of the baseline density/year) fit the comparable points from the baseline date on: a baseline chosen after a
 *   treatment restarts the clock, and earlier points are shown but not fitted.
 * - The projection is that of the ΔE00 rate, with the observed points deciding whether the
 *   threshold has already been reached.
 */
export function analyseSpotHistory(
  observations: readonly SpotObservation[],
  options: { baselineSessionId: string | null; threshold: number },
): SpotChange {
  const ordered = [...observations].sort(chronological);
  const chosen = options.baselineSessionId ? ordered.find((o) => o.sessionId === options.baselineSessionId) : undefined;
  const base = chosen ?? ordered[0];
  if (!base) return { baseline: null, points: [], rate: null, densityChangeRate: null, densityLossRate: null, projection: null };

  const baseDensity = densityOf(base);
  const baseline: SpotBaseline = { sessionId: base.sessionId, measuredOn: base.measuredOn, lab: base.lab, density: baseDensity, chosen: chosen !== undefined };
  const points = ordered.map((o) => pointAgainst(base, o));

  const fitted = fittedPoints({ baseline, points });
  const colourSeries: SeriesPoint[] = fitted.map((p) => ({ t: p.measuredOn, value: p.dE00 }));
  const rate = fadingRate(colourSeries);
  const changeSeries: SeriesPoint[] = fitted.flatMap((p) => (p.dD !== null ? [{ t: p.measuredOn, value: p.dD }] : []));
  const lossSeries: SeriesPoint[] = fitted.flatMap((p) => (p.densityLossPercent !== null ? [{ t: p.measuredOn, value: p.densityLossPercent }] : []));
  const densityChangeRate = baseDensity !== null && changeSeries.length > 0 ? fadingRate(changeSeries) : null;
  const densityLossRate = baseDensity !== null && lossSeries.length > 0 ? fadingRate(lossSeries) : null;
  const projection = rate.ok ? projectThreshold(rate, { t: base.measuredOn }, options.threshold, colourSeries) : null;
  return { baseline, points, rate, densityChangeRate, densityLossRate, projection };
}

/** The latest ΔE00 from the baseline among the fitted points; null when there is none. */
export function latestDeltaE00(change: Pick<SpotChange, 'baseline' | 'points'>): number | null {
  return fittedPoints(change).at(-1)?.dE00 ?? null;
}

// ── Ranking spots across the collection ──

export interface RankedSpot {
  ratePerYear: number | null;
  latestDeltaE00: number | null;
  /** The print's accession sort key (see accession.ts), then the spot's name, break ties. */
  accessionSort: string;
  spotName: string;
}

/** Larger first, unknowns last. */
const descending = (x: number | null, y: number | null) => (x === null ? (y === null ? 0 : 1) : y === null ? -1 : y - x);

/**
 * The order of the leaders list: by rate (ΔE00 per year) then latest change, or the other way
 * round; larger first, unknowns last; ties by accession number, then spot name.
 */
export function compareRankedSpots(sort: 'rate' | 'change'): (x: RankedSpot, y: RankedSpot) => number {
  const [first, second] = sort === 'rate' ? (['ratePerYear', 'latestDeltaE00'] as const) : (['latestDeltaE00', 'ratePerYear'] as const);
  return (x, y) =>
    descending(x[first], y[first]) || descending(x[second], y[second]) ||
    x.accessionSort.localeCompare(y.accessionSort) || x.spotName.localeCompare(y.spotName);
}
