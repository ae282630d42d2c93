/** Strength of connection (symmetric measure, as in smoothed aggregation): j is strong for i when |a_ij| >= theta sqrt(a_ii a_jj). */
import type { Csr } from '../csr';

/** Strong off-diagonal pattern of A (values are a_ij), diagonal excluded. */
export function symmetricStrength(a: Csr, theta: number, diag: Float64Array): Csr {
  const { n, rowPtr, col, val } = a;
  const t2 = theta * theta;
  const sp = new Int32Array(n + 1);
  let nnz = 0;
  for (let i = 0; i < n; i++) {
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
      const j = col[k];
      if (j !== i && val[k] * val[k] >= t2 * Math.abs(diag[i] * diag[j])) nnz++;
    }
    sp[i + 1] = nnz;
  }
  const sc = new Int32Array(nnz);
  const sv = new Float64Array(nnz);
  let p = 0;
  for (let i = 0; i < n; i++)
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
      const j = col[k];
      if (j !== i && val[k] * val[k] >= t2 * Math.abs(diag[i] * diag[j])) {
        sc[p] = j;
        sv[p++] = val[k];
      }
    }
  return { n, m: n, rowPtr: sp, col: sc, val: sv };
}
