import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import sharp from 'sharp';
import { Op } from 'sequelize';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { testApp, sessionFor } from '../../test/app';
import { accession, createEnclosure, createImageRecord, createLocation, createMaker, createPaper, createRecipe } from '../../test/factories';
import {
  Addendum, BathRecipe, ConditionTerm, EnclosureType, Image, Location, Maker, MeasurementSpot, Paper, Print, Setting,
} from '../models';

const t = testApp();
const c = {} as Record<Role, string>;
afterAll(() => t.close());

type Method = 'post' | 'patch' | 'put';
const send = (method: Method, url: string, role: Role, body: object) =>
  supertest(t.app)[method](url).set('Origin', t.origin).set('Cookie', c[role]).send(body);
const tag = () => randomUUID().slice(0, 8);

/** The two kinds of text the rule refuses, with the words a person reads. */
const BAD = [
  { name: 'NUL', char: '\u0000', message: /invisible control character \(NUL\)/ },
  { name: 'lone high surrogate', char: '\ud800', message: /broken character/ },
  { name: 'lone low surrogate', char: '\udc00', message: /broken character/ },
] as const;

interface Case {
  name: string;
  role: Role;
  method: Method;
  url: () => string;
  /** The body, with `bad` placed in one text field. */
  body: (bad: string) => object;
  /** Where the bad text is, as the envelope names it. */
  path: string;
  /** What must be the same before and after the refused write. */
  state: () => Promise<unknown>;
}

const rec = {} as {
  maker: Maker; paper: Paper; recipe: BathRecipe; enclosure: EnclosureType; location: Location; print: { id: string; version: number };
  image: Image; spot: { id: string; version: number }; term: string; report: { id: string }; prefix: string;
};
const row = async (model: { findByPk(id: string): Promise<{ toJSON(): object } | null> }, id: string) => (await model.findByPk(id))!.toJSON();

beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
  rec.prefix = `Input rules ${tag()}`;
  rec.maker = await createMaker();
  rec.paper = await createPaper();
  rec.recipe = await createRecipe();
  rec.enclosure = await createEnclosure();
  rec.location = await createLocation();
  const p = await send('post', '/api/prints', 'registrar', { accessionNumber: accession(), title: 'Weir at dusk', process: 'gelatin_silver_developing_out' });
  expect(p.status, JSON.stringify(p.body)).toBe(201);
  rec.print = p.body.data;
  rec.image = await createImageRecord(rec.print.id);
  const s = await send('post', `/api/prints/${rec.print.id}/measurement-spots`, 'conservator', { name: 'Dmax', purpose: 'dmax' });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  rec.spot = s.body.data;
  rec.term = `t_${tag()}`;
  const term = await send('post', '/api/condition-terms', 'admin', { code: rec.term, label: 'Edge lifting' });
  expect(term.status, JSON.stringify(term.body)).toBe(201);
  const draft = await send('post', `/api/prints/${rec.print.id}/condition-reports`, 'conservator', { examinedOn: '2025-03-14', context: 'routine', grade: 'fair' });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  const signed = await send('post', `/api/condition-reports/${draft.body.data.id}/sign`, 'conservator', { version: draft.body.data.version });
  expect(signed.status, JSON.stringify(signed.body)).toBe(200);
  rec.report = signed.body.data;
});

const named = (model: { count(o: object): Promise<number> }, field: string) => () => model.count({ where: { [field]: { [Op.like]: `${rec.prefix}%` } } });

