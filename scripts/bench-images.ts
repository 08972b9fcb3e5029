/**
 * The image pipeline, measured (part of `npm run bench`, or alone: `npx tsx scripts/bench-images.ts`).
 *
 * 1. A 24-megapixel JPEG (6000 × 4000, noisy so it compresses like a photograph) goes through the
 *    real upload route over HTTP on loopback (receive, hash, type check, full decode check, EXIF,
 *    rendering the screen-size WebP copy, store in S3, record) and then the derivative work the
 *    background job runs (the thumbnail), timed apart from the queue's wait. Beside it: sharp alone, reading the
 *    same file and making the same two resizes. Target: pipeline within 1.5 × sharp alone, as the
 *    median of 15 per-run ratios (BENCH_IMAGE_RUNS), the two alternating which goes first.
 * 2. Memory while a 200 MB upload streams in, against a 20 MB one: resident memory of the server
 *    process is sampled every 20 ms; a streamed upload does not grow with the file's size.
 *
 * It runs on fresh local services in a temporary folder, sends requests only to 127.0.0.1, and stops by itself.
 */
import { mkdtempSync, rmSync, statSync, createReadStream, openSync, writeSync, closeSync } from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { startLocalServices } from './services';

const log = (m: string) => console.log(`[bench:images] ${m}`);
const quartile = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b);
  const pos = (s.length - 1) * q;
  return s[Math.floor(pos)] + (s[Math.ceil(pos)] - s[Math.floor(pos)]) * (pos - Math.floor(pos));
};
const median = (xs: number[]) => quartile(xs, 0.5);

function multipartUpload(url: URL, cookie: string, origin: string, file: string, viewType = 'recto'): Promise<{ status: number; body: string }> {
  const boundary = `bench${Date.now()}`;
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="viewType"\r\n\r\n${viewType}\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="bench.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`,
  );
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const size = statSync(file).size;
  return new Promise((resolve, reject) => {
    const req = http.request(url, {
      method: 'POST',
      headers: { cookie, origin, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(head.length + size + tail.length) },
    });
    req.on('response', (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (d: string) => (body += d));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
    });
    req.on('error', reject);
    req.write(head);
    const stream = createReadStream(file);
    stream.on('end', () => req.end(tail));
    stream.pipe(req, { end: false });
  });
}

async function sampleRss<T>(work: () => Promise<T>): Promise<{ result: T; peakMb: number; baseMb: number }> {
  global.gc?.();
  const baseMb = process.memoryUsage().rss / 1024 / 1024;
  let peak = baseMb;
  const timer = setInterval(() => {
    peak = Math.max(peak, process.memoryUsage().rss / 1024 / 1024);
  }, 20);
  try {
    const result = await work();
    return { result, peakMb: peak, baseMb };
  } finally {
    clearInterval(timer);
  }
}

