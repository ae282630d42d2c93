/**
 * Operator-dependent interpolation (Dendy's black-box multigrid, 1982) from a coarse grid of every
 * other point to the fine grid. A fine point between two coarse points on a grid line takes the
 * weights of its own row collapsed across that line (so flux, not temperature, is continuous across
 * a conductivity jump); a point between four coarse points solves its own row with its eight
 * neighbours interpolated. Weights are stored per coarse point (the lower-left one of the cell of
 * coarse points that holds the fine point), so the prolongator is eight arrays on the coarse grid.
 */
import type { GridLevel } from './grid';

export interface Prolongator {
  /** Coarse grid size and stride. */
  nx: number;
  ny: number;
  stride: number;
  /** Fine point (2I+1, 2J): weights of coarse (I, J) and (I+1, J). */
  hl: Float64Array;
  hr: Float64Array;
  /** Fine point (2I, 2J+1): weights of coarse (I, J) and (I, J+1). */
  vb: Float64Array;
  vt: Float64Array;
  /** Fine point (2I+1, 2J+1): weights of coarse (I, J), (I+1, J), (I, J+1), (I+1, J+1). */
  q00: Float64Array;
  q10: Float64Array;
  q01: Float64Array;
  q11: Float64Array;
}

export function coarseSize(n: number): number {
  return (n + 1) >> 1;
}

export function prolongatorBytes(p: Prolongator): number {
  return 8 * p.hl.byteLength;
}

/** Weights of the prolongator onto fine level `f` from the grid of its even points. */
export function operatorInterpolation(f: GridLevel): Prolongator {
  const nxc = coarseSize(f.nx), nyc = coarseSize(f.ny);
  const cs = nxc + 2;
  const len = cs * (nyc + 2);
  const p: Prolongator = {
    nx: nxc, ny: nyc, stride: cs,
    hl: new Float64Array(len), hr: new Float64Array(len), vb: new Float64Array(len), vt: new Float64Array(len),
    q00: new Float64Array(len), q10: new Float64Array(len), q01: new Float64Array(len), q11: new Float64Array(len),
  };
  const { nx, ny, stride: st, c, w: W, s: S } = f;
  const SW = f.sw, SE = f.se;
  const { hl, hr, vb, vt, q00, q10, q01, q11 } = p;
  // Edge points first (the centre points use them).
  for (let j = 0; j < ny; j++) {
    const row = (j + 1) * st + 1;
    const cb = ((j >> 1) + 1) * cs + 1;
    for (let i = (j & 1) ? 0 : 1; i < nx; i += 2) {
      const k = row + i;
      const K = cb + (i >> 1);
      const w = W[k], e = W[k + 1], s = S[k], n = S[k + st];
      const sw = SW ? SW[k] : 0, se = SE ? SE[k] : 0, nw = SE ? SE[k + st - 1] : 0, ne = SW ? SW[k + st + 1] : 0;
      if (j & 1) {
        // (even, odd): between coarse below and above; collapse the row along x.
        const den = c[k] + w + e;
        if (den > 0) { vb[K] = -(s + sw + se) / den; vt[K] = -(n + nw + ne) / den; }
      } else {
        // (odd, even): between coarse left and right; collapse the row along y.
        const den = c[k] + s + n;
        if (den > 0) { hl[K] = -(w + nw + sw) / den; hr[K] = -(e + ne + se) / den; }
      }
    }
  }
  for (let j = 1; j < ny; j += 2) {
    const row = (j + 1) * st + 1;
    const cb = ((j >> 1) + 1) * cs + 1;
    for (let i = 1; i < nx; i += 2) {
      const k = row + i;
      const K = cb + (i >> 1);
      const w = W[k], e = W[k + 1], s = S[k], n = S[k + st];
      const sw = SW ? SW[k] : 0, se = SE ? SE[k] : 0, nw = SE ? SE[k + st - 1] : 0, ne = SW ? SW[k + st + 1] : 0;
      const ic = 1 / c[k];
      q00[K] = -(sw + w * vb[K] + s * hl[K]) * ic;
      q10[K] = -(se + e * vb[K + 1] + s * hr[K]) * ic;
      q01[K] = -(nw + w * vt[K] + n * hl[K + cs]) * ic;
      q11[K] = -(ne + e * vt[K + 1] + n * hr[K + cs]) * ic;
    }
  }
  return p;
}

/**
 * The row of the prolongator at fine point (i, j): coarse padded indices into `ks`, weights into
 * `ws`; returns how many (zero weights left out).
 */
export function prolongatorRow(p: Prolongator, i: number, j: number, ks: Int32Array, ws: Float64Array): number {
  const cs = p.stride;
  const K = ((j >> 1) + 1) * cs + 1 + (i >> 1);
  const oi = i & 1, oj = j & 1;
  if (!oi && !oj) { ks[0] = K; ws[0] = 1; return 1; }
  let m = 0;
  if (!oj) {
    const a = p.hl[K], b = p.hr[K];
    if (a !== 0) { ks[m] = K; ws[m++] = a; }
    if (b !== 0) { ks[m] = K + 1; ws[m++] = b; }
  } else if (!oi) {
    const a = p.vb[K], b = p.vt[K];
    if (a !== 0) { ks[m] = K; ws[m++] = a; }
    if (b !== 0) { ks[m] = K + cs; ws[m++] = b; }
  } else {
    const a = p.q00[K], b = p.q10[K], c = p.q01[K], d = p.q11[K];
    if (a !== 0) { ks[m] = K; ws[m++] = a; }
    if (b !== 0) { ks[m] = K + 1; ws[m++] = b; }
    if (c !== 0) { ks[m] = K + cs; ws[m++] = c; }
    if (d !== 0) { ks[m] = K + cs + 1; ws[m++] = d; }
  }
  return m;
}
