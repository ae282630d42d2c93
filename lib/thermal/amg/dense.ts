/** Dense Cholesky for the coarsest level. */
import type { Csr } from '../csr';

export interface DenseCholesky {
  n: number;
  l: Float64Array;
}

export function denseCholesky(a: Csr): DenseCholesky {
  const n = a.n;
  const l = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let k = a.rowPtr[i]; k < a.rowPtr[i + 1]; k++) l[i * n + a.col[k]] += a.val[k];
  let scale = 0;
  for (let i = 0; i < n; i++) scale = Math.max(scale, l[i * n + i]);
  for (let j = 0; j < n; j++) {
    let d = l[j * n + j];
    for (let k = 0; k < j; k++) d -= l[j * n + k] * l[j * n + k];
    // A pivot lost to round-off (a nearly singular coarse block) is regularised, not trusted.
    d = d > 1e-14 * scale ? Math.sqrt(d) : Math.sqrt(1e-14 * scale + 1e-300);
    l[j * n + j] = d;
    for (let i = j + 1; i < n; i++) {
      let s = l[i * n + j];
      for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
      l[i * n + j] = s / d;
    }
  }
  return { n, l };
}

/** Solve L L^T x = b in place of x (x may alias b). */
export function denseSolve(c: DenseCholesky, b: Float64Array, x: Float64Array): void {
  const { n, l } = c;
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= l[i * n + k] * x[k];
    x[i] = s / l[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < n; k++) s -= l[k * n + i] * x[k];
    x[i] = s / l[i * n + i];
  }
}
