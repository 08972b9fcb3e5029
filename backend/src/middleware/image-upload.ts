import { createHash, randomUUID } from 'node:crypto';
import { createWriteStream, rmSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Transform, finished, type Readable, type TransformCallback } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import multer, { type StorageEngine } from 'multer';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { AppError, validationFailed } from '../errors';
import { SIGNATURE_BYTES, sniffImageType } from '../services/image-signature';
import type { ReceivedFile } from '../services/image-ingest';

/**
 * An image upload through multer without holding it in memory: the one file of the multipart field
 * "file" streams to a private temporary folder while its SHA-256 and size are computed, and its
 * type is judged from its first bytes (not its name or declared type). The text fields land in
 * `req.body` as multer leaves them. Decoding is left to `inspectImage` (services/image-ingest.ts).
 *
 * Nothing is left behind: a refused, oversized or interrupted upload's folder is removed before
 * the error goes on, and a received one's when the response is over.
 */

const FIELD = 'file';
/** The temporary folders' prefix (os.tmpdir()/toneledger-upload-XXXXXX). */
export const UPLOAD_TEMP_PREFIX = 'toneledger-upload-';

/** What the storage engine adds to multer's record of the file (`req.file`). */
interface StoredImage {
  tempDir: string;
  path: string;
  size: number;
  sha256: string;
  contentType: string;
}

const sizeOf = (bytes: number) => (bytes >= 1024 * 1024 ? `${Math.round(bytes / 1024 / 1024)} MB` : `${Math.round(bytes / 1024)} KB`);
const tooLarge = (maxBytes: number) => new AppError('payload_too_large', 413, `The file is larger than ${sizeOf(maxBytes)}.`);
const notAnImage = () => new AppError('unsupported_media_type', 415, 'This is not a JPEG, PNG, TIFF or WebP image (judged by its content, not its name).');
const empty = () => validationFailed([{ path: FIELD, message: 'The file is empty.', code: 'empty' }]);

/** Passes the bytes through, hashing and counting them; fails as soon as the first bytes show it is not an image. */
class Digest extends Transform {
  private readonly hash = createHash('sha256');
  size = 0;
  private head = Buffer.alloc(0);
  contentType: string | null = null;

  private judge(): Error | null {
    if (this.contentType) return null;
    this.contentType = sniffImageType(this.head);
    return this.contentType ? null : notAnImage();
  }

  override _transform(chunk: Buffer, _enc: BufferEncoding, cb: TransformCallback) {
    this.hash.update(chunk);
    this.size += chunk.length;
    if (this.head.length < SIGNATURE_BYTES) {
      this.head = Buffer.concat([this.head, chunk.subarray(0, SIGNATURE_BYTES - this.head.length)]);
      if (this.head.length >= SIGNATURE_BYTES) {
        const refused = this.judge();
        if (refused) return cb(refused);
      }
    }
    cb(null, chunk);
  }

  override _flush(cb: TransformCallback) {
    if (this.size === 0) return cb(empty());
    cb(this.judge());
  }

  sha256(): string {
    return this.hash.digest('hex');
  }
}

/**
 * A multer storage engine: each file to its own temporary folder, hashed while it streams.
 * `maxBytes` is multer's `limits.fileSize`; past it the writing stops at once.
 */
export class HashingTempStorage implements StorageEngine {
  constructor(private readonly maxBytes: number) {}

  _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<Express.Multer.File>) => void): void {
    this.store(file.stream).then(
      (stored) => cb(null, { ...stored, destination: stored.tempDir, filename: path.basename(stored.path) } as Partial<Express.Multer.File>),
      (err: unknown) => cb(err),
    );
  }

  _removeFile(_req: Request, file: Express.Multer.File, cb: (error: Error | null) => void): void {
    const { tempDir } = file as Express.Multer.File & Partial<StoredImage>;
    if (!tempDir) return cb(null);
    rm(tempDir, { recursive: true, force: true }).then(() => cb(null), cb);
  }

  private async store(source: Readable): Promise<StoredImage> {
    const tempDir = await mkdtemp(path.join(os.tmpdir(), UPLOAD_TEMP_PREFIX));
    const target = path.join(tempDir, randomUUID());
    const digest = new Digest();
    // Past the size limit, or when the rest is refused, the remaining bytes are read and dropped, so
    // multer can finish the request; an error of the source (a client gone) ends the writing.
    const drop = (err: Error) => {
      source.unpipe(digest);
      source.resume();
      digest.destroy(err);
    };
    const onLimit = () => drop(tooLarge(this.maxBytes));
    source.once('limit', onLimit);
    const stopWatching = finished(source, (err) => {
      if (err) digest.destroy(err);
    });
    try {
      source.pipe(digest);
      await pipeline(digest, createWriteStream(target));
      return { tempDir, path: target, size: digest.size, sha256: digest.sha256(), contentType: digest.contentType! };
    } catch (err) {
      source.unpipe(digest);
      source.resume();
      await rm(tempDir, { recursive: true, force: true });
      throw err;
    } finally {
      source.off('limit', onLimit);
      stopWatching();
    }
  }
}

