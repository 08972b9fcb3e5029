import http from 'node:http';
import zlib from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import sharp from 'sharp';
import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import os from 'node:os';
import { PutObjectCommand, DeleteObjectCommand } from '@aws-sdk/client-s3';
import type { ObjectStore } from '@toneledger/storage/object-store';
import type { S3ObjectStore } from '@toneledger/storage/s3-store';
import { testAppWithQueue, testApp, sessionFor, type TestApp } from '../../../test/app';
import { accession } from '../../../test/factories';
import { Image, Print } from '../../models';

let t: TestApp;
const c: Record<string, string> = {};
let printId: string;
beforeAll(async () => {
  t = await testAppWithQueue();
  for (const r of ['conservator', 'registrar', 'researcher', 'viewer', 'admin'] as const) c[r] = await sessionFor(t.app, r);
  const p = await supertest(t.app).post('/api/prints').set('Cookie', c.registrar).set('Origin', t.origin)
    .send({ accessionNumber: accession(), title: 'Slipway, morning', process: 'gelatin_silver_developing_out' });
  printId = p.body.data.id;
});
afterAll(() => t.close());

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

/** A JPEG with known EXIF tags (make, model, original date). */
async function jpegWithExif(width = 640, height = 480) {
  return sharp({ create: { width, height, channels: 3, background: '#5b6f8a' } })
    .jpeg({ quality: 85 })
    .withExif({ IFD0: { Make: 'Fenwick Optical', Model: 'Plate Copier 4' }, IFD2: { DateTimeOriginal: '2019:06:14 10:32:00' } })
    .toBuffer();
}

const upload = (buf: Buffer, name: string, fields: Record<string, string> = { viewType: 'recto' }, cookie = c.conservator) => {
  let r = supertest(t.app).post(`/api/prints/${printId}/images`).set('Cookie', cookie).set('Origin', t.origin);
  for (const [k, v] of Object.entries(fields)) r = r.field(k, v);
  return r.attach('file', buf, name);
};

const uploadTemps = () => readdirSync(os.tmpdir()).filter((f) => f.startsWith('toneledger-upload-')).length;

