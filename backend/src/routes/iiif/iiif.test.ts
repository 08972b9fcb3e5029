import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import sharp from 'sharp';
import { QueryTypes } from 'sequelize';
import { errorEnvelopeSchema } from '@toneledger/common/schemas/envelope';
import { testApp, sessionFor, type TestApp } from '../../../test/app';
import { accession } from '../../../test/factories';
import { db } from '../../db';
import { Exhibition, ExhibitionObject, ExhibitionVenue, Image } from '../../models';
import { forgetIiifMemory } from '../../services/iiif-image.service';
import { purgeWithdrawn } from '../../services/image.service';

/**
 * The IIIF Image API 3.0 and Presentation API 3.0 endpoints against the real app and PostgreSQL.
 * The required properties checked below are written from the specifications' texts as recalled from
 * memory (Image API 3.0 §5 "Image Information"; Presentation API 3.0 §3 resource properties and §5
 * resource structure); each check names its section.
 */

let t: TestApp;
const c: Record<string, string> = {};
let printId: string;
let title: string;
/** 2400 × 1600, a pattern that differs at every pixel (so a shifted crop cannot pass). */
let original: Buffer;
let imageId: string;
let laterImageId: string;
const W = 2400;
const H = 1600;

async function patterned(width: number, height: number): Promise<Buffer> {
  const raw = Buffer.alloc(width * height * 3);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 3;
      raw[i] = (x * 7 + y * 3) & 255;
      raw[i + 1] = (x * 13) ^ (y * 5) & 255;
      raw[i + 2] = (x + y * 11) & 255;
    }
  }
  return sharp(raw, { raw: { width, height, channels: 3 } }).png().toBuffer();
}

const binary = (r: supertest.Test) =>
  r.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (d: Buffer) => chunks.push(d));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });
const get = (path: string, role: string | null) => {
  const r = supertest(t.app).get(path);
  return role ? r.set('Cookie', c[role]!) : r;
};
const raw = async (buf: Buffer) => sharp(buf).raw().toBuffer({ resolveWithObject: true });

beforeAll(async () => {
  t = testApp();
  for (const r of ['conservator', 'registrar', 'researcher', 'viewer', 'admin'] as const) c[r] = await sessionFor(t.app, r);
  title = `Breakwater iiif${Date.now().toString(36)}`;
  const p = await supertest(t.app).post('/api/prints').set('Cookie', c.registrar!).set('Origin', t.origin)
    .send({ accessionNumber: accession(), title, process: 'gelatin_silver_developing_out', creditLine: 'Gift of Orla Penhallow, 2011', dateMade: '1968' });
  expect(p.status, JSON.stringify(p.body)).toBe(201);
  printId = p.body.data.id;
  original = await patterned(W, H);
  const up = async (capturedOn: string, viewType: string) => {
    const res = await supertest(t.app).post(`/api/prints/${printId}/images`).set('Cookie', c.conservator!).set('Origin', t.origin)
      .field('viewType', viewType).field('capturedOn', capturedOn).attach('file', original, 'scan.png');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.data.id as string;
  };
  // Uploaded later but captured earlier: the manifest must put it first.
  laterImageId = await up('2021-05-02', 'raking_light');
  imageId = await up('1999-03-10', 'recto');
}, 120_000);
afterAll(() => t.close());

