/**
 * Summaries of a list of values (fading rates per group) and of a share (incidence of a
 * deterioration term). Pure, no I/O.
 */
import { normalQuantileForLevel } from './survival';

/** The R default ("type 7") quantile of sorted values: linear interpolation at h = (n − 1)·p. */
function quantileSorted(sorted: number[], p: number): number {
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/** n, median, quartiles (R's default "type 7" quantile, Hyndman & Fan 1996), min, max; nulls for an empty list. */
export function describe(values: number[]): { n: number; median: number | null; q1: number | null; q3: number | null; min: number | null; max: number | null } {
  for (const [i, v] of values.entries()) if (!Number.isFinite(v)) throw new RangeError(`value ${i} is not a finite number (got ${v})`);
  if (values.length === 0) return { n: 0, median: null, q1: null, q3: null, min: null, max: null };
  const s = [...values].sort((a, b) => a - b);
  return { n: s.length, median: quantileSorted(s, 0.5), q1: quantileSorted(s, 0.25), q3: quantileSorted(s, 0.75), min: s[0], max: s[s.length - 1] };
}

/**
 * A share count/n with its Wilson score interval (E. B. Wilson, JASA 22:209–212, 1927; method 3 of
 * R. G. Newcombe, Statistics in Medicine 17:857–872, 1998): the proportions π for which
 * |p̂ − π| ≤ z·√(π(1 − π)/n), i.e. (p̂ + z²/2n ± z·√(p̂(1 − p̂)/n + z²/4n²)) / (1 + z²/n).
 * With n = 0 nothing is known: share 0, interval [0, 1].
 */
export function wilsonInterval(count: number, n: number, level = 0.95): { share: number; lower: number; upper: number } {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`n must be a whole number ≥ 0 (got ${n})`);
  if (!Number.isInteger(count) || count < 0 || count > n) throw new RangeError(`count must be a whole number from 0 to n (got ${count})`);
  if (n === 0) return { share: 0, lower: 0, upper: 1 };
  const z = normalQuantileForLevel(level);
  const p = count / n;
  const z2 = z * z;
  const den = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / den;
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / den;
  return { share: p, lower: count === 0 ? 0 : Math.max(0, centre - half), upper: count === n ? 1 : Math.min(1, centre + half) };
}
