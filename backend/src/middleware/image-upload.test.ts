import { createHash } from 'node:crypto';
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import os from 'node:os';
import express, { type Request } from 'express';
import supertest from 'supertest';
import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { errorHandler } from './error-handler';
import { requestId } from './request-id';
import { UPLOAD_TEMP_PREFIX, imageUpload, receiveImage, uploadedImage } from './image-upload';
import type { ReceivedFile } from '../services/image-ingest';

const temps = () => readdirSync(os.tmpdir()).filter((f) => f.startsWith(UPLOAD_TEMP_PREFIX)).length;

/** An app with the middleware before a handler that answers what it was given, and whether the file was on disk then. */
function appWith(maxBytes: number, wiring: 'before' | 'in-handler') {
  const app = express();
  app.use(requestId);
  const answer = (file: ReceivedFile) => ({ ...file, onDisk: existsSync(file.path), bytes: readFileSync(file.path).length });
  if (wiring === 'before') {
    app.post('/upload', imageUpload(maxBytes), (req: Request, res) => void res.json(answer(uploadedImage(req))));
  } else {
    app.post('/upload', async (req, res) => void res.json(answer(await receiveImage(req, maxBytes))));
  }
  app.use(errorHandler);
  return app;
}

let png: Buffer;
beforeAll(async () => {
  png = await sharp({ create: { width: 300, height: 200, channels: 3, background: '#7a6a58' } }).png().toBuffer();
});

describe.each(['before', 'in-handler'] as const)('imageUpload, wired %s the handler', (wiring) => {
  const app = appWith(10 * 1024 * 1024, wiring);

  it('streams the file to a temporary folder with the SHA-256 and size of the bytes sent (node:crypto over the whole buffer)', async () => {
    const before = temps();
    const res = await supertest(app).post('/upload').field('viewType', 'recto').field('notes', 'Gelatin flaking, upper left').attach('file', png, 'Ströme 01.png');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({
      sha256: createHash('sha256').update(png).digest('hex'), sizeBytes: png.length, bytes: png.length, onDisk: true,
      contentType: 'image/png', originalName: 'Ströme 01.png', fields: { viewType: 'recto', notes: 'Gelatin flaking, upper left' },
    });
    // The folder goes when the response is over, whoever forgets it.
    await new Promise((r) => setTimeout(r, 100));
    expect(existsSync(res.body.tempDir)).toBe(false);
    expect(temps()).toBe(before);
  });

  it('refuses what is not multipart (415), no file (400 on file) and an empty file (400)', async () => {
    const json = await supertest(app).post('/upload').send({ file: 'x' });
    expect([json.status, json.body.error.code]).toEqual([415, 'unsupported_media_type']);
    const none = await supertest(app).post('/upload').field('viewType', 'recto');
    expect([none.status, none.body.error.details[0]]).toEqual([400, expect.objectContaining({ path: 'file', code: 'required' })]);
    const before = temps();
    const empty = await supertest(app).post('/upload').attach('file', Buffer.alloc(0), 'empty.png');
    expect(empty.status).toBe(400);
    expect(temps()).toBe(before);
  });

  it('refuses a file sent in another field, naming that field', async () => {
    const res = await supertest(app).post('/upload').attach('image', png, 'a.png');
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ path: 'image', code: 'upload' });
  });
});

describe('imageUpload refusals leave nothing behind', () => {
  it('judges the type by the first bytes: a PNG name on text is 415 and nothing is kept', async () => {
    const before = temps();
    const res = await supertest(appWith(1024 * 1024, 'before')).post('/upload').attach('file', Buffer.from('Not a picture at all, only words.'), 'x.png');
    expect([res.status, res.body.error.code]).toEqual([415, 'unsupported_media_type']);
    expect(temps()).toBe(before);
  });

  it('413 in the envelope past the limit, and the folder is gone', async () => {
    const before = temps();
    const big = Buffer.concat([png, Buffer.alloc(300 * 1024, 1)]);
    const res = await supertest(appWith(256 * 1024, 'before')).post('/upload').attach('file', big, 'big.png');
    expect([res.status, res.body.error.code]).toEqual([413, 'payload_too_large']);
    expect(res.body.error.message).toBe('The file is larger than 256 KB.');
    expect(temps()).toBe(before);
  });
});