describe('IIIF image information (info.json)', () => {
  it('has every property Image API 3.0 §5 requires, with the original\'s size for a role that reads originals', async () => {
    const res = await get(`/api/iiif/images/${imageId}/info.json`, 'researcher');
    expect(res.status).toBe(200);
    const info = res.body;
    // §5.1–5.3 (recalled from memory): @context, id, type, protocol, profile, width, height are required.
    expect(info['@context']).toBe('http://iiif.io/api/image/3/context.json');
    expect(info.type).toBe('ImageService3');
    expect(info.protocol).toBe('http://iiif.io/api/image');
    expect(['level0', 'level1', 'level2']).toContain(info.profile);
    // §5.2: id is the base URI, absolute, without /info.json; here built from the request's origin.
    expect(info.id).toBe(`${res.request.url.replace(/\/info\.json$/, '')}`);
    expect(info.id).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/api\/iiif\/images\//);
    expect([info.width, info.height]).toEqual([W, H]);
    // §5.5–5.6: sizes are {width, height}; tiles have width and scaleFactors.
    for (const s of info.sizes) expect(s.width * H).toBeCloseTo(s.height * W, -4);
    expect(info.tiles[0].width).toBeGreaterThan(0);
    expect(info.tiles[0].scaleFactors[0]).toBe(1);
    expect(Math.max(W, H) / info.tiles[0].scaleFactors.at(-1)).toBeLessThanOrEqual(info.tiles[0].width);
    expect(res.headers['link']).toContain('level1.json');
  });

  it('gives a viewer the display copy only: its size as width/height and as maxWidth/maxHeight', async () => {
    const res = await get(`/api/iiif/images/${imageId}/info.json`, 'viewer');
    expect(res.status).toBe(200);
    const row = await Image.findByPk(imageId);
    const screen = await sharp(await readObject(row!.screenKey!)).metadata();
    expect([res.body.width, res.body.height]).toEqual([screen.width, screen.height]);
    expect(Math.max(res.body.width, res.body.height)).toBeLessThanOrEqual(1600);
    expect([res.body.maxWidth, res.body.maxHeight]).toEqual([screen.width, screen.height]);
    for (const s of res.body.sizes) expect(s.width).toBeLessThanOrEqual(res.body.maxWidth);
  });

  it('the base URI redirects to info.json (§2.2, 303 recommended)', async () => {
    const res = await get(`/api/iiif/images/${imageId}`, 'viewer').redirects(0);
    expect(res.status).toBe(303);
    expect(res.headers.location).toMatch(new RegExp(`/api/iiif/images/${imageId}/info\\.json$`));
  });
});

async function readObject(key: string): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of await t.deps.store.get(key)) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

