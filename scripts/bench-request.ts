/**
 * The fixed cost of a signed-in request, for `npm run bench`.
 *
 * `productionApp` builds the app as production runs it (NODE_ENV=production: no response-contract
 * check, every request logged at info) from the collaborators of a running server, with the log
 * written to /dev/null instead of the terminal. Only the transport differs: plain HTTP on loopback.
 *
 * `instrument` wraps every middleware of that app to time each stage of a request with
 * process.hrtime: from entering a middleware to its `next()`, and for the router (access check,
 * validation, handler, JSON) from entering it to `res.end`. The log line pino-http writes when the
 * response finishes is timed apart. `measureMe` asks GET /api/me many times and prints each
 * stage's median in µs, beside the client's whole request time (HTTP on loopback included).
 */
import { open } from 'node:fs/promises';
import http, { type Server } from 'node:http';
import type { Express, NextFunction, Request, Response } from 'express';
import type { Logger } from 'pino';
import type { AppDeps } from '../backend/src/deps';

type Stage = { label: string; samples: number[] };
const now = () => Number(process.hrtime.bigint()) / 1000; // µs

export const median = (xs: number[]) => quantile(xs, 0.5);
export function quantile(xs: number[], q: number): number {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const pos = (s.length - 1) * q;
  const lo = Math.floor(pos);
  const hi = Math.ceil(pos);
  return s[lo] + (s[hi] - s[lo]) * (pos - lo);
}

const LABELS: Record<string, string> = {
  requestId: 'request id',
  result: 'pino-http (attach logger)',
  loggingMiddleware: 'pino-http (attach logger)',
  helmetMiddleware: 'helmet (security headers)',
  jsonParser: 'express.json (no body on a GET)',
  sameOrigin: 'same-origin check',
  session: 'session (cookie + store read)',
  loadUser: 'signed-in user (role read fresh)',
  router: 'route: access, validation, handler, JSON',
};

export interface Instrumented {
  stages: Stage[];
  /** Entry of the first middleware → res.end, per request. */
  server: number[];
  /** pino-http's log line, written when the response finishes. */
  log: number[];
  reset(): void;
}

/** Wraps each layer of the app's router; call before the app serves any request. */
export function instrument(app: Express): Instrumented {
  const router = (app as unknown as { router: { stack: { name: string; handle: (...a: never[]) => unknown }[] } }).router;
  const result: Instrumented = {
    stages: [],
    server: [],
    log: [],
    reset() {
      for (const s of result.stages) s.samples.length = 0;
      result.server.length = 0;
      result.log.length = 0;
    },
  };
  router.stack.forEach((layer, i) => {
    const original = layer.handle;
    if (original.length === 4) return; // error handlers
    const stage: Stage = { label: LABELS[layer.name] ?? (layer.name === '<anonymous>' || !layer.name ? `middleware ${i}` : layer.name), samples: [] };
    const after = i > 0 ? router.stack[i - 1].name : '';
    if (layer.name === '<anonymous>' && after === 'helmetMiddleware') stage.label = 'Cache-Control: no-store';
    if (layer.name === '<anonymous>' && after === 'jsonParser') stage.label = 'same-origin check';
    result.stages.push(stage);
    const first = i === 0;
    const isRouter = layer.name === 'router';
    layer.handle = function timed(this: unknown, req: Request, res: Response, next: NextFunction) {
      const t0 = now();
      if (first) {
        // Runs before pino-http's own 'finish' listener; the router stage adds one after it.
        const end = res.end.bind(res);
        res.end = ((...a: Parameters<Response['end']>) => {
          result.server.push(now() - t0);
          return end(...a);
        }) as Response['end'];
        res.once('finish', () => {
          (res as unknown as { logStart: number }).logStart = now();
        });
      }
      if (isRouter) {
        const end = res.end.bind(res);
        res.end = ((...a: Parameters<Response['end']>) => {
          stage.samples.push(now() - t0);
          return end(...a);
        }) as Response['end'];
        res.once('finish', () => {
          const start = (res as unknown as { logStart?: number }).logStart;
          if (start) result.log.push(now() - start);
        });
        return (original as (...a: unknown[]) => unknown).call(this, req, res, next);
      }
      return (original as (...a: unknown[]) => unknown).call(this, req, res, (err?: unknown) => {
        stage.samples.push(now() - t0);
        next(err as never);
      });
    };
  });
  return result;
}

export interface ProductionApp {
  /** The measured app: as production builds it, nothing added. */
  app: Express;
  url: string;
  /** A second, identical app whose every stage is timed (`instrument`), for the breakdown alone. */
  instrumentedUrl: string;
  instrumented: Instrumented;
  close(): Promise<void>;
}

/**
 * The app as production builds it, its log going to /dev/null, listening on a free loopback port;
 * beside it an identical app with every stage timed. The timing wrappers cost time and garbage of
 * their own on every request, so the figures compared with targets come from the plain app and
 * the breakdown from the timed one.
 */
