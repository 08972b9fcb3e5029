import { MS_PER_YEAR } from '@toneledger/common/domain/fading';
import type { SpotAnalysis } from '@toneledger/common/schemas/measurements';
import { valueAxis, yearAxis, type Axis } from '@/lib/chart-axis';

export interface ChartPoint {
  /** Milliseconds since the epoch (UTC midnight of the session date). */
  t: number;
  value: number;
}

export interface ExcludedPoint {
  sessionId: string;
  measuredOn: string;
  reason: string;
}

export interface ChangeChartData {
  /** Comparable sessions with a ΔE00 against the baseline: the only points plotted. */
  observed: ChartPoint[];
  /** Sessions that cannot be compared with the baseline, with the reason; never plotted. */
  excluded: ExcludedPoint[];
  /** The fitted straight line over the span of the fitted sessions, when there is a rate. */
  trend: ChartPoint[] | null;
  /** The fitted line carried on (dashed) from the last fitted session to the projected date. */
  projection: ChartPoint[] | null;
  /** True when the projected date lies beyond the drawn time axis and the dashed line is cut there. */
  projectionCut: boolean;
  /** The projected date's interval, clipped to the axis; `to` is the axis end when it is open-ended. */
  band: { from: number; to: number } | null;
  /** Density loss in % of the baseline density, for comparable sessions that have it. */
  densityLoss: ChartPoint[];
  /** The span of time drawn: first plotted session to the last point, projection or band. */
  domain: [number, number];
  /** Top of the ΔE00 axis: above the threshold and the highest point. */
  yMax: number;
  /** The time axis of both charts: whole years around `domain`, labelled at round intervals. */
  timeAxis: Axis;
  /** The ΔE00 axis: 0 to `yMax`, with round ticks. */
  changeAxis: Axis;
  /** The density-loss axis (%), with round ticks. */
  densityAxis: Axis;
}

export function dayToMs(isoDay: string): number {
  return Date.parse(isoDay.length === 10 ? `${isoDay}T00:00:00Z` : isoDay);
}

/** A projection further than this past the last session is cut at the axis end, so the data stay readable. */
export const MAX_PROJECTION_YEARS = 30;

/**
 * Turns one spot's analysis into what the chart draws. Only comparable points are plotted;
 * points measured under other conditions are listed apart with their reason.
 */
export function changeChartData(analysis: SpotAnalysis, threshold: number): ChangeChartData {
  const observed = analysis.points
    .filter((p) => p.comparable && p.dE00 !== null)
    .map((p) => ({ t: dayToMs(p.measuredOn), value: p.dE00 as number }))
    .sort((a, b) => a.t - b.t);
  const excluded = analysis.points
    .filter((p) => !p.comparable)
    .map((p) => ({ sessionId: p.sessionId, measuredOn: p.measuredOn, reason: p.reason ?? 'Not comparable with the baseline' }));
  const densityLoss = analysis.points
    .filter((p) => p.comparable && p.densityLossPercent !== null)
    .map((p) => ({ t: dayToMs(p.measuredOn), value: p.densityLossPercent as number }))
    .sort((a, b) => a.t - b.t);

  const first = observed[0]?.t ?? null;
  const last = observed.at(-1)?.t ?? null;

  let trend: ChartPoint[] | null = null;
  const rate = analysis.rate;
  if (rate?.ok && first !== null && analysis.baseline) {
    // The fit counts time in years from its earliest session, which is the baseline: sessions
    // before a baseline chosen later are plotted but not fitted.
    const origin = dayToMs(analysis.baseline.measuredOn);
    const end = origin + rate.spanYears * MS_PER_YEAR;
    trend = [
      { t: origin, value: rate.intercept },
      { t: end, value: rate.intercept + rate.slopePerYear * rate.spanYears },
    ];
  }

  let end = Math.max(last ?? 0, trend?.[1]?.t ?? 0);
  const start = first ?? end;
  const cap = end + MAX_PROJECTION_YEARS * MS_PER_YEAR;

  let projection: ChartPoint[] | null = null;
  let projectionCut = false;
  let band: ChangeChartData['band'] = null;
  const p = analysis.projection;
  if (p && p.reached && !p.alreadyReached && trend) {
    const from = trend[1]!;
    const target = Date.parse(p.date);
    if (target > from.t) {
      if (target > cap) {
        projectionCut = true;
        const share = (cap - from.t) / (target - from.t);
        projection = [from, { t: cap, value: from.value + (p.threshold - from.value) * share }];
      } else {
        projection = [from, { t: target, value: p.threshold }];
      }
      const axisEnd = projection[1]!.t;
      const earliest = Math.min(Date.parse(p.interval.earliest), axisEnd);
      // An open-ended interval runs to the end of the axis.
      const latest = p.interval.latest === null ? Math.max(axisEnd, earliest) : Math.min(Date.parse(p.interval.latest), cap);
      band = { from: Math.max(earliest, start), to: Math.max(latest, earliest) };
      end = Math.max(axisEnd, band.to);
    }
  }
  if (end <= start) end = start + MS_PER_YEAR;

  const highest = Math.max(threshold, ...observed.map((o) => o.value), ...(trend ?? []).map((o) => o.value));
  // Room above the highest value for the threshold's label; the ends are then rounded to the ticks.
  const changeAxis = valueAxis(0, highest * 1.15, 5);
  const densityAxis = valueAxis(Math.min(0, ...densityLoss.map((p) => p.value)), Math.max(1, ...densityLoss.map((p) => p.value)), 4);
  return {
    observed,
    excluded,
    trend,
    projection,
    projectionCut,
    band,
    densityLoss,
    domain: [start, end],
    yMax: changeAxis.domain[1],
    timeAxis: yearAxis([start, end]),
    changeAxis,
    densityAxis,
  };
}
