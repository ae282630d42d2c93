/**
 * The grid V-cycle as a preconditioner for PCG on the solver's unknowns: z = M^-1 r with one
 * smoothing sweep before each coarse correction and its adjoint after (per level: zebra
 * alternating line Gauss-Seidel, or point Gauss-Seidel forward then backward on levels whose cells
 * are all near square), restriction P^T and an
 * exact (banded Cholesky) coarsest solve, so M is symmetric positive definite.
 */
import type { Preconditioner } from '../preconditioner';
import { bandSolve } from './band';
import type { GridHierarchy } from './hierarchy';
import { lineSmoothPost, lineSmoothPre } from './lines';
import { gaussSeidelBackward, gaussSeidelForwardFromZero, prolongAdd, restrictResidual } from './smoothers';

export class GridVCycle implements Preconditioner {
  constructor(readonly h: GridHierarchy) {}

  apply(r: Float64Array, z: Float64Array): void {
    const { gridOf, levels } = this.h;
    const b = levels[0].b, x = levels[0].x;
    for (let u = 0; u < gridOf.length; u++) b[gridOf[u]] = r[u];
    this.cycle(0);
    for (let u = 0; u < gridOf.length; u++) z[u] = x[gridOf[u]];
  }

  private cycle(l: number): void {
    const h = this.h;
    const lv = h.levels[l];
    if (l === h.levels.length - 1) {
      bandSolve(h.coarse, lv.b, lv.x);
      return;
    }
    const next = h.levels[l + 1];
    const p = h.prolongators[l];
    // Both pre-smoothers start from x = 0 and write every point before reading it (no clearing pass).
    const piv = h.pivots[l];
    if (piv) lineSmoothPre(lv, piv);
    else gaussSeidelForwardFromZero(lv);
    // The line smoother ends on the odd columns, so the residual there is zero.
    restrictResidual(lv, p, next.b, piv !== null);
    this.cycle(l + 1);
    prolongAdd(lv, p, next.x);
    if (piv) lineSmoothPost(lv, piv);
    else gaussSeidelBackward(lv);
  }
}