describe('IIIF image requests', () => {
  it('a region at a size is pixel for pixel what sharp makes of the original with extract + resize', async () => {
    const res = await binary(get(`/api/iiif/images/${imageId}/100,200,700,500/350,/0/default.png`, 'conservator'));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('image/png');
    const mine = await raw(res.body as Buffer);
    const theirs = await sharp(original).extract({ left: 100, top: 200, width: 700, height: 500 }).resize(350, 250, { fit: 'fill' }).raw().toBuffer({ resolveWithObject: true });
    expect([mine.info.width, mine.info.height]).toEqual([350, 250]);
    expect(mine.data.equals(theirs.data)).toBe(true);
  });

  it('pct:, square, !w,h, gray and a mirrored quarter turn match sharp too', async () => {
    const pct = await binary(get(`/api/iiif/images/${imageId}/pct:25,25,50,50/max/0/default.png`, 'registrar'));
    expect((await raw(pct.body)).data.equals((await sharp(original).extract({ left: 600, top: 400, width: 1200, height: 800 }).raw().toBuffer()))).toBe(true);
    const square = await binary(get(`/api/iiif/images/${imageId}/square/!200,200/0/gray.png`, 'registrar'));
    const sq = await sharp(original).extract({ left: 400, top: 0, width: 1600, height: 1600 }).resize(200, 200, { fit: 'fill' }).grayscale().raw().toBuffer({ resolveWithObject: true });
    // A one-channel PNG (sharp reads it back as three equal channels unless asked for one).
    expect(await sharp(square.body).metadata()).toMatchObject({ width: 200, height: 200, channels: 1 });
    const got = await sharp(square.body).extractChannel(0).raw().toBuffer({ resolveWithObject: true });
    expect(sq.info.channels).toBe(1);
    expect(got.data.equals(sq.data)).toBe(true);
    const turned = await binary(get(`/api/iiif/images/${imageId}/0,0,300,100/max/!90/default.png`, 'registrar'));
    const expected = await sharp(await sharp(original).extract({ left: 0, top: 0, width: 300, height: 100 }).png().toBuffer()).flop().rotate(90).raw().toBuffer({ resolveWithObject: true });
    const turnedRaw = await raw(turned.body);
    expect([turnedRaw.info.width, turnedRaw.info.height]).toEqual([100, 300]);
    expect(turnedRaw.data.equals(expected.data)).toBe(true);
  });

  it('serves jpg and webp with their types, and crops a region that reaches past the edge (§4.1)', async () => {
    const jpg = await binary(get(`/api/iiif/images/${imageId}/2300,1500,400,400/max/0/default.jpg`, 'admin'));
    expect(jpg.headers['content-type']).toBe('image/jpeg');
    expect(await sharp(jpg.body).metadata()).toMatchObject({ format: 'jpeg', width: 100, height: 100 });
    const webp = await binary(get(`/api/iiif/images/${imageId}/full/240,/0/color.webp`, 'admin'));
    expect(await sharp(webp.body).metadata()).toMatchObject({ format: 'webp', width: 240, height: 160 });
  });

  it('makes an answer once and serves it from memory or storage after that', async () => {
    const path = `/api/iiif/images/${imageId}/512,512,512,512/256,/0/default.jpg`;
    const first = await binary(get(path, 'researcher'));
    const second = await binary(get(path, 'researcher'));
    expect(first.headers['x-iiif-cache']).toBe('miss');
    expect(second.headers['x-iiif-cache']).toBe('memory');
    expect((second.body as Buffer).equals(first.body as Buffer)).toBe(true);
    // With the memory emptied (as after a restart, or on another server), object storage answers.
    forgetIiifMemory();
    const third = await binary(get(path, 'researcher'));
    expect(third.headers['x-iiif-cache']).toBe('hit');
    expect((third.body as Buffer).equals(first.body as Buffer)).toBe(true);
    // The same pixels asked in percentages resolve to the same answer.
    const pct = await binary(get(`/api/iiif/images/${imageId}/pct:21.3333,32,21.3333,32/256,/0/default.jpg`, 'researcher'));
    expect(pct.headers['x-iiif-cache']).toBe('memory');
    expect((pct.body as Buffer).equals(first.body as Buffer)).toBe(true);
    const rows = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM iiif_cache WHERE image_id = $1 AND key LIKE $2', {
      bind: [imageId, '%/original/512,512,512,512/256,256/0/default.jpg'], type: QueryTypes.SELECT,
    });
    expect(rows[0]!.n).toBe(1);
    expect(first.headers['cache-control']).toBe('private, max-age=3600');
  });
});