const CASES: Case[] = [
  { name: 'maker create', role: 'registrar', method: 'post', url: () => '/api/makers', body: (b) => ({ name: `${rec.prefix} ${b}` }), path: 'name', state: named(Maker, 'name') },
  { name: 'maker edit', role: 'registrar', method: 'patch', url: () => `/api/makers/${rec.maker.id}`, body: (b) => ({ notes: `Studio ${b}`, version: rec.maker.version }), path: 'notes', state: () => row(Maker, rec.maker.id) },
  { name: 'paper edit', role: 'registrar', method: 'patch', url: () => `/api/papers/${rec.paper.id}`, body: (b) => ({ product: `Bromide ${b}`, version: rec.paper.version }), path: 'product', state: () => row(Paper, rec.paper.id) },
  {
    name: 'recipe create (nested ingredient)', role: 'registrar', method: 'post', url: () => '/api/recipes',
    body: (b) => ({ name: `${rec.prefix} toner`, volumeMl: 500, ingredients: [{ chemical: 'water', amount: 1, unit: 'g' }, { chemical: `sodium ${b}sulphide`, amount: 4, unit: 'g' }] }),
    path: 'ingredients.1.chemical', state: named(BathRecipe, 'name'),
  },
  { name: 'recipe edit', role: 'registrar', method: 'patch', url: () => `/api/recipes/${rec.recipe.id}`, body: (b) => ({ mixingNotes: `Stir ${b}`, version: rec.recipe.version }), path: 'mixingNotes', state: () => row(BathRecipe, rec.recipe.id) },
  { name: 'enclosure edit', role: 'registrar', method: 'patch', url: () => `/api/enclosures/${rec.enclosure.id}`, body: (b) => ({ name: `Folder ${b}`, version: rec.enclosure.version }), path: 'name', state: () => row(EnclosureType, rec.enclosure.id) },
  { name: 'location edit', role: 'registrar', method: 'patch', url: () => `/api/locations/${rec.location.id}`, body: (b) => ({ name: `Room ${b}`, version: rec.location.version }), path: 'name', state: () => row(Location, rec.location.id) },
  {
    name: 'print create', role: 'registrar', method: 'post', url: () => '/api/prints',
    body: (b) => ({ accessionNumber: accession(), title: `${rec.prefix} ${b}`, process: 'gelatin_silver_developing_out' }), path: 'title', state: named(Print, 'title'),
  },
  { name: 'print edit', role: 'registrar', method: 'patch', url: () => `/api/prints/${rec.print.id}`, body: (b) => ({ title: `Weir ${b}`, version: rec.print.version }), path: 'title', state: () => row(Print, rec.print.id) },
  { name: 'image edit', role: 'conservator', method: 'patch', url: () => `/api/images/${rec.image.id}`, body: (b) => ({ notes: `Raking ${b}`, version: rec.image.version }), path: 'notes', state: () => row(Image, rec.image.id) },
  { name: 'spot edit', role: 'conservator', method: 'patch', url: () => `/api/measurement-spots/${rec.spot.id}`, body: (b) => ({ name: `Dmax ${b}`, version: rec.spot.version }), path: 'name', state: () => row(MeasurementSpot, rec.spot.id) },
  {
    name: 'spot create', role: 'conservator', method: 'post', url: () => `/api/prints/${rec.print.id}/measurement-spots`,
    body: (b) => ({ name: `${rec.prefix} ${b}`, purpose: 'dmax' }), path: 'name', state: named(MeasurementSpot, 'name'),
  },
  {
    name: 'baseline reason', role: 'conservator', method: 'put', url: () => `/api/measurement-spots/${rec.spot.id}/baseline`,
    body: (b) => ({ sessionId: null, reason: `First reading ${b}`, version: rec.spot.version }), path: 'reason', state: () => row(MeasurementSpot, rec.spot.id),
  },
  { name: 'condition term create', role: 'admin', method: 'post', url: () => '/api/condition-terms', body: (b) => ({ code: `x_${tag()}`, label: `${rec.prefix} ${b}` }), path: 'label', state: named(ConditionTerm, 'label') },
  { name: 'condition term edit', role: 'admin', method: 'patch', url: () => `/api/condition-terms/${rec.term}`, body: (b) => ({ description: `Lifting ${b}` }), path: 'description', state: () => row(ConditionTerm, rec.term) },
  {
    name: 'addendum', role: 'conservator', method: 'post', url: () => `/api/condition-reports/${rec.report.id}/addenda`,
    body: (b) => ({ text: `Correction ${b}` }), path: 'text', state: () => Addendum.count({ where: { reportId: rec.report.id } }),
  },
  {
    name: 'catalogue settings', role: 'admin', method: 'put', url: () => '/api/settings/catalogue',
    body: (b) => ({ accessionPattern: 'YYYY.N.N', institutionName: `Trust ${b}` }), path: 'institutionName', state: async () => (await Setting.findAll({ order: [['key', 'ASC']] })).map((s) => s.toJSON()),
  },
];

describe('text holding NUL or a broken character is refused on every write, naming the field; nothing is stored', () => {
  for (const k of CASES) {
    for (const bad of BAD) {
      it(`${k.name}: ${bad.name}`, async () => {
        const before = await k.state();
        const res = await send(k.method, k.url(), k.role, k.body(bad.char));
        expect(res.status, JSON.stringify(res.body)).toBe(400);
        expect(res.body.error.code).toBe('validation_failed');
        expect(res.body.error.details).toEqual(expect.arrayContaining([expect.objectContaining({ path: k.path, message: expect.stringMatching(bad.message) })]));
        expect(await k.state()).toEqual(before);
      });
    }
  }

  it('reports every bad string at once, object keys included, and query strings too', async () => {
    const res = await send('patch', `/api/makers/${rec.maker.id}`, 'registrar', { name: 'A\u0000', notes: 'B\ud800', ['k\u0000']: 1, version: rec.maker.version });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path).sort();
    // A bad key is named with its bad character shown as U+FFFD: the answer never echoes it.
    expect(paths).toEqual(['k\uFFFD', 'name', 'notes'].sort());
    const q = await supertest(t.app).get('/api/makers?q=a%00b').set('Cookie', c.viewer);
    expect(q.status).toBe(400);
    expect(q.body.error.details[0]).toMatchObject({ path: 'query.q' });
  });

  it('a multipart text field goes through the same check', async () => {
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#777' } }).png().toBuffer();
    const before = await Image.count({ where: { printId: rec.print.id } });
    const res = await supertest(t.app).post(`/api/prints/${rec.print.id}/images`).set('Origin', t.origin).set('Cookie', c.conservator)
      .field('viewType', 'recto').field('notes', 'verso \u0000 stamp').attach('file', png, 'a.png');
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ path: 'notes' });
    expect(await Image.count({ where: { printId: rec.print.id } })).toBe(before);
  });
});

