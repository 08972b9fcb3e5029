import { afterAll, describe, expect, it } from 'vitest';
import { describe as summarise } from '@toneledger/common/domain/distribution';
import { testApp } from '../../test/app';
import { QUARTILES, keptRanks, pickEvenly, pointRows } from './cohort-aggregate';
import { pgRows } from './print-list.service';

// The aggregated cohort statement computes quartiles with PostgreSQL's percentile_cont and picks the
// strip-plot points by rank in SQL; both are checked here against the JS rules they replace.
const t = testApp();
afterAll(() => t.close());

/** A fixed, irregular list (a linear congruential sequence, so the test needs no random seed). */
const values = (n: number): number[] => {
  const out: number[] = [];
  let x = 12345;
  for (let i = 0; i < n; i += 1) { x = (x * 1103515245 + 12345) % 2147483648; out.push(Math.round((x / 2147483648) * 1e6) / 1e4); }
  return out;
};

describe('percentile_cont', () => {
  it('gives the quartiles of describe (R type 7, Hyndman & Fan 1996), including ties and small n', async () => {
    // Hyndman & Fan's type 7 is linear interpolation at h = (n − 1)·p, which is PostgreSQL's documented
    // percentile_cont ("interpolating between adjacent input items if needed").
    const lists = [[7], [1, 2], [3, 1, 2, 4], [1, 1, 1, 5, 9, 9], values(11), values(1001)];
    // A value worked by hand: 1, 2, 3, 4 → h = 3·0.25 = 0.75 → 1 + 0.75·(2 − 1) = 1.75; median 2.5; q3 3.25.
    expect(summarise([3, 1, 2, 4])).toMatchObject({ q1: 1.75, median: 2.5, q3: 3.25 });
    for (const list of lists) {
      const [row] = await pgRows<{ q: number[]; lo: number; hi: number }>(
        'SELECT percentile_cont(ARRAY[0.25, 0.5, 0.75]) WITHIN GROUP (ORDER BY v) AS q, min(v) AS lo, max(v) AS hi FROM unnest($1::float8[]) AS v', [list]);
      const d = summarise(list);
      expect(row!.q[0]).toBeCloseTo(d.q1!, 12);
      expect(row!.q[1]).toBeCloseTo(d.median!, 12);
      expect(row!.q[2]).toBeCloseTo(d.q3!, 12);
      expect([row!.lo, row!.hi]).toEqual([d.min, d.max]);
    }
  });
});

describe('the quartiles from the sorted values', () => {
  it('equal percentile_cont exactly (same float8 operations), ties, small n and two groups included', async () => {
    // The figures' statement sorts each rate once and reads the quartiles from the sorted array (QUARTILES);
    // percentile_cont, checked above against describe, is the reference, to the last bit.
    const lists = [[7], [1, 2], [3, 1, 2, 4], [1, 1, 1, 5, 9, 9], [0.1, 0.2, 0.3], values(11), values(12), values(1001), values(2000).map((v) => v / 7)];
    for (const list of lists) {
      const [row] = await pgRows<{ mine: number[]; pg: number[]; other: number[] }>(
        `WITH x AS (SELECT g, v FROM unnest($1::float8[]) WITH ORDINALITY AS u(v, i) CROSS JOIN (VALUES ('a'), ('b')) AS gs(g) WHERE g = 'a' OR i % 2 = 0),
              s AS (SELECT g AS k0, NULL::text AS k1, 'de'::text AS metric, array_agg(v ORDER BY v) AS vs FROM x GROUP BY g)
         SELECT (SELECT qs FROM (${QUARTILES}) q WHERE k0 = 'a') AS mine,
                (SELECT percentile_cont(ARRAY[0.25, 0.5, 0.75]) WITHIN GROUP (ORDER BY v) FROM x WHERE g = 'a') AS pg,
                (SELECT json_build_array((SELECT qs FROM (${QUARTILES}) q WHERE k0 = 'b'), (SELECT to_json(percentile_cont(ARRAY[0.25, 0.5, 0.75]) WITHIN GROUP (ORDER BY v)) FROM x WHERE g = 'b'))) AS other`,
        [list]);
      expect(row!.mine, JSON.stringify(list.slice(0, 6))).toEqual(row!.pg);
      expect(row!.other[0]).toEqual(row!.other[1]);
    }
  });
});

