import { describe, expect, it } from 'vitest';
import { cohortQuerySchema } from '@toneledger/common/schemas/research';
import { IRON_BLUE_QUERY } from '@/features/research/testing/fixtures';
import { decodeQuery, encodeQuery } from '@/features/research/utils/query-url';
import { toBody, toValues } from '@/features/research/utils/builder-form';

describe('the query in the URL', () => {
  it('reads back exactly the query it was written from, defaults left out of the text', () => {
    const q = cohortQuerySchema.parse({
      ...IRON_BLUE_QUERY,
      groupBy: ['alkalineAfterBath', 'acidGL'],
      bands: { acidGL: [2, 5.5] },
      event: { kind: 'grade', grade: 'poor' },
      origin: 'made',
      ci: 'plain',
      filters: [...IRON_BLUE_QUERY.filters, { factor: 'dateMade', fromYear: 1920, toYear: 1939 }, { factor: 'washingMinutes', min: 30 }],
    });
    const text = encodeQuery(q);
    expect(decodeQuery(text)).toEqual({ query: q, problem: null });
    expect(JSON.parse(text)).not.toHaveProperty('coxFactors', []);
    expect(encodeQuery(cohortQuerySchema.parse({}))).toBe('{}');
  });

  it('says why a link cannot be read instead of running something else', () => {
    expect(decodeQuery('{"groupBy":["nonsense"]')?.problem).toMatch(/not valid JSON/);
    expect(decodeQuery('{"groupBy":["nonsense"]}')?.problem).toMatch(/groupBy/);
    expect(decodeQuery(null)).toBeNull();
  });

  it('goes through the form’s controls and back to the same query', () => {
    const q = cohortQuerySchema.parse({ ...IRON_BLUE_QUERY, filters: [...IRON_BLUE_QUERY.filters, { factor: 'acidGL', min: 0.5, max: 4 }], groupBy: ['acidGL'], bands: { acidGL: [1, 2.5] } });
    expect(cohortQuerySchema.parse(toBody(toValues(q)))).toEqual(q);
  });
});
