/**
 * The preservation-package scenario of `npm run bench` ("preservation, bag of the catalogue without
 * images"), on the toneledger_scale database (`npm run seed:scale`): the export job as the server's
 * worker runs it (`runExport`: the bag written to a temporary file from one snapshot, batch by batch,
 * then streamed into object storage), without images. Prints the time, the bag's size and files,
 * and the process's resident memory (the local services run in a child process) sampled every 250 ms: at the start, at each quarter of the
 * prints, and its peak (flat memory: the peak does not grow with the number of prints). Run alone
 * with `npm run bench -- --only preservation`.
 */
import { spawn } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { DEV_PG_PORT, openDevCluster } from './dev-cluster';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** The local services in their own process (scripts/bench-services.ts), so the memory measured is the export's alone. */
async function servicesApart(): Promise<{ env: Record<string, string>; stop(): Promise<void> }> {
  const child = spawn(path.join(ROOT, 'node_modules', '.bin', 'tsx'), [path.join(ROOT, 'scripts', 'bench-services.ts')], { cwd: ROOT, stdio: ['pipe', 'pipe', 'inherit'] });
  const env = await new Promise<Record<string, string>>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString('utf8');
      const nl = out.indexOf('\n');
      if (nl >= 0) resolve(JSON.parse(out.slice(0, nl)) as Record<string, string>);
    });
    child.on('exit', (code) => reject(new Error(`the services process ended (${code})`)));
  });
  return { env, stop: () => new Promise<void>((resolve) => { child.once('exit', () => resolve()); child.stdin!.end(); }) };
}

const log = (m: string) => console.log(`[bench:preservation] ${m}`);
const mb = (n: number) => `${(n / 1024 / 1024).toFixed(0)} MB`;

let cluster: { stop(): Promise<void> } | null = null;
const services = await servicesApart();
let code = 0;
try {
  cluster = await openDevCluster(log);
  Object.assign(process.env, services.env, { DATABASE_URL: `postgres://app@127.0.0.1:${DEV_PG_PORT}/toneledger_scale`, LOG_LEVEL: 'warn' });
  const { db } = await import('../backend/src/db');
  const { migrateUp } = await import('../backend/src/migrate');
  const { runExport } = await import('../backend/src/services/preservation.service');
  const { env } = await import('../backend/src/config/env');
  const { S3ObjectStore } = await import('../storage/src/s3-store');
  await migrateUp(db());
  const e = env();
  const store = new S3ObjectStore({ endpoint: e.S3_ENDPOINT, region: e.S3_REGION, bucket: e.S3_BUCKET, accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY, forcePathStyle: e.S3_FORCE_PATH_STYLE });
  const [[{ n }]] = (await db().query('SELECT count(*)::int AS n FROM prints')) as unknown as [[{ n: number }]];
  if (n === 0) throw new Error('toneledger_scale is empty: npm run seed:scale -- --prints 200000');
  const [[admin]] = (await db().query("SELECT id, name FROM users WHERE role = 'admin' ORDER BY created_at LIMIT 1")) as unknown as [[{ id: string; name: string } | undefined]];
  const [[job]] = (await db().query(
    `INSERT INTO bag_jobs (kind, scope, with_images, created_by, created_by_name) VALUES ('export', 'collection', false, $1, $2) RETURNING id`,
    { bind: [admin?.id ?? null, admin?.name ?? 'bench'] },
  )) as unknown as [[{ id: string }]];
  log(`${n.toLocaleString('en-GB')} prints; load ${os.loadavg()[0]!.toFixed(1)}`);

  const start = process.memoryUsage().rss;
  let peak = start;
  const quarters: string[] = [];
  const sampler = setInterval(() => { peak = Math.max(peak, process.memoryUsage().rss); }, 250);
  const t0 = performance.now();
  let lastLine = t0;
  const watcher = setInterval(() => {
    void db().query('SELECT done, total FROM bag_jobs WHERE id = $1', { bind: [job.id], plain: true }).then((r) => {
      const row = r as unknown as { done: number; total: number } | null;
      if (!row?.total) return;
      const q = Math.floor((4 * row.done) / row.total);
      if (q > quarters.length && q <= 4) {
        quarters.push(`${q * 25}%: ${mb(process.memoryUsage().rss)} after ${((performance.now() - t0) / 1000).toFixed(0)} s`);
        log(`${quarters.at(-1)} (peak so far ${mb(peak)})`);
      } else if (performance.now() - lastLine > 60_000) {
        lastLine = performance.now();
        log(`${row.done.toLocaleString('en-GB')} prints after ${((performance.now() - t0) / 1000).toFixed(0)} s: ${mb(process.memoryUsage().rss)} (peak so far ${mb(peak)}); load ${os.loadavg()[0]!.toFixed(1)}`);
      }
    });
  }, 2000);
  await runExport(job.id, store);
  const ms = performance.now() - t0;
  clearInterval(sampler);
  clearInterval(watcher);
  const [[done]] = (await db().query('SELECT size_bytes, file_count, payload_oxum, object_key FROM bag_jobs WHERE id = $1', { bind: [job.id] })) as unknown as [[{ size_bytes: string; file_count: number; payload_oxum: string; object_key: string }]];
  log(`bag of ${n.toLocaleString('en-GB')} prints without images: ${(ms / 1000).toFixed(1)} s (${((n / ms) * 1000).toFixed(0)} prints/s), ${(Number(done.size_bytes) / 1024 ** 3).toFixed(2)} GB, ${done.file_count.toLocaleString('en-GB')} payload files, Payload-Oxum ${done.payload_oxum}`);
  log(`resident memory: ${mb(start)} at the start; ${quarters.join('; ')}; peak ${mb(Math.max(peak, process.resourceUsage().maxRSS * 1024))}; load ${os.loadavg()[0]!.toFixed(1)}`);
  await store.delete(done.object_key);
  await db().query('DELETE FROM bag_jobs WHERE id = $1', { bind: [job.id] });
  await db().close();
} catch (err) {
  console.error(err);
  code = 1;
} finally {
  await services.stop();
  await cluster?.stop();
}
process.exit(code);