/** multer's and busboy's errors in the error envelope. */
function asAppError(err: unknown, maxBytes: number): unknown {
  if (err instanceof AppError) return err;
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') return tooLarge(maxBytes);
    if (err.code === 'LIMIT_UNEXPECTED_FILE') {
      return validationFailed([{ path: err.field ?? FIELD, message: `Send one image, in the field "${FIELD}".`, code: 'upload' }]);
    }
    return validationFailed([{ path: err.field ?? FIELD, message: err.message, code: 'upload' }]);
  }
  // A failure of the disk (no space, no permission) is the server's: it stays an internal error.
  if (err instanceof Error && 'syscall' in err) return err;
  if (err instanceof Error && /^Request (aborted|closed)$/.test(err.message)) {
    return validationFailed([{ path: FIELD, message: 'The upload was interrupted.', code: 'aborted' }]);
  }
  return validationFailed([{ path: FIELD, message: `The upload could not be read: ${(err as Error).message}`, code: 'upload' }]);
}

/**
 * Middleware for an image upload endpoint: multipart/form-data with one file in the field "file"
 * (at most `maxBytes`) and a few short text fields. After it, `req.file` is the stored file and
 * `req.body` the text fields; read both with `uploadedImage(req)`. Refusals go to the error
 * handler as the envelope: not multipart or not an image → 415, too large → 413, no file, an
 * empty file or a broken body → 400.
 */
export function imageUpload(maxBytes: number): RequestHandler {
  const parse = multer({
    storage: new HashingTempStorage(maxBytes),
    limits: { fileSize: maxBytes, files: 1, fields: 10, fieldSize: 4000, parts: 12 },
    // Browsers send file names as UTF-8.
    defParamCharset: 'utf8',
  }).single(FIELD);
  return (req: Request, res: Response, next: NextFunction) => {
    if (!req.is('multipart/form-data')) {
      return next(new AppError('unsupported_media_type', 415, `Send the image as multipart/form-data in the field "${FIELD}".`));
    }
    parse(req, res, (err?: unknown) => {
      if (err) return next(asAppError(err, maxBytes));
      const stored = req.file as (Express.Multer.File & StoredImage) | undefined;
      if (!stored) return next(validationFailed([{ path: FIELD, message: 'Choose an image file', code: 'required' }]));
      // Whatever the handler does with it, the temporary folder goes before the answer is sent (so a
      // client that has its answer never sees it), or when the connection closes without one.
      const end = res.end.bind(res) as (...args: unknown[]) => Response;
      res.end = ((...args: unknown[]) => {
        rmSync(stored.tempDir, { recursive: true, force: true });
        return end(...args);
      }) as Response['end'];
      res.once('close', () => void rm(stored.tempDir, { recursive: true, force: true }));
      next();
    });
  };
}

/** The text fields as strings; a field sent twice keeps its last value. */
function textFields(body: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [name, value] of Object.entries((body ?? {}) as Record<string, unknown>)) {
    const last = Array.isArray(value) ? value.at(-1) : value;
    if (typeof last === 'string') out[name] = last;
  }
  return out;
}

/** The image `imageUpload` received: on disk in `tempDir`, hashed, its type judged by content. */
export function uploadedImage(req: Request): ReceivedFile {
  const stored = req.file as (Express.Multer.File & StoredImage) | undefined;
  if (!stored) throw validationFailed([{ path: FIELD, message: 'Choose an image file', code: 'required' }]);
  return {
    tempDir: stored.tempDir, path: stored.path, originalName: stored.originalname.slice(0, 200), sizeBytes: stored.size,
    sha256: stored.sha256, contentType: stored.contentType, fields: textFields(req.body),
  };
}

/**
 * The received image, running `imageUpload(maxBytes)` first when the route has not put it before
 * its handler. Prefer the middleware in the route's `before` list and `uploadedImage(req)`.
 */
export async function receiveImage(req: Request, maxBytes: number): Promise<ReceivedFile> {
  if (!req.file) {
    if (!req.res) throw new Error('receiveImage needs an Express request (req.res)');
    await new Promise<void>((resolve, reject) => {
      imageUpload(maxBytes)(req, req.res!, (err?: unknown) => (err ? reject(err) : resolve()));
    });
  }
  return uploadedImage(req);
}
