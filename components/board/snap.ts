/**
 * Snapping: a moving box (or point) snaps to the edges and corners of other parts within a tolerance,
 * otherwise to the grid. Returns the snapped offset and the guide lines to show. Pure functions.
 */
import type { Box, Point } from '@/lib/section/geometry';

/** A line a snap aligned to: axis 'x' is a vertical line at x = at, from lo to hi along y. */
export interface Guide {
  axis: 'x' | 'y';
  at: number;
  lo: number;
  hi: number;
}

/** Edges of the other boxes, as candidate coordinates with their extent along the other axis. */
export interface SnapTargets {
  xs: { at: number; lo: number; hi: number }[];
  ys: { at: number; lo: number; hi: number }[];
}

export function targetsFromBoxes(boxes: Iterable<Box>): SnapTargets {
  const xs: SnapTargets['xs'] = [], ys: SnapTargets['ys'] = [];
  for (const b of boxes) {
    xs.push({ at: b.minX, lo: b.minY, hi: b.maxY }, { at: b.maxX, lo: b.minY, hi: b.maxY });
    ys.push({ at: b.minY, lo: b.minX, hi: b.maxX }, { at: b.maxY, lo: b.minX, hi: b.maxX });
  }
  return { xs, ys };
}

export function snapToGrid(v: number, grid: number): number {
  return Math.round(v / grid) * grid;
}

interface AxisSnap {
  delta: number;
  guide: { at: number; lo: number; hi: number } | null;
}

/** Best correction for one axis: `edges` are the moving coordinates after the raw move. */
function snapAxis(edges: number[], targets: SnapTargets['xs'], tol: number, grid: number | null, gridEdge: number): AxisSnap {
  let best: AxisSnap | null = null;
  let bestDist = tol;
  for (const e of edges)
    for (const t of targets) {
      const d = Math.abs(t.at - e);
      if (d <= bestDist) {
        bestDist = d;
        best = { delta: t.at - e, guide: t };
      }
    }
  if (best) return best;
  if (grid) return { delta: snapToGrid(gridEdge, grid) - gridEdge, guide: null };
  return { delta: 0, guide: null };
}

/**
 * Snap a box moved by (dx, dy): its left, right and centre line snap to target x edges, its bottom,
 * top and middle to y edges; failing that its bottom-left corner goes to the grid.
 */
export function snapMove(box: Box, dx: number, dy: number, targets: SnapTargets, tol: number, grid: number | null): { dx: number; dy: number; guides: Guide[] } {
  const xs = [box.minX + dx, box.maxX + dx, (box.minX + box.maxX) / 2 + dx];
  const ys = [box.minY + dy, box.maxY + dy, (box.minY + box.maxY) / 2 + dy];
  const sx = snapAxis(xs, targets.xs, tol, grid, box.minX + dx);
  const sy = snapAxis(ys, targets.ys, tol, grid, box.minY + dy);
  const out = { dx: dx + sx.delta, dy: dy + sy.delta, guides: [] as Guide[] };
  const moved = { minX: box.minX + out.dx, maxX: box.maxX + out.dx, minY: box.minY + out.dy, maxY: box.maxY + out.dy };
  if (sx.guide) out.guides.push({ axis: 'x', at: sx.guide.at, lo: Math.min(sx.guide.lo, moved.minY), hi: Math.max(sx.guide.hi, moved.maxY) });
  if (sy.guide) out.guides.push({ axis: 'y', at: sy.guide.at, lo: Math.min(sy.guide.lo, moved.minX), hi: Math.max(sy.guide.hi, moved.maxX) });
  return out;
}

/** Snap one coordinate along an axis (a handle's edge), to target edges, else to the grid. */
export function snapValue(axis: 'x' | 'y', v: number, cross: number, targets: SnapTargets, tol: number, grid: number | null): { v: number; guide: Guide | null } {
  const s = snapAxis([v], axis === 'x' ? targets.xs : targets.ys, tol, grid, v);
  return { v: v + s.delta, guide: s.guide ? { axis, at: s.guide.at, lo: Math.min(s.guide.lo, cross), hi: Math.max(s.guide.hi, cross) } : null };
}

/** Snap a point (a polygon vertex, a placement) on both axes. */
export function snapPoint(p: Point, targets: SnapTargets, tol: number, grid: number | null): { p: [number, number]; guides: Guide[] } {
  const sx = snapValue('x', p[0], p[1], targets, tol, grid);
  const sy = snapValue('y', p[1], p[0], targets, tol, grid);
  return { p: [sx.v, sy.v], guides: [sx.guide, sy.guide].filter((g): g is Guide => g !== null) };
}
