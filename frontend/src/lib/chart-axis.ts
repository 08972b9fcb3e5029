import { nice, tickStep, ticks } from 'd3-array';

// Chart axes shared by the features that draw charts (measurements, light dose).

/** What a chart axis is given: its extent and the values it labels. */
export interface Axis {
  domain: [number, number];
  ticks: number[];
}

/**
 * A value axis with round ticks (0, 5, 10, 15 or 0, 0.5, 1…): [low, high] widened by d3-array's
 * `nice` to multiples of the tick step, and d3-array's `ticks` in it, so both ends carry a tick
 * and the steps are even. `count` is the number of steps aimed at (d3 picks 1, 2 or 5 × 10^k).
 */
export function valueAxis(low: number, high: number, count = 5): Axis {
  let lo = Math.min(low, high);
  let hi = Math.max(low, high);
  if (hi === lo) hi = lo + 1;
  [lo, hi] = nice(lo, hi, count);
  return { domain: [lo, hi], ticks: ticks(lo, hi, count) };
}

/** The calendar year of a time (ms since the epoch, UTC) as a decimal: 1 July 2000 ≈ 2000.5. */
export function decimalYear(ms: number): number {
  const year = new Date(ms).getUTCFullYear();
  const from = Date.UTC(year, 0, 1);
  return year + (ms - from) / (Date.UTC(year + 1, 0, 1) - from);
}

/** 1 January of `year` (UTC), in ms. */
const newYear = (year: number) => Date.UTC(year, 0, 1);

/**
 * A time axis in whole years: from 1 January of the first year to 1 January after the last
 * (with a little room so no session sits on an edge), labelled every 1, 2, 5, 10, 20… years
 * (d3-array's `tickStep`, never less than a year) on years that are multiples of the step.
 */
export function yearAxis([start, end]: [number, number], count = 6): Axis {
  const pad = Math.max((end - start) * 0.03, 86_400_000);
  const first = Math.floor(decimalYear(start - pad));
  const last = Math.ceil(decimalYear(end + pad));
  const step = Math.max(1, tickStep(first, last, count));
  const labelled: number[] = [];
  for (let y = Math.ceil(first / step) * step; y <= last; y += step) labelled.push(newYear(y));
  return { domain: [newYear(first), newYear(last)], ticks: labelled };
}

/** The year a tick stands for. */
export const yearLabel = (t: number) => String(new Date(t).getUTCFullYear());
