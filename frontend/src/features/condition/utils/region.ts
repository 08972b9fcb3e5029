import polylabel from 'polylabel';
import { regionSchema, type Region } from '@toneledger/common/schemas/condition';

/** A point on an image: x and y as fractions (0–1) of the image's width and height. */
export type Point = [number, number];
export type Shape = Region['shape'];

export interface Box {
  left: number;
  top: number;
  width: number;
  height: number;
}

/** Four decimals: a tenth of a pixel on a 1,000-pixel image, and short enough to read. */
export function round4(n: number): number {
  return Math.round(n * 10_000) / 10_000;
}

export function clamp01(n: number): number {
  if (!Number.isFinite(n)) return 0;
  return Math.min(1, Math.max(0, n));
}

/** Where a pointer at (clientX, clientY) falls on the drawn image, normalised and kept inside it. */
export function toNormalised(clientX: number, clientY: number, box: Box): Point {
  if (box.width <= 0 || box.height <= 0) return [0, 0];
  return [round4(clamp01((clientX - box.left) / box.width)), round4(clamp01((clientY - box.top) / box.height))];
}

/** The two corners (top-left, bottom-right) of the rectangle spanned by a drag from `a` to `b`. */
export function rectFromDrag(a: Point, b: Point): [Point, Point] {
  return [
    [Math.min(a[0], b[0]), Math.min(a[1], b[1])],
    [Math.max(a[0], b[0]), Math.max(a[1], b[1])],
  ];
}

/** A drag shorter than this (in either direction) is taken as a click, not a rectangle. */
export const MIN_RECT_SIDE = 0.005;

export function isTooSmall(points: Point[]): boolean {
  if (points.length !== 2) return true;
  const [a, b] = points as [Point, Point];
  return Math.abs(a[0] - b[0]) < MIN_RECT_SIDE || Math.abs(a[1] - b[1]) < MIN_RECT_SIDE;
}

const same = (a: Point, b: Point) => Math.abs(a[0] - b[0]) < 1e-4 && Math.abs(a[1] - b[1]) < 1e-4;

/** Adds a polygon vertex, ignoring a repeat of the last one (the clicks of a double-click). */
export function addPolygonPoint(points: Point[], point: Point): Point[] {
  const last = points[points.length - 1];
  if (last && same(last, point)) return points;
  return [...points, point];
}

/** Why a region cannot be kept as it is, or null when it can (the shared schema decides). */
export function regionProblem(imageId: string, shape: Shape, points: Point[]): string | null {
  if (!imageId) return 'Choose the image the region is drawn on.';
  const result = regionSchema.safeParse({ imageId, shape, points });
  if (result.success) {
    if (shape === 'rect' && isTooSmall(points)) return 'The rectangle has no size; drag across the area, or give two different corners.';
    return null;
  }
  return shape === 'rect' ? 'A rectangle needs two corners, each between 0 and 1.' : 'A polygon needs at least three points, each between 0 and 1.';
}

/**
 * Where to put a region's number: inside the region, as far from its edges as possible. A rectangle
 * (two corners) has its centre; a polygon its pole of inaccessibility (polylabel, to 0.001 of the
 * image), which lies inside even an L- or C-shaped outline where the centroid may not.
 */
export function labelPoint(points: Point[]): Point {
  if (points.length === 0) return [0, 0];
  if (points.length === 1) return points[0]!;
  if (points.length === 2) return [(points[0]![0] + points[1]![0]) / 2, (points[0]![1] + points[1]![1]) / 2];
  const [x, y] = polylabel([points.map(([px, py]) => [px, py])], 0.001);
  return [x, y];
}

export function describeRegion(region: Pick<Region, 'shape' | 'points'>): string {
  return region.shape === 'rect' ? 'Rectangle' : `Polygon of ${region.points.length} points`;
}

/** The SVG `points` attribute for a polygon or polyline in a 0–1 view box. */
export function svgPoints(points: Point[]): string {
  return points.map(([x, y]) => `${x},${y}`).join(' ');
}
