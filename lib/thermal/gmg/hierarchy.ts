/**
 * Geometric multigrid hierarchy (setup) on the rectilinear mesh: the finest level is the operator
 * embedded in the mesh's grid, each coarser level keeps every other grid line (operator-dependent
 * interpolation, Galerkin coarse operator), and the coarsest level is factored (banded Cholesky).
 */
import type { Csr } from '../csr';
import type { BandCholesky } from './band';
import { bandCholesky, bandCost } from './band';
import { galerkinCoarse } from './galerkin';
import type { GridLevel } from './grid';
import { fineLevelFromCsr, inverseDiagonal, levelBytes, levelNonzeros } from './grid';
import type { Prolongator } from './interpolation';
import type { LinePivots } from './lines';
import { linePivots } from './lines';
import { operatorInterpolation, prolongatorBytes } from './interpolation';

export interface GridHierarchy {
  levels: GridLevel[];
  /** prolongators[l] maps level l + 1 onto level l. */
  prolongators: Prolongator[];
  /** Line-smoother pivots per level (all but the coarsest); empty for the point smoother. */
  pivots: LinePivots[];
  smoother: 'line' | 'point';
  /** Padded grid index of every unknown of the operator on the finest level. */
  gridOf: Int32Array;
  coarse: BandCholesky;
  /** Points per level (the finest counts only unknowns). */
  sizes: number[];
  operatorComplexity: number;
  /** Bytes held (levels, prolongators, maps, dense factor), not counting the operator itself. */
  bytes: number;
}

export interface GridHierarchyOptions {
  /** Coarsening stops at the first level whose banded factor costs at most this many multiply-adds. */
  coarseCost?: number;
  /** Zebra alternating line Gauss-Seidel (default) or point Gauss-Seidel. */
  smoother?: 'line' | 'point';
}

export function buildGridHierarchy(a: Csr, cellOf: Int32Array, nx: number, ny: number, opts: GridHierarchyOptions = {}): GridHierarchy {
  const coarseCost = opts.coarseCost ?? 2e6;
  const { level, gridOf } = fineLevelFromCsr(a, cellOf, nx, ny);
  const levels: GridLevel[] = [level];
  const prolongators: Prolongator[] = [];
  let nz = levelNonzeros(level);
  const nz0 = a.rowPtr[a.n];
  let bytes = levelBytes(level) + gridOf.byteLength;
  let lv = level;
  const smoother = opts.smoother ?? 'line';
  const pivots: LinePivots[] = [];
  while (bandCost(lv) > coarseCost && (lv.nx > 1 || lv.ny > 1)) {
    if (smoother === 'line') { const pv = linePivots(lv); pivots.push(pv); bytes += pv.x.byteLength + pv.y.byteLength; }
    else bytes += inverseDiagonal(lv).byteLength;
    const p = operatorInterpolation(lv);
    const next = galerkinCoarse(lv, p);
    prolongators.push(p);
    levels.push(next);
    nz += levelNonzeros(next);
    bytes += prolongatorBytes(p) + levelBytes(next);
    lv = next;
  }
  const coarse = bandCholesky(lv);
  bytes += coarse.l.byteLength + coarse.index.byteLength + coarse.work.byteLength;
  return {
    levels, prolongators, pivots, smoother, gridOf, coarse,
    sizes: [a.n, ...levels.slice(1).map((l) => l.nx * l.ny)],
    operatorComplexity: (nz - levelNonzeros(level) + nz0) / nz0,
    bytes,
  };
}
