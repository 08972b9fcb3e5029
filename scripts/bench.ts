/**
 * npm run bench [-- --runs 50 --warmup 5] [--only "sorted, page 1"] [--no-images]; `--only climate`: the logger-file scenario alone (bench-climate.ts); `--only research`: the longevity-research scenarios alone (bench-research.ts)
 *
 * Measures the catalogue list at scale, on the toneledger_scale database that
 * `npm run seed:scale` fills (on the development PostgreSQL cluster; the demo database is not
 * touched). It starts the real app server with the local identity provider, S3 and mail sink of
 * the test setup, signs in as the demo registrar through the real OpenID Connect flow, and for each
 * scenario times:
 *   - the API: GET /api/prints over HTTP on loopback (node:http, one kept-alive connection) with the
 *     session cookie (whole response read and parsed);
 *   - the bare SQL: the same `buildListSql` text the service runs, select and count in parallel
 *     on two connections, as the service does;
 * The app measured is built as production runs it (scripts/bench-request.ts: no response-contract
 * check, every request logged). Then it prints medians, p95s, the API/SQL ratio, the targets, the
 * cost of GET /api/me stage by stage, and an EXPLAIN (ANALYZE, BUFFERS)
 * summary per scenario (full plans for the scenarios that miss a target).
 *
 * Every request goes to 127.0.0.1; the number of requests is fixed; the script stops by itself.
 */
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { spawnSync } from 'node:child_process';
import { startPostgres, type LocalPostgres } from './postgres';
import { startLocalServices, type LocalServices } from './services';
import { printListQuerySchema, printListItemSchema, type PrintListQuery } from '../common/src/schemas/catalogue';
import { pageEnvelope } from '../common/src/schemas/envelope';
import { DEMO_ACCOUNTS } from '../backend/src/seed/demo-accounts';
import { productionApp, measureMe, measureRequest, plainExpress, getJson, median, quantile } from './bench-request';
import { benchWorklist, fillSchedules } from './bench-worklist';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const DATABASE = 'toneledger_scale';
const ROLE = 'registrar' as const;
const log = (m: string) => console.log(`[bench] ${m}`);

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  const raw = i >= 0 ? process.argv[i + 1] : undefined;
  const n = raw === undefined ? fallback : Number(raw);
  if (!Number.isInteger(n) || n < 1 || n > 1000) throw new Error(`--${name} must be a whole number from 1 to 1000`);
  return n;
}
const RUNS = arg('runs', 50);
const WARMUP = arg('warmup', 5);
/** `--only <text>`: the scenarios whose name contains the text; `--no-images`: the list alone. */
const ONLY = process.argv.includes('--only') ? process.argv[process.argv.indexOf('--only') + 1] ?? '' : '';
/** The storage-climate scenario runs in its own process (scripts/bench-climate.ts); `--only climate` runs it alone. */
const CLIMATE_SCENARIO = 'climate file, 100,000 rows';
const CLIMATE_ONLY = ONLY !== '' && CLIMATE_SCENARIO.includes(ONLY);
/** The full recompute of every print's inspection date runs in its own process (scripts/bench-schedule.ts); `--only schedule` runs it alone. */
const SCHEDULE_SCENARIO = 'schedule, full recompute';
const SCHEDULE_ONLY = ONLY !== '' && SCHEDULE_SCENARIO.includes(ONLY);
/** The longevity-research scenarios run in their own process (scripts/bench-research.ts); `--only research` runs them alone. */
const RESEARCH_SCENARIO = 'research, fading rates, survival with log-rank, Cox on five factors';
const RESEARCH_ONLY = ONLY !== '' && RESEARCH_SCENARIO.includes(ONLY);
/** The preservation package of the scale catalogue runs in its own process (scripts/bench-preservation.ts); `--only preservation` runs it alone. */
const PRESERVATION_SCENARIO = 'preservation, bag of the catalogue without images';
const PRESERVATION_ONLY = ONLY !== '' && PRESERVATION_SCENARIO.includes(ONLY);
const IMAGES = !process.argv.includes('--no-images') && !CLIMATE_ONLY && !SCHEDULE_ONLY && !RESEARCH_ONLY && !PRESERVATION_ONLY;

