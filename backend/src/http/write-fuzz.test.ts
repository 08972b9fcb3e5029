import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import fc from 'fast-check';
import type { z } from 'zod';
import { ROLES, rolesWith, type Role } from '@toneledger/common/domain/roles';
import { errorEnvelopeSchema } from '@toneledger/common/schemas/envelope';
import type { Endpoint } from '@toneledger/common/api/endpoint';
import { testApp, sessionFor } from '../../test/app';
import { allRoutes } from '../app';

/**
 * Property-based fuzzing of every write route (post/put/patch/delete) in `allRoutes()`, called by a
 * role allowed to call it, with malformed path ids, query strings and bodies. Whatever comes in:
 *
 *   - no answer is a 5xx;
 *   - every error answer is the one envelope, its `status` the HTTP status;
 *   - no answer shows a stack frame, SQL or the database driver's words.
 *
 * Bounded and replayable: FUZZ_RUNS runs per route (default 15), FUZZ_TIME_MS for the whole file
 * (default 90 s, shared between routes), FUZZ_SEED (default fixed). A failure names the route, the
 * seed and the counterexample; `FUZZ_SEED=<seed> npm test -- --project backend <this file> -t "<route>"`
 * replays it. See "Fuzz and access tests" in DEVELOPERS.md.
 */

const SEED = Number(process.env.FUZZ_SEED ?? 20261202);
const RUNS = Number(process.env.FUZZ_RUNS ?? 15);
const TIME_MS = Number(process.env.FUZZ_TIME_MS ?? 90_000);

const t = testApp();
const cookie = {} as Record<Role, string>;

const routes = allRoutes(t.deps).filter((r) => r.endpoint.method !== 'get');
const keyOf = (e: Endpoint) => `${e.method.toUpperCase()} ${e.path}`;
const perRouteMs = Math.max(1_000, Math.floor(TIME_MS / routes.length));

/** Settings a lucky body could change for the files that run after this one: put back afterwards. */
const SETTINGS = ['/api/settings/catalogue', '/api/settings/condition', '/api/settings/measurements', '/api/settings/light', '/api/settings/climate'];
const saved = new Map<string, unknown>();

beforeAll(async () => {
  for (const r of ROLES) cookie[r] = await sessionFor(t.app, r);
  for (const path of SETTINGS) {
    const res = await supertest(t.app).get(path).set('Cookie', cookie.admin);
    expect(res.status, `${path} ${res.text}`).toBe(200);
    saved.set(path, res.body.data);
  }
});

afterAll(async () => {
  try {
    for (const [path, data] of saved) {
      const res = await supertest(t.app).put(path).set('Origin', t.origin).set('Cookie', cookie.admin).send(data as object);
      expect(res.status, `restoring ${path}: ${res.text}`).toBe(200);
    }
  } finally {
    await t.close();
  }
});

/** A role allowed to call the endpoint (no session for a public one: /auth/logout would end a role's session). */
function callerOf(e: Endpoint): Role | null {
  if (e.access === 'public') return null;
  if (e.access === 'signed_in') return 'viewer';
  return rolesWith(e.access)[0]!;
}

function keysOf(schema: z.ZodType | undefined): string[] {
  let s = schema as unknown as { shape?: Record<string, unknown>; unwrap?: () => unknown } | undefined;
  for (let i = 0; i < 3 && s && !s.shape && typeof s.unwrap === 'function'; i++) s = s.unwrap() as typeof s;
  return s?.shape ? Object.keys(s.shape) : [];
}

// ── Generators ────────────────────────────────────────────────────────────────

const LONE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;
/** encodeURIComponent, except that a lone surrogate (which it refuses) goes as the bytes ED A0 80. */
const enc = (s: string) => encodeURIComponent(s.replace(LONE, '\uFFFF')).replace(/%EF%BF%BF/g, '%ED%A0%80');

