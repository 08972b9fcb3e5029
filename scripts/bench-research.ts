/**
 * The longevity-research scenarios of `npm run bench` ("research, …"), on the toneledger_scale
 * database (`npm run seed:scale`), in process: the cohort service as a request runs it (statement,
 * grouping and statistics), beside the bare statement (`buildAggregateSql`'s text alone, with the
 * service's session settings: `withWorkMem`). First fills
 * `print_outcomes` for prints without a row (as the workers do at start), batch by batch, and says
 * how long that took. Medians of 5 runs (`--runs N`) after one warm-up. Run alone with `npm run bench -- --only research`.
 *
 * Targets: a grouped fading-rate query and a two-group survival curve with its log-rank test under
 * 1 s each, a five-factor Cox model under 3 s.
 */
import os from 'node:os';
import { DEV_PG_PORT, openDevCluster } from './dev-cluster';
import { startLocalServices } from './services';
import type { CohortFigure, CohortQueryIn } from '../common/src/schemas/research';

const log = (m: string) => console.log(`[bench:research] ${m}`);
const pgPort = DEV_PG_PORT;
/** `--explain`: prints the plan of each scenario's statement (EXPLAIN ANALYZE, after one warm-up run) instead of timing it. */
const EXPLAIN = process.argv.includes('--explain');
/** `--runs N`: timed runs per scenario after the warm-up (default 5; fewer when the machine is busy). */
const RUNS = process.argv.includes('--runs') ? Math.max(1, Number(process.argv[process.argv.indexOf('--runs') + 1]) || 5) : 5;
const ONLY = process.argv.includes('--only') ? process.argv[process.argv.indexOf('--only') + 1] ?? '' : '';


/** Each scenario asks for the figures the research screen asks for in one of its requests (it asks for its parts at once). */
const SCENARIOS: { name: string; query: CohortQueryIn; figures: CohortFigure[]; targetMs?: number }[] = [
  { name: 'research, fading rates by toner class', query: { groupBy: ['tonerClass'], event: { kind: 'fading' } }, figures: ['fading'], targetMs: 1000 },
  { name: 'research, survival toned vs untoned with log-rank', query: { groupBy: ['toned'], event: { kind: 'fading' } }, figures: ['survival', 'incidence'], targetMs: 1000 },
  { name: 'research, Cox on five factors', query: { event: { kind: 'fading' }, coxFactors: ['process', 'toned', 'alkalineAfterBath', 'toningMinutes', 'enclosureBuffered'] }, figures: ['cox'], targetMs: 3000 },
  // For comparison, no target: every figure of the first query in one request, as the export asks for them.
  { name: 'research, every figure by toner class in one request', query: { groupBy: ['tonerClass'], event: { kind: 'fading' } }, figures: ['fading', 'survival', 'incidence', 'cox'] },
];

const median = (xs: number[]) => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]!; };

let cluster: { stop(): Promise<void> } | null = null;
const services = await startLocalServices('test', () => {});
let code = 0;
try {
  cluster = await openDevCluster(log);
  Object.assign(process.env, services.env, { DATABASE_URL: `postgres://app@127.0.0.1:${pgPort}/toneledger_scale`, LOG_LEVEL: 'warn' });
  const { db } = await import('../backend/src/db');
  const { migrateUp } = await import('../backend/src/migrate');
  const { recomputeOutcomes } = await import('../backend/src/services/print-outcomes');
  const { runCohort, withWorkMem } = await import('../backend/src/services/cohort.service');
  const { buildAggregateSql } = await import('../backend/src/services/cohort-aggregate');
  const { cohortQuerySchema } = await import('../common/src/schemas/research');
  const { getMeasurementSettings } = await import('../backend/src/services/measurement.service');
  await migrateUp(db());
  const { noticeableDeltaE } = await getMeasurementSettings();
  const [[{ n, have, measured }]] = (await db().query(
    `SELECT (SELECT count(*) FROM prints)::int AS n, (SELECT count(*) FROM print_outcomes)::int AS have, (SELECT count(DISTINCT print_id) FROM spot_readings)::int AS measured`,
  )) as unknown as [[{ n: number; have: number; measured: number }]];
  if (n === 0) throw new Error('toneledger_scale is empty: npm run seed:scale -- --prints 200000');
  log(`${n.toLocaleString('en-GB')} prints, ${measured.toLocaleString('en-GB')} measured, ${have.toLocaleString('en-GB')} with outcomes; load ${os.loadavg()[0]!.toFixed(1)}`);
  if (have < n) {
    const f0 = performance.now();
    let done = 0;
    for (;;) {
      const [rows] = (await db().query(`SELECT p.id FROM prints p WHERE NOT EXISTS (SELECT 1 FROM print_outcomes o WHERE o.print_id = p.id) ORDER BY p.id LIMIT 5000`)) as unknown as [{ id: string }[]];
      if (!rows.length) break;
      await db().transaction((t) => recomputeOutcomes(rows.map((r) => r.id), t));
      done += rows.length;
    }
    const s = (performance.now() - f0) / 1000;
    log(`outcomes filled for ${done.toLocaleString('en-GB')} prints in ${s.toFixed(1)} s (${Math.round(done / s).toLocaleString('en-GB')} prints/s)`);
  }
  for (const sc of SCENARIOS) {
    if (ONLY && !sc.name.includes(ONLY) && !'research'.includes(ONLY)) continue;
    const q = cohortQuerySchema.parse(sc.query);
    // The threshold the service uses: the query's, else the settings' (the stored first-event day is read for that one).
    const sql = buildAggregateSql(q, q.event.thresholdDeltaE ?? noticeableDeltaE, { places: new Map(), pointsCap: 500, figures: sc.figures });
    if (EXPLAIN) {
      await withWorkMem(sql.text, sql.values); // warm: the plan below reads what a repeated query reads
      const plan = await withWorkMem<{ 'QUERY PLAN': string }>(`EXPLAIN (ANALYZE, BUFFERS) ${sql.text}`, sql.values);
      log(`${sc.name}, plan:\n${plan.map((r) => r['QUERY PLAN']).join('\n')}`);
      continue;
    }
    const api: number[] = [];
    const bare: number[] = [];
    let last: Awaited<ReturnType<typeof runCohort>> | null = null;
    for (let i = 0; i <= RUNS; i += 1) {
      const a = performance.now();
      last = await runCohort(q, { figures: sc.figures });
      const b = performance.now();
      await withWorkMem(sql.text, sql.values);
      const c = performance.now();
      if (i > 0) { api.push(b - a); bare.push(c - b); }
    }
    const m = median(api);
    const detail = sc.query.coxFactors
      ? `${last!.cox?.n ?? 0} prints, ${last!.cox?.events ?? 0} events, ${last!.cox?.terms.length ?? 0} terms`
      : `${last!.total.toLocaleString('en-GB')} prints, ${last!.groups.length} groups${last!.survival.logRank ? `, log-rank χ² ${last!.survival.logRank.chi2.toFixed(1)}` : ''}`;
    log(`${sc.name} (figures: ${sc.figures.join(', ')}): ${m.toFixed(0)} ms (bare SQL ${median(bare).toFixed(0)} ms; ${detail}); ${sc.targetMs ? `target < ${sc.targetMs} ms ${m < sc.targetMs ? 'met' : 'MISSED'}` : 'no target'}; load ${os.loadavg()[0]!.toFixed(1)}`);
  }
  await db().close();
} catch (err) {
  console.error(err instanceof Error ? err.stack ?? err.message : err);
  code = 1;
} finally {
  await services.stop();
  await cluster?.stop();
}
process.exit(code);
