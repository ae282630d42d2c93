/**
 * Kernels of the grid cycle, each one pass over a level: lexicographic Gauss-Seidel forward and
 * backward (the backward sweep is the adjoint of the forward one, so a cycle with one of each is
 * symmetric), the residual restricted by P^T in the same pass, and prolongation. No allocation.
 */
import type { GridLevel } from './grid';
import { inverseDiagonal } from './grid';
import type { Prolongator } from './interpolation';

/**
 * Forward Gauss-Seidel from x = 0: the neighbours ahead in the sweep are still zero, so only those
 * behind enter. Writes every point before reading it, so x need not be cleared first.
 */
export function gaussSeidelForwardFromZero(lv: GridLevel): void {
  const { nx, ny, stride: st, w: W, s: S, sw: SW, se: SE, x, b } = lv;
  const id = inverseDiagonal(lv);
  if (SW && SE) {
    for (let j = 1; j <= ny; j++)
      for (let k = j * st + 1, e = k + nx; k < e; k++)
        x[k] = (b[k] - W[k] * x[k - 1] - S[k] * x[k - st] - SW[k] * x[k - st - 1] - SE[k] * x[k - st + 1]) * id[k];
  } else {
    for (let j = 1; j <= ny; j++)
      for (let k = j * st + 1, e = k + nx; k < e; k++) x[k] = (b[k] - W[k] * x[k - 1] - S[k] * x[k - st]) * id[k];
  }
}

export function gaussSeidelBackward(lv: GridLevel): void {
  const { nx, ny, stride: st, w: W, s: S, sw: SW, se: SE, x, b } = lv;
  const id = inverseDiagonal(lv);
  if (SW && SE) {
    for (let j = ny; j >= 1; j--)
      for (let k = j * st + nx, e = j * st; k > e; k--)
        x[k] = (b[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * x[k - st] - S[k + st] * x[k + st]
          - SW[k] * x[k - st - 1] - SE[k] * x[k - st + 1] - SE[k + st - 1] * x[k + st - 1] - SW[k + st + 1] * x[k + st + 1]) * id[k];
  } else {
    for (let j = ny; j >= 1; j--)
      for (let k = j * st + nx, e = j * st; k > e; k--)
        x[k] = (b[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * x[k - st] - S[k + st] * x[k + st]) * id[k];
  }
}

/**
 * cb = P^T (b - A x) on level f (cb is overwritten; its ghosts stay zero). With `oddColumnsSolved`
 * the residual is taken as zero on odd columns (i = 1, 3, ...): true after a smoothing sweep whose
 * last step solved exactly those lines, and it halves the work.
 */
export function restrictResidual(f: GridLevel, p: Prolongator, cb: Float64Array, oddColumnsSolved = false): void {
  cb.fill(0);
  const { nx, ny, stride: st, c: C, w: W, s: S, x, b } = f;
  const SW = f.sw ?? W, SE = f.se ?? W;
  const cs = p.stride;
  const { hl, hr, vb, vt, q00, q10, q01, q11 } = p;
  if (f.sw !== null) {
    for (let j = 0; j < ny; j++) {
      const row = (j + 1) * st + 1, cb0 = ((j >> 1) + 1) * cs + 1, odd = j & 1;
      for (let i = 0; i < nx; i += oddColumnsSolved ? 2 : 1) {
        const k = row + i, K = cb0 + (i >> 1);
        const r = b[k] - C[k] * x[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * x[k - st] - S[k + st] * x[k + st]
          - SW[k] * x[k - st - 1] - SE[k] * x[k - st + 1] - SE[k + st - 1] * x[k + st - 1] - SW[k + st + 1] * x[k + st + 1];
        if (!odd) { if (!(i & 1)) cb[K] += r; else { cb[K] += hl[K] * r; cb[K + 1] += hr[K] * r; } }
        else if (!(i & 1)) { cb[K] += vb[K] * r; cb[K + cs] += vt[K] * r; }
        else { cb[K] += q00[K] * r; cb[K + 1] += q10[K] * r; cb[K + cs] += q01[K] * r; cb[K + cs + 1] += q11[K] * r; }
      }
    }
    return;
  }
  for (let j = 0; j < ny; j++) {
    const row = (j + 1) * st + 1, cb0 = ((j >> 1) + 1) * cs + 1;
    if (!(j & 1)) {
      for (let i = 0; i < nx; i += 2) {
        let k = row + i;
        const K = cb0 + (i >> 1);
        cb[K] += b[k] - C[k] * x[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * x[k - st] - S[k + st] * x[k + st];
        if (i + 1 < nx && !oddColumnsSolved) {
          k++;
          const r = b[k] - C[k] * x[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * x[k - st] - S[k + st] * x[k + st];
          cb[K] += hl[K] * r; cb[K + 1] += hr[K] * r;
        }
      }
    } else {
      for (let i = 0; i < nx; i += 2) {
        let k = row + i;
        const K = cb0 + (i >> 1);
        const r0 = b[k] - C[k] * x[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * x[k - st] - S[k + st] * x[k + st];
        cb[K] += vb[K] * r0; cb[K + cs] += vt[K] * r0;
        if (i + 1 < nx && !oddColumnsSolved) {
          k++;
          const r = b[k] - C[k] * x[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * x[k - st] - S[k + st] * x[k + st];
          cb[K] += q00[K] * r; cb[K + 1] += q10[K] * r; cb[K + cs] += q01[K] * r; cb[K + cs + 1] += q11[K] * r;
        }
      }
    }
  }
}

/** x += P xc on level f. */
export function prolongAdd(f: GridLevel, p: Prolongator, xc: Float64Array): void {
  const { nx, ny, stride: st, x } = f;
  const cs = p.stride;
  const { hl, hr, vb, vt, q00, q10, q01, q11 } = p;
  for (let j = 0; j < ny; j++) {
    const row = (j + 1) * st + 1;
    const cb0 = ((j >> 1) + 1) * cs + 1;
    if (!(j & 1)) {
      for (let i = 0; i < nx; i += 2) {
        const K = cb0 + (i >> 1);
        x[row + i] += xc[K];
        if (i + 1 < nx) x[row + i + 1] += hl[K] * xc[K] + hr[K] * xc[K + 1];
      }
    } else {
      for (let i = 0; i < nx; i += 2) {
        const K = cb0 + (i >> 1);
        x[row + i] += vb[K] * xc[K] + vt[K] * xc[K + cs];
        if (i + 1 < nx) x[row + i + 1] += q00[K] * xc[K] + q10[K] * xc[K + 1] + q01[K] * xc[K + cs] + q11[K] * xc[K + cs + 1];
      }
    }
  }
}
