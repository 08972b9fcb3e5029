import sharp from 'sharp';
import { QueryTypes } from 'sequelize';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { can, type Role } from '@toneledger/common/domain/roles';
import {
  IIIF_MEDIA_TYPES, resolveImageRequest, scaleFactorsFor, sizesFor, type IiifPathSegments, type ResolvedRequest, type ServiceLimits,
} from '@toneledger/common/domain/iiif-image';
import { IIIF_IMAGE_CONTEXT, IIIF_IMAGE_PROTOCOL, type IiifImageInfo } from '@toneledger/common/schemas/iiif';
import { db } from '../db';
import type { Image } from '../models';
import { notFound, serviceUnavailable, validationFailed } from '../errors';
import { getImage } from './image.service';
import { MAX_IMAGE_PIXELS } from './image-ingest';

/**
 * The IIIF Image API 3.0 over the stored images. A role with `images.original` is served from the
 * original; every other reader from the display copy (the screen-size WebP the upload made), whose
 * own dimensions are then the image's width and height and its maxWidth / maxHeight, so no request
 * reaches a pixel of the original. Each answer is made once and kept in object storage under
 * `iiif/<image>/<source>/<x,y,w,h>/<w,h>/<rotation>/<quality>.<format>` (the request resolved to
 * pixels, so equal requests written differently share one object); `iiif_cache` lists them so the
 * purge of a withdrawn image removes them with it. The answers served lately are also kept in memory
 * (64 MB, least recently used first out), in front of storage.
 */

export const TILE_SIZE = 512;
/** The largest answer for roles that read originals: big enough for any screen, far below the 200 MP the upload allows. */
export const ORIGINAL_MAX_AREA = 40_000_000;

export type IiifSource = { kind: 'original' | 'screen'; key: string; width: number; height: number; limits: ServiceLimits; image: Image };

/** Source files kept in memory between requests: a deep-zoom view asks for dozens of tiles of one image. */
const SOURCE_BUDGET_BYTES = 256 * 1024 * 1024;
const sources = new Map<string, Buffer>();
let sourceBytes = 0;
/** The display copies' dimensions, read once per image. */
const screenSizes = new Map<string, { width: number; height: number }>();
/** Answers served lately, in memory in front of object storage (a viewer asks for the same tiles again as it pans back). */
const ANSWER_BUDGET_BYTES = 64 * 1024 * 1024;
const answers = new Map<string, Buffer>();
let answerBytes = 0;

function keepAnswer(key: string, bytes: Buffer) {
  if (bytes.length > ANSWER_BUDGET_BYTES / 8 || answers.has(key)) return;
  answers.set(key, bytes);
  answerBytes += bytes.length;
  for (const [k, v] of answers) {
    if (answerBytes <= ANSWER_BUDGET_BYTES) break;
    answers.delete(k);
    answerBytes -= v.length;
  }
}

function answerFromMemory(key: string): Buffer | null {
  const hit = answers.get(key);
  if (!hit) return null;
  answers.delete(key);
  answers.set(key, hit);
  return hit;
}

/** Empties the in-memory caches (the bench times reads from object storage with it). */
export function forgetIiifMemory(): void {
  answers.clear();
  answerBytes = 0;
  sources.clear();
  sourceBytes = 0;
  screenSizes.clear();
}

/** Answers being made now: a second identical request waits for the first. */
const inFlight = new Map<string, Promise<Buffer>>();

async function readAll(store: ObjectStore, key: string): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of await store.get(key)) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

async function sourceBytesOf(store: ObjectStore, key: string): Promise<Buffer> {
  const hit = sources.get(key);
  if (hit) {
    sources.delete(key);
    sources.set(key, hit);
    return hit;
  }
  let buf: Buffer;
  try {
    buf = await readAll(store, key);
  } catch {
    throw serviceUnavailable('Image storage is not available.');
  }
  if (buf.length <= SOURCE_BUDGET_BYTES) {
    sources.set(key, buf);
    sourceBytes += buf.length;
    for (const [k, v] of sources) {
      if (sourceBytes <= SOURCE_BUDGET_BYTES) break;
      sources.delete(k);
      sourceBytes -= v.length;
    }
  }
  return buf;
}

/** What a role may see of an image through IIIF: the original, or the display copy. */
export async function iiifSourceFor(store: ObjectStore, imageId: string, role: Role | null): Promise<IiifSource> {
  const { row } = await getImage(imageId, role);
  if (row.purgedAt) throw notFound('The image file');
  if (can(role, 'images.original')) {
    return { kind: 'original', key: row.originalKey, width: row.width, height: row.height, limits: { maxArea: ORIGINAL_MAX_AREA }, image: row };
  }
  if (!row.screenKey || row.derivatives !== 'ready') throw notFound('The display copy of this image (still being made)');
  let size = screenSizes.get(row.id);
  if (!size) {
    const meta = await sharp(await sourceBytesOf(store, row.screenKey)).metadata();
    size = { width: meta.width!, height: meta.height! };
    screenSizes.set(row.id, size);
  }
  return { kind: 'screen', key: row.screenKey, ...size, limits: { maxWidth: size.width, maxHeight: size.height }, image: row };
}

