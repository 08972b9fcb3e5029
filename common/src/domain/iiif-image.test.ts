import { describe, expect, it } from 'vitest';
import {
  parseQualityFormat, parseRegion, parseRotation, parseSize, resolveImageRequest, resolveRegion, resolveSize, scaleFactorsFor, sizesFor,
} from './iiif-image';

const resolve = (region: string, size: string, w = 300, h = 200, limits = {}) =>
  resolveImageRequest({ region, size, rotation: '0', file: 'default.jpg' }, w, h, limits);

describe('IIIF Image API 3.0 region (§4.1)', () => {
  // The specification's own worked example, recalled from memory: on a 300 × 200 image the pixel
  // region 125,15,120,140 and the percentage region pct:41.6,7.5,40,70 select the same pixels.
  it('pct:41.6,7.5,40,70 on 300 × 200 is the pixel region 125,15,120,140', () => {
    const spec = (text: string) => {
      const p = parseRegion(text);
      if (!p.ok) throw new Error(p.message);
      return p.value;
    };
    const px = resolveRegion(spec('125,15,120,140'), 300, 200);
    const pct = resolveRegion(spec('pct:41.6,7.5,40,70'), 300, 200);
    expect(px).toEqual({ left: 125, top: 15, width: 120, height: 140 });
    expect(pct).toEqual(px);
  });

  // Recalled from memory: a region reaching past the image is cropped at its edges (125,15,200,200 → 175 × 185).
  it('crops a region that reaches past the edge', () => {
    const r = resolve('125,15,200,200', 'max');
    expect(r.ok && r.value.region).toEqual({ left: 125, top: 15, width: 175, height: 185 });
  });

  it('square is the largest centred square', () => {
    expect(resolveRegion({ kind: 'square' }, 300, 200)).toEqual({ left: 50, top: 0, width: 200, height: 200 });
    expect(resolveRegion({ kind: 'square' }, 200, 301)).toEqual({ left: 0, top: 50, width: 200, height: 200 });
  });

  it('refuses a region wholly outside, zero-sized or malformed', () => {
    expect(resolve('300,0,10,10', 'max')).toMatchObject({ ok: false, field: 'region' });
    expect(resolve('0,200,10,10', 'max')).toMatchObject({ ok: false, field: 'region' });
    for (const bad of ['0,0,0,10', 'pct:0,0,0,10', '1,2,3', '-1,0,5,5', 'pct:101,0,5,5', 'a,b,c,d', '1.5,0,5,5', '', 'fullish', '99999999,0,1,1']) {
      expect(parseRegion(bad).ok, bad).toBe(false);
    }
  });
});

describe('IIIF Image API 3.0 size (§4.2)', () => {
  const region = { rw: 300, rh: 200 };
  const size = (s: string, limits = {}) => {
    const p = parseSize(s);
    if (!p.ok) return p;
    return resolveSize(p.value, region.rw, region.rh, limits);
  };
  it('w, and ,h keep the aspect ratio; w,h is exact; pct:n scales', () => {
    expect(size('150,')).toEqual({ ok: true, value: { width: 150, height: 100 } });
    expect(size(',50')).toEqual({ ok: true, value: { width: 75, height: 50 } });
    expect(size('100,100')).toEqual({ ok: true, value: { width: 100, height: 100 } });
    expect(size('pct:50')).toEqual({ ok: true, value: { width: 150, height: 100 } });
  });
  it('!w,h fits inside the box keeping the aspect ratio', () => {
    expect(size('!150,150')).toEqual({ ok: true, value: { width: 150, height: 100 } });
    expect(size('!600,600')).toEqual({ ok: true, value: { width: 300, height: 200 } });
    expect(size('^!600,600')).toEqual({ ok: true, value: { width: 600, height: 400 } });
  });
  // 3.0 changed 2.x: without ^ a size larger than the region is an error, and "full" is gone (recalled from memory).
  it('refuses upscaling without ^ and sizes of 2.x', () => {
    expect(size('301,').ok).toBe(false);
    expect(size('^301,')).toEqual({ ok: true, value: { width: 301, height: 201 } });
    expect(size('pct:101').ok).toBe(false);
    for (const bad of ['full', '0,', ',0', '!100,', 'pct:0', 'pct:x', ',', 'max!', '-5,']) expect(parseSize(bad).ok, bad).toBe(false);
  });
  it('max keeps maxWidth / maxHeight / maxArea; an explicit size above them is refused', () => {
    expect(size('max', { maxWidth: 150 })).toEqual({ ok: true, value: { width: 150, height: 100 } });
    expect(size('max', { maxHeight: 50 })).toEqual({ ok: true, value: { width: 75, height: 50 } });
    expect(size('max', { maxArea: 15_000 })).toEqual({ ok: true, value: { width: 150, height: 100 } });
    expect(size('^max', { maxWidth: 600, maxHeight: 600 })).toEqual({ ok: true, value: { width: 600, height: 400 } });
    expect(size('200,', { maxWidth: 150 }).ok).toBe(false);
  });
});

describe('IIIF Image API 3.0 rotation, quality and format (§4.3–4.5)', () => {
  it('turns by multiples of 90, mirrored with !', () => {
    expect(parseRotation('0')).toEqual({ ok: true, value: { degrees: 0, mirror: false } });
    expect(parseRotation('!90')).toEqual({ ok: true, value: { degrees: 90, mirror: true } });
    expect(parseRotation('360')).toEqual({ ok: true, value: { degrees: 0, mirror: false } });
    for (const bad of ['45', '-90', '361', 'x', '', '!']) expect(parseRotation(bad).ok, bad).toBe(false);
  });
  it('reads quality.format', () => {
    expect(parseQualityFormat('gray.png')).toEqual({ ok: true, value: { quality: 'gray', format: 'png' } });
    for (const bad of ['default', 'bitonal.jpg', 'default.tif', 'native.jpg', '.jpg', 'default.']) expect(parseQualityFormat(bad).ok, bad).toBe(false);
  });
});

describe('info.json tiles and sizes', () => {
  it('halves until the image fits one tile; sizes smallest first, within the limits', () => {
    expect(scaleFactorsFor(4000, 3000, 512)).toEqual([1, 2, 4, 8]);
    expect(scaleFactorsFor(400, 300, 512)).toEqual([1]);
    expect(sizesFor(4000, 3000, [1, 2, 4, 8], {})).toEqual([
      { width: 500, height: 375 }, { width: 1000, height: 750 }, { width: 2000, height: 1500 }, { width: 4000, height: 3000 },
    ]);
    expect(sizesFor(4000, 3000, [1, 2, 4, 8], { maxWidth: 1600 })).toHaveLength(2);
  });
});
