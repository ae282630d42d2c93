/**
 * Temperatures from a solution: per cell, on each face (flux-continuous interface value, surface
 * value behind the surface resistance, or the cell value on an adiabatic face), at any point
 * (the cell value plus one-sided linear reconstruction toward the nearest faces, limited to the
 * range of the solution; exact in 1-D), and at a grid node on a surface (a corner where a surface
 * ends), from a local refined solve around the node (see nodeTemperatures).
 */
import type { ThermalSystem } from './assemble';
import { choleskyBand, solveBand } from './band';

/** A set of temperatures: per unknown (cell) and per zone. */
export interface TemperatureSet {
  x: Float64Array;
  tz: ArrayLike<number>;
}

/** Local refined solve at a node: coarse cells on each side of the node, and sub-cells per coarse cell and direction. */
export const NODE_PATCH_CELLS = 3;
export const NODE_PATCH_SPLIT = 4;

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

  /** Surface resistance used on boundary face k, m2K/W. */
  surfaceResistance(k: number): number {
    return this.rs[k];
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
    return this.faceOf(c, s, this.x, this.tz);
  }

  private faceOf(c: number, s: number, xv: Float64Array, tzv: ArrayLike<number>): number {
    const { mesh, unknownOf } = this.sys;
    const { nx, ny, xs, ys, owner } = mesh;
    const tp = xv[unknownOf[c]];
    const i = c % nx, j = (c - i) / nx;
    const k = this.faceAt[c * 4 + s];
    if (k >= 0) return this.surfaceWith(k, xv, tzv);
    const ii = s === 0 ? i - 1 : s === 1 ? i + 1 : i, jj = s === 2 ? j - 1 : s === 3 ? j + 1 : j;
    if (ii < 0 || jj < 0 || ii >= nx || jj >= ny) return tp;
    const d = jj * nx + ii;
    if (unknownOf[d] < 0) return tp;
    const hp = s < 2 ? (xs[i + 1] - xs[i]) / 2 : (ys[j + 1] - ys[j]) / 2;
    const hq = s < 2 ? (xs[ii + 1] - xs[ii]) / 2 : (ys[jj + 1] - ys[jj]) / 2;
    const kp = this.lambda[owner[c]] / hp, kq = this.lambda[owner[d]] / hq;
    return (kp * tp + kq * xv[unknownOf[d]]) / (kp + kq);
  }

  /**
   * Temperature at a point; NaN outside the solids. On a grid line or node the adjacent solid cell of
   * highest conductivity is used (its reconstruction is the most nearly linear).
   */
  at(x: number, y: number): number {
    const v = this.atOf(x, y, this.x, this.tz);
    // The reconstruction is linear in x and y from the cell centre; off both centre lines near a
    // warm or cold corner it can pass the range of the solution, so it is limited to that range
    // (cells and zones on the faces), which keeps the maximum principle at every point.
    return Number.isNaN(v) ? v : Math.min(Math.max(v, this.lo), this.hi);
  }

  /** at() for another set of temperatures, without the range limit (linear in the set). */
  private atOf(x: number, y: number, xv: Float64Array, tzv: ArrayLike<number>): number {
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
      const tp = xv[this.sys.unknownOf[c]];
      const hx = (xs[i + 1] - xs[i]) / 2, hy = (ys[j + 1] - ys[j]) / 2;
      const fx = (x - xc[i]) / hx, fy = (y - yc[j]) / hy;
      const tx = fx >= 0 ? this.faceOf(c, 1, xv, tzv) : this.faceOf(c, 0, xv, tzv);
      const ty = fy >= 0 ? this.faceOf(c, 3, xv, tzv) : this.faceOf(c, 2, xv, tzv);
      sum += tp + Math.abs(fx) * (tx - tp) + Math.abs(fy) * (ty - tp);
      count++;
    }
    return sum / count;
  }

  /** Lowest and highest temperature of this solution (cells and zones on its faces). */
  range(): [number, number] {
    return [this.lo, this.hi];
  }

  /**
   * Temperature at grid node (i0, j0), for each set, where a surface ends at a corner or meets another
   * part. The cell-centred solution has no value there, and next to a corner the field changes over
   * less than a cell (a conductive part touching the surface at a point, a surface that turns, a
   * surface condition that changes), so reading the centre of the first face makes the answer move
   * with the cell size. Instead: the NODE_PATCH_CELLS coarse cells on each side of the node are split
   * `split` (NODE_PATCH_SPLIT unless given) times in each direction (same materials, zones and surface resistances: every
   * part edge is a grid line), the patch is solved with the coarse solution's face-level
   * temperatures on its cut edges (fixed values: the point reconstruction, at()), and the node value is
   * the planar extrapolation, from the centre and the two faces meeting at the node, of the adjacent
   * sub-cell of highest conductivity (the segment's own cell, `prefer`, on a tie). Linear in the set
   * (weights from unit solutions add up); exact for a 1-D field. NaN when the patch has no fixed value.
   */
  nodeTemperatures(i0: number, j0: number, prefer: number, sets: readonly TemperatureSet[], split = NODE_PATCH_SPLIT): number[] {
    const { mesh, unknownOf, faces } = this.sys;
    const { nx, ny, xs, ys, owner } = mesh;
    const P = NODE_PATCH_CELLS, K = split;
    const ia = Math.max(0, i0 - P), ib = Math.min(nx, i0 + P), ja = Math.max(0, j0 - P), jb = Math.min(ny, j0 + P);
    const mx = (ib - ia) * K, my = (jb - ja) * K;
    const sx = new Float64Array(mx + 1), sy = new Float64Array(my + 1);
    for (let i = ia; i < ib; i++) for (let q = 0; q < K; q++) sx[(i - ia) * K + q] = xs[i] + ((xs[i + 1] - xs[i]) * q) / K;
    sx[mx] = xs[ib];
    for (let j = ja; j < jb; j++) for (let q = 0; q < K; q++) sy[(j - ja) * K + q] = ys[j] + ((ys[j + 1] - ys[j]) * q) / K;
    sy[my] = ys[jb];
    const coarse = (p: number, r: number) => (ja + ((r / K) | 0)) * nx + ia + ((p / K) | 0);
    const idx = new Int32Array(mx * my).fill(-1);
    let n = 0;
    for (let r = 0; r < my; r++) for (let p = 0; p < mx; p++) if (unknownOf[coarse(p, r)] >= 0) idx[r * mx + p] = n++;
    const nan = () => sets.map(() => NaN);
    if (n === 0) return nan();
    const bw = mx; // vertical neighbours are at most one sub-row apart in the unknown order
    const w = bw + 1;
    const band = new Float64Array(n * w);
    // Fixed-value terms: sub-unknown, conductance, zone (>= 0) or a point on a cut edge (zone -1).
    const bcU: number[] = [], bcG: number[] = [], bcZ: number[] = [], bcX: number[] = [], bcY: number[] = [];
    const lam = (c: number) => this.lambda[owner[c]];
    for (let r = 0; r < my; r++)
      for (let p = 0; p < mx; p++) {
        const m = idx[r * mx + p];
        if (m < 0) continue;
        const c = coarse(p, r), l = lam(c);
        const hx = sx[p + 1] - sx[p], hy = sy[r + 1] - sy[r];
        for (let s = 0; s < 4; s++) {
          const pp = s === 0 ? p - 1 : s === 1 ? p + 1 : p, rr = s === 2 ? r - 1 : s === 3 ? r + 1 : r;
          const len = s < 2 ? hy : hx, half = (s < 2 ? hx : hy) / (2 * l);
          if (pp >= 0 && rr >= 0 && pp < mx && rr < my) {
            const q = idx[rr * mx + pp];
            if (q >= 0) {
              const cq = coarse(pp, rr);
              const g = len / (half + (s < 2 ? sx[pp + 1] - sx[pp] : sy[rr + 1] - sy[rr]) / (2 * lam(cq)));
              band[m * w] += g;
              if (q > m) band[m * w + (q - m)] -= g;
              continue;
            }
          }
          // Across a coarse face: a zone (surface resistance of that face), a cut edge of the patch, or adiabatic.
          // (An unknown neighbour was handled above, so the neighbour is in another coarse cell.)
          const inside = pp >= 0 && rr >= 0 && pp < mx && rr < my;
          const k = this.faceAt[c * 4 + s];
          if (k >= 0) {
            const g = len / (this.rs[k] + half);
            band[m * w] += g;
            bcU.push(m); bcG.push(g); bcZ.push(faces.zone[k]); bcX.push(0); bcY.push(0);
            continue;
          }
          if (inside) continue; // void
          const i = c % nx, j = (c - i) / nx;
          const ii = s === 0 ? i - 1 : s === 1 ? i + 1 : i, jj = s === 2 ? j - 1 : s === 3 ? j + 1 : j;
          if (ii < 0 || jj < 0 || ii >= nx || jj >= ny || unknownOf[jj * nx + ii] < 0) continue;
          const g = len / half;
          band[m * w] += g;
          bcU.push(m); bcG.push(g); bcZ.push(-1);
          bcX.push(s === 0 ? sx[p] : s === 1 ? sx[p + 1] : 0.5 * (sx[p] + sx[p + 1]));
          bcY.push(s === 2 ? sy[r] : s === 3 ? sy[r + 1] : 0.5 * (sy[r] + sy[r + 1]));
        }
      }
    if (!bcU.length || !choleskyBand(band, n, bw)) return nan();
    // The sub-cell at the node: highest conductivity, the segment's own cell on a tie.
    const pn = (i0 - ia) * K, rn = (j0 - ja) * K;
    let best = -1, bestL = -Infinity, bestP = 0, bestR = 0;
    for (const [p, r] of [[pn - 1, rn - 1], [pn, rn - 1], [pn, rn], [pn - 1, rn]]) {
      if (p < 0 || r < 0 || p >= mx || r >= my || idx[r * mx + p] < 0) continue;
      const c = coarse(p, r), l = lam(c);
      if (l > bestL || (l === bestL && c === prefer)) { best = idx[r * mx + p]; bestL = l; bestP = p; bestR = r; }
    }
    if (best < 0) return nan();
    const b = new Float64Array(n);
    return sets.map((set) => {
      b.fill(0);
      for (let t = 0; t < bcU.length; t++) b[bcU[t]] += bcG[t] * (bcZ[t] >= 0 ? set.tz[bcZ[t]] : this.atOf(bcX[t], bcY[t], set.x, set.tz));
      solveBand(band, n, bw, b);
      const sideX = bestP < pn ? 1 : 0, sideY = bestR < rn ? 3 : 2;
      const subFace = (s: number): number => {
        const p = bestP, r = bestR, tp = b[best];
        const c = coarse(p, r), l = lam(c);
        const pp = s === 0 ? p - 1 : s === 1 ? p + 1 : p, rr = s === 2 ? r - 1 : s === 3 ? r + 1 : r;
        const hp = (s < 2 ? sx[p + 1] - sx[p] : sy[r + 1] - sy[r]) / 2;
        if (pp >= 0 && rr >= 0 && pp < mx && rr < my) {
          const q = idx[rr * mx + pp];
          if (q >= 0) {
            const hq = (s < 2 ? sx[pp + 1] - sx[pp] : sy[rr + 1] - sy[rr]) / 2;
            const kp = l / hp, kq = lam(coarse(pp, rr)) / hq;
            return (kp * tp + kq * b[q]) / (kp + kq);
          }
          if (owner[coarse(pp, rr)] > -2) return tp; // void
        }
        const k = this.faceAt[c * 4 + s];
        if (k < 0) return tp;
        const tzk = set.tz[faces.zone[k]], rs = this.rs[k];
        return tzk + ((tp - tzk) * rs) / (rs + hp / l);
      };
      return subFace(sideX) + subFace(sideY) - b[best];
    });
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
