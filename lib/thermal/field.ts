/**
 * Temperatures from a solution: per cell, on each face (flux-continuous interface value, surface
 * value behind the surface resistance, or the cell value on an adiabatic face), and at any point
 * (the cell value plus one-sided linear reconstruction toward the nearest faces, limited to the
 * range of the solution; exact in 1-D).
 */
import type { ThermalSystem } from './assemble';

export class TemperatureField {
  /** Per boundary face, the surface resistance used (m2K/W). */
  private rs: Float64Array;
  /** Boundary face index by cell and side (4 per cell), -1 when none. */
  private faceAt: Int32Array;
  /** Range of the solution: its cells and the zones on its faces (the maximum principle's bounds). */
  private lo = Infinity;
  private hi = -Infinity;

  constructor(
    readonly sys: ThermalSystem,
    readonly lambda: ArrayLike<number>,
    readonly g: Float64Array,
    /** Temperature of each unknown. */
    readonly x: Float64Array,
    /** Temperature of each zone. */
    readonly tz: ArrayLike<number>,
  ) {
    const f = sys.faces;
    this.rs = new Float64Array(f.count);
    const nc = sys.mesh.nx * sys.mesh.ny;
    this.faceAt = new Int32Array(nc * 4).fill(-1);
    for (let k = 0; k < f.count; k++) {
      this.rs[k] = Math.max(0, f.len[k] / g[k] - f.rHalf[k]);
      this.faceAt[sys.cellOf[f.unknown[k]] * 4 + f.side[k]] = k;
      const t = tz[f.zone[k]];
      if (t < this.lo) this.lo = t;
      if (t > this.hi) this.hi = t;
    }
    for (let u = 0; u < x.length; u++) {
      if (x[u] < this.lo) this.lo = x[u];
      if (x[u] > this.hi) this.hi = x[u];
    }
  }

  cell(c: number): number {
    const u = this.sys.unknownOf[c];
    return u >= 0 ? this.x[u] : NaN;
  }

  /** Surface temperature of boundary face k. */
  surface(k: number): number {
    const f = this.sys.faces;
    const tp = this.x[f.unknown[k]], tz = this.tz[f.zone[k]];
    const rs = this.rs[k];
    return tz + ((tp - tz) * rs) / (rs + f.rHalf[k]);
  }

  /** Surface temperature of boundary face k for another solution x with zone temperatures tz. */
  surfaceWith(k: number, x: Float64Array, tz: ArrayLike<number>): number {
    const f = this.sys.faces;
    const tp = x[f.unknown[k]], t = tz[f.zone[k]];
    const rs = this.rs[k];
    return t + ((tp - t) * rs) / (rs + f.rHalf[k]);
  }

  /** Temperature on side s (0 W, 1 E, 2 S, 3 N) of solid cell c. */
  face(c: number, s: number): number {
    const { mesh, unknownOf } = this.sys;
    const { nx, ny, xs, ys, owner } = mesh;
    const tp = this.cell(c);
    const i = c % nx, j = (c - i) / nx;
    const k = this.faceAt[c * 4 + s];
    if (k >= 0) return this.surface(k);
    const ii = s === 0 ? i - 1 : s === 1 ? i + 1 : i, jj = s === 2 ? j - 1 : s === 3 ? j + 1 : j;
    if (ii < 0 || jj < 0 || ii >= nx || jj >= ny) return tp;
    const d = jj * nx + ii;
    if (unknownOf[d] < 0) return tp;
    const hp = s < 2 ? (xs[i + 1] - xs[i]) / 2 : (ys[j + 1] - ys[j]) / 2;
    const hq = s < 2 ? (xs[ii + 1] - xs[ii]) / 2 : (ys[jj + 1] - ys[jj]) / 2;
    const kp = this.lambda[owner[c]] / hp, kq = this.lambda[owner[d]] / hq;
    return (kp * tp + kq * this.cell(d)) / (kp + kq);
  }

  /**
   * Temperature at a point; NaN outside the solids. On a grid line or node the adjacent solid cell of
   * highest conductivity is used (its reconstruction is the most nearly linear).
   */
  at(x: number, y: number): number {
    const { nx, ny, xs, ys, xc, yc, owner } = this.sys.mesh;
    const tol = 1e-9;
    const iCand = candidates(xs, x, tol, nx), jCand = candidates(ys, y, tol, ny);
    let bestLambda = -Infinity;
    for (const j of jCand) for (const i of iCand) {
      const c = j * nx + i;
      if (this.sys.unknownOf[c] >= 0) bestLambda = Math.max(bestLambda, this.lambda[owner[c]]);
    }
    if (bestLambda === -Infinity) return NaN;
    let sum = 0, count = 0;
    for (const j of jCand) for (const i of iCand) {
      const c = j * nx + i;
      if (this.sys.unknownOf[c] < 0 || this.lambda[owner[c]] !== bestLambda) continue;
      const tp = this.cell(c);
      const hx = (xs[i + 1] - xs[i]) / 2, hy = (ys[j + 1] - ys[j]) / 2;
      const fx = (x - xc[i]) / hx, fy = (y - yc[j]) / hy;
      const tx = fx >= 0 ? this.face(c, 1) : this.face(c, 0);
      const ty = fy >= 0 ? this.face(c, 3) : this.face(c, 2);
      sum += tp + Math.abs(fx) * (tx - tp) + Math.abs(fy) * (ty - tp);
      count++;
    }
    // The reconstruction is linear in x and y from the cell centre; off both centre lines near a
    // warm or cold corner it can pass the range of the solution, so it is limited to that range
    // (cells and zones on the faces), which keeps the maximum principle at every point.
    return Math.min(Math.max(sum / count, this.lo), this.hi);
  }
}

/** Cells whose closed extent holds v (one, or two when v is on a line). */
function candidates(lines: Float64Array, v: number, tol: number, n: number): number[] {
  let lo = 0, hi = n;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (lines[mid] <= v) lo = mid;
    else hi = mid;
  }
  const out: number[] = [];
  if (v < lines[0] - tol || v > lines[n] + tol) return out;
  out.push(lo);
  if (lo > 0 && Math.abs(v - lines[lo]) <= tol) out.push(lo - 1);
  if (lo + 1 < n && Math.abs(v - lines[lo + 1]) <= tol) out.push(lo + 1);
  return out;
}
