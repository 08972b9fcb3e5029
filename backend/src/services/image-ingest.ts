import { createHash, randomUUID } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { rm, mkdtemp } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Transform, type TransformCallback } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import busboy from 'busboy';
import sharp, { type Metadata } from 'sharp';
import exifr from 'exifr';
import type { Request } from 'express';
import { AppError, validationFailed } from '../errors';

/**
 * Receiving an image upload without holding it in memory: the file streams to a private
 * temporary file while its SHA-256 and size are computed; its type is judged from its first
 * bytes (not its name); sharp then decodes it under a pixel limit, so a truncated file or a
 * decompression bomb is refused before anything is kept (the decode check runs beside the
 * upload to storage, and a refused file's object is deleted again).
 */

/** 200 megapixels: far above any camera or scanner in use for prints; a bomb declares more. */
export const MAX_IMAGE_PIXELS = 200_000_000;

/** A file on disk whose signature says it is an image; not yet decoded (see inspectImage). */
export interface ReceivedFile {
  tempDir: string;
  path: string;
  originalName: string;
  sizeBytes: number;
  sha256: string;
  contentType: string;
  fields: Record<string, string>;
}

export interface ExifSummary {
  capturedAt: string | null;
  make: string | null;
  model: string | null;
  lens: string | null;
  exposureTime: number | null;
  fNumber: number | null;
  iso: number | null;
  focalLength: number | null;
}

