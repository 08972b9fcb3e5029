import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import sharp, { type Metadata } from 'sharp';
import exifr from 'exifr';
import { AppError, validationFailed } from '../errors';

/**
 * Checking an image received without holding it in memory: the upload has streamed to a private
 * temporary file while its SHA-256 and size were computed, and its type was judged from its first
 * bytes (middleware/image-upload.ts, a multer storage engine). Here sharp decodes it under a pixel
 * limit, so a truncated file or a decompression bomb is refused before anything is kept (the
 * decode check runs beside the upload to storage, and a refused file's object is deleted again).
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

export { sniffImageType } from './image-signature';

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

/** SHA-256 of a stream, without holding it. */
export async function sha256Of(stream: NodeJS.ReadableStream): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of stream) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export { createReadStream };