export async function runImageBench(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'toneledger-bench-images-'));
  const services = await startLocalServices('test', () => {});
  let close = async () => {};
  try {
    Object.assign(process.env, services.env, { LOG_LEVEL: 'warn', IMAGE_MAX_MB: '400' });
    const { startServer } = await import('../backend/src/server');
    const { db } = await import('../backend/src/db');
    const { seedDemoIfEmpty } = await import('../backend/src/seed/demo');
    const { signIn } = await import('../backend/test/app');
    const { buildApp } = await import('../backend/src/app');
    const { composeDeps } = await import('../backend/src/compose');
    const { env } = await import('../backend/src/config/env');
    const { makeDerivatives, DERIVATIVES } = await import('../backend/src/services/image.service');
    const { Print } = await import('../backend/src/models');
    const { pino } = await import('pino');
    const running = await startServer({ migrate: true });
    close = running.close;
    await seedDemoIfEmpty(db(), { catalogue: false });
    const origin = process.env.PUBLIC_URL!;
    const app = buildApp(composeDeps(env()), pino({ level: 'silent' }));
    const cookie = await signIn(app, 'conservator@calder-reach.example', 'conservator-demo');
    const print = await Print.create({ accessionNumber: '2000.1.1', accessionSort: '2000.1.1', title: 'Bench print', process: 'gelatin_silver_developing_out', status: 'in_store' } as never);
    const uploadUrl = new URL(`/api/prints/${print.id}/images`, running.url);

    log('making a 24-megapixel JPEG (6000 × 4000)…');
    const jpeg = path.join(dir, 'bench-24mp.jpg');
    await sharp({ create: { width: 6000, height: 4000, channels: 3, background: '#808080', noise: { type: 'gaussian', mean: 128, sigma: 40 } } })
      .blur(1.2)
      .jpeg({ quality: 90 })
      .toFile(jpeg);
    log(`  ${(statSync(jpeg).size / 1024 / 1024).toFixed(1)} MB`);

    // Many runs, alternating which of the two goes first, so both see the same load drift; the
    // figure is the median of the per-run ratios (each pipeline run against the sharp run beside it).
    const runs = Number(process.env.BENCH_IMAGE_RUNS ?? 15);
    const pipeline: number[] = [];
    const ingestOnly: number[] = [];
    const derive: number[] = [];
    const alone: number[] = [];
    const ratios: number[] = [];
    const sharpAlone = async () => {
      // sharp alone: read the file and make the same two WebP copies the same way (screen from the original, thumbnail from the screen copy).
      const t0 = performance.now();
      await sharp(jpeg, { limitInputPixels: 200_000_000 }).metadata();
      const screen = await sharp(jpeg, { limitInputPixels: 200_000_000 }).rotate().resize(DERIVATIVES.screen, DERIVATIVES.screen, { fit: 'inside' }).webp({ quality: 82 }).toBuffer();
      await sharp(screen).resize(DERIVATIVES.thumb, DERIVATIVES.thumb, { fit: 'inside' }).webp({ quality: 70 }).toBuffer();
      return performance.now() - t0;
    };
    const store = running.deps.store;
    const throughPipeline = async () => {
      const t1 = performance.now();
      const res = await multipartUpload(uploadUrl, cookie, origin, jpeg);
      const tIngest = performance.now() - t1;
      if (res.status !== 201) throw new Error(`upload answered ${res.status}: ${res.body}`);
      const id = JSON.parse(res.body).data.id as string;
      const t2 = performance.now();
      await makeDerivatives(store, id);
      return { tIngest, tDerive: performance.now() - t2 };
    };
    for (let i = 0; i < runs + 1; i++) {
      let tAlone: number;
      let p: { tIngest: number; tDerive: number };
      if (i % 2 === 0) {
        tAlone = await sharpAlone();
        p = await throughPipeline();
      } else {
        p = await throughPipeline();
        tAlone = await sharpAlone();
      }
      if (i === 0) continue; // warm-up
      alone.push(tAlone);
      ingestOnly.push(p.tIngest);
      derive.push(p.tDerive);
      pipeline.push(p.tIngest + p.tDerive);
      ratios.push((p.tIngest + p.tDerive) / tAlone);
    }
    const ratio = median(ratios);
    console.log('');
    console.log(`Image pipeline, 24-megapixel JPEG (medians of ${runs} runs after 1 warm-up, the two alternating which goes first; load average ${os.loadavg().map((x) => x.toFixed(2)).join(' ')})`);
    console.log(`  upload route (receive, SHA-256, type, full decode rendering the screen copy, EXIF, S3, record)  ${median(ingestOnly).toFixed(0).padStart(6)} ms`);
    console.log(`  derivative job (thumbnail ${DERIVATIVES.thumb} px from the ${DERIVATIVES.screen} px screen copy, store)   ${median(derive).toFixed(0).padStart(6)} ms`);
    console.log(`  pipeline total                                                         ${median(pipeline).toFixed(0).padStart(6)} ms`);
    console.log(`  sharp alone, same resizes                                              ${median(alone).toFixed(0).padStart(6)} ms`);
    console.log(`  ratio pipeline / sharp alone, median of the ${runs} per-run ratios: ${ratio.toFixed(2)}× (quartiles ${quartile(ratios, 0.25).toFixed(2)}–${quartile(ratios, 0.75).toFixed(2)}; ratio of medians ${(median(pipeline) / median(alone)).toFixed(2)}×)   target < 1.5×: ${ratio < 1.5 ? 'met' : 'NOT met'}`);
    console.log('  (the queue\'s pick-up wait, up to its 1 s polling interval, is not counted: it is latency, not work)');

    // Memory while streaming: junk bodies with a JPEG signature stream fully to disk, then fail the decode check.
    const makeFile = (mb: number) => {
      const file = path.join(dir, `stream-${mb}mb.bin`);
      const fd = openSync(file, 'w');
      const chunk = Buffer.alloc(1024 * 1024, 0x5a);
      chunk[0] = 0xff;
      chunk[1] = 0xd8;
      chunk[2] = 0xff;
      writeSync(fd, chunk);
      chunk[0] = chunk[1] = chunk[2] = 0x5a;
      for (let i = 1; i < mb; i++) writeSync(fd, chunk);
      closeSync(fd);
      return file;
    };
    console.log('');
    console.log('Memory held by the server process while an upload streams in');
    const results: { mb: number; growth: number; status: number }[] = [];
    for (const mb of [20, 200]) {
      const file = makeFile(mb);
      const { result, peakMb, baseMb } = await sampleRss(() => multipartUpload(uploadUrl, cookie, origin, file));
      results.push({ mb, growth: peakMb - baseMb, status: result.status });
      console.log(`  ${String(mb).padStart(3)} MB upload: resident memory grew by ${(peakMb - baseMb).toFixed(1)} MB (peak ${peakMb.toFixed(0)} MB); answered ${result.status} (the body is not an image)`);
      rmSync(file);
    }
    const [small, big] = results;
    const flat = big.growth < small.growth + 40;
    console.log(`  10× the file, ${(big.growth - small.growth).toFixed(1)} MB more memory: ${flat ? 'streamed (does not grow with the file)' : 'GROWS with the file size'}`);
    console.log('  (the sender runs in the same process, so its own read buffers are included)');
  } finally {
    await close().catch(() => {});
    await services.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await runImageBench();
  process.exit(0);
}
