/**
 * Grid levels for geometric multigrid on the rectilinear mesh. Every level is a structured grid of
 * nx by ny points stored with one ghost layer all round (stride nx + 2), so stencil loops need no
 * bounds tests: ghost values are zero and every coefficient toward a ghost is zero.
 *
 * The operator is symmetric, so each point keeps only its own diagonal and the couplings toward
 * its lower neighbours (matrix entries, negative or zero): w = A(k, k-1), s = A(k, k-stride),
 * sw = A(k, k-stride-1), se = A(k, k-stride+1). The upper ones are read from the neighbour:
 * e(k) = w[k+1], n(k) = s[k+stride], ne(k) = sw[k+stride+1], nw(k) = se[k+stride-1].
 * The finest level is a 5-point stencil (sw and se are null); Galerkin coarse levels are 9-point.
 * Points that are not unknowns (zone and void cells) are decoupled rows with diagonal 1.
 */
import type { Csr } from '../csr';

export interface GridLevel {
  nx: number;
  ny: number;
  stride: number;
  c: Float64Array;
  /** Inverse diagonal, for the point smoother only (see inverseDiagonal). */
  id: Float64Array | null;
  w: Float64Array;
  s: Float64Array;
  sw: Float64Array | null;
  se: Float64Array | null;
  /** Work vectors (solution and right-hand side of this level's cycle). */
  x: Float64Array;
  b: Float64Array;
}

/** Padded index of interior point (i, j), both from 0. */
export function gridIndex(stride: number, i: number, j: number): number {
  return (j + 1) * stride + i + 1;
}

export function emptyLevel(nx: number, ny: number, ninePoint: boolean): GridLevel {
  const stride = nx + 2;
  const len = stride * (ny + 2);
  return {
    nx, ny, stride,
    c: new Float64Array(len), id: null, w: new Float64Array(len), s: new Float64Array(len),
    sw: ninePoint ? new Float64Array(len) : null, se: ninePoint ? new Float64Array(len) : null,
    x: new Float64Array(len), b: new Float64Array(len),
  };
}

/** Decoupled or empty rows get diagonal 1. */
export function finishDiagonal(lv: GridLevel): void {
  const { nx, ny, stride, c } = lv;
  for (let j = 1; j <= ny; j++)
    for (let k = j * stride + 1, e = k + nx; k < e; k++) if (!(c[k] > 0)) c[k] = 1;
}

/** The inverse diagonal (the point smoother's); computed once per level. */
export function inverseDiagonal(lv: GridLevel): Float64Array {
  if (lv.id) return lv.id;
  const { nx, ny, stride, c } = lv;
  const id = new Float64Array(c.length);
  for (let j = 1; j <= ny; j++)
    for (let k = j * stride + 1, e = k + nx; k < e; k++) id[k] = 1 / c[k];
  lv.id = id;
  return id;
}

/**
 * The finest level from a 5-point operator whose unknown u sits at mesh cell cellOf[u]
 * (row-major, j nx + i). Returns the level and the padded grid index of every unknown.
 */
export function fineLevelFromCsr(a: Csr, cellOf: Int32Array, nx: number, ny: number): { level: GridLevel; gridOf: Int32Array } {
  const lv = emptyLevel(nx, ny, false);
  const { stride, c, w, s } = lv;
  const gridOf = new Int32Array(a.n);
  for (let u = 0; u < a.n; u++) {
    const cell = cellOf[u];
    const i = cell % nx;
    gridOf[u] = gridIndex(stride, i, (cell - i) / nx);
  }
  for (let u = 0; u < a.n; u++) {
    const k = gridOf[u];
    for (let p = a.rowPtr[u], e = a.rowPtr[u + 1]; p < e; p++) {
      const d = gridOf[a.col[p]] - k;
      const v = a.val[p];
      if (d === 0) c[k] += v;
      else if (d === -1) w[k] = v;
      else if (d === -stride) s[k] = v;
      else if (d !== 1 && d !== stride) throw new Error('fineLevelFromCsr: the operator is not a 5-point stencil on the mesh');
    }
  }
  finishDiagonal(lv);
  return { level: lv, gridOf };
}

/** Number of stored stencil entries of a level counted as a full matrix (for operator complexity). */
export function levelNonzeros(lv: GridLevel): number {
  const { nx, ny, stride, w, s, sw, se } = lv;
  let nz = 0;
  for (let j = 1; j <= ny; j++)
    for (let k = j * stride + 1, e = k + nx; k < e; k++) {
      nz += 1 + (w[k] !== 0 ? 2 : 0) + (s[k] !== 0 ? 2 : 0);
      if (sw && se) nz += (sw[k] !== 0 ? 2 : 0) + (se[k] !== 0 ? 2 : 0);
    }
  return nz;
}

export function levelBytes(lv: GridLevel): number {
  let b = lv.c.byteLength + (lv.id ? lv.id.byteLength : 0) + lv.w.byteLength + lv.s.byteLength + lv.x.byteLength + lv.b.byteLength;
  if (lv.sw) b += lv.sw.byteLength;
  if (lv.se) b += lv.se.byteLength;
  return b;
}
