/**
 * Banded Cholesky for symmetric positive definite band matrices stored by rows:
 * a[i (bw + 1) + d] = A[i][i + d] for d = 0 .. bw. Used for the corner patches of the surface
 * reading (field.ts) and the coarsest multigrid level (gmg/band.ts).
 */

/**
 * In-place factor R (A = R^T R). A pivot at or below `minPivot` fails the factor (returns false),
 * unless `regularise` is set, when it is replaced by sqrt(minPivot) (a pivot lost to round-off).
 */
export function choleskyBand(a: Float64Array, n: number, bw: number, minPivot = 0, regularise = false): boolean {
  const w = bw + 1;
  for (let i = 0; i < n; i++) {
    const kmin = Math.max(0, i - bw);
    for (let d = 0; d <= bw && i + d < n; d++) {
      const j = i + d;
      let sum = a[i * w + d];
      for (let k = Math.max(kmin, j - bw); k < i; k++) sum -= a[k * w + (i - k)] * a[k * w + (j - k)];
      if (d === 0) {
        if (!(sum > minPivot)) {
          if (!regularise) return false;
          sum = minPivot + 1e-300;
        }
        a[i * w] = Math.sqrt(sum);
      } else a[i * w + d] = sum / a[i * w];
    }
  }
  return true;
}

/** Solve R^T R x = b in place (b becomes x) with the factor from choleskyBand. */
export function solveBand(a: Float64Array, n: number, bw: number, b: Float64Array): void {
  const w = bw + 1;
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = Math.max(0, i - bw); k < i; k++) s -= a[k * w + (i - k)] * b[k];
    b[i] = s / a[i * w];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i];
    for (let d = 1; d <= bw && i + d < n; d++) s -= a[i * w + d] * b[i + d];
    b[i] = s / a[i * w];
  }
}
