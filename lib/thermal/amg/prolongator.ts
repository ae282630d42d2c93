/**
 * Smoothed-aggregation prolongator: P = (I - omega D_F^-1 A_F) T, with T the piecewise-constant
 * tentative prolongator of the aggregates and A_F the filtered operator (weak connections lumped
 * into the diagonal, so rows keep their sums). omega = 4 / (3 rho(D_F^-1 A_F)).
 */
import type { Csr } from '../csr';
import type { Aggregation } from './aggregate';

/** Largest eigenvalue of D^-1 A (A symmetric, D its diagonal) by a few power iterations. */
export function spectralRadiusDinvA(a: Csr, d: Float64Array, iterations = 12): number {
  const n = a.n;
  let x = new Float64Array(n), y = new Float64Array(n);
  let seed = 12345;
  for (let i = 0; i < n; i++) {
    seed = (seed * 1103515245 + 12345) & 0x7fffffff;
    x[i] = seed / 0x7fffffff + 0.5;
  }
  let rho = 1;
  for (let it = 0; it < iterations; it++) {
    let norm = 0;
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let k = a.rowPtr[i]; k < a.rowPtr[i + 1]; k++) s += a.val[k] * x[a.col[k]];
      y[i] = s / d[i];
      norm += y[i] * y[i];
    }
    norm = Math.sqrt(norm);
    if (!(norm > 0)) break;
    let xn = 0;
    for (let i = 0; i < n; i++) xn += x[i] * x[i];
    rho = norm / Math.sqrt(xn);
    for (let i = 0; i < n; i++) y[i] /= norm;
    const t = x; x = y; y = t;
  }
  return rho;
}

export function smoothedProlongator(a: Csr, diag: Float64Array, strong: Csr, ag: Aggregation): Csr {
  const n = a.n;
  // Filtered operator: strong off-diagonals and the diagonal with weak ones lumped in.
  const fp = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) fp[i + 1] = fp[i] + (strong.rowPtr[i + 1] - strong.rowPtr[i]) + 1;
  const fc = new Int32Array(fp[n]);
  const fv = new Float64Array(fp[n]);
  const fd = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let weak = 0;
    for (let k = a.rowPtr[i]; k < a.rowPtr[i + 1]; k++) if (a.col[k] !== i) weak += a.val[k];
    let p = fp[i];
    for (let k = strong.rowPtr[i]; k < strong.rowPtr[i + 1]; k++) {
      fc[p] = strong.col[k];
      fv[p++] = strong.val[k];
      weak -= strong.val[k];
    }
    fd[i] = diag[i] + weak;
    if (!(fd[i] > 0)) fd[i] = diag[i];
    fc[p] = i;
    fv[p] = fd[i];
  }
  const af: Csr = { n, m: n, rowPtr: fp, col: fc, val: fv };
  const omega = 4 / 3 / spectralRadiusDinvA(af, fd);
  const agg = ag.agg;
  const marker = new Int32Array(ag.count).fill(-1);
  const rowPtr = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) {
    let c = 0;
    for (let k = fp[i]; k < fp[i + 1]; k++) {
      const g = agg[fc[k]];
      if (g >= 0 && marker[g] !== i) { marker[g] = i; c++; }
    }
    if (agg[i] >= 0 && marker[agg[i]] !== i) { marker[agg[i]] = i; c++; }
    rowPtr[i + 1] = rowPtr[i] + c;
  }
  const col = new Int32Array(rowPtr[n]);
  const val = new Float64Array(rowPtr[n]);
  marker.fill(-1);
  for (let i = 0; i < n; i++) {
    const start = rowPtr[i];
    let c = start;
    const s = omega / fd[i];
    for (let k = fp[i] - 1; k < fp[i + 1]; k++) {
      // k = fp[i] - 1 stands for the identity term of T.
      const g = k < fp[i] ? agg[i] : agg[fc[k]];
      if (g < 0) continue;
      const v = k < fp[i] ? 1 : -s * fv[k];
      const p = marker[g];
      if (p < start) { marker[g] = c; col[c] = g; val[c] = v; c++; } else val[p] += v;
    }
  }
  return { n, m: ag.count, rowPtr, col, val };
}
