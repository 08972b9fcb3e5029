/**
 * The work list at scale, for `npm run bench` (scenarios named "work list, …"; `--only "work list"`
 * runs them alone): GET /api/inspections over HTTP beside the bare statements of `buildWorklistSql`,
 * on the toneledger_scale database.
 *
 * Setup: `fillSchedules` writes a schedule row for every print that has none, in one set-based
 * statement, before the server starts (so the risk model's start-up pass finds nothing to
 * do): due dates spread from a year ago to three years ahead, risk bands about 5 / 15 / 35 / 45 %
 * urgent / high / moderate / low, one reason each, all from a hash of the print's id, so a second
 * fill gives the same rows.
 */
import type pg from 'pg';
import { worklistQuerySchema } from '../common/src/schemas/inspections';
import { getJson, median, quantile } from './bench-request';

export const WORKLIST_P95_MS = 50;

/** One statement: a plausible schedule row per print that has none. Returns how many were written. */
export async function fillSchedules(pool: pg.Pool): Promise<number> {
  const res = await pool.query(`
    INSERT INTO print_schedules (print_id, computed_due_on, due_on, interval_months, risk, risk_rank, factors, reasons, main_reason, last_checked_on)
    SELECT p.id, d.due, d.due, r.months, r.risk, r.rank,
           jsonb_build_array(jsonb_build_object('code', f.code, 'text', f.words, 'months', -r.months / 4, 'dueBy', NULL)), ARRAY[f.code], f.words,
           (d.due - (r.months * 30))::date
      FROM prints p
      CROSS JOIN LATERAL (SELECT abs(hashtext(p.id::text)::bigint) AS h) x
      CROSS JOIN LATERAL (SELECT (current_date + (x.h % 1461)::int - 365) AS due) d
      CROSS JOIN LATERAL (SELECT CASE WHEN x.h / 7 % 100 < 5 THEN 'urgent' WHEN x.h / 7 % 100 < 20 THEN 'high' WHEN x.h / 7 % 100 < 55 THEN 'moderate' ELSE 'low' END AS risk) b
      CROSS JOIN LATERAL (SELECT b.risk, CASE b.risk WHEN 'urgent' THEN 4 WHEN 'high' THEN 3 WHEN 'moderate' THEN 2 ELSE 1 END AS rank,
                                 CASE b.risk WHEN 'urgent' THEN 6 WHEN 'high' THEN 18 WHEN 'moderate' THEN 36 ELSE 60 END AS months) r
      CROSS JOIN LATERAL (SELECT (ARRAY['condition','condition_trend','vulnerable_process','enclosure','light','climate','fading','never_checked'])[1 + x.h / 13 % 8] AS code) c
      CROSS JOIN LATERAL (SELECT c.code, CASE c.code
          WHEN 'condition' THEN 'graded fair at the last check' WHEN 'condition_trend' THEN 'grade fell between the last two checks'
          WHEN 'vulnerable_process' THEN 'iron-blue toned print' WHEN 'enclosure' THEN 'enclosure failed the PAT'
          WHEN 'light' THEN 'displayed past half its annual light budget' WHEN 'climate' THEN 'store room RH above 60% for weeks'
          WHEN 'fading' THEN 'fading 0.4 ΔE00 a year' ELSE 'never checked since it was catalogued' END AS words) f
    ON CONFLICT (print_id) DO NOTHING`);
  // As autovacuum leaves a table at rest: visibility map set (index-only scans), statistics fresh.
  await pool.query('VACUUM (ANALYZE) print_schedules');
  return res.rowCount ?? 0;
}

/** The store room (a place directly under a building) holding the most prints, with its subtree. */
async function busiestRoom(pool: pg.Pool): Promise<{ id: string; label: string; prints: number }> {
  const { rows } = await pool.query(`
    WITH RECURSIVE tree AS (
      SELECT l.id AS room, l.id FROM locations l JOIN locations b ON b.id = l.parent_id WHERE b.parent_id IS NULL
      UNION ALL SELECT t.room, c.id FROM locations c JOIN tree t ON c.parent_id = t.id)
    SELECT t.room AS id, r.path_label AS label, count(p.id)::int AS prints
      FROM tree t JOIN locations r ON r.id = t.room LEFT JOIN prints p ON p.location_id = t.id
     GROUP BY t.room, r.path_label ORDER BY prints DESC LIMIT 1`);
  return rows[0];
}

