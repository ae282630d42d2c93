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
  if (lv.sw && lv.se) xLines9(lv.nx, lv.ny, lv.stride, lv.w, lv.s, lv.sw, lv.se, lv.x, lv.b, piv, parity);
  else xLines5(lv.nx, lv.ny, lv.stride, lv.w, lv.s, lv.x, lv.b, piv, parity);
}

/** Solve the y-lines (columns) i = parity, parity + 2, ... (i from 0), all of them together row by row. */
export function yLines(lv: GridLevel, piv: Float64Array, parity: number): void {
  if (lv.sw && lv.se) yLines9(lv.nx, lv.ny, lv.stride, lv.w, lv.s, lv.sw, lv.se, lv.x, lv.b, piv, parity);
  else yLines5(lv.nx, lv.ny, lv.stride, lv.w, lv.s, lv.x, lv.b, piv, parity);
}

// One function per stencil, so each stays monomorphic. In every row the first elimination step
// reads a ghost (0) and the couplings toward ghosts are 0, so no boundary needs a special case.

function xLines5(nx: number, ny: number, st: number, W: Float64Array, S: Float64Array, x: Float64Array, b: Float64Array, piv: Float64Array, parity: number): void {
  for (let j = parity; j < ny; j += 2) {
    const k0 = (j + 1) * st + 1, k1 = k0 + nx;
    for (let k = k0; k < k1; k++) x[k] = b[k] - S[k] * x[k - st] - S[k + st] * x[k + st] - W[k] * piv[k - 1] * x[k - 1];
    x[k1 - 1] *= piv[k1 - 1];
    for (let k = k1 - 2; k >= k0; k--) x[k] = (x[k] - W[k + 1] * x[k + 1]) * piv[k];
  }
}

function xLines9(nx: number, ny: number, st: number, W: Float64Array, S: Float64Array, SW: Float64Array, SE: Float64Array, x: Float64Array, b: Float64Array, piv: Float64Array, parity: number): void {
  for (let j = parity; j < ny; j += 2) {
    const k0 = (j + 1) * st + 1, k1 = k0 + nx;
    for (let k = k0; k < k1; k++)
      x[k] = b[k] - S[k] * x[k - st] - S[k + st] * x[k + st]
        - SW[k] * x[k - st - 1] - SE[k] * x[k - st + 1] - SE[k + st - 1] * x[k + st - 1] - SW[k + st + 1] * x[k + st + 1]
        - W[k] * piv[k - 1] * x[k - 1];
    x[k1 - 1] *= piv[k1 - 1];
    for (let k = k1 - 2; k >= k0; k--) x[k] = (x[k] - W[k + 1] * x[k + 1]) * piv[k];
  }
}

function yLines5(nx: number, ny: number, st: number, W: Float64Array, S: Float64Array, x: Float64Array, b: Float64Array, piv: Float64Array, parity: number): void {
  for (let j = 1; j <= ny; j++)
    for (let k = j * st + 1 + parity, e = j * st + 1 + nx; k < e; k += 2)
      x[k] = b[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1] - S[k] * piv[k - st] * x[k - st];
  for (let k = ny * st + 1 + parity, e = ny * st + 1 + nx; k < e; k += 2) x[k] *= piv[k];
  for (let j = ny - 1; j >= 1; j--)
    for (let k = j * st + 1 + parity, e = j * st + 1 + nx; k < e; k += 2) x[k] = (x[k] - S[k + st] * x[k + st]) * piv[k];
}

function yLines9(nx: number, ny: number, st: number, W: Float64Array, S: Float64Array, SW: Float64Array, SE: Float64Array, x: Float64Array, b: Float64Array, piv: Float64Array, parity: number): void {
  for (let j = 1; j <= ny; j++)
    for (let k = j * st + 1 + parity, e = j * st + 1 + nx; k < e; k += 2)
      x[k] = b[k] - W[k] * x[k - 1] - W[k + 1] * x[k + 1]
        - SW[k] * x[k - st - 1] - SE[k] * x[k - st + 1] - SE[k + st - 1] * x[k + st - 1] - SW[k + st + 1] * x[k + st + 1]
        - S[k] * piv[k - st] * x[k - st];
  for (let k = ny * st + 1 + parity, e = ny * st + 1 + nx; k < e; k += 2) x[k] *= piv[k];
  for (let j = ny - 1; j >= 1; j--)
    for (let k = j * st + 1 + parity, e = j * st + 1 + nx; k < e; k += 2) x[k] = (x[k] - S[k + st] * x[k + st]) * piv[k];
}

/**
 * The even x-lines when x is zero: their neighbouring rows are zero, so only the line itself enters.
 * It writes every even row without reading any other row, so x need not be cleared first.
 */
function evenRowsFromZero(lv: GridLevel, piv: Float64Array): void {
  const { nx, ny, stride: st, w: W, x, b } = lv;
  for (let j = 0; j < ny; j += 2) {
    const k0 = (j + 1) * st + 1, k1 = k0 + nx;
    for (let k = k0; k < k1; k++) x[k] = b[k] - W[k] * piv[k - 1] * x[k - 1];
    x[k1 - 1] *= piv[k1 - 1];
    for (let k = k1 - 2; k >= k0; k--) x[k] = (x[k] - W[k + 1] * x[k + 1]) * piv[k];
  }
}

/**
 * Pre-smoothing from x = 0: x-lines even then odd, y-lines even then odd. Every point is written
 * before it is read (the even rows from zero, then the odd rows from the even ones), so whatever x
 * held before does not matter and the level needs no clearing pass.
 */
export function lineSmoothPre(lv: GridLevel, p: LinePivots): void {
  evenRowsFromZero(lv, p.x); xLines(lv, p.x, 1);
  yLines(lv, p.y, 0); yLines(lv, p.y, 1);
}

/** Post-smoothing: the adjoint of the pre-smoother (the same half-sweeps in reverse order). */
export function lineSmoothPost(lv: GridLevel, p: LinePivots): void {
  yLines(lv, p.y, 1); yLines(lv, p.y, 0);
  xLines(lv, p.x, 1); xLines(lv, p.x, 0);
}
