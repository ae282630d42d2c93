/**
 * Zebra line Gauss-Seidel: every other grid line (x-lines are rows, y-lines are columns) solved
 * exactly as a tridiagonal system with its neighbouring lines held, then the other half. Robust to
 * the strong anisotropy of graded rectilinear meshes, where a thin cell's couplings along one
 * direction are hundreds of times those across it. The tridiagonal pivots of every line are
 * factored once at setup (one array per direction); the sweeps allocate nothing.
 */
import type { GridLevel } from './grid';

export interface LinePivots {
  /** Inverse pivots of the x-line (row) and y-line (column) factorisations. */
  x: Float64Array;
  y: Float64Array;
}

export function linePivots(lv: GridLevel): LinePivots {
  const { nx, ny, stride: st, c, w, s } = lv;
  const px = new Float64Array(c.length), py = new Float64Array(c.length);
  for (let j = 1; j <= ny; j++)
    for (let k = j * st + 1, e = k + nx; k < e; k++) {
      px[k] = 1 / (c[k] - w[k] * w[k] * px[k - 1]);
      py[k] = 1 / (c[k] - s[k] * s[k] * py[k - st]);
    }
  return { x: px, y: py };
}

/** Solve the x-lines (rows) j = parity, parity + 2, ... (j from 0). */
export function xLines(lv: GridLevel, piv: Float64Array, parity: number): void {
  const { nx, ny, stride: st, w: W, s: S, sw: SW, se: SE, x, b } = lv;
  for (let j = parity; j < ny; j += 2) {
    const k0 = (j + 1) * st + 1, k1 = k0 + nx;
    if (SW && SE) {
      for (let k = k0; k < k1; k++) {
        const r = b[k] - S[k] * x[k - st] - S[k + st] * x[k + st]
          - SW[k] * x[k - st - 1] - SE[k] * x[k - st + 1] - SE[k + st - 1] * x[k + st - 1] - SW[k + st + 1] * x[k + st + 1];
        x[k] = r - W[k] * piv[k - 1] * x[k - 1];
      }
    } else {
      for (let k = k0; k < k1; k++) x[k] = b[k] - S[k] * x[k - st] - S[k + st] * x[k + st] - W[k] * piv[k - 1] * x[k - 1];
    }
    // x[k0 - 1] is a ghost (0), so the first row of the elimination needs no special case.
    x[k1 - 1] *= piv[k1 - 1];
    for (let k = k1 - 2; k >= k0; k--) x[k] = (x[k] - W[k + 1] * x[k + 1]) * piv[k];
  }
}

/** Solve the y-lines (columns) i = parity, parity + 2, ... (i from 0), all of them together row by row. */
export function yLines(lv: GridLevel, piv: Float64Array, parity: number): void {
  const { nx, ny, stride: st, w: W, s: S, sw: SW, se: SE, x, b } = lv;
  for (let j = 1; j <= ny; j++) {
    const row = j * st + 1;
    if (SW && SE) {
      for (let i = parity; i < nx; i += 2) {
        const k = row + i;
        const r = b[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1]
          - SW[k] * x[k - st - 1] - SE[k] * x[k - st + 1] - SE[k + st - 1] * x[k + st - 1] - SW[k + st + 1] * x[k + st + 1];
        x[k] = r - S[k] * piv[k - st] * x[k - st];
      }
    } else {
      for (let i = parity; i < nx; i += 2) {
        const k = row + i;
        x[k] = b[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * piv[k - st] * x[k - st];
      }
    }
  }
  // The ghost row below is 0, so the elimination above needed no special case; now back-substitute.
  for (let i = parity, k = ny * st + 1 + parity; i < nx; i += 2, k += 2) x[k] *= piv[k];
  for (let j = ny - 1; j >= 1; j--) {
    const row = j * st + 1;
    for (let i = parity; i < nx; i += 2) {
      const k = row + i;
      x[k] = (x[k] - S[k + st] * x[k + st]) * piv[k];
    }
  }
}

/** Pre-smoothing: x-lines even then odd, y-lines even then odd. */
export function lineSmoothPre(lv: GridLevel, p: LinePivots): void {
  xLines(lv, p.x, 0); xLines(lv, p.x, 1);
  yLines(lv, p.y, 0); yLines(lv, p.y, 1);
}

/** Post-smoothing: the adjoint of the pre-smoother (the same half-sweeps in reverse order). */
export function lineSmoothPost(lv: GridLevel, p: LinePivots): void {
  yLines(lv, p.y, 1); yLines(lv, p.y, 0);
  xLines(lv, p.x, 1); xLines(lv, p.x, 0);
}
