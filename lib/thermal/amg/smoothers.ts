/**
 * Relaxation on CSR: Gauss-Seidel sweeps forward and backward (together a symmetric smoother), and Jacobi.
 * Each update is x_i += (b_i - (A x)_i) / a_ii over the whole row, which equals the classical
 * Gauss-Seidel step and needs no test for the diagonal inside the inner loop.
 */
import type { Csr } from '../csr';

export function gaussSeidelForward(a: Csr, invDiag: Float64Array, x: Float64Array, b: Float64Array): void {
  const { n, rowPtr, col, val } = a;
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) s -= val[k] * x[col[k]];
    x[i] += s * invDiag[i];
  }
}

export function gaussSeidelBackward(a: Csr, invDiag: Float64Array, x: Float64Array, b: Float64Array): void {
  const { rowPtr, col, val } = a;
  for (let i = a.n - 1; i >= 0; i--) {
    let s = b[i];
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) s -= val[k] * x[col[k]];
    x[i] += s * invDiag[i];
  }
}

/** bc = P^T (b - A x), without storing the residual. */
export function restrictResidual(a: Csr, p: Csr, x: Float64Array, b: Float64Array, bc: Float64Array): void {
  bc.fill(0);
  const { n, rowPtr, col, val } = a;
  const pp = p.rowPtr, pc = p.col, pv = p.val;
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) s -= val[k] * x[col[k]];
    if (s === 0) continue;
    for (let k = pp[i], e = pp[i + 1]; k < e; k++) bc[pc[k]] += pv[k] * s;
  }
}

/** z = D^-1 r */
export function jacobiApply(invDiag: Float64Array, r: Float64Array, z: Float64Array): void {
  for (let i = 0; i < r.length; i++) z[i] = invDiag[i] * r[i];
}
