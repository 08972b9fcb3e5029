import type { Print } from '@toneledger/common/schemas/catalogue';
import type { SpotAnalysis } from '@toneledger/common/schemas/measurements';
import { PROCESS, TONER_CLASS } from '@toneledger/common/schemas/vocab';

type Rate = SpotAnalysis['rate'];
type Projection = SpotAnalysis['projection'];

/** A typographic minus, so negative figures read as numbers and line up. */
function minus(text: string): string {
  return text.replace(/^-/, '−');
}

/** A figure with a fixed number of decimals (2 unless told), negative with a real minus sign. */
export function formatNumber(value: number, digits = 2): string {
  const text = value.toFixed(digits);
  // "-0.00" is zero.
  return Number(text) === 0 ? (0).toFixed(digits) : minus(text);
}

/** A difference with its sign always shown: +1.20, −0.45, 0.00. */
export function formatSigned(value: number, digits = 2): string {
  const text = formatNumber(value, digits);
  return value > 0 && Number(text) !== 0 ? `+${text}` : text;
}

/** The threshold as set: at least one decimal (2.0, 1.6, 1.25). */
export function formatThreshold(value: number): string {
  return new Intl.NumberFormat('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 2 }).format(value);
}

const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const monthYear = new Intl.DateTimeFormat('en-GB', { month: 'long', year: 'numeric', timeZone: 'UTC' });

/** A calendar date (YYYY-MM-DD, or the day of an ISO date-time), read in UTC so it never shifts a day. */
export function formatDay(iso: string | null | undefined): string {
  if (!iso) return '—';
  const date = new Date(iso.length === 10 ? `${iso}T00:00:00Z` : iso);
  return Number.isNaN(date.getTime()) ? iso : day.format(date);
}

export function formatMonthYear(iso: string): string {
  return monthYear.format(new Date(iso));
}

export function formatYear(iso: string): string {
  return String(new Date(iso).getUTCFullYear());
}

/** A range of two figures: "0.15–0.27", or "−0.02 to 0.05" when a dash would read as a minus. */
export function formatRange(low: number, high: number, digits = 2): string {
  const a = formatNumber(low, digits);
  const b = formatNumber(high, digits);
  return low < 0 || high < 0 ? `${a} to ${b}` : `${a}–${b}`;
}

/**
 * The rate of change in words: "0.21 ΔE00/year (95 % CI 0.15–0.27, n = 6 over 24.0 years)", or the
 * server's own explanation of why no rate is given.
 */
export function rateText(rate: Rate, unit = 'ΔE00/year', digits = 2): string {
  if (!rate) return 'No rate: there are no comparable measurements at this spot yet.';
  if (!rate.ok) return rate.message;
  const span = rate.spanYears.toFixed(1);
  return `${formatNumber(rate.slopePerYear, digits)} ${unit} (95 % CI ${formatRange(rate.ci95[0], rate.ci95[1], digits)}, n = ${rate.n} over ${span} ${span === '1.0' ? 'year' : 'years'})`;
}

/**
 * When the change becomes noticeable, in words:
 * "reaches ΔE00 2.0 around March 2031 (between 2029 and 2036)", "not reached on current trend",
 * "already beyond the threshold since 4 May 2019".
 */
export function projectionText(projection: Projection): string {
  if (!projection) return 'no projection without a rate';
  if (!projection.reached) return projection.reason.trim() || 'not reached on current trend';
  if (projection.alreadyReached) return `already beyond the threshold since ${formatDay(projection.firstDate)}`;
  const { earliest, latest } = projection.interval;
  const from = formatYear(earliest);
  const interval =
    latest === null
      ? `not before ${from}; no latest year can be given on current data`
      : from === formatYear(latest)
        ? `within ${from}`
        : `between ${from} and ${formatYear(latest)}`;
  return `reaches ΔE00 ${formatThreshold(projection.threshold)} around ${formatMonthYear(projection.date)} (${interval})`;
}

/** The first letter in capitals, for a phrase that starts a sentence. */
export function sentence(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Process and toners on one line, under the accession number and title. */
export function identityLine(print: Pick<Print, 'process' | 'tonerClasses'>): string {
  const toners = print.tonerClasses.map((t) => TONER_CLASS.labels[t]).join(', ');
  return `${PROCESS.labels[print.process]} · ${toners ? `toned: ${toners}` : 'no toning recorded'}`;
}