describe('IIIF access rules', () => {
  it('a viewer gets the display copy, never the original: full/max is the stored screen copy, pixel for pixel', async () => {
    const row = await Image.findByPk(imageId);
    const screen = await sharp(await readObject(row!.screenKey!)).raw().toBuffer({ resolveWithObject: true });
    const res = await binary(get(`/api/iiif/images/${imageId}/full/max/0/default.png`, 'viewer'));
    expect(res.status).toBe(200);
    const mine = await raw(res.body);
    expect([mine.info.width, mine.info.height]).toEqual([screen.info.width, screen.info.height]);
    expect(mine.data.equals(screen.data)).toBe(true);
    const upscaled = await binary(get(`/api/iiif/images/${imageId}/full/^max/0/default.png`, 'viewer'));
    expect((await sharp(upscaled.body).metadata()).width).toBe(screen.info.width);
  });

  it("refuses a viewer anything beyond the display copy's size: the original's size, an upscale, a region outside it", async () => {
    for (const path of [`full/${W},/0/default.jpg`, `full/^${W},/0/default.jpg`, `0,0,${W},${H}/${W},${H}/0/default.jpg`, `1700,0,100,100/max/0/default.jpg`]) {
      const res = await get(`/api/iiif/images/${imageId}/${path}`, 'viewer');
      expect(res.status, path).toBe(400);
      expect(errorEnvelopeSchema.safeParse(res.body).success).toBe(true);
    }
  });

  it("a withdrawn image is not found for a viewer (staff still reach it), leaves the print's manifest, and its IIIF answers are purged with it", async () => {
    const up = await supertest(t.app).post(`/api/prints/${printId}/images`).set('Cookie', c.conservator!).set('Origin', t.origin)
      .field('viewType', 'verso').field('capturedOn', '1990-01-01').attach('file', await patterned(320, 200), 'verso.png');
    expect(up.status).toBe(201);
    const w = await supertest(t.app).post(`/api/images/${up.body.data.id}/withdraw`).set('Cookie', c.conservator!).set('Origin', t.origin)
      .send({ reason: 'Wrong print photographed', version: up.body.data.version });
    expect(w.status, JSON.stringify(w.body)).toBe(200);
    expect((await get(`/api/iiif/images/${up.body.data.id}/info.json`, 'viewer')).status).toBe(404);
    expect((await get(`/api/iiif/images/${up.body.data.id}/full/max/0/default.jpg`, 'viewer')).status).toBe(404);
    expect((await get(`/api/iiif/images/${up.body.data.id}/info.json`, 'researcher')).status).toBe(200);
    const m = await get(`/api/iiif/prints/${printId}/manifest`, 'researcher');
    expect(m.body.items.map((cv: { id: string }) => cv.id.split('/').at(-1))).not.toContain(up.body.data.id);
    // Its IIIF answers go with its files when the retention ends.
    expect((await binary(get(`/api/iiif/images/${up.body.data.id}/full/100,/0/default.jpg`, 'researcher'))).status).toBe(200);
    const keys = await db().query<{ key: string }>('SELECT key FROM iiif_cache WHERE image_id = $1', { bind: [up.body.data.id], type: QueryTypes.SELECT });
    expect(keys).toHaveLength(1);
    expect(await t.deps.store.head(keys[0]!.key)).not.toBeNull();
    await Image.update({ purgeAfter: new Date(Date.now() - 1000) }, { where: { id: up.body.data.id } });
    await purgeWithdrawn(t.deps.store, 90);
    expect(await t.deps.store.head(keys[0]!.key)).toBeNull();
    expect(await db().query('SELECT key FROM iiif_cache WHERE image_id = $1', { bind: [up.body.data.id], type: QueryTypes.SELECT })).toHaveLength(0);
    expect((await get(`/api/iiif/images/${up.body.data.id}/full/100,/0/default.jpg`, 'researcher')).status).toBe(404);
  });

  it('401 without a session, 404 for an unknown image or print', async () => {
    expect((await get(`/api/iiif/images/${imageId}/info.json`, null)).status).toBe(401);
    expect((await get(`/api/iiif/images/${imageId}/full/max/0/default.jpg`, null)).status).toBe(401);
    expect((await get('/api/iiif/images/6f2b1c44-2a8e-4f0e-9a55-0c1d2e3f4a5b/info.json', 'viewer')).status).toBe(404);
    expect((await get('/api/iiif/prints/6f2b1c44-2a8e-4f0e-9a55-0c1d2e3f4a5b/manifest', 'viewer')).status).toBe(404);
  });
});

