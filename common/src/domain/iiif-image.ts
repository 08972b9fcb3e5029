/**
 * IIIF Image API 3.0 request parameters: parsing each path segment and resolving a request against
 * an image's dimensions. Pure functions, used by the server (which renders the answer) and its tests.
 *
 * The rules follow the specification's sections (recalled from memory of the 3.0 text):
 *   §4.1 region   full | square | x,y,w,h | pct:x,y,w,h   (a region partly outside is cropped at the
 *                 image's edges; one wholly outside, or with zero width or height, is an error)
 *   §4.2 size     max | w, | ,h | pct:n | w,h | !w,h, each with an optional ^ that allows upscaling;
 *                 without ^ a size larger than the region is an error; every answer respects
 *                 maxWidth / maxHeight / maxArea
 *   §4.3 rotation n or !n (mirrored first); this server turns by multiples of 90 only
 *   §4.4 quality  default | color | gray | bitonal (bitonal is not offered here)
 *   §4.5 format   jpg | png | webp here
 */

export const IIIF_QUALITIES = ['default', 'color', 'gray'] as const;
export const IIIF_FORMATS = ['jpg', 'png', 'webp'] as const;
export type IiifQuality = (typeof IIIF_QUALITIES)[number];
export type IiifFormat = (typeof IIIF_FORMATS)[number];

export const IIIF_MEDIA_TYPES: Record<IiifFormat, string> = { jpg: 'image/jpeg', png: 'image/png', webp: 'image/webp' };

export type RegionSpec =
  | { kind: 'full' }
  | { kind: 'square' }
  | { kind: 'px'; x: number; y: number; w: number; h: number }
  | { kind: 'pct'; x: number; y: number; w: number; h: number };

export type SizeSpec =
  | { kind: 'max'; upscale: boolean }
  | { kind: 'w'; upscale: boolean; w: number }
  | { kind: 'h'; upscale: boolean; h: number }
  | { kind: 'pct'; upscale: boolean; n: number }
  | { kind: 'wh'; upscale: boolean; w: number; h: number }
  | { kind: 'confined'; upscale: boolean; w: number; h: number };

export interface RotationSpec { degrees: 0 | 90 | 180 | 270; mirror: boolean }

/** Limits of an image service: what `info.json` says as maxWidth / maxHeight / maxArea. */
export interface ServiceLimits { maxWidth?: number; maxHeight?: number; maxArea?: number }

export interface ResolvedRequest {
  /** The region in the source image's pixels, inside the image. */
  region: { left: number; top: number; width: number; height: number };
  /** The scaled region's size, before rotation. */
  width: number;
  height: number;
  rotation: RotationSpec;
  quality: IiifQuality;
  format: IiifFormat;
}

/** A parse result: the value, or the reason in the product's words. */
export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

const INT = /^\d+$/;
const DEC = /^(\d+(\.\d*)?|\.\d+)$/;
const ok = <T>(value: T): Parsed<T> => ({ ok: true, value });
const fail = <T>(message: string): Parsed<T> => ({ ok: false, message });

/** Integers beyond this are refused before any arithmetic (no image is near it). */
const MAX_INT = 1_000_000;

function ints(text: string, count: number): number[] | null {
  const parts = text.split(',');
  if (parts.length !== count || !parts.every((p) => INT.test(p))) return null;
  const values = parts.map(Number);
  return values.every((v) => v <= MAX_INT) ? values : null;
}

export function parseRegion(text: string): Parsed<RegionSpec> {
  if (text === 'full') return ok({ kind: 'full' });
  if (text === 'square') return ok({ kind: 'square' });
  if (text.startsWith('pct:')) {
    const parts = text.slice(4).split(',');
    if (parts.length !== 4 || !parts.every((p) => DEC.test(p))) return fail('A percentage region is pct:x,y,w,h with four numbers from 0 to 100.');
    const [x, y, w, h] = parts.map(Number) as [number, number, number, number];
    if (x > 100 || y > 100) return fail('A percentage region starts inside the image (x and y at most 100).');
    if (w <= 0 || h <= 0) return fail('A region needs a width and a height above zero.');
    return ok({ kind: 'pct', x, y, w, h });
  }
  const px = ints(text, 4);
  if (!px) return fail('The region is full, square, x,y,w,h in pixels or pct:x,y,w,h.');
  const [x, y, w, h] = px as [number, number, number, number];
  if (w === 0 || h === 0) return fail('A region needs a width and a height above zero.');
  return ok({ kind: 'px', x, y, w, h });
}

