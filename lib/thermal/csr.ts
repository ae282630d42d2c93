/** Compressed sparse row matrices in typed arrays, and the few kernels the solver needs. */

export interface Csr {
  n: number;
  /** Number of columns (square unless a prolongator). */
  m: number;
  rowPtr: Int32Array;
  col: Int32Array;
  val: Float64Array;
}

export function csrBytes(a: Csr): number {
  return a.rowPtr.byteLength + a.col.byteLength + a.val.byteLength;
}

/** y = A x */
export function spmv(a: Csr, x: Float64Array, y: Float64Array): void {
  const { n, rowPtr, col, val } = a;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) s += val[k] * x[col[k]];
    y[i] = s;
  }
}

/** r = b - A x */
export function residual(a: Csr, x: Float64Array, b: Float64Array, r: Float64Array): void {
  const { n, rowPtr, col, val } = a;
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) s -= val[k] * x[col[k]];
    r[i] = s;
  }
}

export function diagonal(a: Csr): Float64Array {
  const d = new Float64Array(a.n);
  for (let i = 0; i < a.n; i++)
    for (let k = a.rowPtr[i]; k < a.rowPtr[i + 1]; k++) if (a.col[k] === i) d[i] += a.val[k];
  return d;
}

export function transpose(a: Csr): Csr {
  const { n, m, rowPtr, col, val } = a;
  const cnt = new Int32Array(m + 1);
  for (let k = 0; k < rowPtr[n]; k++) cnt[col[k] + 1]++;
  for (let j = 0; j < m; j++) cnt[j + 1] += cnt[j];
  const tp = cnt.slice();
  const tc = new Int32Array(rowPtr[n]);
  const tv = new Float64Array(rowPtr[n]);
  const next = cnt.slice(0, m);
  for (let i = 0; i < n; i++)
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
      const p = next[col[k]]++;
      tc[p] = i;
      tv[p] = val[k];
    }
  return { n: m, m: n, rowPtr: tp, col: tc, val: tv };
}

/** C = A B (Gustavson, two passes, dense marker of size B.m). */
export function spgemm(a: Csr, b: Csr): Csr {
  const n = a.n, m = b.m;
  const marker = new Int32Array(m).fill(-1);
  const rowPtr = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) {
    let c = 0;
    for (let ka = a.rowPtr[i]; ka < a.rowPtr[i + 1]; ka++) {
      const j = a.col[ka];
      for (let kb = b.rowPtr[j]; kb < b.rowPtr[j + 1]; kb++) {
        const l = b.col[kb];
        if (marker[l] !== i) {
          marker[l] = i;
          c++;
        }
      }
    }
    rowPtr[i + 1] = rowPtr[i] + c;
  }
  const col = new Int32Array(rowPtr[n]);
  const val = new Float64Array(rowPtr[n]);
  marker.fill(-1);
  for (let i = 0; i < n; i++) {
    const start = rowPtr[i];
    let c = start;
    for (let ka = a.rowPtr[i]; ka < a.rowPtr[i + 1]; ka++) {
      const j = a.col[ka], av = a.val[ka];
      for (let kb = b.rowPtr[j]; kb < b.rowPtr[j + 1]; kb++) {
        const l = b.col[kb];
        const p = marker[l];
        if (p < start) {
          marker[l] = c;
          col[c] = l;
          val[c] = av * b.val[kb];
          c++;
        } else val[p] += av * b.val[kb];
      }
    }
  }
  return { n, m, rowPtr, col, val };
}

/** y = A x, returning x . y (one pass instead of two, for CG's p . A p). */
export function spmvDot(a: Csr, x: Float64Array, y: Float64Array): number {
  const { n, rowPtr, col, val } = a;
  let d = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) s += val[k] * x[col[k]];
    y[i] = s;
    d += x[i] * s;
  }
  return d;
}