const weirdString = fc.constantFrom(
  '', ' ', 'null', 'undefined', 'true', 'NaN', 'Infinity', '-Infinity', '1e309', '-0', '0x1F', '9007199254740993',
  '-9007199254740993', '2024-02-31', '2023-02-29', '0000-01-01', '2024-13-01', '2024-00-10', '99999-01-01',
  '2024-01-01T25:00:00Z', '2024-01-01T00:00:00+15:00', '2024-02-31T00:00:00Z', '\u0000', 'a\u0000b', '\ud800',
  'x\udc00y', '\udbff\udbff', '__proto__', 'constructor', 'prototype', '[]', '{}', '../../etc/passwd', "'; --", '%', '%00',
  '\u202e', '\ufeff', '😀', '\r\n', '=1+1', 'create_only', 'thumb',
);
const hugeString = fc.constantFrom(1_000, 10_000, 200_000).map((n) => 'x'.repeat(n));
const smallText = fc.oneof(
  { weight: 4, arbitrary: weirdString },
  { weight: 3, arbitrary: fc.string({ maxLength: 30 }) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 12 }) },
);
/** Huge strings only at the top of a value, so a body stays near the 1 MB limit instead of hundreds of MB. */
const text = fc.oneof({ weight: 9, arbitrary: smallText }, { weight: 1, arbitrary: hugeString });
const number = fc.oneof(
  fc.constantFrom(2 ** 53, 2 ** 53 + 2, -(2 ** 53) - 2, 1e308, -1e308, 5e-324, -0, 0.5, 1.5, -1, 0, 1e21, 2 ** 31, -(2 ** 31) - 1),
  fc.integer(),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
);
const leaf = fc.oneof(smallText, number, fc.boolean(), fc.constant(null));
const key = (known: string[]) =>
  fc.oneof(
    fc.constantFrom('__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', '', 'a.b', '0', 'id', 'version', ...known),
    fc.string({ maxLength: 8 }),
    fc.constantFrom('\u0000', 'k\ud800'),
  );
const longArray = fc.constantFrom(1_000, 20_000).chain((n) => leaf.map((v) => Array.from({ length: n }, () => v)));

function jsonValue(known: string[]) {
  const { value } = fc.letrec<{ value: unknown }>((tie) => ({
    value: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      leaf,
      fc.array(tie('value'), { maxLength: 4 }),
      fc.dictionary(key(known), tie('value'), { maxKeys: 4 }),
    ),
  }));
  return fc.oneof({ weight: 6, arbitrary: value }, { weight: 1, arbitrary: longArray }, { weight: 1, arbitrary: hugeString });
}

type Body =
  | { kind: 'json'; value: unknown }
  | { kind: 'raw'; type: string; text: string | Buffer };

