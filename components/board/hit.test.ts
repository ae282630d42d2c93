/** Hit-testing: top of the stack wins, thin parts are reachable with slop, marquee contains whole boxes. */
import { describe, expect, it } from 'vitest';
import type { HitSolid } from './hit';
import { boxOf, boxesInside, hitSolid, nearestPoint, rectBetween, segmentDistance } from './hit';

const rect = (id: string, x0: number, y0: number, x1: number, y1: number): HitSolid => {
  const polygon: [number, number][] = [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];
  return { partId: id, polygon, box: boxOf(polygon) };
};

describe('hit', () => {
  const soil = rect('soil', -5, -5, 5, 0);
  const footing = rect('footing', -0.2, -1.2, 0.4, -0.95);
  const membrane = rect('membrane', 0, 0, 1, 0.0002); // 0.2 mm thick
  const L: HitSolid = { partId: 'ell', polygon: [[2, 2], [3, 2], [3, 2.2], [2.2, 2.2], [2.2, 3], [2, 3]], box: { minX: 2, minY: 2, maxX: 3, maxY: 3 } };
  const solids = [soil, footing, membrane, L];

  it('the top-most solid at a point wins', () => {
    expect(hitSolid(solids, 0, -1)).toBe('footing');
    expect(hitSolid(solids, 3, -1)).toBe('soil');
    expect(hitSolid(solids, 0, 4)).toBeNull();
  });

  it('a point inside the box but outside a concave outline misses', () => {
    expect(hitSolid(solids, 2.1, 2.9)).toBe('ell');
    expect(hitSolid(solids, 2.8, 2.8)).toBeNull();
  });

  it('a thin membrane is picked within the slop, and not without it', () => {
    expect(hitSolid(solids, 0.5, 0.002)).toBeNull();
    expect(hitSolid(solids, 0.5, 0.002, 0.003)).toBe('membrane');
  });

  it('distance to a segment clamps to its ends', () => {
    expect(segmentDistance(0.5, 1, [0, 0], [1, 0])).toBeCloseTo(1, 12);
    expect(segmentDistance(2, 0, [0, 0], [1, 0])).toBeCloseTo(1, 12);
    expect(segmentDistance(0, 0, [0, 0], [0, 0])).toBe(0);
  });

  it('marquee selects only boxes entirely inside', () => {
    const items = [{ id: 'a', box: footing.box }, { id: 'b', box: soil.box }];
    expect(boxesInside(items, rectBetween([1, 0], [-1, -2]))).toEqual(['a']);
    expect(rectBetween([1, 0], [-1, -2])).toEqual({ minX: -1, minY: -2, maxX: 1, maxY: 0 });
  });

  it('nearest screen point within the tolerance', () => {
    const pts: [number, number][] = [[0, 0], [10, 0], [10, 10]];
    expect(nearestPoint(pts, 9, 1, 5)).toBe(1);
    expect(nearestPoint(pts, 50, 50, 5)).toBe(-1);
  });
});