async function waitForDerivatives(id: string) {
  for (let i = 0; i < 80; i++) {
    const res = await supertest(t.app).get(`/api/images/${id}`).set('Cookie', c.viewer);
    if (res.body.data.derivatives !== 'pending') return res.body.data;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('derivatives not made within 20 s');
}

describe('uploading an image', () => {
  it('401 without a session, 403 for a researcher or viewer', async () => {
    const buf = await jpegWithExif();
    expect((await supertest(t.app).post(`/api/prints/${printId}/images`).set('Origin', t.origin).attach('file', buf, 'a.jpg')).status).toBe(401);
    expect((await upload(buf, 'a.jpg', { viewType: 'recto' }, c.researcher)).status).toBe(403);
    expect((await upload(buf, 'a.jpg', { viewType: 'recto' }, c.viewer)).status).toBe(403);
  });

  it('stores the original unchanged with its SHA-256, reads EXIF, and makes derivatives in a background job', async () => {
    const buf = await jpegWithExif();
    const res = await upload(buf, 'IMG 0001 (final).JPG', { viewType: 'raking_light', notes: 'Light from the left' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const img = res.body.data;
    expect(img).toMatchObject({ viewType: 'raking_light', contentType: 'image/jpeg', width: 640, height: 480, sizeBytes: buf.length, sha256: sha(buf), capturedOn: '2019-06-14' });
    expect(img.exif).toMatchObject({ make: 'Fenwick Optical', model: 'Plate Copier 4', capturedAt: '2019-06-14T10:32:00' });
    const row = await Image.findByPk(img.id);
    expect(row!.originalKey).toBe(`images/${printId}/${img.id}/original`);
    expect(row!.originalKey).not.toMatch(/IMG|JPG/);
    const original = await supertest(t.app).get(img.urls.original).set('Cookie', c.researcher).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (d: Buffer) => chunks.push(d));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(original.status).toBe(200);
    expect(sha(original.body as Buffer)).toBe(sha(buf));
    const ready = await waitForDerivatives(img.id);
    expect(ready.derivatives).toBe('ready');
    const thumb = await supertest(t.app).get(ready.urls.thumb).set('Cookie', c.viewer).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (d: Buffer) => chunks.push(d));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(thumb.headers['content-type']).toBe('image/webp');
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect(Math.max(meta.width!, meta.height!)).toBe(320);
    expect((await supertest(t.app).get(img.urls.original).set('Cookie', c.viewer)).status).toBe(403);
  });

  it('judges the type by content: a text file named .jpg is refused and leaves nothing behind', async () => {
    const before = { rows: await Image.count(), temps: uploadTemps() };
    const res = await upload(Buffer.from('just some words, not a picture'), 'holiday.jpg');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
    expect(await Image.count()).toBe(before.rows);
    expect(uploadTemps()).toBe(before.temps);
  });

  it('the original downloads under the extension of its detected type, whatever the uploaded name said', async () => {
    const jpeg = await jpegWithExif(64, 48);
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#abc' } }).png().toBuffer();
    const cases: [Buffer, string, string, string][] = [
      [jpeg, 'poly.html', 'image/jpeg', 'poly.jpg'],
      [png, 'scan "recto".svg', 'image/png', 'scan__recto_.png'],
      [jpeg, 'IMG_0007.JPEG', 'image/jpeg', 'IMG_0007.jpg'],
      [png, 'no-extension', 'image/png', 'no-extension.png'],
      [jpeg, '.htaccess', 'image/jpeg', 'htaccess.jpg'],
      [jpeg, '...', 'image/jpeg', 'image.jpg'],
    ];
    for (const [buf, name, type, download] of cases) {
      const res = await upload(buf, name);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const original = await supertest(t.app).get(res.body.data.urls.original).set('Cookie', c.researcher);
      expect(original.status).toBe(200);
      expect(original.headers['content-type']).toBe(type);
      expect(original.headers['content-disposition']).toBe(`attachment; filename="${download}"`);
    }
  });

  it('refuses a truncated JPEG with a clear 4xx and no row', async () => {
    const buf = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#222' } }).jpeg().toBuffer();
    const before = await Image.count();
    const res = await upload(buf.subarray(0, Math.floor(buf.length / 2)), 'cut.jpg');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/damaged or incomplete/);
    expect(await Image.count()).toBe(before);
  });

  it('refuses a decompression bomb (a small PNG declaring 50,000 × 50,000 pixels)', async () => {
    // A valid 1×1 PNG whose IHDR is rewritten to declare 50,000 × 50,000 (CRC recomputed), the usual shape of such a file.
    const png = await sharp({ create: { width: 1, height: 1, channels: 3, background: '#fff' } }).png().toBuffer();
    const bomb = Buffer.from(png);
    bomb.writeUInt32BE(50_000, 16);
    bomb.writeUInt32BE(50_000, 20);
    bomb.writeUInt32BE(zlib.crc32(bomb.subarray(12, 29)), 29);
    expect(bomb.length).toBeLessThan(200);
    const before = await Image.count();
    const res = await upload(bomb, 'small.png');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
    expect(res.body.error.message).toMatch(/50000 × 50000|pixels/);
    expect(await Image.count()).toBe(before);
  });

  it('refuses a file over the size limit with 413 and keeps nothing', async () => {
    const small = testApp({ env: { ...t.deps.env, IMAGE_MAX_MB: 1 } });
    try {
      const big = Buffer.alloc(1024 * 1024 + 4096, 0x20);
      big[0] = 0xff; big[1] = 0xd8; big[2] = 0xff;
      const before = { rows: await Image.count(), temps: uploadTemps() };
      const res = await supertest(small.app).post(`/api/prints/${printId}/images`).set('Cookie', c.conservator).set('Origin', t.origin).field('viewType', 'recto').attach('file', big, 'huge.jpg');
      expect(res.status).toBe(413);
      expect(res.body.error.code).toBe('payload_too_large');
      expect(res.body.error.message).toMatch(/larger than 1 MB/);
      expect(await Image.count()).toBe(before.rows);
      expect(uploadTemps()).toBe(before.temps);
    } finally {
      await small.close();
    }
  });

  it('an upload interrupted half-way leaves no row, no object and no temporary file', async () => {
    const server = t.app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const port = (server.address() as { port: number }).port;
    const before = { rows: await Image.count(), temps: uploadTemps() };
    const boundary = 'cutcutcut';
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="viewType"\r\n\r\nrecto\r\n--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="x.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`;
    const jpeg = await jpegWithExif(1200, 900);
    await new Promise<void>((resolve) => {
      const req = http.request({
        host: '127.0.0.1', port, method: 'POST', path: `/api/prints/${printId}/images`,
        headers: { cookie: c.conservator, origin: t.origin, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(head.length + jpeg.length + 100) },
      });
      req.on('error', () => resolve());
      req.write(head);
      req.write(jpeg.subarray(0, Math.floor(jpeg.length / 2)));
      setTimeout(() => {
        req.destroy();
        resolve();
      }, 300);
    });
    await new Promise((r) => setTimeout(r, 500));
    server.close();
    expect(await Image.count()).toBe(before.rows);
    expect(uploadTemps()).toBe(before.temps);
  });

  it('503 when object storage is down, and nothing is written', async () => {
    const down = { ...t.deps.store, bucket: 'x', put: async () => { throw new Error('ECONNREFUSED'); } } as unknown as ObjectStore;
    const broken = testApp({ store: down });
    try {
      const before = await Image.count();
      const buf = await jpegWithExif();
      const res = await supertest(broken.app).post(`/api/prints/${printId}/images`).set('Cookie', c.conservator).set('Origin', t.origin).field('viewType', 'verso').attach('file', buf, 'v.jpg');
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('service_unavailable');
      expect(await Image.count()).toBe(before);
    } finally {
      await broken.close();
    }
  });

  it('400 for an unknown view type, naming the field', async () => {
    const res = await upload(await jpegWithExif(), 'a.jpg', { viewType: 'sideways' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('viewType');
  });
});

describe('fixity', () => {
  it('detects an object changed and an object removed behind the app, and lists them for an admin', async () => {
    const buf = await jpegWithExif(300, 200);
    const res = await upload(buf, 'f.jpg', { viewType: 'verso' });
    const id = res.body.data.id;
    const ok = await supertest(t.app).post(`/api/images/${id}/fixity`).set('Cookie', c.admin).set('Origin', t.origin).send({});
    expect(ok.body.data).toMatchObject({ ok: true, outcome: 'match', expected: sha(buf), actual: sha(buf) });
    expect((await supertest(t.app).post(`/api/images/${id}/fixity`).set('Cookie', c.conservator).set('Origin', t.origin).send({})).status).toBe(403);

    const row = await Image.findByPk(id);
    const s3 = (t.deps.store as S3ObjectStore).client;
    const tampered = Buffer.concat([buf, Buffer.from('x')]);
    await s3.send(new PutObjectCommand({ Bucket: t.deps.store.bucket, Key: row!.originalKey, Body: tampered, ContentLength: tampered.length }));
    const bad = await supertest(t.app).post(`/api/images/${id}/fixity`).set('Cookie', c.admin).set('Origin', t.origin).send({});
    expect(bad.body.data).toMatchObject({ ok: false, outcome: 'mismatch', actual: sha(tampered) });

    const alerts = await supertest(t.app).get('/api/admin/fixity/alerts').set('Cookie', c.admin);
    expect(alerts.body.data.find((a: { imageId: string }) => a.imageId === id).result.outcome).toBe('mismatch');
    const shown = await supertest(t.app).get(`/api/images/${id}`).set('Cookie', c.registrar);
    expect(shown.body.data.lastFixity.outcome).toBe('mismatch');

    await s3.send(new DeleteObjectCommand({ Bucket: t.deps.store.bucket, Key: row!.originalKey }));
    const gone = await supertest(t.app).post(`/api/images/${id}/fixity`).set('Cookie', c.admin).set('Origin', t.origin).send({});
    expect(gone.body.data.outcome).toBe('missing');
    const timeline = await supertest(t.app).get(`/api/prints/${printId}/timeline`).set('Cookie', c.registrar);
    expect(timeline.body.data.map((e: { title: string }) => e.title)).toContain('Fixity check: missing');
  });
});

describe('withdrawing and alignment', () => {
  it('withdrawing keeps the files for the retention period and records who and why', async () => {
    const res = await upload(await jpegWithExif(), 'w.jpg', { viewType: 'detail' });
    const img = res.body.data;
    const w = await supertest(t.app).post(`/api/images/${img.id}/withdraw`).set('Cookie', c.conservator).set('Origin', t.origin).send({ reason: 'Duplicate of an earlier capture', version: 1 });
    expect(w.status).toBe(200);
    expect(w.body.data.withdrawn).toMatchObject({ by: 'Tamsin Wrey', reason: 'Duplicate of an earlier capture' });
    expect(new Date(w.body.data.withdrawn.purgeAfter).getTime()).toBeGreaterThan(Date.now() + 29 * 86_400_000);
    expect((await Image.findByPk(img.id))!.purgedAt).toBeNull();
    const head = await t.deps.store.head((await Image.findByPk(img.id))!.originalKey);
    expect(head).not.toBeNull();
    const forViewer = await supertest(t.app).get(`/api/prints/${printId}/images`).set('Cookie', c.viewer);
    expect(forViewer.body.data.map((i: { id: string }) => i.id)).not.toContain(img.id);
    const forStaff = await supertest(t.app).get(`/api/prints/${printId}/images?includeWithdrawn=true`).set('Cookie', c.registrar);
    expect(forStaff.body.data.map((i: { id: string }) => i.id)).toContain(img.id);
  });

  it('saves an alignment of two images of the same print; refuses images of two prints', async () => {
    const a = (await upload(await jpegWithExif(), 'a.jpg', { viewType: 'recto', capturedOn: '2001-05-02' })).body.data;
    const b = (await upload(await jpegWithExif(), 'b.jpg', { viewType: 'recto', capturedOn: '2024-05-02' })).body.data;
    const saved = await supertest(t.app).put('/api/image-alignments').set('Cookie', c.conservator).set('Origin', t.origin).send({ baseImageId: a.id, otherImageId: b.id, offsetX: 0.01, offsetY: -0.02, scale: 1.03 });
    expect(saved.status).toBe(200);
    const got = await supertest(t.app).get(`/api/image-alignments?baseImageId=${a.id}&otherImageId=${b.id}`).set('Cookie', c.viewer);
    expect(got.body.data).toMatchObject({ offsetX: 0.01, offsetY: -0.02, scale: 1.03, savedBy: 'Tamsin Wrey' });
    const other = await Print.create({ accessionNumber: accession(), accessionSort: 'x', title: 'Other', process: 'cyanotype', status: 'in_store' } as never);
    const foreign = await Image.create({ ...(await Image.findByPk(a.id))!.get({ plain: true }), id: undefined, printId: other.id, originalKey: `x/${Date.now()}` } as never);
    const refused = await supertest(t.app).put('/api/image-alignments').set('Cookie', c.conservator).set('Origin', t.origin).send({ baseImageId: a.id, otherImageId: foreign.id, offsetX: 0, offsetY: 0, scale: 1 });
    expect(refused.status).toBe(400);
  });
});