describe('IIIF bad parameters', () => {
  it.each([
    ['bogus/max/0/default.jpg', 'params.region'],
    ['0,0,0,10/max/0/default.jpg', 'params.region'],
    [`${W},0,10,10/max/0/default.jpg`, 'params.region'],
    ['pct:101,0,10,10/max/0/default.jpg', 'params.region'],
    ['99999999999,0,1,1/max/0/default.jpg', 'params.region'],
    ['full/full/0/default.jpg', 'params.size'],
    ['0,0,100,100/200,/0/default.jpg', 'params.size'],
    ['full/0,/0/default.jpg', 'params.size'],
    ['full/max/45/default.jpg', 'params.rotation'],
    ['full/max/-90/default.jpg', 'params.rotation'],
    ['full/max/0/bitonal.jpg', 'params.file'],
    ['full/max/0/default.tif', 'params.file'],
    ['full/max/0/default', 'params.file'],
  ])('%s → 400 naming %s', async (path, field) => {
    const res = await get(`/api/iiif/images/${imageId}/${path}`, 'admin');
    expect(res.status).toBe(400);
    const env = errorEnvelopeSchema.parse(res.body);
    expect(env.error.code).toBe('validation_failed');
    expect((env.error.details as { path: string }[]).map((d) => d.path)).toContain(field);
  });

  it('a NUL in a segment is refused by the input rules, an id that is not one is 400', async () => {
    expect((await get(`/api/iiif/images/${imageId}/full/max/0/default%00.jpg`, 'admin')).status).toBe(400);
    expect((await get('/api/iiif/images/not-an-id/info.json', 'admin')).status).toBe(400);
  });
});

describe('IIIF Presentation API 3.0 manifest of a print', () => {
  it('has the required properties (§3, §5.3), canvases in capture order, absolute ids and the credit line', async () => {
    const res = await get(`/api/iiif/prints/${printId}/manifest`, 'researcher');
    expect(res.status).toBe(200);
    const m = res.body;
    const origin = new URL(res.request.url).origin;
    // §3 / §5.3 (recalled from memory): a Manifest must have @context, id, type, label and items.
    expect(m['@context']).toBe('http://iiif.io/api/presentation/3/context.json');
    expect(m.type).toBe('Manifest');
    expect(m.id).toBe(`${origin}/api/iiif/prints/${printId}/manifest`);
    // §3.1 label: a language map, strings in arrays.
    expect(m.label).toEqual({ en: [title] });
    expect(Object.values(m.summary).every((v) => Array.isArray(v))).toBe(true);
    expect(m.requiredStatement).toEqual({ label: { en: ['Credit line'] }, value: { en: ['Gift of Orla Penhallow, 2011'] } });
    expect(m.metadata.map((e: { label: { en: string[] } }) => e.label.en[0])).toEqual(expect.arrayContaining(['Accession number', 'Maker', 'Date made', 'Process']));
    expect(m.rights).toBeUndefined();
    expect(m.items.map((cv: { id: string }) => cv.id.split('/').at(-1))).toEqual([imageId, laterImageId]);
    for (const canvas of m.items) {
      // §5.4 Canvas: id, type, and height/width when it has content; items of AnnotationPages.
      expect(canvas.type).toBe('Canvas');
      expect(canvas.id.startsWith(`${origin}/`)).toBe(true);
      expect([canvas.width, canvas.height]).toEqual([W, H]);
      const page = canvas.items[0];
      expect(page.type).toBe('AnnotationPage');
      const anno = page.items[0];
      // Web Annotation model as Presentation 3.0 uses it: painting motivation, target is the canvas.
      expect(anno).toMatchObject({ type: 'Annotation', motivation: 'painting', target: canvas.id });
      expect(anno.body).toMatchObject({ type: 'Image', format: 'image/jpeg', width: W, height: H });
      expect(anno.body.service[0]).toMatchObject({ type: 'ImageService3', profile: 'level1' });
      // The body's id is a real image request on its own service.
      const img = await binary(get(new URL(anno.body.id).pathname, 'researcher'));
      expect(img.status).toBe(200);
      expect(img.headers['content-type']).toBe('image/jpeg');
    }
  });

  it("a viewer's manifest paints the display copy and names its service, never the original's size", async () => {
    const res = await get(`/api/iiif/prints/${printId}/manifest`, 'viewer');
    expect(res.status).toBe(200);
    const body = res.body.items[0].items[0].items[0].body;
    expect(Math.max(body.width, body.height)).toBeLessThanOrEqual(1600);
    const info = await get(new URL(`${body.service[0].id}/info.json`).pathname, 'viewer');
    expect([info.body.width, info.body.height]).toEqual([body.width, body.height]);
  });
});