/** Image API 3.0 §5: the image information document. */
export function imageInfo(serviceId: string, source: IiifSource): IiifImageInfo {
  const factors = scaleFactorsFor(source.width, source.height, TILE_SIZE);
  return {
    '@context': IIIF_IMAGE_CONTEXT,
    id: serviceId,
    type: 'ImageService3',
    protocol: IIIF_IMAGE_PROTOCOL,
    profile: 'level1',
    width: source.width,
    height: source.height,
    ...source.limits,
    sizes: sizesFor(source.width, source.height, factors, source.limits),
    tiles: [{ width: TILE_SIZE, height: TILE_SIZE, scaleFactors: factors }],
    extraQualities: ['color', 'gray'],
    extraFormats: ['png', 'webp'],
    preferredFormats: ['jpg', 'webp'],
    extraFeatures: ['mirroring', 'regionByPct', 'regionSquare', 'rotationBy90s', 'sizeByConfinedWh', 'sizeByPct', 'sizeUpscaling', 'baseUriRedirect'],
  };
}

export function cacheKeyOf(imageId: string, kind: IiifSource['kind'], r: ResolvedRequest): string {
  const { left, top, width, height } = r.region;
  const rotation = `${r.rotation.mirror ? '!' : ''}${r.rotation.degrees}`;
  return `iiif/${imageId}/${kind}/${left},${top},${width},${height}/${r.width},${r.height}/${rotation}/${r.quality}.${r.format}`;
}

/** Renders one answer from the source bytes (region, size, mirror and rotation, quality, format). */
export async function renderImage(source: Buffer, r: ResolvedRequest): Promise<Buffer> {
  let out = sharp(source, { limitInputPixels: MAX_IMAGE_PIXELS, autoOrient: true })
    .extract(r.region)
    .resize(r.width, r.height, { fit: 'fill' });
  if (r.rotation.mirror || r.rotation.degrees) {
    // flop() always runs before rotate() in sharp: mirrored first, then turned, as §4.3 asks.
    const { data, info } = await out.raw().toBuffer({ resolveWithObject: true });
    out = sharp(data, { raw: { width: info.width, height: info.height, channels: info.channels } });
    if (r.rotation.mirror) out = out.flop();
    if (r.rotation.degrees) out = out.rotate(r.rotation.degrees);
  }
  if (r.quality === 'gray') out = out.grayscale().toColourspace('b-w');
  switch (r.format) {
    case 'jpg':
      return out.flatten({ background: '#ffffff' }).jpeg({ quality: 85, mozjpeg: false }).toBuffer();
    case 'png':
      return out.png().toBuffer();
    case 'webp':
      return out.webp({ quality: 82 }).toBuffer();
  }
}

async function remember(store: ObjectStore, key: string, imageId: string, bytes: Buffer): Promise<void> {
  await store.put(key, bytes, { contentType: 'application/octet-stream', contentLength: bytes.length });
  await db().query('INSERT INTO iiif_cache (key, image_id, byte_size) VALUES ($1, $2, $3) ON CONFLICT (key) DO NOTHING', {
    bind: [key, imageId, bytes.length], type: QueryTypes.INSERT,
  });
}

async function cached(store: ObjectStore, key: string): Promise<Buffer | null> {
  try {
    return await readAll(store, key);
  } catch {
    return null;
  }
}

/** One image request: from storage when made before, otherwise made now and kept. */
export async function imageRequest(
  store: ObjectStore,
  imageId: string,
  segments: IiifPathSegments,
  role: Role | null,
): Promise<{ bytes: Buffer; contentType: string; cache: 'memory' | 'hit' | 'miss' }> {
  const source = await iiifSourceFor(store, imageId, role);
  const resolved = resolveImageRequest(segments, source.width, source.height, source.limits);
  if (!resolved.ok) throw validationFailed([{ path: `params.${resolved.field}`, message: resolved.message, code: 'iiif' }], resolved.message);
  const r = resolved.value;
  const contentType = IIIF_MEDIA_TYPES[r.format];
  const key = cacheKeyOf(imageId, source.kind, r);
  const recent = answerFromMemory(key);
  if (recent) return { bytes: recent, contentType, cache: 'memory' };
  const hit = await cached(store, key);
  if (hit) {
    keepAnswer(key, hit);
    return { bytes: hit, contentType, cache: 'hit' };
  }
  let job = inFlight.get(key);
  if (!job) {
    job = (async () => {
      const bytes = await renderImage(await sourceBytesOf(store, source.key), r);
      keepAnswer(key, bytes);
      await remember(store, key, imageId, bytes).catch(() => {
        // Not kept (storage refused): the next request makes it again.
      });
      return bytes;
    })().finally(() => inFlight.delete(key));
    inFlight.set(key, job);
  }
  return { bytes: await job, contentType, cache: 'miss' };
}

/** Deletes every kept IIIF answer of an image (called by the purge after retention). */
export async function dropIiifCache(store: ObjectStore, imageId: string): Promise<number> {
  const rows = await db().query<{ key: string }>('SELECT key FROM iiif_cache WHERE image_id = $1', { bind: [imageId], type: QueryTypes.SELECT });
  for (const { key } of rows) await store.delete(key);
  await db().query('DELETE FROM iiif_cache WHERE image_id = $1', { bind: [imageId] });
  for (const [key, buf] of [...answers]) {
    if (!key.startsWith(`iiif/${imageId}/`)) continue;
    answers.delete(key);
    answerBytes -= buf.length;
  }
  for (const [key, buf] of [...sources]) {
    if (!key.includes(imageId)) continue;
    sources.delete(key);
    sourceBytes -= buf.length;
  }
  screenSizes.delete(imageId);
  return rows.length;
}