export function parseSize(text: string): Parsed<SizeSpec> {
  const upscale = text.startsWith('^');
  const rest = upscale ? text.slice(1) : text;
  if (rest === 'max') return ok({ kind: 'max', upscale });
  if (rest.startsWith('pct:')) {
    const n = rest.slice(4);
    if (!DEC.test(n) || Number(n) <= 0) return fail('A percentage size is pct:n with n above zero.');
    if (Number(n) > 100 && !upscale) return fail('A size above 100 % needs ^ (upscaling) before it.');
    return ok({ kind: 'pct', upscale, n: Number(n) });
  }
  const confined = rest.startsWith('!');
  const body = confined ? rest.slice(1) : rest;
  const m = /^(\d*),(\d*)$/.exec(body);
  if (!m) return fail('The size is max, w,, ,h, pct:n, w,h or !w,h (each may start with ^).');
  const [, ws, hs] = m as unknown as [string, string, string];
  const w = ws === '' ? null : Number(ws);
  const h = hs === '' ? null : Number(hs);
  if ((w !== null && w > MAX_INT) || (h !== null && h > MAX_INT)) return fail('The size is larger than any image served here.');
  if (w === 0 || h === 0) return fail('A size needs a width and a height above zero.');
  if (confined) {
    if (w === null || h === null) return fail('A confined size !w,h needs both a width and a height.');
    return ok({ kind: 'confined', upscale, w, h });
  }
  if (w !== null && h !== null) return ok({ kind: 'wh', upscale, w, h });
  if (w !== null) return ok({ kind: 'w', upscale, w });
  if (h !== null) return ok({ kind: 'h', upscale, h });
  return fail('The size needs a width, a height or both.');
}

export function parseRotation(text: string): Parsed<RotationSpec> {
  const mirror = text.startsWith('!');
  const n = mirror ? text.slice(1) : text;
  if (!DEC.test(n)) return fail('The rotation is a number of degrees from 0 to 360, optionally after ! (mirror).');
  const deg = Number(n) % 360;
  if (Number(n) > 360) return fail('The rotation is at most 360 degrees.');
  if (deg !== 0 && deg !== 90 && deg !== 180 && deg !== 270) return fail('This server turns images by 0, 90, 180 or 270 degrees only.');
  return ok({ degrees: deg, mirror });
}

/** The last segment, `{quality}.{format}`. */
export function parseQualityFormat(text: string): Parsed<{ quality: IiifQuality; format: IiifFormat }> {
  const dot = text.lastIndexOf('.');
  if (dot <= 0) return fail('The last part is quality.format, e.g. default.jpg.');
  const quality = text.slice(0, dot);
  const format = text.slice(dot + 1);
  if (!(IIIF_QUALITIES as readonly string[]).includes(quality)) return fail(`The quality is one of ${IIIF_QUALITIES.join(', ')}.`);
  if (!(IIIF_FORMATS as readonly string[]).includes(format)) return fail(`The format is one of ${IIIF_FORMATS.join(', ')}.`);
  return ok({ quality: quality as IiifQuality, format: format as IiifFormat });
}

/** §4.1: the region in pixels, cropped to the image; null when nothing of it lies inside. */
export function resolveRegion(spec: RegionSpec, imageWidth: number, imageHeight: number): ResolvedRequest['region'] | null {
  let x: number, y: number, w: number, h: number;
  switch (spec.kind) {
    case 'full':
      return { left: 0, top: 0, width: imageWidth, height: imageHeight };
    case 'square': {
      const side = Math.min(imageWidth, imageHeight);
      return { left: Math.floor((imageWidth - side) / 2), top: Math.floor((imageHeight - side) / 2), width: side, height: side };
    }
    case 'px':
      ({ x, y, w, h } = spec);
      break;
    case 'pct':
      x = Math.round((spec.x / 100) * imageWidth);
      y = Math.round((spec.y / 100) * imageHeight);
      w = Math.round((spec.w / 100) * imageWidth);
      h = Math.round((spec.h / 100) * imageHeight);
      break;
  }
  if (x >= imageWidth || y >= imageHeight) return null;
  const width = Math.min(w, imageWidth - x);
  const height = Math.min(h, imageHeight - y);
  if (width <= 0 || height <= 0) return null;
  return { left: x, top: y, width, height };
}

/** The largest size of a w × h region that keeps the service's limits, keeping the aspect ratio. */
function fitLimits(w: number, h: number, limits: ServiceLimits): { width: number; height: number } {
  let scale = 1;
  if (limits.maxWidth && w * scale > limits.maxWidth) scale = limits.maxWidth / w;
  if (limits.maxHeight && h * scale > limits.maxHeight) scale = Math.min(scale, limits.maxHeight / h);
  if (limits.maxArea && w * h * scale * scale > limits.maxArea) scale = Math.min(scale, Math.sqrt(limits.maxArea / (w * h)));
  return { width: Math.max(1, Math.floor(w * scale)), height: Math.max(1, Math.floor(h * scale)) };
}

