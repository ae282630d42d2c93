/**
 * The multigrid V-cycle as a preconditioner: z = M^-1 r with one forward Gauss-Seidel sweep before
 * and one backward sweep after the coarse correction, so M is symmetric positive definite (PCG).
 */
import type { Csr } from '../csr';
import { denseSolve } from './dense';
import type { Hierarchy } from './hierarchy';
import { gaussSeidelBackward, gaussSeidelForward, restrictResidual } from './smoothers';

export interface Preconditioner {
  /** z = M^-1 r; r is not modified. */
  apply(r: Float64Array, z: Float64Array): void;
}

function prolongAdd(p: Csr, xc: Float64Array, x: Float64Array): void {
  const { n, rowPtr, col, val } = p;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let k = rowPtr[i], e = rowPtr[i + 1]; k < e; k++) s += val[k] * xc[col[k]];
    x[i] += s;
  }
}

export class VCycle implements Preconditioner {
  constructor(readonly h: Hierarchy) {}

  apply(r: Float64Array, z: Float64Array): void {
    this.cycle(0, r, z);
  }

  private cycle(l: number, b: Float64Array, x: Float64Array): void {
    const h = this.h;
    const lv = h.levels[l];
    if (l === h.levels.length - 1) {
      if (h.coarse) denseSolve(h.coarse, b, x);
      else {
        x.fill(0);
        for (let k = 0; k < 4; k++) {
          gaussSeidelForward(lv.a, lv.invDiag, x, b);
          gaussSeidelBackward(lv.a, lv.invDiag, x, b);
        }
      }
      return;
    }
    x.fill(0);
    gaussSeidelForward(lv.a, lv.invDiag, x, b);
    const next = h.levels[l + 1];
    restrictResidual(lv.a, lv.p!, x, b, next.b);
    this.cycle(l + 1, next.b, next.x);
    prolongAdd(lv.p!, next.x, x);
    gaussSeidelBackward(lv.a, lv.invDiag, x, b);
  }
}

/** Diagonal scaling, the baseline preconditioner. */
export class JacobiPreconditioner implements Preconditioner {
  constructor(readonly invDiag: Float64Array) {}
  apply(r: Float64Array, z: Float64Array): void {
    for (let i = 0; i < r.length; i++) z[i] = this.invDiag[i] * r[i];
  }
}
