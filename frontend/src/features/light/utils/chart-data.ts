import type { PrintLight } from '@toneledger/common/schemas/light';
import { valueAxis, yearAxis, type Axis } from '@/lib/chart-axis';

const DAY_MS = 86_400_000;
const YEAR_MS = 365 * DAY_MS;

/** A calendar day 'YYYY-MM-DD' as ms since the epoch (UTC midnight). */
export const dayMs = (day: string) => Date.parse(`${day}T00:00:00Z`);

export interface ExposurePoint {
  t: number;
  value: number;
}

export interface DisplayBand {
  id: string;
  from: number;
  /** The day after the last day shown, so a one-day display still has width. */
  to: number;
  title: string;
  /** Not yet ended on the day the figures are for. */
  planned: boolean;
}

export interface ExposureChartData {
  cumulative: ExposurePoint[];
  /** The annual budget accumulated from the first display: what the print may have had by each day, at most. */
  budgetLine: ExposurePoint[] | null;
  bands: DisplayBand[];
  timeAxis: Axis;
  valueAxis: Axis;
  asOf: number;
}

/**
 * The chart of cumulative lux-hours: the server's series as points, each display as a band, and the
 * budget line (the annual budget as a rate, from the first display on). The value axis has round
 * ticks over the exposure and the budget line as far as the exposure goes; later budget runs off the
 * top. Null when the print has never been on display.
 */
export function exposureChartData(light: Pick<PrintLight, 'series' | 'displays' | 'budget' | 'asOf'>): ExposureChartData | null {
  if (light.series.length === 0) return null;
  const cumulative = light.series.map((p) => ({ t: dayMs(p.date), value: p.luxHours }));
  const asOf = dayMs(light.asOf);
  const first = cumulative[0]!.t;
  const last = Math.max(cumulative.at(-1)!.t, asOf);
  const timeAxis = yearAxis([first, last]);
  const annual = light.budget.annualLuxHours;
  const allowedAt = (t: number) => ((annual ?? 0) * (t - first)) / YEAR_MS;
  const budgetLine = annual === null ? null : [{ t: first, value: 0 }, { t: timeAxis.domain[1], value: allowedAt(timeAxis.domain[1]) }];
  const highest = Math.max(...cumulative.map((p) => p.value), annual === null ? 0 : allowedAt(cumulative.at(-1)!.t));
  const bands = light.displays.map((d) => ({
    id: d.id,
    from: dayMs(d.startsOn),
    to: dayMs(d.endsOn) + DAY_MS,
    title: d.exhibitionTitle,
    planned: d.endsOn >= light.asOf,
  }));
  return { cumulative, budgetLine, bands, timeAxis, valueAxis: valueAxis(0, highest), asOf };
}