export interface WorklistBenchOptions {
  base: string;
  cookie: string;
  pool: pg.Pool;
  runs: number;
  warmup: number;
  only: string;
}

/** Runs the work list's scenarios and prints p50/p95 of the API and of the bare statements. */
export async function benchWorklist({ base, cookie, pool, runs, warmup, only }: WorklistBenchOptions): Promise<void> {
  const { buildWorklistSql, todayIso } = await import('../backend/src/services/worklist.service');
  const room = await busiestRoom(pool);
  const all: { name: string; query: Record<string, string> }[] = [
    { name: 'work list, place + due date, 90 days', query: { locationId: room.id, window: '90', sort: 'dueOn' } },
    { name: 'work list, place + due date, all', query: { locationId: room.id, window: 'all', sort: 'dueOn' } },
    { name: 'work list, place + due date, all, page 20', query: { locationId: room.id, window: 'all', sort: 'dueOn', page: '20' } },
  ];
  const scenarios = all.filter((s) => s.name.includes(only));
  if (!scenarios.length) return;
  console.log('');
  console.log(`Work list, place "${room.label}" (${room.prints.toLocaleString('en-GB')} prints in it and below), ${runs} runs after ${warmup} warm-up (ms):`);
  console.log('');
  console.log('| scenario | matches | API p50 | API p95 | SQL p50 | SQL p95 | target |');
  console.log('| --- | ---: | ---: | ---: | ---: | ---: | --- |');
  for (const s of scenarios) {
    const query = worklistQuerySchema.parse(s.query);
    const sql = buildWorklistSql(query, todayIso());
    const url = `${base}/api/inspections?${new URLSearchParams(s.query)}`;
    const callApi = async () => {
      const t0 = performance.now();
      const { status, body } = await getJson<{ pagination: { total: number } }>(url, cookie);
      if (status !== 200) throw new Error(`${s.name}: ${status} ${JSON.stringify(body).slice(0, 300)}`);
      return { t: performance.now() - t0, total: body.pagination.total };
    };
    const callSql = async () => {
      const t0 = performance.now();
      await Promise.all([pool.query(sql.select, sql.params), pool.query(sql.counts, sql.countParams)]);
      return performance.now() - t0;
    };
    let total = 0;
    for (let i = 0; i < warmup; i++) {
      total = (await callApi()).total;
      await callSql();
    }
    const api: number[] = [];
    const bare: number[] = [];
    for (let i = 0; i < runs; i++) {
      api.push((await callApi()).t);
      bare.push(await callSql());
    }
    const p95 = quantile(api, 0.95);
    console.log(`| ${s.name} | ${total.toLocaleString('en-GB')} | ${median(api).toFixed(1)} | ${p95.toFixed(1)} | ${median(bare).toFixed(1)} | ${quantile(bare, 0.95).toFixed(1)} | p95 < ${WORKLIST_P95_MS} ms ${p95 < WORKLIST_P95_MS ? 'ok' : 'MISS'} |`);
    const plan = (await pool.query(`EXPLAIN (ANALYZE, BUFFERS) ${sql.select}`, sql.params)).rows.map((r: { 'QUERY PLAN': string }) => r['QUERY PLAN']);
    const countPlan = (await pool.query(`EXPLAIN (ANALYZE, BUFFERS) ${sql.counts}`, sql.countParams)).rows.map((r: { 'QUERY PLAN': string }) => r['QUERY PLAN']);
    console.log(`    select: ${plan[0]!.trim()} — ${plan.find((l) => l.startsWith('Execution Time')) ?? ''}`);
    console.log(`    counts: ${countPlan[0]!.trim()} — ${countPlan.find((l) => l.startsWith('Execution Time')) ?? ''}`);
  }
}