describe('IIIF collections', () => {
  it('a catalogue search lists the matching prints as manifests', async () => {
    const q = title.split(' ')[1]!;
    const res = await get(`/api/iiif/catalogue/collection?q=${q}`, 'viewer');
    expect(res.status).toBe(200);
    expect(res.body['@context']).toBe('http://iiif.io/api/presentation/3/context.json');
    expect(res.body).toMatchObject({ type: 'Collection', label: { en: [`Catalogue search: ${q}`] } });
    expect(res.body.id).toMatch(new RegExp(`/api/iiif/catalogue/collection\\?q=${q}$`));
    expect(res.body.items).toHaveLength(1);
    expect(res.body.items[0]).toMatchObject({ type: 'Manifest' });
    expect(res.body.items[0].id).toMatch(new RegExp(`^http://127\\.0\\.0\\.1:\\d+/api/iiif/prints/${printId}/manifest$`));
    expect((await get('/api/iiif/catalogue/collection?pageSize=0', 'viewer')).status).toBe(400);
  });

  it("a saved search's collection: its owner's (or anyone's once shared), named after it", async () => {
    const q = title.split(' ')[1]!;
    const saved = await supertest(t.app).post('/api/saved-searches').set('Cookie', c.viewer!).set('Origin', t.origin)
      .send({ name: 'Breakwater prints', query: { q }, shared: false });
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    const path = `/api/iiif/saved-searches/${saved.body.data.id}/collection`;
    const res = await get(path, 'viewer');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ type: 'Collection', label: { en: ['Breakwater prints'] } });
    expect(res.body.id).toBe(`${new URL(res.request.url).origin}${path}`);
    expect(res.body.items.map((i: { id: string }) => new URL(i.id).pathname)).toEqual([`/api/iiif/prints/${printId}/manifest`]);
    expect((await get(path, 'researcher')).status).toBe(404);
    const shared = await supertest(t.app).patch(`/api/saved-searches/${saved.body.data.id}`).set('Cookie', c.viewer!).set('Origin', t.origin)
      .send({ shared: true, version: saved.body.data.version });
    expect(shared.status, JSON.stringify(shared.body)).toBe(200);
    expect((await get(path, 'researcher')).status).toBe(200);
  });

  it("an exhibition's collection lists its prints; 404 for an unknown exhibition", async () => {
    // An exhibition always has at least one venue with its dates (the contract's rule; the list of
    // exhibitions other tests read presents them), so the fixture gets one too.
    const e = await Exhibition.create({ title: `Tide lines ${Date.now()}`, organiser: 'Calder Reach', summary: null } as never);
    await ExhibitionVenue.create({ exhibitionId: e.id, name: 'Calder Reach, East Gallery', place: 'Calder Reach', opensOn: '2025-03-01', closesOn: '2025-05-31', position: 0 } as never);
    await ExhibitionObject.create({ exhibitionId: e.id, printId } as never);
    const res = await get(`/api/iiif/exhibitions/${e.id}/collection`, 'viewer');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ type: 'Collection', label: { en: [e.title] } });
    expect(res.body.items.map((i: { id: string }) => new URL(i.id).pathname)).toEqual([`/api/iiif/prints/${printId}/manifest`]);
    expect((await get('/api/iiif/exhibitions/6f2b1c44-2a8e-4f0e-9a55-0c1d2e3f4a5b/collection', 'viewer')).status).toBe(404);
  });
});
