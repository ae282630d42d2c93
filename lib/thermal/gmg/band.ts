/**
 * The coarsest grid level factored with banded Cholesky (../band.ts). The level's points are
 * numbered along its short side fastest, so a 9-point stencil couples each point only to points
 * within (short side + 1) of it, and the factor costs n * bandwidth^2 (a 21 x 21 level, the largest the hierarchy keeps by default: about 2 x 10^5
 * multiply-adds) instead of n^3 / 3.
 */
import { choleskyBand, solveBand } from '../band';
import type { GridLevel } from './grid';

export interface BandCholesky {
  n: number;
  /** Bandwidth of the factor. */
  bw: number;
  /** The factor, by rows (../band.ts). */
  l: Float64Array;
  /** Padded grid index of factor row q. */
  index: Int32Array;
  work: Float64Array;
}

export function bandCost(lv: GridLevel): number {
  const short = Math.min(lv.nx, lv.ny);
  return lv.nx * lv.ny * (short + 1) * (short + 1);
}

export function bandCholesky(lv: GridLevel): BandCholesky {
  const { nx, ny, stride: st, c, w, s } = lv;
  const sw = lv.sw, se = lv.se;
  const n = nx * ny;
  const byColumns = ny < nx; // number the short side fastest
  const bw = (byColumns ? ny : nx) + 1;
  const index = new Int32Array(n);
  const pos = new Int32Array(c.length).fill(-1);
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) {
      const q = byColumns ? i * ny + j : j * nx + i;
      const k = (j + 1) * st + i + 1;
      index[q] = k;
      pos[k] = q;
    }
  const W = bw + 1;
  const l = new Float64Array(n * W);
  // Each stored lower coupling A(k, kk) goes to row min(q, qq) of the upper band.
  const put = (k: number, kk: number, v: number) => {
    const q = pos[k], qq = pos[kk];
    if (q < 0 || qq < 0 || v === 0) return;
    l[Math.min(q, qq) * W + Math.abs(q - qq)] = v;
  };
  let scale = 0;
  for (let q = 0; q < n; q++) {
    const k = index[q];
    l[q * W] = c[k];
    scale = Math.max(scale, c[k]);
    put(k, k - 1, w[k]);
    put(k, k - st, s[k]);
    if (sw && se) { put(k, k - st - 1, sw[k]); put(k, k - st + 1, se[k]); }
  }
  // A pivot lost to round-off (a nearly singular coarse block) is regularised, not trusted.
  choleskyBand(l, n, bw, 1e-14 * scale, true);
  return { n, bw, l, index, work: new Float64Array(n) };
}

/** x = A^-1 b on the level's padded arrays (only the level's points are read and written). */
export function bandSolve(f: BandCholesky, b: Float64Array, x: Float64Array): void {
  const { n, bw, l, index, work } = f;
  for (let q = 0; q < n; q++) work[q] = b[index[q]];
  solveBand(l, n, bw, work);
  for (let q = 0; q < n; q++) x[index[q]] = work[q];
}