interface Scenario {
  name: string;
  query: Record<string, string>;
  /** Targets that apply: p95 of the API under `p95Ms`. Every scenario also has API ≤ 1.5 × SQL. */
  p95Ms?: number;
  target?: string;
}

const SCENARIOS: Scenario[] = [
  { name: 'sorted, page 1', query: { sort: 'accessionNumber' } },
  { name: 'filtered + sorted, page 1', query: { process: 'gelatin_silver_developing_out', tonerClass: 'selenium', sort: '-dateMade' }, p95Ms: 50, target: 'p95 < 50 ms' },
  { name: 'filtered + sorted, page 500', query: { process: 'gelatin_silver_developing_out', tonerClass: 'selenium', sort: '-dateMade', page: '500', pageSize: '50' }, p95Ms: 50, target: 'p95 < 50 ms' },
  { name: 'search, page 1', query: { q: 'harbour' }, p95Ms: 100, target: 'p95 < 100 ms' },
  { name: 'search + filter, page 1', query: { q: 'harbour', tonerClass: 'iron_blue' }, p95Ms: 100, target: 'p95 < 100 ms' },
  { name: 'sort by maker, page 500', query: { sort: 'maker', page: '500', pageSize: '50' } },
];
const RATIO_TARGET = 1.5;
/** Unmeasured rounds before any figure is taken (each: every scenario's page once, GET /api/me five times). */
const STEADY_ROUNDS = 150;

const ms = (x: number) => x.toFixed(1);

async function reachable(port: number): Promise<boolean> {
  const c = new pg.Client({ host: '127.0.0.1', port, user: 'app', database: 'postgres', connectionTimeoutMillis: 1500 });
  try {
    await c.connect();
    await c.end();
    return true;
  } catch {
    return false;
  }
}

const pgPort = Number(process.env.TONELEDGER_PG_PORT ?? 54329);
let cluster: LocalPostgres | null = null;
let services: LocalServices | null = null;
let closeServer: () => Promise<void> = async () => {};
let closeProd: () => Promise<void> = async () => {};
let sqlPool: pg.Pool | null = null;
let code = 0;

