import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { testApp, sessionFor } from '../../../test/app';
import { createLocation, createMaker } from '../../../test/factories';
import { AuditEventModel, Location, Print } from '../../models';

const t = testApp();
const c = {} as Record<Role, string>;
beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
});
afterAll(() => t.close());

const send = (method: 'post' | 'patch' | 'put', url: string, role: Role | null, body: object) => {
  const r = supertest(t.app)[method](url).set('Origin', t.origin);
  return (role ? r.set('Cookie', c[role]) : r).send(body);
};
const get = (url: string, role: Role | null) => (role ? supertest(t.app).get(url).set('Cookie', c[role]) : supertest(t.app).get(url));
const uniq = () => `${Date.now()}-${Math.floor(Math.random() * 1e6)}`;

describe('bath recipes', () => {
  it('normalises to g/L and lists the safety cautions (darkroom common practice check, no published source)', async () => {
    const res = await send('post', '/api/recipes', 'registrar', {
      name: `Iron blue single bath ${uniq()}`, tonerClass: 'iron_blue', volumeMl: 500,
      ingredients: [
        { chemical: 'ferric ammonium citrate', amount: 4, unit: 'g' },
        { chemical: 'potassium ferricyanide', amount: 4, unit: 'g' },
        { chemical: 'acetic acid', amount: 130, unit: 'g', strengthPercent: 28 },
      ],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const n = res.body.data.normalised;
    expect(n[0].gramsPerLitre).toBeCloseTo(8, 6);
    expect(n[1].gramsPerLitre).toBeCloseTo(8, 6);
    expect(n[2].pureGramsPerLitre).toBeCloseTo(72.8, 6); // 130 g × 0.28 / 0.5 L
    const codes = res.body.data.cautions.map((x: { code: string }) => x.code);
    expect(codes).toEqual(expect.arrayContaining(['ferricyanide_acid_heat', 'acid_to_water', 'safety_data_sheet']));
  });

  it('refuses a recipe without ingredients and a negative amount, naming the field', async () => {
    const empty = await send('post', '/api/recipes', 'registrar', { name: `x ${uniq()}`, volumeMl: 500, ingredients: [] });
    expect(empty.status).toBe(400);
    expect(empty.body.error.details[0].path).toBe('ingredients');
    const neg = await send('post', '/api/recipes', 'registrar', { name: `y ${uniq()}`, volumeMl: 500, ingredients: [{ chemical: 'water', amount: -1, unit: 'ml' }] });
    expect(neg.body.error.details[0].path).toBe('ingredients.0.amount');
  });

  it('researchers read recipes but cannot write them', async () => {
    expect((await get('/api/recipes', 'researcher')).status).toBe(200);
    expect((await send('post', '/api/recipes', 'researcher', { name: 'z', volumeMl: 1, ingredients: [{ chemical: 'w', amount: 1, unit: 'g' }] })).status).toBe(403);
    expect((await get('/api/recipes', null)).status).toBe(401);
  });
});

describe('makers and papers', () => {
  it('409 for a duplicate maker name; renaming a maker renames it on its prints', async () => {
    const name = `Ada Quellwater ${uniq()}`;
    const m = await send('post', '/api/makers', 'registrar', { name, lifeDates: '1921/1994' });
    expect(m.status).toBe(201);
    const dup = await send('post', '/api/makers', 'admin', { name: name.toUpperCase() });
    expect(dup.status).toBe(409);
    expect(dup.body.error.details[0].path).toBe('name');
    const p = await send('post', '/api/prints', 'registrar', { accessionNumber: `2097.${Date.now() % 100000}.1`, title: 'x', process: 'cyanotype', makerId: m.body.data.id });
    const renamed = await send('patch', `/api/makers/${m.body.data.id}`, 'registrar', { version: 1, name: `${name} (née Pell)` });
    expect(renamed.status).toBe(200);
    expect(renamed.body.data.printCount).toBe(1);
    expect((await Print.findByPk(p.body.data.id))!.makerName).toBe(`${name} (née Pell)`);
    const stale = await send('patch', `/api/makers/${m.body.data.id}`, 'registrar', { version: 1, notes: 'old form' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.version).toBe(2);
  });

  it('a paper with a bad manufacture date is refused; a good one is parsed', async () => {
    const bad = await send('post', '/api/papers', 'registrar', { manufacturer: 'Harrowgate Mills', product: `Argenta ${uniq()}`, base: 'fibre', madeDates: '1950/1940' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('madeDates');
    const ok = await send('post', '/api/papers', 'registrar', { manufacturer: 'Harrowgate Mills', product: `Argenta ${uniq()}`, base: 'fibre', surface: 'glossy', madeDates: '195X' });
    expect(ok.status).toBe(201);
    expect(ok.body.data.label).toMatch(/^Harrowgate Mills Argenta .*, glossy$/);
    expect(ok.body.data.madeDisplay).toBeTruthy();
  });
});

describe('locations', () => {
  it('viewers cannot read locations', async () => {
    expect((await get('/api/locations', 'viewer')).status).toBe(403);
    expect((await get('/api/locations', 'researcher')).status).toBe(200);
  });

  it('builds paths, renames a subtree, and refuses to move a place inside itself', async () => {
    const b = await send('post', '/api/locations', 'registrar', { name: `Annex ${uniq()}`, kind: 'building' });
    const room = await send('post', '/api/locations', 'registrar', { name: 'Cold room', kind: 'room', parentId: b.body.data.id });
    const box = await send('post', '/api/locations', 'registrar', { name: 'Box 12', kind: 'box', parentId: room.body.data.id });
    expect(box.body.data.pathLabel).toBe(`${b.body.data.name} › Cold room › Box 12`);
    expect(box.body.data.depth).toBe(2);
    const renamed = await send('patch', `/api/locations/${room.body.data.id}`, 'registrar', { version: 1, name: 'Cool room' });
    expect(renamed.status).toBe(200);
    expect((await Location.findByPk(box.body.data.id))!.pathLabel).toBe(`${b.body.data.name} › Cool room › Box 12`);
    const cycle = await send('patch', `/api/locations/${b.body.data.id}`, 'registrar', { version: 1, parentId: box.body.data.id });
    expect(cycle.status).toBe(409);
    expect(cycle.body.error.details[0].path).toBe('parentId');
    const sibling = await send('post', '/api/locations', 'registrar', { name: 'cool ROOM', kind: 'room', parentId: b.body.data.id });
    expect(sibling.status).toBe(409);
  });
});

describe('enclosure types', () => {
  it('records buffered as unknown (null) and audits the change', async () => {
    const res = await send('post', '/api/enclosures', 'registrar', { name: `Sleeve ${uniq()}`, material: 'polyester', alkalineBuffered: null, patResult: 'not_tested' });
    expect(res.status).toBe(201);
    expect(res.body.data.alkalineBuffered).toBeNull();
    const audit = await AuditEventModel.findOne({ where: { entityType: 'enclosure', entityId: res.body.data.id } });
    expect(audit?.action).toBe('enclosure.created');
  });
});

describe('catalogue settings', () => {
  it('everyone reads; only an admin changes; a malformed pattern is refused', async () => {
    const r = await get('/api/settings/catalogue', 'viewer');
    expect(r.body.data.accessionPattern).toBe('YYYY.N.N');
    expect((await send('put', '/api/settings/catalogue', 'registrar', { accessionPattern: 'N', institutionName: 'x' })).status).toBe(403);
    const bad = await send('put', '/api/settings/catalogue', 'admin', { accessionPattern: 'YYYY.NN', institutionName: 'Calder Reach Photographic Trust' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('accessionPattern');
    const ok = await send('put', '/api/settings/catalogue', 'admin', { accessionPattern: 'YYYY.N.N', institutionName: 'Calder Reach Photographic Trust' });
    expect(ok.status).toBe(200);
    expect((await get('/api/settings/catalogue', 'viewer')).body.data.institutionName).toBe('Calder Reach Photographic Trust');
  });

  it('refuses a regular expression that could freeze the server, saying what to write instead', async () => {
    const res = await send('put', '/api/settings/catalogue', 'admin', { accessionPattern: 're:(\\d+\\.?)+[A-Z]', institutionName: 'Calder Reach Photographic Trust' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('accessionPattern');
    expect(res.body.error.details[0].message).toMatch(/template instead.*YYYY\.N\.N/);
    expect((await get('/api/settings/catalogue', 'viewer')).body.data.accessionPattern).not.toBe('re:(\\d+\\.?)+[A-Z]');
  });
});

describe('reference list reads', () => {
  it('lists makers with their print counts and searches by name', async () => {
    const m = await createMaker(`Searchable Sorrel ${uniq()}`);
    const res = await get(`/api/makers?q=${encodeURIComponent('searchable sorrel')}`, 'viewer');
    expect(res.status).toBe(200);
    expect(res.body.data.map((x: { id: string }) => x.id)).toContain(m.id);
    expect((await get('/api/makers/not-an-id', 'viewer')).status).toBe(400);
    expect((await get('/api/makers/00000000-0000-4000-8000-000000000000', 'viewer')).status).toBe(404);
    await createLocation();
  });
});
