/**
 * What lies under a point of the section: the top solid and its material, the temperature of the
 * surface-temperature run (design day) in that cell, and the nearest verdict surface with its figures.
 * Pure functions over the resolved section and the results.
 */
import type { Point } from '@/lib/section/geometry';
import { pointInPolygon } from '@/lib/section/geometry';
import type { ResolvedSolid } from '@/lib/section/resolve';
import type { Segment } from '@/lib/thermal/types';
import type { GridField } from './colour';
import { fieldAt } from './colour';

/** The top-most solid at a point (solids are bottom of the stack first), or null. */
export function solidAt(solids: readonly ResolvedSolid[], x: number, y: number): ResolvedSolid | null {
  for (let i = solids.length - 1; i >= 0; i--) if (pointInPolygon(x, y, solids[i].polygon)) return solids[i];
  return null;
}

/** Distance from a point to the segment a-b. */
function distanceToSegment(x: number, y: number, a: Point, b: Point): number {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  const u = l2 ? Math.max(0, Math.min(1, ((x - a[0]) * dx + (y - a[1]) * dy) / l2)) : 0;
  return Math.hypot(x - a[0] - u * dx, y - a[1] - u * dy);
}

/** The verdict surface nearest to a point within `tol` metres, or null. */
export function segmentNear(segments: readonly Segment[], x: number, y: number, tol: number): Segment | null {
  let best: Segment | null = null, bestD = tol;
  for (const s of segments) {
    const d = distanceToSegment(x, y, s.from, s.to);
    if (d <= bestD) { bestD = d; best = s; }
  }
  return best;
}

export interface ProbeReading {
  at: [number, number];
  /** Top solid under the point, or null over a zone or outside. */
  partId: string | null;
  materialId: string | null;
  /** Design-day temperature of the surface-temperature run in the cell under the point, C; null outside the solids. */
  t: number | null;
  /** The verdict surface under the pointer, with its coldest temperature and highest surface RH. */
  segment: Segment | null;
}

export function probeAt(solids: readonly ResolvedSolid[], field: GridField | null, segments: readonly Segment[], x: number, y: number, tol: number): ProbeReading {
  const s = solidAt(solids, x, y);
  const t = field ? fieldAt(field, x, y) : NaN;
  return { at: [x, y], partId: s?.partId ?? null, materialId: s?.materialId ?? null, t: Number.isFinite(t) ? t : null, segment: segmentNear(segments, x, y, tol) };
}
