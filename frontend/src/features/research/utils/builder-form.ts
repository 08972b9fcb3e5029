import { COHORT_FACTORS, COHORT_FACTOR_CODES, type CohortFactorCode } from '@toneledger/common/fields/cohort';
import type { CohortFilter, CohortQuery, CohortQueryIn } from '@toneledger/common/schemas/research';
import { typedNumber } from '@/lib/forms/typed-number';

/** What the controls of one factor's filter hold: chosen values (choice, text, flag) or typed text. */
export interface FilterValues { values: string[]; min: string; max: string; locationId: string; fromYear: string; toYear: string }

/** The builder's controls: one filter per factor of the table, keyed by factor code. */
export interface BuilderValues {
  filters: Record<CohortFactorCode, FilterValues>;
  groupBy1: string;
  groupBy2: string;
  /** Cut points of a number factor grouped by, typed as "2, 5" (decimals with a point). */
  bands: Record<string, string>;
  eventKind: string;
  threshold: string;
  term: string;
  grade: string;
  origin: string;
  ci: string;
  coxFactors: string[];
}

const blankFilter = (): FilterValues => ({ values: [], min: '', max: '', locationId: '', fromYear: '', toYear: '' });
const text = (n: number | undefined) => (n === undefined ? '' : String(n));

export function toValues(q: CohortQuery): BuilderValues {
  const filters = Object.fromEntries(COHORT_FACTOR_CODES.map((c) => [c, blankFilter()])) as Record<CohortFactorCode, FilterValues>;
  for (const f of q.filters) {
    filters[f.factor] = { values: f.values ?? [], min: text(f.min), max: text(f.max), locationId: f.locationId ?? '', fromYear: text(f.fromYear), toYear: text(f.toYear) };
  }
  return {
    filters,
    groupBy1: q.groupBy[0] ?? '',
    groupBy2: q.groupBy[1] ?? '',
    bands: Object.fromEntries(Object.entries(q.bands ?? {}).map(([k, cuts]) => [k, cuts.join(', ')])),
    eventKind: q.event.kind,
    threshold: text(q.event.thresholdDeltaE),
    term: q.event.term ?? '',
    grade: q.event.grade ?? '',
    origin: q.origin,
    ci: q.ci,
    coxFactors: q.coxFactors,
  };
}

/** Whether the person gave anything for this factor's filter (an untouched factor is no filter). */
function given(f: FilterValues): boolean {
  return f.values.length > 0 || [f.min, f.max, f.locationId, f.fromYear, f.toYear].some((v) => v.trim() !== '');
}

const num = (s: string) => {
  const n = typedNumber(s);
  return n === null ? undefined : n;
};

/** The factors that hold a filter, in the table's order: the order of `filters` in the body. */
export function filteredFactors(v: BuilderValues): CohortFactorCode[] {
  return COHORT_FACTOR_CODES.filter((c) => given(v.filters[c]));
}

/** The controls as the cohort query (the schema checks it; text that is not a number stays text so it says so). */
export function toBody(v: BuilderValues): CohortQueryIn {
  const filters = filteredFactors(v).map((factor) => {
    const f = v.filters[factor];
    const kind = COHORT_FACTORS[factor].kind;
    const out: Record<string, unknown> = { factor };
    if (kind === 'choice' || kind === 'text' || kind === 'flag') out.values = f.values;
    if (kind === 'number') Object.assign(out, { min: num(f.min), max: num(f.max) });
    if (kind === 'place') out.locationId = f.locationId || undefined;
    if (kind === 'year') Object.assign(out, { fromYear: num(f.fromYear), toYear: num(f.toYear) });
    return out as CohortFilter;
  });
  const groupBy = [v.groupBy1, v.groupBy2].filter(Boolean) as CohortFactorCode[];
  const bands: Record<string, unknown[]> = {};
  for (const g of groupBy) {
    const typed = (v.bands[g] ?? '').trim();
    if (COHORT_FACTORS[g].kind === 'number' && typed) bands[g] = typed.split(/[;,\s]+/).filter(Boolean).map((s) => typedNumber(s));
  }
  const event: Record<string, unknown> = { kind: v.eventKind };
  if (v.eventKind === 'fading' && v.threshold.trim()) event.thresholdDeltaE = typedNumber(v.threshold);
  if (v.eventKind === 'observation') event.term = v.term || undefined;
  if (v.eventKind === 'grade') event.grade = v.grade || undefined;
  return {
    filters,
    groupBy,
    ...(Object.keys(bands).length ? { bands: bands as Record<string, number[]> } : {}),
    event: event as CohortQueryIn['event'],
    origin: v.origin as CohortQuery['origin'],
    ci: v.ci as CohortQuery['ci'],
    coxFactors: v.coxFactors as CohortFactorCode[],
  };
}

/** A path of the body (`filters.1.max`, `event.term`) as the control that shows it. */
export function fieldFor(path: string, v: BuilderValues): string {
  const parts = path.split('.');
  if (parts[0] === 'filters' && parts.length >= 3) {
    const factor = filteredFactors(v)[Number(parts[1])];
    if (factor) return `filters.${factor}.${parts[2]}`;
  }
  if (parts[0] === 'groupBy') return parts[1] === '1' ? 'groupBy2' : 'groupBy1';
  if (parts[0] === 'bands' && parts[1]) return `bands.${parts[1]}`;
  if (path === 'event.thresholdDeltaE') return 'threshold';
  if (path === 'event.term') return 'term';
  if (path === 'event.grade') return 'grade';
  if (path === 'event.kind') return 'eventKind';
  return path;
}
