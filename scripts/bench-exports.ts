/**
 * The readings export of `npm run bench` ("exports, readings CSV"), on the toneledger_scale database
 * (`npm run seed:scale`), in process: `writeReadingsCsv` as the route runs it, into a sink that
 * counts bytes and waits like a slow socket now and then, so the export's own back-pressure is used.
 * Prints rows, bytes, time and the process's peak resident memory and heap, sampled every 50 ms,
 * against the memory before the export: the export streams a chunk of prints at a time, so the
 * peak must not grow with the number of rows. The full `npm run bench` runs it on the cyanotype prints; alone: `npx tsx scripts/bench-exports.ts`
 * (`--process albumen` narrows it to one process, as the measurements area's filter does).
 *
 * Target: memory flat (peak heap growth under 150 MB whatever the row count).
 */
import { Writable } from 'node:stream';
import { DEV_PG_PORT, openDevCluster } from './dev-cluster';

const log = (m: string) => console.log(`[bench:exports] ${m}`);
const arg = (name: string) => (process.argv.includes(`--${name}`) ? process.argv[process.argv.indexOf(`--${name}`) + 1] : undefined);
const MB = 1024 * 1024;

let cluster: { stop(): Promise<void> } | null = null;
let code = 0;
try {
  cluster = await openDevCluster(log);
  // The export reads the database only: the other services' settings are placeholders that nothing here contacts.
  Object.assign(process.env, {
    DATABASE_URL: `postgres://app@127.0.0.1:${DEV_PG_PORT}/toneledger_scale`, LOG_LEVEL: 'warn',
    S3_BUCKET: 'bench-unused', S3_ACCESS_KEY_ID: 'unused', S3_SECRET_ACCESS_KEY: 'unused', OIDC_ISSUER: 'http://127.0.0.1:9/unused',
    OIDC_CLIENT_ID: 'unused', SMTP_URL: 'smtp://127.0.0.1:9', SESSION_SECRET: 'bench-exports-unused-secret',
  });
  const { db } = await import('../backend/src/db');
  const { migrateUp } = await import('../backend/src/migrate');
  const { writeReadingsCsv } = await import('../backend/src/services/exports/readings-export');
  await migrateUp(db());
  const [[{ prints, readings }]] = (await db().query(
    'SELECT (SELECT count(DISTINCT print_id) FROM measurement_spots)::int AS prints, (SELECT count(*) FROM spot_readings)::int AS readings',
  )) as unknown as [[{ prints: number; readings: number }]];
  if (readings === 0) throw new Error('toneledger_scale has no readings: npm run seed:scale -- --prints 200000');
  const query = arg('process') ? { process: arg('process') } : {};
  log(`${prints.toLocaleString('en-GB')} prints with spots, ${readings.toLocaleString('en-GB')} readings in the database; query ${JSON.stringify(query)}`);

  global.gc?.();
  const before = process.memoryUsage();
  let peakRss = before.rss;
  let peakHeap = before.heapUsed;
  const sample = setInterval(() => {
    const m = process.memoryUsage();
    peakRss = Math.max(peakRss, m.rss);
    peakHeap = Math.max(peakHeap, m.heapUsed);
  }, 50);
  let bytes = 0;
  let writes = 0;
  const sink = new Writable({
    highWaterMark: 64 * 1024,
    write(chunk: Buffer, _enc, done) {
      bytes += chunk.length;
      // Every 50th write waits a tick, as a socket to a slower client would.
      if (++writes % 50 === 0) setImmediate(done);
      else done();
    },
  });
  const t0 = performance.now();
  const rows = await writeReadingsCsv(query as never, sink);
  const s = (performance.now() - t0) / 1000;
  clearInterval(sample);
  const growth = (peakHeap - before.heapUsed) / MB;
  log(`readings CSV: ${rows.toLocaleString('en-GB')} rows, ${(bytes / MB).toFixed(1)} MB in ${s.toFixed(1)} s (${Math.round(rows / s).toLocaleString('en-GB')} rows/s)`);
  log(`memory: RSS ${(before.rss / MB).toFixed(0)} → peak ${(peakRss / MB).toFixed(0)} MB; heap ${(before.heapUsed / MB).toFixed(0)} → peak ${(peakHeap / MB).toFixed(0)} MB (growth ${growth.toFixed(0)} MB; target under 150 MB)`);
  if (growth > 150) code = 1;
  await db().close();
} catch (err) {
  console.error(err);
  code = 1;
} finally {
  await cluster?.stop();
}
process.exit(code);