describe('a JSON body that is not valid UTF-8', () => {
  it('is refused with 400, not read with replacement characters', async () => {
    const raw = Buffer.concat([Buffer.from(`{"notes":"Studio `), Buffer.from([0xc3, 0x28]), Buffer.from(`","version":${rec.maker.version}}`)]);
    const before = await row(Maker, rec.maker.id);
    const res = await supertest(t.app).patch(`/api/makers/${rec.maker.id}`).set('Origin', t.origin).set('Cookie', c.registrar)
      .set('Content-Type', 'application/json').serialize((b) => b).send(raw);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error, JSON.stringify(res.body)).toMatchObject({ code: 'validation_failed', message: expect.stringMatching(/UTF-8/) });
    expect(await row(Maker, rec.maker.id)).toEqual(before);
  });
});

describe('dates that do not exist', () => {
  const IMPOSSIBLE = ['2024-02-31', '2024-13-01', '0000-00-00', '0000-01-01'];

  it('PATCH /api/images/:id answers 400 on capturedOn', async () => {
    for (const day of IMPOSSIBLE) {
      const before = await row(Image, rec.image.id);
      const res = await send('patch', `/api/images/${rec.image.id}`, 'conservator', { capturedOn: day, version: rec.image.version });
      expect(res.status, `${day} ${JSON.stringify(res.body)}`).toBe(400);
      expect(res.body.error.details[0]).toMatchObject({ path: 'capturedOn', message: 'Enter a real date, as YYYY-MM-DD' });
      expect(await row(Image, rec.image.id)).toEqual(before);
    }
  });

  it('the image upload answers 400 on capturedOn', async () => {
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#777' } }).png().toBuffer();
    for (const day of IMPOSSIBLE) {
      const res = await supertest(t.app).post(`/api/prints/${rec.print.id}/images`).set('Origin', t.origin).set('Cookie', c.conservator)
        .field('viewType', 'recto').field('capturedOn', day).attach('file', png, 'a.png');
      expect(res.status, `${day} ${JSON.stringify(res.body)}`).toBe(400);
      expect(res.body.error.details[0]).toMatchObject({ path: 'capturedOn' });
    }
  });

  it('an EDTF date made with an impossible offset or year 0000 answers 400 on dateMade', async () => {
    for (const dateMade of ['2024-01-01T00:00:00+99:00', '0000']) {
      const before = await row(Print, rec.print.id);
      const res = await send('patch', `/api/prints/${rec.print.id}`, 'registrar', { dateMade, version: (before as { version: number }).version });
      expect(res.status, `${dateMade} ${JSON.stringify(res.body)}`).toBe(400);
      expect(res.body.error.details[0]).toMatchObject({ path: 'dateMade' });
      expect(await row(Print, rec.print.id)).toEqual(before);
    }
  });

  it('a movement date-time with an impossible offset or year 0 answers 400', async () => {
    const to = await createLocation();
    for (const movedAt of ['2024-01-01T00:00:00+99:00', '2024-01-01T00:00:00+23:00', '0000-01-01T00:00:00Z']) {
      const res = await send('post', `/api/prints/${rec.print.id}/movements`, 'registrar', { toLocationId: to.id, reason: 'Rehoused', movedAt, version: rec.print.version });
      expect(res.status, `${movedAt} ${JSON.stringify(res.body)}`).toBe(400);
      expect(res.body.error.details[0]).toMatchObject({ path: 'movedAt' });
    }
  });
});

describe('answers that depend on the session are never cached', () => {
  it('API and auth JSON carry Cache-Control: no-store; image bytes keep their own private caching', async () => {
    for (const url of ['/api/me', `/api/prints/${rec.print.id}`, '/api/makers', '/api/no-such-route']) {
      const res = await supertest(t.app).get(url).set('Cookie', c.viewer);
      expect(res.headers['cache-control'], url).toBe('no-store');
    }
    const refused = await send('patch', `/api/makers/${rec.maker.id}`, 'registrar', { name: '' });
    expect(refused.headers['cache-control']).toBe('no-store');
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#777' } }).png().toBuffer();
    const up = await supertest(t.app).post(`/api/prints/${rec.print.id}/images`).set('Origin', t.origin).set('Cookie', c.conservator)
      .field('viewType', 'verso').attach('file', png, 'v.png');
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    expect(up.headers['cache-control']).toBe('no-store');
    const bytes = await supertest(t.app).get(up.body.data.urls.original).set('Cookie', c.conservator);
    expect(bytes.status).toBe(200);
    expect(bytes.headers['cache-control']).toBe('private, max-age=3600');
    const logout = await supertest(t.app).post('/auth/logout').set('Origin', t.origin).set('Cookie', c.researcher);
    expect(logout.headers['cache-control']).toBe('no-store');
  });
});
