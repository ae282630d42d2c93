/**
 * A cut line across the section: the layers it crosses (where the top solid changes along it) and the
 * temperature along it, sampled from the cell field of the surface-temperature run. Pure functions.
 */
import type { Point } from '@/lib/section/geometry';
import type { ResolvedSolid } from '@/lib/section/resolve';
import type { GridField } from './colour';
import { fieldAt } from './colour';
import { solidAt } from './probe';

export interface CutLayer {
  /** Distances along the cut from its start, m. */
  s0: number;
  s1: number;
  partId: string | null;
  materialId: string | null;
}

/** Parameter u in (0, 1) where segment p-q crosses segment a-b, or null. */
function crossing(p: Point, q: Point, a: Point, b: Point): number | null {
  const rx = q[0] - p[0], ry = q[1] - p[1], sx = b[0] - a[0], sy = b[1] - a[1];
  const den = rx * sy - ry * sx;
  if (Math.abs(den) < 1e-15) return null;
  const ax = a[0] - p[0], ay = a[1] - p[1];
  const u = (ax * sy - ay * sx) / den, v = (ax * ry - ay * rx) / den;
  return u > 0 && u < 1 && v >= 0 && v <= 1 ? u : null;
}

/** The runs along from-to with one top solid each (a run over no solid has partId null). */
export function cutLayers(solids: readonly ResolvedSolid[], from: Point, to: Point): CutLayer[] {
  const len = Math.hypot(to[0] - from[0], to[1] - from[1]);
  if (!(len > 0)) return [];
  const us = [0, 1];
  const minX = Math.min(from[0], to[0]), maxX = Math.max(from[0], to[0]), minY = Math.min(from[1], to[1]), maxY = Math.max(from[1], to[1]);
  for (const s of solids) {
    const poly = s.polygon;
    for (let i = 0; i < poly.length; i++) {
      const a = poly[i], b = poly[(i + 1) % poly.length];
      if (Math.max(a[0], b[0]) < minX || Math.min(a[0], b[0]) > maxX || Math.max(a[1], b[1]) < minY || Math.min(a[1], b[1]) > maxY) continue;
      const u = crossing(from, to, a, b);
      if (u !== null) us.push(u);
    }
  }
  us.sort((a, b) => a - b);
  const out: CutLayer[] = [];
  for (let i = 0; i + 1 < us.length; i++) {
    const u0 = us[i], u1 = us[i + 1];
    if ((u1 - u0) * len < 1e-9) continue;
    const um = (u0 + u1) / 2;
    const top = solidAt(solids, from[0] + um * (to[0] - from[0]), from[1] + um * (to[1] - from[1]));
    const partId = top?.partId ?? null, materialId = top?.materialId ?? null;
    const last = out[out.length - 1];
    if (last && last.partId === partId && last.materialId === materialId) last.s1 = u1 * len;
    else out.push({ s0: u0 * len, s1: u1 * len, partId, materialId });
  }
  return out;
}

export interface CutProfile {
  length: number;
  /** Distance along the cut of each sample, m. */
  s: Float64Array;
  /** Temperature at each sample, C; NaN where the cut runs outside the solids. */
  t: Float64Array;
  layers: CutLayer[];
}

/** `n` samples evenly along the cut (both ends included) and its layers. */
export function cutProfile(field: GridField, solids: readonly ResolvedSolid[], from: Point, to: Point, n = 241): CutProfile {
  const length = Math.hypot(to[0] - from[0], to[1] - from[1]);
  const s = new Float64Array(n), t = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const u = n > 1 ? i / (n - 1) : 0;
    s[i] = u * length;
    t[i] = fieldAt(field, from[0] + u * (to[0] - from[0]), from[1] + u * (to[1] - from[1]));
  }
  return { length, s, t, layers: cutLayers(solids, from, to) };
}

/** Lowest and highest finite temperature of a profile (null when it crosses no solid). */
export function profileRange(p: CutProfile): { lo: number; hi: number } | null {
  let lo = Infinity, hi = -Infinity;
  for (const v of p.t) if (v === v) { if (v < lo) lo = v; if (v > hi) hi = v; }
  return lo <= hi ? { lo, hi } : null;
}

/** SVG polyline pieces (broken where the cut leaves the solids) for a chart of w x h pixels. */
export function chartPaths(p: CutProfile, w: number, h: number, range: { lo: number; hi: number }): string[] {
  const span = range.hi - range.lo || 1;
  const X = (s: number) => (p.length ? (s / p.length) * w : 0), Y = (t: number) => h - ((t - range.lo) / span) * h;
  const out: string[] = [];
  let cur: string[] = [];
  for (let i = 0; i < p.s.length; i++) {
    const v = p.t[i];
    if (v !== v) { if (cur.length > 1) out.push(cur.join(' ')); cur = []; continue; }
    cur.push(`${X(p.s[i]).toFixed(1)},${Y(v).toFixed(1)}`);
  }
  if (cur.length > 1) out.push(cur.join(' '));
  return out;
}
