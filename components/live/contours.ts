/**
 * Isotherms: d3-contour on the cell field, mapped to world coordinates through the non-uniform cell
 * centres. d3-contour closes rings along the model's edge and around cells outside the solids (it treats
 * them as colder than anything); those pieces are not isotherms and are cut away, leaving polylines.
 */
import { contours } from 'd3-contour';
import type { GridField } from './colour';

export interface Isotherm { value: number; lines: number[][] /* flat x0,y0,x1,y1,... in metres */ }

/** Grid coordinate g (sample i at g = i + 0.5) to world, along one axis. */
export function gridToWorld(lines: ArrayLike<number>, g: number): number {
  const n = lines.length - 1;
  const c = (i: number) => 0.5 * (lines[i] + lines[i + 1]);
  if (g <= 0.5) return lines[0] + (c(0) - lines[0]) * (g / 0.5);
  if (g >= n - 0.5) return c(n - 1) + (lines[n] - c(n - 1)) * ((g - (n - 0.5)) / 0.5);
  const i0 = Math.floor(g - 0.5), f = g - 0.5 - i0;
  return c(i0) + f * (c(i0 + 1) - c(i0));
}

export function isotherms(f: GridField, values: readonly number[]): Isotherm[] {
  if (f.nx < 2 || f.ny < 2 || !values.length) return [];
  const data = Array.from(f.t);
  // Raw marching-squares points (no smoothing): each lies on the edge between two samples; we interpolate in world.
  const gen = contours().size([f.nx, f.ny]).thresholds(values as number[]).smooth(false);
  const ok = (i: number, j: number) => i >= 0 && j >= 0 && i < f.nx && j < f.ny && f.t[j * f.nx + i] === f.t[j * f.nx + i];
  const cx = (i: number) => 0.5 * (f.xs[i] + f.xs[i + 1]);
  const cy = (j: number) => 0.5 * (f.ys[j] + f.ys[j + 1]);
  const T = (i: number, j: number) => f.t[j * f.nx + i];
  return values.map((value) => {
    // A point is genuine when both samples beside it are valid (not the model edge, not a void); then its world position.
    const place = (x: number, y: number): [number, number] | null => {
      if (Number.isInteger(x) && !Number.isInteger(y)) {
        const j = Math.floor(y);
        if (!ok(x - 1, j) || !ok(x, j)) return null;
        const a = T(x - 1, j), b = T(x, j);
        const u = b === a ? 0.5 : Math.max(0, Math.min(1, (value - a) / (b - a)));
        return [cx(x - 1) + u * (cx(x) - cx(x - 1)), cy(j)];
      }
      if (Number.isInteger(y) && !Number.isInteger(x)) {
        const i = Math.floor(x);
        if (!ok(i, y - 1) || !ok(i, y)) return null;
        const a = T(i, y - 1), b = T(i, y);
        const u = b === a ? 0.5 : Math.max(0, Math.min(1, (value - a) / (b - a)));
        return [cx(i), cy(y - 1) + u * (cy(y) - cy(y - 1))];
      }
      return null;
    };
    const mp = gen.contour(data, value);
    const lines: number[][] = [];
    for (const poly of mp.coordinates) for (const ring of poly) {
      let cur: number[] = [];
      for (const [x, y] of ring) {
        const p = place(x, y);
        if (p) cur.push(p[0], p[1]);
        else { if (cur.length >= 4) lines.push(cur); cur = []; }
      }
      if (cur.length >= 4) lines.push(cur);
    }
    return { value, lines };
  });
}

/** Heat-flow direction marks: -grad T at a coarse set of cells, unit vectors (world). */
export function flowMarks(f: GridField, every: number): { x: number; y: number; dx: number; dy: number }[] {
  const out: { x: number; y: number; dx: number; dy: number }[] = [];
  const c = (a: ArrayLike<number>, i: number) => 0.5 * (a[i] + a[i + 1]);
  const step = Math.max(1, Math.round(every));
  for (let j = 1; j < f.ny - 1; j += step) for (let i = 1; i < f.nx - 1; i += step) {
    const t = (a: number, b: number) => f.t[b * f.nx + a];
    const vals = [t(i, j), t(i - 1, j), t(i + 1, j), t(i, j - 1), t(i, j + 1)];
    if (vals.some((v) => v !== v)) continue;
    const gx = (vals[2] - vals[1]) / (c(f.xs, i + 1) - c(f.xs, i - 1));
    const gy = (vals[4] - vals[3]) / (c(f.ys, j + 1) - c(f.ys, j - 1));
    const m = Math.hypot(gx, gy);
    if (!(m > 1e-9)) continue;
    out.push({ x: c(f.xs, i), y: c(f.ys, j), dx: -gx / m, dy: -gy / m });
  }
  return out;
}
