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

/** The app as production builds it, its log going to /dev/null; listens on a free loopback port. */
export async function productionApp(deps: AppDeps): Promise<{ app: Express; url: string; close(): Promise<void>; instrumented: Instrumented }> {
  const { pino } = await import('pino');
  const { buildApp } = await import('../backend/src/app');
  const devNull = await open('/dev/null', 'w');
  const logger: Logger = pino(
    { level: 'info', redact: ['req.headers.cookie', 'res.headers["set-cookie"]'] },
    pino.destination({ fd: devNull.fd, sync: false }),
  );
  const app = buildApp({ ...deps, env: { ...deps.env, NODE_ENV: 'production' } }, logger);
  // Touch the lazy router so its stack exists, then time it.
  app.get('/__bench_never', (_req, res) => res.end());
  const instrumented = instrument(app);
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  return {
    app,
    url: `http://127.0.0.1:${port}`,
    instrumented,
    close: async () => {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await devNull.close();
    },
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
  base: string, cookie: string, runs: number, warmup: number, instrumented: Instrumented,
  inProcess: { label: string; run: () => unknown }[],
): Promise<{ median: number; p95: number }> {
  return measureRequest(base, '/api/me', 'Cost of a signed-in request: GET /api/me', cookie, runs, warmup, instrumented, inProcess);
}

/** GET `path` `runs` times after `warmup`; prints each stage's median and returns the client's times (ms). */
export async function measureRequest(
  base: string, path: string, title: string, cookie: string, runs: number, warmup: number, instrumented: Instrumented,
  inProcess: { label: string; run: () => unknown }[],
): Promise<{ median: number; p95: number }> {
  const client: number[] = [];
  for (let i = 0; i < runs + warmup; i++) {
    if (i === warmup) instrumented.reset();
    const t0 = performance.now();
    const res = await getJson(`${base}${path}`, cookie);
    if (res.status !== 200) throw new Error(`GET ${path} answered ${res.status}`);
    if (i >= warmup) client.push(performance.now() - t0);
  }
  const us = (x: number) => `${Math.round(x).toString().padStart(6)} µs`;
  const width = Math.max(...instrumented.stages.map((s) => s.label.length), ...inProcess.map((s) => s.label.length + 4), 44);
  console.log('');
  console.log(`${title}, ${runs} runs after ${warmup} warm-up, production configuration (medians):`);
  for (const s of instrumented.stages) if (s.samples.length) console.log(`  ${s.label.padEnd(width)} ${us(median(s.samples))}`);
  for (const p of inProcess) {
    const xs: number[] = [];
    for (let i = 0; i < 200; i++) {
      const t0 = now();
      await p.run();
      xs.push(now() - t0);
    }
    console.log(`    ${p.label.padEnd(width - 2)} ${us(median(xs))}   (in process, 200 runs)`);
  }
  console.log(`  ${'pino-http log line (on finish, after the answer)'.padEnd(width)} ${us(median(instrumented.log))}`);
  const server = median(instrumented.server);
  const total = median(client) * 1000;
  console.log(`  ${'server: first middleware → res.end'.padEnd(width)} ${us(server)}`);
  console.log(`  ${'HTTP on loopback + client (node:http, JSON)'.padEnd(width)} ${us(total - server)}`);
  console.log(`  ${'client: whole request'.padEnd(width)} ${us(total)}   p95 ${us(quantile(client, 0.95) * 1000)}`);
  return { median: median(client), p95: quantile(client, 0.95) };
}