function bodies(known: string[]): fc.Arbitrary<Body> {
  const field = known.length ? fc.constantFrom(...known) : fc.constant('a');
  const nest = (d: number, open: string, close: string, inner: string) => open.repeat(d) + inner + close.repeat(d);
  return fc.oneof(
    // The endpoint's own fields, each with a wrong value.
    { weight: 5, arbitrary: fc.record(Object.fromEntries(known.map((k) => [k, jsonValue(known)])), { requiredKeys: [] }).map((value) => ({ kind: 'json', value }) as Body) },
    // Any JSON at all (top-level scalars and arrays too).
    { weight: 3, arbitrary: jsonValue(known).map((value) => ({ kind: 'json', value }) as Body) },
    // What JSON.stringify cannot write: the parser must refuse it.
    {
      weight: 3,
      arbitrary: fc.tuple(field, fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e400', '-1e400', '9007199254740993', '"\\ud800"', '"\\u0000"', '"\\udc00x"', 'undefined', "'x'", '0x10', '01'))
        .map(([f, v]) => ({ kind: 'raw', type: 'application/json', text: `{"${f}":${v}}` }) as Body),
    },
    {
      weight: 3,
      arbitrary: fc.constantFrom(
        '', 'null', '"text"', '42', 'true', '{', '{"a":', '{"a":1,}', '[1,2', '{"a":1}{"b":2}',
        '{"__proto__":{"role":"admin","isAdmin":true},"constructor":{"prototype":{"polluted":1}}}',
        '{"version":1,"version":"two"}',
      ).map((text) => ({ kind: 'raw', type: 'application/json', text }) as Body),
    },
    // Deep nesting, as raw text (JSON.stringify itself would recurse).
    {
      weight: 2,
      arbitrary: fc.tuple(field, fc.constantFrom(100, 2_000, 20_000), fc.boolean()).map(([f, d, arr]) => ({
        kind: 'raw', type: 'application/json',
        text: `{"${f}":${arr ? nest(d, '[', ']', '1') : nest(d, '{"a":', '}', '1')}}`,
      }) as Body),
    },
    // Not UTF-8, other content types, a multipart body that ends too soon.
    {
      weight: 2,
      arbitrary: fc.constantFrom<Body>(
        { kind: 'raw', type: 'application/json', text: Buffer.from([0x7b, 0x22, 0x61, 0x22, 0x3a, 0x22, 0xff, 0xfe, 0x22, 0x7d]) },
        { kind: 'raw', type: 'application/json; charset=latin1', text: '{"a":"b"}' },
        { kind: 'raw', type: 'text/plain', text: 'hello' },
        { kind: 'raw', type: 'application/x-www-form-urlencoded', text: 'a=b&__proto__[x]=1&version=NaN' },
        { kind: 'raw', type: 'multipart/form-data; boundary=XyZ', text: '--XyZ\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\n\r\nabc' },
        { kind: 'raw', type: 'multipart/form-data', text: 'no boundary' },
      ),
    },
  );
}

const idValue = fc.oneof(
  { weight: 2, arbitrary: fc.uuid().map(enc) },
  { weight: 4, arbitrary: text.filter((s) => s.length > 0 && s.length <= 2_000).map(enc) },
  // Already encoded: malformed escapes, NUL, a lone surrogate as UTF-8 bytes, an id with a slash.
  { weight: 2, arbitrary: fc.constantFrom('%', '%zz', '%00', '%ED%A0%80', '%FF', '..', '%2F', '1%2F2', '00000000-0000-0000-0000-000000000000', 'FFFFFFFF-FFFF-FFFF-FFFF-FFFFFFFFFFFF', '1e309', '-1') },
);

function queries(known: string[]): fc.Arbitrary<string> {
  const k = fc.oneof(
    fc.constantFrom('__proto__', 'constructor[prototype][x]', '__proto__[role]', 'a[b][c][d][e][f][g][h]', 'a[]', 'a[99999]', 'version[]', 'version', 'page', ...known),
    fc.string({ maxLength: 8 }),
  );
  const v = text.filter((s) => s.length <= 2_000);
  const pair = fc.oneof(
    fc.tuple(k, v).map(([a, b]) => `${enc(a)}=${enc(b)}`),
    fc.constantFrom('%', 'a=%zz', '%00=1', 'a=%ED%A0%80', '=', '&&', 'a'),
  );
  return fc.array(pair, { maxLength: 5 }).map((ps) => ps.join('&'));
}

// ── The property ──────────────────────────────────────────────────────────────

/** Words no answer may carry: a stack frame, SQL, the database driver and its error texts. */
const LEAKS: Array<[string, RegExp]> = [
  ['a stack frame', /\bat [\w$.<>\[\] ]+ \(|\bat (?:file|node):|\.(?:ts|js|mjs):\d+:\d+/],
  ['SQL', /\b(?:SELECT|INSERT|UPDATE|DELETE)\b[\s\S]{0,200}\b(?:FROM|INTO|SET|WHERE|VALUES)\b/],
  ['Sequelize', /sequelize/i],
  ['node_modules', /node_modules/],
];
/** Checked in the messages the server writes (not in field paths, which may echo a generated key). */
const MESSAGE_LEAKS: Array<[string, RegExp]> = [
  ['pg', /\bpg\b|\bpg-/i],
  ['a PostgreSQL error', /violates|invalid input syntax|syntax error at|relation "|column "|out of range for type|SQLSTATE/i],
  ['SQL', /\b(?:SELECT|INSERT)\b/],
];

function urlOf(e: Endpoint, ids: string[], query: string) {
  let i = 0;
  const path = e.path.replace(/:([A-Za-z0-9_]+)/g, () => ids[i++ % ids.length]!);
  return query ? `${path}?${query}` : path;
}

async function send(e: Endpoint, role: Role | null, url: string, body: Body) {
  let req = supertest(t.app)[e.method](url).set('Origin', t.origin);
  if (role) req = req.set('Cookie', cookie[role]);
  if (body.kind === 'json') return req.set('Content-Type', 'application/json').send(JSON.stringify(body.value) ?? 'null');
  return req.set('Content-Type', body.type).send(body.text);
}

function problemsOf(res: supertest.Response): string[] {
  const found: string[] = [];
  if (res.status >= 500) found.push(`answered ${res.status}`);
  for (const [what, re] of LEAKS) if (re.test(res.text ?? '')) found.push(`shows ${what}`);
  if (res.status >= 400) {
    const env = errorEnvelopeSchema.safeParse(res.body);
    if (!env.success) found.push('error body is not the envelope');
    else {
      if (env.data.error.status !== res.status) found.push(`envelope status ${env.data.error.status} ≠ HTTP ${res.status}`);
      const details = Array.isArray(env.data.error.details) ? (env.data.error.details as Array<{ message?: unknown }>) : [];
      const messages = [env.data.error.message, ...details.map((d) => String(d?.message ?? ''))];
      for (const [what, re] of MESSAGE_LEAKS) if (messages.some((m) => re.test(m))) found.push(`message shows ${what}`);
    }
  }
  return found;
}

const show = (v: unknown) => {
  const s = typeof v === 'string' ? v : Buffer.isBuffer(v) ? `<bytes ${v.toString('hex')}>` : JSON.stringify(v);
  return s && s.length > 400 ? `${s.slice(0, 400)}… (${s.length} chars)` : s;
};

describe(`write routes under malformed input (FUZZ_SEED=${SEED}, FUZZ_RUNS=${RUNS})`, () => {
  it('fuzzes every write route the app serves', () => {
    expect(routes.length).toBeGreaterThan(30);
    for (const r of routes) expect(['post', 'put', 'patch', 'delete']).toContain(r.endpoint.method);
  });

  it.each(routes.map((r) => [keyOf(r.endpoint), r.endpoint] as const))('%s', async (name, e) => {
    const role = callerOf(e);
    const bodyKeys = keysOf(e.body);
    const queryKeys = keysOf(e.query);
    const params = (e.path.match(/:[A-Za-z0-9_]+/g) ?? []).length;
    const input = fc.record({
      ids: fc.array(idValue, { minLength: Math.max(params, 1), maxLength: Math.max(params, 1) }),
      query: queries(queryKeys),
      body: bodies(bodyKeys),
    });
    const property = fc.asyncProperty(input, async ({ ids, query, body }) => {
      const url = urlOf(e, ids, query);
      const res = await send(e, role, url, body);
      const problems = problemsOf(res);
      if (problems.length) {
        throw new Error(
          `${name} as ${role ?? 'no session'}: ${problems.join('; ')}\n` +
          `  url:  ${show(url)}\n  body: ${body.kind === 'json' ? show(body.value) : `${body.type} ${show(body.text)}`}\n` +
          `  answer: ${res.status} ${show(res.text)}`,
        );
      }
    });
    try {
      await fc.assert(property, { seed: SEED, numRuns: RUNS, plugins: [fc.interruptAfterTimeLimit(perRouteMs)] });
    } catch (err) {
      throw new Error(`${name}: replay with FUZZ_SEED=${SEED} npm test -- --project backend backend/src/http/write-fuzz.test.ts -t "${name}"\n${(err as Error).message}`);
    }
  }, perRouteMs + 60_000);
});
