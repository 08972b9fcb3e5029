import { describe, expect, it } from 'vitest';
import { labelPoint, type Point } from '@/features/condition/utils/region';

/** Ray casting: whether a point lies inside a polygon (a standard even–odd test). */
function inside([x, y]: Point, polygon: Point[]): boolean {
  let hit = false;
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
    const [xi, yi] = polygon[i]!;
    const [xj, yj] = polygon[j]!;
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) hit = !hit;
  }
  return hit;
}

describe('labelPoint: where an observation’s number sits', () => {
  it('puts a rectangle’s number at its centre, not its corner', () => {
    const [x, y] = labelPoint([[0.2, 0.1], [0.6, 0.5]]);
    expect(x).toBeCloseTo(0.4, 12);
    expect(y).toBeCloseTo(0.3, 12);
  });

  it('puts a triangle’s number at its incentre (the pole of inaccessibility of a triangle, a geometric fact)', () => {
    // Right triangle (0,0), (0.6,0), (0,0.8): sides 0.6, 0.8, 1.0; the incentre is (r, r) with r = (a + b − c) / 2 = 0.2.
    const [x, y] = labelPoint([[0, 0], [0.6, 0], [0, 0.8]]);
    expect(x).toBeCloseTo(0.2, 2);
    expect(y).toBeCloseTo(0.2, 2);
  });

  it('keeps an L-shaped region’s number inside the region, away from the bounding box’s corner', () => {
    const l: Point[] = [[0.1, 0.1], [0.3, 0.1], [0.3, 0.7], [0.8, 0.7], [0.8, 0.9], [0.1, 0.9]];
    const p = labelPoint(l);
    expect(inside(p, l)).toBe(true);
    expect(p).not.toEqual([0.1, 0.1]);
    // The centre of the bounding box (0.45, 0.5) lies outside this L: the label must not go there.
    expect(inside([0.45, 0.5], l)).toBe(false);
  });
});