export async function productionApp(deps: AppDeps): Promise<ProductionApp> {
  const { pino } = await import('pino');
  const { buildApp } = await import('../backend/src/app');
  const devNull = await open('/dev/null', 'w');
  const logger: Logger = pino(
    { level: 'info', redact: ['req.headers.cookie', 'res.headers["set-cookie"]'] },
    pino.destination({ fd: devNull.fd, sync: false }),
  );
  const build = () => buildApp({ ...deps, env: { ...deps.env, NODE_ENV: 'production' } }, logger);
  const app = build();
  const timed = build();
  // Touch the lazy router so its stack exists, then time it.
  timed.get('/__bench_never', (_req, res) => res.end());
  const instrumented = instrument(timed);
  const listen = (a: Express) =>
    new Promise<Server>((resolve) => {
      const s = a.listen(0, '127.0.0.1', () => resolve(s));
    });
  const servers = [await listen(app), await listen(timed)];
  const [url, instrumentedUrl] = servers.map((server) => {
    const address = server.address();
    return `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}`;
  });
  return {
    app,
    url: url!,
    instrumentedUrl: instrumentedUrl!,
    instrumented,
    close: async () => {
      await Promise.all(
        servers.map(
          (server) =>
            new Promise<void>((resolve) => {
              server.close(() => resolve());
              server.closeAllConnections();
            }),
        ),
      );
      await devNull.close();
    },
  };
}

/**
 * The floor under the house: plain Express answering GET `path` with `answer()` as JSON, nothing
 * else (no session, no log line, no security headers, no contract). What a request costs in this
 * process before anything the product adds.
 */
export async function plainExpress(path: string, answer: () => Promise<unknown>): Promise<{ url: string; close(): Promise<void> }> {
  const express = (await import('express')).default;
  const app = express();
  app.set('etag', false);
  app.get(path, (_req, res, next) => {
    answer().then((body) => res.json(body), next);
  });
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const address = server.address();
  return {
    url: `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });

/**
 * GET over one kept-alive loopback connection, the whole body read and parsed. node:http rather
 * than fetch: fetch's own cost in this process (about a millisecond under load) is the client's,
 * not the server's.
 */
export function getJson<T = unknown>(url: string, cookie: string): Promise<{ status: number; body: T }> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { agent, headers: { cookie } }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          try {
            resolve({ status: res.statusCode ?? 0, body: JSON.parse(Buffer.concat(chunks).toString('utf8')) as T });
          } catch (err) {
            reject(err);
          }
        });
        res.on('error', reject);
      })
      .on('error', reject);
  });
}

/** GET /api/me `runs` times after `warmup`; prints the breakdown and returns the client's times (ms). */
export function measureMe(
  target: ProductionApp, cookie: string, runs: number, warmup: number,
  inProcess: { label: string; run: () => unknown }[],
): Promise<{ median: number; p95: number }> {
  return measureRequest(target, '/api/me', 'Cost of a signed-in request: GET /api/me', cookie, runs, warmup, inProcess);
}

/**
 * GET `path` `runs` times after `warmup` from the plain app (the figures returned), then as many
 * times from the timed app for each stage's median; prints both.
 */
export async function measureRequest(
  target: ProductionApp, path: string, title: string, cookie: string, runs: number, warmup: number,
  inProcess: { label: string; run: () => unknown }[],
): Promise<{ median: number; p95: number }> {
  const { instrumented } = target;
  const times = async (base: string, before?: () => void) => {
    const xs: number[] = [];
    for (let i = 0; i < runs + warmup; i++) {
      if (i === warmup) before?.();
      const t0 = performance.now();
      const res = await getJson(`${base}${path}`, cookie);
      if (res.status !== 200) throw new Error(`GET ${path} answered ${res.status}`);
      if (i >= warmup) xs.push(performance.now() - t0);
    }
    return xs;
  };
  const client = await times(target.url);
  const timedClient = await times(target.instrumentedUrl, () => instrumented.reset());
  const us = (x: number) => `${Math.round(x).toString().padStart(6)} µs`;
  const width = Math.max(...instrumented.stages.map((s) => s.label.length), ...inProcess.map((s) => s.label.length + 4), 52);
  console.log('');
  console.log(`${title}, ${runs} runs after ${warmup} warm-up, production configuration (medians):`);
  console.log(`  ${'client: whole request'.padEnd(width)} ${us(median(client) * 1000)}   p95 ${us(quantile(client, 0.95) * 1000)}`);
  console.log(`  where the time goes, from the same app with each stage timed (${runs} runs more):`);
  for (const s of instrumented.stages) if (s.samples.length) console.log(`    ${s.label.padEnd(width - 2)} ${us(median(s.samples))}`);
  for (const p of inProcess) {
    const xs: number[] = [];
    for (let i = 0; i < 200; i++) {
      const t0 = now();
      await p.run();
      xs.push(now() - t0);
    }
    console.log(`      ${p.label.padEnd(width - 4)} ${us(median(xs))}   (in process, 200 runs)`);
  }
  console.log(`    ${'pino-http log line (on finish, after the answer)'.padEnd(width - 2)} ${us(median(instrumented.log))}`);
  const server = median(instrumented.server);
  const total = median(timedClient) * 1000;
  console.log(`    ${'server: first middleware → res.end'.padEnd(width - 2)} ${us(server)}`);
  console.log(`    ${'HTTP on loopback + client (node:http, JSON)'.padEnd(width - 2)} ${us(total - server)}`);
  console.log(`    ${'client: whole request, stages timed'.padEnd(width - 2)} ${us(total)}   p95 ${us(quantile(timedClient, 0.95) * 1000)}`);
  return { median: median(client), p95: quantile(client, 0.95) };
}
