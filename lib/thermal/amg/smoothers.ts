/** Relaxation on CSR: Gauss-Seidel sweeps forward and backward (together a symmetric smoother), and Jacobi. */
import type { Csr } from '../csr';

export function gaussSeidelForward(a: Csr, invDiag: Float64Array, x: Float64Array, b: Float64Array): void {
  const { n, rowPtr, col, val } = a;
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) {
      const j = col[k];
      if (j !== i) s -= val[k] * x[j];
    }
    x[i] = s * invDiag[i];
  }
}

export function gaussSeidelBackward(a: Csr, invDiag: Float64Array, x: Float64Array, b: Float64Array): void {
  const { rowPtr, col, val } = a;
  for (let i = a.n - 1; i >= 0; i--) {
    let s = b[i];
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) {
      const j = col[k];
      if (j !== i) s -= val[k] * x[j];
    }
    x[i] = s * invDiag[i];
  }
}

/** z = D^-1 r */
export function jacobiApply(invDiag: Float64Array, r: Float64Array, z: Float64Array): void {
  for (let i = 0; i < r.length; i++) z[i] = invDiag[i] * r[i];
}
