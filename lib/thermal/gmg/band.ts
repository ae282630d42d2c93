/**
 * Banded Cholesky for the coarsest grid level. The level's points are numbered along its longer
 * side first, so a 9-point stencil couples each point only to points within (short side + 1) of it,
 * and the factor costs n * bandwidth^2 (a 32 x 32 level: about 10^6 multiply-adds) instead of n^3 / 3.
 */
import type { GridLevel } from './grid';

export interface BandCholesky {
  n: number;
  /** Bandwidth: L(q, q - d) is stored for d = 0 .. bw. */
  bw: number;
  /** Row q holds L(q, q - d) at q * (bw + 1) + d. */
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
  const fast = byColumns ? ny : nx;
  const bw = fast + 1;
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
  // Lower triangle of A into the band: entry (q, q - d).
  const put = (k: number, kk: number, v: number) => {
    const q = pos[k], qq = pos[kk];
    if (q < 0 || qq < 0 || v === 0) return;
    const hi = Math.max(q, qq), d = Math.abs(q - qq);
    l[hi * W + d] = v;
  };
  for (let q = 0; q < n; q++) {
    const k = index[q];
    l[q * W] = c[k];
    put(k, k - 1, w[k]);
    put(k, k - st, s[k]);
    if (sw && se) { put(k, k - st - 1, sw[k]); put(k, k - st + 1, se[k]); }
  }
  let scale = 0;
  for (let q = 0; q < n; q++) scale = Math.max(scale, l[q * W]);
  for (let q = 0; q < n; q++) {
    const rq = q * W;
    for (let d = Math.min(bw, q); d >= 1; d--) {
      const p = q - d, rp = p * W;
      let v = l[rq + d];
      // sum over m of L(q, q - m) L(p, q - m) for q - m < p, i.e. m > d, and (q - m) >= p - bw.
      for (let m = d + 1, e = Math.min(bw, q, d + bw); m <= e; m++) v -= l[rq + m] * l[rp + (m - d)];
      l[rq + d] = v / l[rp];
    }
    let dd = l[rq];
    for (let m = 1, e = Math.min(bw, q); m <= e; m++) dd -= l[rq + m] * l[rq + m];
    // A pivot lost to round-off is regularised, not trusted.
    l[rq] = dd > 1e-14 * scale ? Math.sqrt(dd) : Math.sqrt(1e-14 * scale + 1e-300);
  }
  return { n, bw, l, index, work: new Float64Array(n) };
}

/** x = A^-1 b on the level's padded arrays (only the level's points are read and written). */
export function bandSolve(f: BandCholesky, b: Float64Array, x: Float64Array): void {
  const { n, bw, l, index, work: y } = f;
  const W = bw + 1;
  for (let q = 0; q < n; q++) {
    const rq = q * W;
    let v = b[index[q]];
    for (let m = 1, e = Math.min(bw, q); m <= e; m++) v -= l[rq + m] * y[q - m];
    y[q] = v / l[rq];
  }
  for (let q = n - 1; q >= 0; q--) {
    const v = y[q] / l[q * W];
    y[q] = v;
    // Subtract L(q, p) v from every p above q in the band.
    const rq = q * W;
    for (let m = 1, e = Math.min(bw, q); m <= e; m++) y[q - m] -= l[rq + m] * v;
  }
  for (let q = 0; q < n; q++) x[index[q]] = y[q];
}