/** The content type from the file's signature; null when it is not an image type we keep. */
export function sniffImageType(head: Buffer): string | null {
  if (head.length >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'image/jpeg';
  if (head.length >= 8 && head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
  if (head.length >= 4 && (head.subarray(0, 4).equals(Buffer.from('II*\0', 'latin1')) || head.subarray(0, 4).equals(Buffer.from('MM\0*', 'latin1')))) return 'image/tiff';
  if (head.length >= 12 && head.subarray(0, 4).toString('latin1') === 'RIFF' && head.subarray(8, 12).toString('latin1') === 'WEBP') return 'image/webp';
  return null;
}

class Digest extends Transform {
  readonly hash = createHash('sha256');
  size = 0;
  head = Buffer.alloc(0);
  override _transform(chunk: Buffer, _enc: BufferEncoding, cb: TransformCallback) {
    this.hash.update(chunk);
    this.size += chunk.length;
    if (this.head.length < 16) this.head = Buffer.concat([this.head, chunk.subarray(0, 16 - this.head.length)]);
    cb(null, chunk);
  }
}

const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const str = (v: unknown) => (typeof v === 'string' && v.trim() ? v.trim() : null);

/** EXIF with exifr: dates come back as Dates read as UTC; we keep the wall-clock value as written. */
export async function readExif(file: string): Promise<ExifSummary> {
  let tags: Record<string, unknown> | undefined;
  try {
    tags = await exifr.parse(file, { tiff: true, exif: true, gps: false, xmp: false, icc: false, iptc: false, reviveValues: true });
  } catch {
    tags = undefined;
  }
  const t = tags ?? {};
  const when = t.DateTimeOriginal ?? t.CreateDate ?? t.ModifyDate;
  return {
    capturedAt: when instanceof Date && !Number.isNaN(when.getTime()) ? when.toISOString().slice(0, 19) : null,
    make: str(t.Make), model: str(t.Model), lens: str(t.LensModel),
    exposureTime: num(t.ExposureTime), fNumber: num(t.FNumber), iso: num(t.ISO), focalLength: num(t.FocalLength),
  };
}

/**
 * Decodes the whole image, so truncation and pixel bombs fail here. The decode has to happen anyway,
 * so when `screen` is given it renders the screen-size WebP copy on the way (the thumbnail is left to
 * the background job); otherwise it decodes to a tiny image.
 */
export async function inspectImage(file: string, screen?: { path: string; size: number }): Promise<{ width: number; height: number }> {
  const options = { limitInputPixels: MAX_IMAGE_PIXELS, failOn: 'truncated' as const };
  let meta: Metadata;
  try {
    meta = await sharp(file, options).metadata();
  } catch (err) {
    if (/pixel limit/i.test((err as Error).message)) {
      throw new AppError('payload_too_large', 413, `The image has more pixels than the limit of ${MAX_IMAGE_PIXELS / 1e6} million.`);
    }
    throw new AppError('unsupported_media_type', 415, 'The file could not be read as an image.');
  }
  if (!meta.width || !meta.height) throw new AppError('unsupported_media_type', 415, 'The image has no dimensions.');
  if (meta.width * meta.height > MAX_IMAGE_PIXELS) {
    throw new AppError('payload_too_large', 413, `The image declares ${meta.width} × ${meta.height} pixels, more than the limit of ${MAX_IMAGE_PIXELS / 1e6} million.`);
  }
  try {
    if (screen) {
      await sharp(file, options).rotate().resize(screen.size, screen.size, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 82 }).toFile(screen.path);
    } else {
      await sharp(file, options).resize(32, 32, { fit: 'inside' }).raw().toBuffer();
    }
  } catch {
    throw validationFailed([{ path: 'file', message: 'The image is damaged or incomplete (it could not be decoded to the end).', code: 'corrupt' }], 'The image is damaged or incomplete.');
  }
  const orientation = meta.orientation ?? 1;
  return orientation >= 5 ? { width: meta.height, height: meta.width } : { width: meta.width, height: meta.height };
}

/**
 * Reads a multipart request with one file field "file" and small text fields. Resolves once the
 * file is on disk and inspected; on any failure the temporary folder is removed before rejecting.
 */
export async function receiveImage(req: Request, maxBytes: number): Promise<ReceivedFile> {
  if (!req.is('multipart/form-data')) throw new AppError('unsupported_media_type', 415, 'Send the image as multipart/form-data in the field "file".');
  const tempDir = await mkdtemp(path.join(os.tmpdir(), 'toneledger-upload-'));
  const target = path.join(tempDir, randomUUID());
  const cleanup = () => rm(tempDir, { recursive: true, force: true });
  try {
    const received = await new Promise<{ digest: Digest; name: string; fields: Record<string, string> }>((resolve, reject) => {
      let bb: busboy.Busboy;
      try {
        bb = busboy({ headers: req.headers, limits: { files: 1, fileSize: maxBytes, fields: 10, fieldSize: 4000 } });
      } catch {
        reject(validationFailed([{ path: 'file', message: 'The upload is not valid multipart data.', code: 'upload' }]));
        return;
      }
      const fields: Record<string, string> = {};
      let fileDone: Promise<{ digest: Digest; name: string }> | null = null;
      let failed = false;
      const fail = (err: Error) => {
        if (failed) return;
        failed = true;
        req.unpipe(bb);
        req.resume();
        reject(err);
      };
      bb.on('field', (name, value) => {
        fields[name] = value;
      });
      bb.on('file', (name, stream, info) => {
        if (name !== 'file') {
          stream.resume();
          return;
        }
        const digest = new Digest();
        stream.on('limit', () => {
          stream.unpipe();
          fail(new AppError('payload_too_large', 413, `The file is larger than ${Math.round(maxBytes / 1024 / 1024)} MB.`));
        });
        fileDone = pipeline(stream, digest, createWriteStream(target)).then(() => ({ digest, name: info.filename ?? 'image' }));
        fileDone.catch((err) => fail(err));
      });
      bb.on('error', (err) => fail(validationFailed([{ path: 'file', message: `The upload could not be read: ${(err as Error).message}`, code: 'upload' }])));
      bb.on('close', () => {
        if (failed) return;
        if (!fileDone) return fail(validationFailed([{ path: 'file', message: 'Choose an image file', code: 'required' }]));
        fileDone.then((f) => !failed && resolve({ ...f, fields }), () => {});
      });
      // A client that goes away half-way: busboy sees an unexpected end.
      req.on('aborted', () => fail(validationFailed([{ path: 'file', message: 'The upload was interrupted.', code: 'aborted' }])));
      req.pipe(bb);
    });
    const { digest } = received;
    if (digest.size === 0) throw validationFailed([{ path: 'file', message: 'The file is empty.', code: 'empty' }]);
    const contentType = sniffImageType(digest.head);
    if (!contentType) throw new AppError('unsupported_media_type', 415, 'This is not a JPEG, PNG, TIFF or WebP image (judged by its content, not its name).');
    return {
      tempDir, path: target, originalName: received.name.slice(0, 200), sizeBytes: digest.size, sha256: digest.hash.digest('hex'),
      contentType, fields: received.fields,
    };
  } catch (err) {
    await cleanup();
    throw err;
  }
}

/** SHA-256 of a stream, without holding it. */
export async function sha256Of(stream: NodeJS.ReadableStream): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of stream) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export { createReadStream };