describe('the strip-plot points', () => {
  const picked = async (n: number, cap: number) => (await pgRows<{ rn: string }>(
    `SELECT rn FROM generate_series(1, $1::int) AS rn WHERE ${pickEvenly('rn', '$1::int', '$2::int')} ORDER BY rn`, [n, cap])).map((r) => Number(r.rn));

  it('keeps every print up to the cap', async () => {
    expect(await picked(7, 10)).toEqual([1, 2, 3, 4, 5, 6, 7]);
    expect(await picked(10, 10)).toHaveLength(10);
  });

  it('keeps exactly `cap` ranks, evenly spaced, from the lowest to the highest', async () => {
    // 11 of 5: ranks 1 + round(k·10/4) for k = 0..4 = 1, 4 (2.5 rounds up), 6, 9 (7.5 up), 11 [by hand].
    expect(await picked(11, 5)).toEqual([1, 4, 6, 9, 11]);
    for (const [n, cap] of [[1001, 500], [200000, 500], [501, 500]] as const) {
      const ranks = await picked(n, cap);
      expect(ranks).toHaveLength(cap);
      expect(ranks[0]).toBe(1);
      expect(ranks.at(-1)).toBe(n);
      // Each gap is the even step (n − 1)/(cap − 1) rounded one way or the other.
      const step = (n - 1) / (cap - 1);
      for (let i = 1; i < ranks.length; i += 1) {
        expect(ranks[i]! - ranks[i - 1]!).toBeGreaterThanOrEqual(Math.floor(step));
        expect(ranks[i]! - ranks[i - 1]!).toBeLessThanOrEqual(Math.ceil(step));
      }
    }
  });

  it('are the ranks keptRanks lists without testing every rank', async () => {
    // keptRanks tests only 1 + round(j·(n − 1)/(cap − 1)) ± 1; the reference is pickEvenly over every rank.
    // n = cap + 1 has the smallest step (cap/(cap − 1)), so the least margin in the proof of keptRanks.
    for (const [n, cap] of [[7, 10], [10, 10], [11, 5], [1001, 500], [200000, 500], [200001, 500], [501, 500], [999, 500], [1000, 2], [3, 2], [12345, 37], [100003, 499]] as const) {
      const listed = (await pgRows<{ rn: number }>(`SELECT rn FROM (SELECT $1::int AS n) x CROSS JOIN LATERAL (${keptRanks('$2::int')}) k ORDER BY rn`, [n, cap])).map((r) => Number(r.rn));
      expect(listed, `${n} of ${cap}`).toEqual(await picked(n, cap));
    }
    // No cap (the export): every rank.
    expect((await pgRows<{ rn: number }>(`SELECT rn FROM (SELECT 4 AS n) x CROSS JOIN LATERAL (${keptRanks('NULL')}) k ORDER BY rn`, [])).map((r) => Number(r.rn))).toEqual([1, 2, 3, 4]);
  });
});

describe("the strip-plot points' prints", () => {
  it('are the prints at the kept ranks when each group is ordered by value, then id, ties included', async () => {
    // Reference: the ids sorted by value then id (what the statement sorted before pointRows) read at each kept rank.
    for (const [n, cap] of [[40, 7], [1001, 50], [300, 500], [5000, 499]] as const) {
      // Values rounded to whole tens of the list, so most values are tied and ranks fall inside tie runs.
      const vals = values(n).map((v) => Math.round(v / 10));
      const rows = await pgRows<{ k0: string; rn: number; v: number; id: string; want: string; want_v: number; tied: boolean }>(
        `WITH k AS (SELECT (CASE WHEN i % 3 = 0 THEN 'b' ELSE 'a' END) COLLATE "C" AS k0, NULL::text COLLATE "C" AS k1, v, md5(i::text)::uuid AS id
                      FROM unnest($1::float8[]) WITH ORDINALITY AS u(v, i)),
              a AS (SELECT k0, k1, array_agg(v) AS vs0, array_agg(id) AS ids0 FROM k GROUP BY k0, k1),
              s AS (SELECT k0, k1, 'de'::text AS metric, vs0, ids0, (SELECT array_agg(v ORDER BY v) FROM unnest(vs0) AS v) AS vs FROM a),
              ${pointRows('$2::int')},
              ref AS (SELECT k0, array_agg(id ORDER BY v, id) AS ids, array_agg(v ORDER BY v, id) AS vs FROM k GROUP BY k0)
         SELECT pt.k0, pt.rn, pt.v, pt.id::text AS id, ref.ids[pt.rn]::text AS want, ref.vs[pt.rn] AS want_v,
                pt.rn > 1 AND ref.vs[pt.rn - 1] = pt.v AS tied
           FROM pt JOIN ref ON ref.k0 = pt.k0 ORDER BY pt.k0, pt.rn`,
        [vals, cap]);
      const sizes = { a: vals.filter((_, i) => (i + 1) % 3 !== 0).length, b: vals.filter((_, i) => (i + 1) % 3 === 0).length };
      for (const g of ['a', 'b'] as const) expect(rows.filter((r) => r.k0 === g), `${g}, ${n} of ${cap}`).toHaveLength(Math.min(sizes[g], cap));
      for (const r of rows) {
        expect(r.id, `${r.k0} rank ${r.rn}`).toBe(r.want);
        expect(r.v).toBe(r.want_v);
      }
      // The data does reach a rank inside a run of ties (the branch that looks for the run's first rank).
      expect(rows.some((r) => r.tied), `${n} of ${cap}`).toBe(true);
    }
  });
});