try {
  if (CLIMATE_ONLY || SCHEDULE_ONLY || RESEARCH_ONLY || PRESERVATION_ONLY) throw Object.assign(new Error('list skipped'), { skip: true });
  if (!(await reachable(pgPort))) {
    cluster = await startPostgres({
      baseDir: path.resolve(ROOT, process.env.TONELEDGER_DATA_DIR ?? '.data', 'pg'), port: pgPort, database: 'postgres', log, fallbackKey: 'dev',
    });
  }
  const scaleUrl = `postgres://app@127.0.0.1:${pgPort}/${DATABASE}`;
  const probe = new pg.Client({ connectionString: scaleUrl });
  const prints = await probe.connect().then(
    async () => Number((await probe.query('SELECT count(*) AS n FROM prints').catch(() => ({ rows: [{ n: 0 }] }))).rows[0].n),
    () => 0,
  );
  await probe.end().catch(() => {});
  if (prints === 0) {
    console.error(`The ${DATABASE} database is missing or empty. Fill it first:\n\n  npm run seed:scale -- --prints 200000\n`);
    code = 2;
  } else {
    log(`${DATABASE}: ${prints.toLocaleString('en-GB')} prints`);

    // The identity provider, S3 and mail sink of the test setup (fresh, free ports); the app on the scale database.
    services = await startLocalServices('test', () => {});
    Object.assign(process.env, services.env, { DATABASE_URL: scaleUrl, LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn' });
    const { db } = await import('../backend/src/db');
    const { seedDemoIfEmpty } = await import('../backend/src/seed/demo');
    const { startServer } = await import('../backend/src/server');
    const { signIn } = await import('../backend/test/app');
    const { buildListSql, EXACT_COUNT_CAP } = await import('../backend/src/services/print-list.service');

    await seedDemoIfEmpty(db(), { catalogue: false });
    // Each run has a new identity provider (a new issuer): let the registrar's row be claimed again.
    const registrar = DEMO_ACCOUNTS.find((a) => a.role === ROLE)!;
    await db().query('UPDATE users SET issuer = NULL, subject = NULL WHERE lower(email) = lower($1)', { bind: [registrar.email] });

    const registrarId = ((await db().query('SELECT id FROM users WHERE lower(email) = lower($1)', { bind: [registrar.email] }))[0][0] as { id: string }).id;
    // The work list needs schedule rows: migrated and filled before the server starts, so its start-up pass finds none missing.
    const { migrateUp } = await import('../backend/src/migrate');
    await migrateUp(db());
    const fillPool = new pg.Pool({ connectionString: scaleUrl, max: 1 });
    const filled = await fillSchedules(fillPool).finally(() => fillPool.end());
    if (filled) log(`Wrote ${filled.toLocaleString('en-GB')} schedule rows for the work list`);
    const running = await startServer({ migrate: true });
    closeServer = running.close;
    // Fresh planner statistics (a migration may just have changed the table), so the estimated totals hold still.
    await db().query('ANALYZE prints');
    const cookie = await signIn(running.url.replace('localhost', '127.0.0.1') as never, registrar.email, registrar.password);
    // Measured: the app as production builds it (no response-contract check, every request logged at info, to /dev/null).
    const prod = await productionApp(running.deps);
    closeProd = prod.close;
    const base = prod.url;
    log(`Signed in as ${registrar.email} (${ROLE}); measuring the production configuration on ${base} (NODE_ENV=production, log level info to /dev/null)`);

    // Steady state first. V8 optimises a function only after it has run many times and sizes its
    // heap to the load, and a server answers many thousands of requests between restarts: on this
    // machine GET /api/me settles only after about 1,500 requests (1.8 ms median over requests
    // 500–900, 1.1–1.2 ms from 2,500 on). Unmeasured, round after round: each scenario's page once
    // and GET /api/me five times, on the measured app and (fewer rounds) on the timed one.
    const steadyPaths = [...SCENARIOS.filter((x) => x.name.includes(ONLY)).map((x) => `/api/prints?${new URLSearchParams(x.query)}`), ...Array(5).fill('/api/me')];
    const steadyStart = performance.now();
    let steadyCount = 0;
    for (const [b, rounds] of [[base, STEADY_ROUNDS], [prod.instrumentedUrl, Math.ceil(STEADY_ROUNDS / 3)]] as const) {
      for (let i = 0; i < rounds; i++) for (const p of steadyPaths) {
        await getJson(`${b}${p}`, cookie);
        steadyCount++;
      }
    }
    log(`Steady state: ${steadyCount.toLocaleString('en-GB')} unmeasured requests in ${((performance.now() - steadyStart) / 1000).toFixed(1)} s`);

    sqlPool = new pg.Pool({ connectionString: scaleUrl, max: 2 });
    const envelope = pageEnvelope(printListItemSchema);

    interface Result {
      s: Scenario; total: number; api: number[]; sql: number[]; check: number[]; plan: string[]; countPlan: string[];
    }
    const results: Result[] = [];

    for (const s of SCENARIOS.filter((x) => x.name.includes(ONLY))) {
      const query: PrintListQuery = printListQuerySchema.parse(s.query);
      const url = `${base}/api/prints?${new URLSearchParams(s.query)}`;
      const sql = buildListSql(query, ROLE);
      const countParams = sql.countParams;
      const callApi = async () => {
        const t0 = performance.now();
        const { status, body } = await getJson<{ data: unknown[]; pagination: { total: number } }>(url, cookie);
        const t = performance.now() - t0;
        if (status !== 200) throw new Error(`${s.name}: ${status} ${JSON.stringify(body).slice(0, 300)}`);
        return { t, body };
      };
      const callSql = async () => {
        const t0 = performance.now();
        const [rows, count] = await Promise.all([sqlPool!.query(sql.select, sql.params), sqlPool!.query(sql.count, countParams)]);
        let total = count.rows[0].total as number;
        // As the service does: past the cap, the planner's estimate.
        if (total > EXACT_COUNT_CAP) {
          const plan = await sqlPool!.query(sql.estimate, countParams);
          total = Math.max(EXACT_COUNT_CAP + 1, Math.round(plan.rows[0]['QUERY PLAN'][0].Plan['Plan Rows']));
        }
        return { t: performance.now() - t0, rows: rows.rowCount ?? 0, total };
      };
      let lastBody: { data: unknown[]; pagination: { total: number } } | null = null;
      for (let i = 0; i < WARMUP; i++) {
        lastBody = (await callApi()).body;
        await callSql();
      }
      const api: number[] = [];
      const bare: number[] = [];
      // Interleaved, so both see the same cache state and background noise.
      for (let i = 0; i < RUNS; i++) {
        api.push((await callApi()).t);
        const r = await callSql();
        bare.push(r.t);
        if (r.total !== lastBody!.pagination.total) throw new Error(`${s.name}: API total ${lastBody!.pagination.total} ≠ SQL total ${r.total}`);
      }
      // What the response-contract check (on outside production) costs for this page, in process.
      const check: number[] = [];
      for (let i = 0; i < 20; i++) {
        const t0 = performance.now();
        envelope.safeParse(lastBody);
        check.push(performance.now() - t0);
      }
      const explain = async (text: string, params: unknown[]) =>
        ((await sqlPool!.query(`EXPLAIN (ANALYZE, BUFFERS) ${text}`, params)).rows as { 'QUERY PLAN': string }[]).map((x) => x['QUERY PLAN']);
      results.push({
        s, total: lastBody!.pagination.total, api, sql: bare, check,
        plan: await explain(sql.select, sql.params), countPlan: await explain(sql.count, countParams),
      });
      log(`${s.name}: done (${lastBody!.data.length} rows of ${lastBody!.pagination.total.toLocaleString('en-GB')})`);
    }

    // ── Report ──
    const head = ['scenario', 'matches', 'API med', 'API p95', 'SQL med', 'SQL p95', 'API/SQL', 'check med', 'targets'];
    const rows = results.map((r) => {
      const apiMed = median(r.api);
      const apiP95 = quantile(r.api, 0.95);
      const sqlMed = median(r.sql);
      const ratio = apiMed / sqlMed;
      const checks: string[] = [];
      if (r.s.p95Ms) checks.push(`${r.s.target} ${apiP95 < r.s.p95Ms ? 'ok' : 'MISS'}`);
      checks.push(`≤${RATIO_TARGET}× SQL ${ratio <= RATIO_TARGET ? 'ok' : 'MISS'}`);
      return {
        cells: [r.s.name, r.total.toLocaleString('en-GB'), ms(apiMed), ms(apiP95), ms(sqlMed), ms(quantile(r.sql, 0.95)), `${ratio.toFixed(2)}×`, ms(median(r.check)), checks.join('; ')],
        miss: checks.some((c) => c.endsWith('MISS')),
      };
    });
    const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r.cells[i].length)));
    const line = (cells: string[]) => `| ${cells.map((c, i) => (i === 0 || i === cells.length - 1 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join(' | ')} |`;
    console.log('');
    console.log(`Catalogue list, ${prints.toLocaleString('en-GB')} prints, role ${ROLE}, ${RUNS} measured runs after ${WARMUP} warm-up (times in ms):`);
    console.log('');
    console.log(line(head));
    console.log(`|${widths.map((w, i) => (i === 0 || i === widths.length - 1 ? ` ${'-'.repeat(w)} ` : ` ${'-'.repeat(w - 1)}: `)).join('|')}|`);
    for (const r of rows) console.log(line(r.cells));
    await benchWorklist({ base, cookie, pool: sqlPool, runs: RUNS, warmup: WARMUP, only: ONLY });
    console.log('');
    // The fixed cost of any signed-in request, stage by stage (scripts/bench-request.ts).
    const { getMe } = await import('../backend/src/services/user.service');
    const { meSchema } = await import('../common/src/schemas/users');
    const { dataEnvelope } = await import('../common/src/schemas/envelope');
    const [[registrarRow]] = (await db().query('SELECT id, name, email, role, created_at AS "createdAt", last_sign_in_at AS "lastSignInAt" FROM users WHERE id = $1', { bind: [registrarId] })) as unknown as [[Parameters<typeof getMe>[0]]];
    const me = getMe(registrarRow, new Date(), 'production');
    const meEnvelope = dataEnvelope(meSchema);
    const fixed = await measureMe(prod, cookie, Math.max(RUNS, 200), WARMUP * 4, [
      { label: 'of which getMe (present the row read with the session)', run: () => getMe(registrarRow, new Date(), 'production') },
      { label: 'contract check of the answer (off in production)', run: () => meEnvelope.safeParse({ data: me }) },
      { label: 'JSON.stringify of the answer', run: () => JSON.stringify({ data: me }) },
    ]);
    console.log('');
    // The list's largest fixed part, stage by stage: the first scenario measured (sorted, page 1 by default).
    if (results.length) {
      const { listPrints } = await import('../backend/src/services/print-list.service');
      const s = results[0].s;
      const query = printListQuerySchema.parse(s.query);
      const sql = buildListSql(query, ROLE);
      const answer = await listPrints(query, ROLE);
      await measureRequest(prod, `/api/prints?${new URLSearchParams(s.query)}`, `The list, ${s.name}: GET /api/prints`, cookie, Math.max(RUNS, 100), WARMUP * 4, [
        { label: 'of which listPrints (the service: its statements on the app pool)', run: () => listPrints(query, ROLE) },
        { label: 'the bare statements (select ‖ count, then estimate)', run: async () => {
          await Promise.all([sqlPool!.query(sql.select, sql.params), sqlPool!.query(sql.count, sql.countParams)]);
          if (answer.estimated) await sqlPool!.query(sql.estimate, sql.countParams);
        } },
        { label: 'JSON.stringify of the answer', run: () => JSON.stringify({ data: answer.rows, pagination: { total: answer.total } }) },
      ]);
      console.log(`  load average ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
      // How low the API could go in this process: the same page from plain Express (the same service,
      // nothing of the house), the app, and the bare statements, interleaved.
      const floor = await plainExpress('/api/prints', async () => {
        const page = await listPrints(query, ROLE);
        return { data: page.rows, pagination: { page: query.page, pageSize: query.pageSize, total: page.total } };
      });
      try {
        const path = `/api/prints?${new URLSearchParams(s.query)}`;
        const series = { app: [] as number[], plain: [] as number[], sql: [] as number[] };
        const runs = Math.max(RUNS, 200);
        for (let i = 0; i < runs + 50; i++) {
          let t0 = performance.now();
          const fromApp = await getJson(`${base}${path}`, cookie);
          const app = performance.now() - t0;
          t0 = performance.now();
          const fromPlain = await getJson(`${floor.url}${path}`, '');
          const plain = performance.now() - t0;
          if (fromApp.status !== 200 || fromPlain.status !== 200) throw new Error(`floor: the app answered ${fromApp.status}, plain Express ${fromPlain.status}`);
          t0 = performance.now();
          await Promise.all([sqlPool!.query(sql.select, sql.params), sqlPool!.query(sql.count, sql.countParams)]);
          if (answer.estimated) await sqlPool!.query(sql.estimate, sql.countParams);
          if (i >= 50) {
            series.app.push(app);
            series.plain.push(plain);
            series.sql.push(performance.now() - t0);
          }
        }
        const bare = median(series.sql);
        console.log('');
        console.log(`The floor, ${s.name}: ${runs} runs each after 50, interleaved (medians):`);
        console.log(`  the app (production configuration)                      ${ms(median(series.app))} ms   ${(median(series.app) / bare).toFixed(2)}× SQL`);
        console.log(`  plain Express, the same service, nothing of the house    ${ms(median(series.plain))} ms   ${(median(series.plain) / bare).toFixed(2)}× SQL`);
        console.log(`  the bare statements                                      ${ms(bare)} ms`);
      } finally {
        await floor.close();
      }
    }
    console.log(`Fixed cost of a signed-in request (GET /api/me): median ${fixed.median.toFixed(2)} ms, p95 ${fixed.p95.toFixed(2)} ms (target: median ≤ 1.5 ms) ${fixed.median <= 1.5 ? 'ok' : 'MISS'}; load average ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}.`)
    console.log('API = GET /api/prints over HTTP incl. session lookup and JSON; SQL = the same select + count in parallel; ');
    console.log(`check = in-process cost of the response-contract check the app runs in development and tests only (not in API: production skips it).`);

    console.log('');
    console.log('EXPLAIN (ANALYZE, BUFFERS), top node and execution time:');
    const summary = (plan: string[]) => {
      const top = plan[0].trim();
      const exec = plan.find((l) => l.startsWith('Execution Time'))?.trim() ?? '';
      const buffers = plan.find((l) => l.trim().startsWith('Buffers:'))?.trim() ?? '';
      return `${top}\n      ${buffers}${buffers ? '; ' : ''}${exec}`;
    };
    for (const r of results) {
      console.log(`  ${r.s.name}`);
      console.log(`    select: ${summary(r.plan)}`);
      console.log(`    count:  ${summary(r.countPlan)}`);
    }
    // Full plans: every scenario, those that miss a target marked, so index effects can be read.
    console.log('');
    console.log('Full plans (select, then count):');
    results.forEach((r, i) => {
      console.log('');
      console.log(`── ${r.s.name}${rows[i].miss ? ' (MISSES A TARGET)' : ''}: ${new URLSearchParams(r.s.query)} ──`);
      console.log('select:');
      for (const l of r.plan) console.log(`  ${l}`);
      console.log('count:');
      for (const l of r.countPlan) console.log(`  ${l}`);
    });
  }
} catch (err) {
  if (!(err as { skip?: boolean }).skip) {
    console.error(err instanceof Error ? err.stack ?? err.message : err);
    code = 1;
  }
} finally {
  await sqlPool?.end().catch(() => {});
  await closeProd().catch(() => {});
  await closeServer().catch(() => {});
  await services?.stop();
  await cluster?.stop();
}
// The image pipeline, in a process of its own (its own services and environment).
const images = !IMAGES ? { status: 0 } : spawnSync(path.join(ROOT, 'node_modules', '.bin', 'tsx'), [path.join(ROOT, 'scripts', 'bench-images.ts')], { stdio: 'inherit', cwd: ROOT });
if (images.status !== 0 && code === 0) code = images.status ?? 1;
const climate = (ONLY && !CLIMATE_ONLY) || SCHEDULE_ONLY ? { status: 0 } : spawnSync(path.join(ROOT, 'node_modules', '.bin', 'tsx'), [path.join(ROOT, 'scripts', 'bench-climate.ts')], { stdio: 'inherit', cwd: ROOT });
if (climate.status !== 0 && code === 0) code = climate.status ?? 1;
const schedule = ONLY && !SCHEDULE_ONLY ? { status: 0 } : spawnSync(path.join(ROOT, 'node_modules', '.bin', 'tsx'), [path.join(ROOT, 'scripts', 'bench-schedule.ts')], { stdio: 'inherit', cwd: ROOT });
if (schedule.status !== 0 && code === 0) code = schedule.status ?? 1;
const research = ONLY && !RESEARCH_ONLY ? { status: 0 } : spawnSync(path.join(ROOT, 'node_modules', '.bin', 'tsx'), [path.join(ROOT, 'scripts', 'bench-research.ts'), ...(ONLY ? ['--only', ONLY] : []), ...(process.argv.includes('--runs') ? ['--runs', String(RUNS)] : [])], { stdio: 'inherit', cwd: ROOT });
if (research.status !== 0 && code === 0) code = research.status ?? 1;
// The readings export at scale (scripts/bench-exports.ts): with the full bench only; alone: `npx tsx scripts/bench-exports.ts [--process cyanotype]`.
const exportsRun = ONLY ? { status: 0 } : spawnSync(path.join(ROOT, 'node_modules', '.bin', 'tsx'), [path.join(ROOT, 'scripts', 'bench-exports.ts'), '--process', 'cyanotype'], { stdio: 'inherit', cwd: ROOT });
if (exportsRun.status !== 0 && code === 0) code = exportsRun.status ?? 1;
const preservation = ONLY && !PRESERVATION_ONLY ? { status: 0 } : spawnSync(path.join(ROOT, 'node_modules', '.bin', 'tsx'), [path.join(ROOT, 'scripts', 'bench-preservation.ts')], { stdio: 'inherit', cwd: ROOT });
if (preservation.status !== 0 && code === 0) code = preservation.status ?? 1;
process.exit(code);
