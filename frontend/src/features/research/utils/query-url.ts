import { cohortQuerySchema, type CohortQuery } from '@toneledger/common/schemas/research';

/** The URL parameter holding the cohort query, as compact JSON. */
export const QUERY_PARAM = 'q';

export const EMPTY_QUERY: CohortQuery = cohortQuerySchema.parse({});

/**
 * A query as the URL's `q`: compact JSON with the defaults left out, so a link reads
 * `?q={"filters":[…],"groupBy":["alkalineAfterBath"]}` and reproduces the query exactly.
 */
export function encodeQuery(query: CohortQuery): string {
  const out: Record<string, unknown> = {};
  if (query.filters.length) out.filters = query.filters;
  if (query.groupBy.length) out.groupBy = query.groupBy;
  if (query.bands && Object.keys(query.bands).length) out.bands = query.bands;
  if (JSON.stringify(query.event) !== JSON.stringify(EMPTY_QUERY.event)) out.event = query.event;
  if (query.origin !== EMPTY_QUERY.origin) out.origin = query.origin;
  if (query.ci !== EMPTY_QUERY.ci) out.ci = query.ci;
  if (query.coxFactors.length) out.coxFactors = query.coxFactors;
  return JSON.stringify(out);
}

export type DecodedQuery = { query: CohortQuery; problem: null } | { query: null; problem: string };

/** The query in a URL's `q`: none yet, the parsed query, or why the link cannot be read. */
export function decodeQuery(text: string | null): DecodedQuery | null {
  if (text === null || text === '') return null;
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    return { query: null, problem: 'The query in this link is not readable (it is not valid JSON).' };
  }
  const parsed = cohortQuerySchema.safeParse(raw);
  if (!parsed.success) return { query: null, problem: `The query in this link does not fit the query form: ${parsed.error.issues.map((i) => `${i.path.join('.') || 'query'}: ${i.message}`).join('; ')}.` };
  return { query: parsed.data, problem: null };
}