/** §4.2: the answer's size for a region of rw × rh; a message when the request cannot be met. */
export function resolveSize(spec: SizeSpec, rw: number, rh: number, limits: ServiceLimits): Parsed<{ width: number; height: number }> {
  let width: number, height: number;
  switch (spec.kind) {
    case 'max': {
      // max: the region's size, or the largest the limits allow; ^max may grow up to the limits.
      const capped = fitLimits(rw, rh, limits);
      if (spec.upscale && (limits.maxWidth || limits.maxHeight || limits.maxArea)) {
        const grown = fitLimits(rw * MAX_INT, rh * MAX_INT, limits);
        return ok(grown.width >= rw ? grown : capped);
      }
      return ok(capped);
    }
    case 'w':
      width = spec.w;
      height = Math.max(1, Math.round((rh * spec.w) / rw));
      break;
    case 'h':
      height = spec.h;
      width = Math.max(1, Math.round((rw * spec.h) / rh));
      break;
    case 'pct':
      width = Math.max(1, Math.round((rw * spec.n) / 100));
      height = Math.max(1, Math.round((rh * spec.n) / 100));
      break;
    case 'wh':
      ({ w: width, h: height } = spec);
      break;
    case 'confined': {
      const scale = Math.min(spec.w / rw, spec.h / rh);
      width = Math.max(1, Math.min(spec.w, Math.round(rw * scale)));
      height = Math.max(1, Math.min(spec.h, Math.round(rh * scale)));
      if (!spec.upscale && scale > 1) {
        width = rw;
        height = rh;
      }
      break;
    }
  }
  if (!spec.upscale && (width > rw || height > rh)) {
    return fail(`The size ${width} × ${height} is larger than the region (${rw} × ${rh}); put ^ before the size to allow upscaling.`);
  }
  if (limits.maxWidth && width > limits.maxWidth) return fail(`The width ${width} is above this image's maximum of ${limits.maxWidth} pixels.`);
  if (limits.maxHeight && height > limits.maxHeight) return fail(`The height ${height} is above this image's maximum of ${limits.maxHeight} pixels.`);
  if (limits.maxArea && width * height > limits.maxArea) return fail(`The size ${width} × ${height} is above this image's maximum of ${limits.maxArea} pixels.`);
  return ok({ width, height });
}

export interface IiifPathSegments { region: string; size: string; rotation: string; file: string }

/** Parses and resolves a whole request: `{ ok: false, field, message }` names the segment at fault. */
export function resolveImageRequest(
  segments: IiifPathSegments,
  imageWidth: number,
  imageHeight: number,
  limits: ServiceLimits,
): { ok: true; value: ResolvedRequest } | { ok: false; field: keyof IiifPathSegments; message: string } {
  const region = parseRegion(segments.region);
  if (!region.ok) return { ok: false, field: 'region', message: region.message };
  const size = parseSize(segments.size);
  if (!size.ok) return { ok: false, field: 'size', message: size.message };
  const rotation = parseRotation(segments.rotation);
  if (!rotation.ok) return { ok: false, field: 'rotation', message: rotation.message };
  const qf = parseQualityFormat(segments.file);
  if (!qf.ok) return { ok: false, field: 'file', message: qf.message };
  const px = resolveRegion(region.value, imageWidth, imageHeight);
  if (!px) return { ok: false, field: 'region', message: `The region lies outside the image (${imageWidth} × ${imageHeight} pixels).` };
  const out = resolveSize(size.value, px.width, px.height, limits);
  if (!out.ok) return { ok: false, field: 'size', message: out.message };
  return { ok: true, value: { region: px, ...out.value, rotation: rotation.value, ...qf.value } };
}

/**
 * Scale factors for the tiles section of info.json: powers of two until the whole image fits in one
 * tile (common practice for deep-zoom viewers).
 */
export function scaleFactorsFor(width: number, height: number, tileSize: number): number[] {
  const factors = [1];
  while (Math.max(width, height) / factors[factors.length - 1]! > tileSize) factors.push(factors[factors.length - 1]! * 2);
  return factors;
}

/** The sizes list of info.json: the whole image at each scale factor, smallest first, within the limits. */
export function sizesFor(width: number, height: number, factors: number[], limits: ServiceLimits): { width: number; height: number }[] {
  const cap = fitLimits(width, height, limits);
  return factors
    .map((f) => ({ width: Math.ceil(width / f), height: Math.ceil(height / f) }))
    .filter((s) => s.width <= cap.width && s.height <= cap.height)
    .reverse();
}
