/** Hit-testing in world and screen coordinates. Pure functions; the canvas layers do not listen. */
import type { Box, Point } from '@/lib/section/geometry';
import { pointInPolygon } from '@/lib/section/geometry';

export interface HitSolid {
  partId: string;
  polygon: readonly Point[];
  box: Box;
}

export function boxOf(poly: readonly Point[]): Box {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const [x, y] of poly) {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY };
}

const inBox = (b: Box, x: number, y: number, pad = 0) => x >= b.minX - pad && x <= b.maxX + pad && y >= b.minY - pad && y <= b.maxY + pad;

/** Distance from a point to a segment. */
export function segmentDistance(px: number, py: number, a: Point, b: Point): number {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  const t = len2 ? Math.max(0, Math.min(1, ((px - a[0]) * dx + (py - a[1]) * dy) / len2)) : 0;
  const qx = a[0] + t * dx, qy = a[1] + t * dy;
  return Math.hypot(px - qx, py - qy);
}

/**
 * The top-most solid at (x, y): `solids` are bottom of the stack first. A point within `slop` metres of a
 * thin solid's outline counts as on it, so a membrane a fraction of a pixel thick can still be picked.
 */
export function hitSolid(solids: readonly HitSolid[], x: number, y: number, slop = 0): string | null {
  for (let i = solids.length - 1; i >= 0; i--) {
    const s = solids[i];
    if (!inBox(s.box, x, y, slop)) continue;
    if (pointInPolygon(x, y, s.polygon)) return s.partId;
  }
  if (slop > 0)
    for (let i = solids.length - 1; i >= 0; i--) {
      const s = solids[i];
      if (!inBox(s.box, x, y, slop)) continue;
      const p = s.polygon;
      for (let j = 0; j < p.length; j++) if (segmentDistance(x, y, p[j], p[(j + 1) % p.length]) <= slop) return s.partId;
    }
  return null;
}

/** Ids of the boxes entirely inside the rectangle. */
export function boxesInside<T extends { id: string; box: Box }>(items: readonly T[], r: Box): string[] {
  return items.filter((it) => it.box.minX >= r.minX && it.box.maxX <= r.maxX && it.box.minY >= r.minY && it.box.maxY <= r.maxY).map((it) => it.id);
}

/** Index of the nearest screen point within `tol` pixels, or -1. */
export function nearestPoint(points: readonly (readonly [number, number])[], sx: number, sy: number, tol: number): number {
  let best = -1, bestD = tol;
  points.forEach(([x, y], i) => {
    const d = Math.hypot(x - sx, y - sy);
    if (d <= bestD) {
      bestD = d;
      best = i;
    }
  });
  return best;
}

/** Normalised rectangle between two points. */
export function rectBetween(a: Point, b: Point): Box {
  return { minX: Math.min(a[0], b[0]), minY: Math.min(a[1], b[1]), maxX: Math.max(a[0], b[0]), maxY: Math.max(a[1], b[1]) };
}
