/** Snapping to other parts' edges (with guides), else to the grid. */
import { describe, expect, it } from 'vitest';
import { snapMove, snapPoint, snapToGrid, snapValue, targetsFromBoxes } from './snap';

const wall = { minX: 0, minY: 0, maxX: 0.2, maxY: 1.2 };
const targets = targetsFromBoxes([wall]);

describe('snap', () => {
  it('rounds to the grid', () => {
    expect(snapToGrid(0.237, 0.01)).toBeCloseTo(0.24, 12);
    expect(snapToGrid(-0.237, 0.05)).toBeCloseTo(-0.25, 12);
  });

  it('a box moved near an edge lands on it and shows a guide along that edge', () => {
    const board = { minX: 0.3, minY: 0.1, maxX: 0.35, maxY: 0.9 };
    // Move left by 0.095: its left edge would be at 0.205, 5 mm from the wall's right face.
    const s = snapMove(board, -0.095, 0, targets, 0.008, null);
    expect(s.dx).toBeCloseTo(-0.1, 12);
    expect(s.dy).toBe(0);
    expect(s.guides).toHaveLength(1);
    expect(s.guides[0]).toMatchObject({ axis: 'x', at: 0.2 });
    expect(s.guides[0].lo).toBeLessThanOrEqual(0);
    expect(s.guides[0].hi).toBeGreaterThanOrEqual(1.2);
  });

  it('snaps the nearest of left, right and centre lines', () => {
    const b = { minX: 1, minY: 0, maxX: 1.1, maxY: 0.1 };
    // Right edge to 0.203 after the move: 3 mm off the wall face; the left edge is 0.103 (far).
    const s = snapMove(b, -0.897, 0, targets, 0.008, null);
    expect(b.maxX + s.dx).toBeCloseTo(0.2, 12);
  });

  it('beyond the tolerance falls back to the grid, with no guide', () => {
    const b = { minX: 1, minY: 2, maxX: 1.1, maxY: 2.1 };
    const s = snapMove(b, 0.0137, 0.0263, targets, 0.008, 0.01);
    expect(b.minX + s.dx).toBeCloseTo(1.01, 12);
    expect(b.minY + s.dy).toBeCloseTo(2.03, 12);
    expect(s.guides).toEqual([]);
  });

  it('without a grid and far from edges the move is unchanged', () => {
    const b = { minX: 5, minY: 5, maxX: 6, maxY: 6 };
    expect(snapMove(b, 0.0137, -0.0211, targets, 0.008, null)).toEqual({ dx: 0.0137, dy: -0.0211, guides: [] });
  });

  it('snaps a handle coordinate and a point on both axes', () => {
    const v = snapValue('y', 1.195, 0.1, targets, 0.008, 0.01);
    expect(v.v).toBeCloseTo(1.2, 12);
    expect(v.guide).toMatchObject({ axis: 'y', at: 1.2 });
    const p = snapPoint([0.196, 1.204], targets, 0.008, 0.05);
    expect(p.p[0]).toBeCloseTo(0.2, 12);
    expect(p.p[1]).toBeCloseTo(1.2, 12);
    expect(p.guides.map((g) => g.axis).sort()).toEqual(['x', 'y']);
  });
});
