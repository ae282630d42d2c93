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
  /** Smoother per level (all but the coarsest), and the line smoother's pivots (null on point levels). */
  smoothers: ('line' | 'point')[];
  pivots: (LinePivots | null)[];
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
  /**
   * 'line': zebra alternating line Gauss-Seidel on every level; 'point': point Gauss-Seidel; 'auto'
   * (the default): per level, point Gauss-Seidel where every cell's aspect ratio is at most
   * POINT_ASPECT and lines elsewhere (needs `widths`; without them, lines).
   */
  smoother?: 'line' | 'point' | 'auto';
  /** Cell widths of the mesh along x (nx of them) and y (ny), m. */
  widths?: { dx: ArrayLike<number>; dy: ArrayLike<number> };
}

/**
 * Point relaxation smooths well only where a cell couples about equally in both directions; on
 * cells longer than this ratio, errors smooth along the long side only and need line relaxation
 * (the textbook rule for anisotropic problems; Trottenberg, Oosterlee and Schueller, Multigrid,
 * 2001, chapter 5, recalled from memory). Measured here: 2 keeps the checkerboard's iteration count.
 */
export const POINT_ASPECT = 2;

/** Cell widths of a mesh with grid lines xs and ys. */
export function meshWidths(xs: ArrayLike<number>, ys: ArrayLike<number>): { dx: Float64Array; dy: Float64Array } {
  const dx = new Float64Array(xs.length - 1), dy = new Float64Array(ys.length - 1);
  for (let i = 0; i < dx.length; i++) dx[i] = xs[i + 1] - xs[i];
  for (let j = 0; j < dy.length; j++) dy[j] = ys[j + 1] - ys[j];
  return { dx, dy };
}

/** Widths of the next coarser level's cells (pairs of cells merged, as the coarse grid keeps every other line). */
function coarserWidths(d: Float64Array): Float64Array {
  const m = (d.length + 1) >> 1;
  const out = new Float64Array(m);
  for (let i = 0; i < d.length; i++) out[i >> 1] += d[i];
  return out;
}

function maxAspect(dx: Float64Array, dy: Float64Array): number {
  let xmin = Infinity, xmax = 0, ymin = Infinity, ymax = 0;
  for (const v of dx) { xmin = Math.min(xmin, v); xmax = Math.max(xmax, v); }
  for (const v of dy) { ymin = Math.min(ymin, v); ymax = Math.max(ymax, v); }
  return Math.max(xmax / ymin, ymax / xmin);
}

export function buildGridHierarchy(a: Csr, cellOf: Int32Array, nx: number, ny: number, opts: GridHierarchyOptions = {}): GridHierarchy {
  const coarseCost = opts.coarseCost ?? 2e5;
  const { level, gridOf } = fineLevelFromCsr(a, cellOf, nx, ny);
  const levels: GridLevel[] = [level];
  const prolongators: Prolongator[] = [];
  const nzFineGrid = levelNonzeros(level);
  let nz = nzFineGrid;
  const nz0 = a.rowPtr[a.n];
  let bytes = levelBytes(level) + gridOf.byteLength;
  let lv = level;
  const mode = opts.smoother ?? 'auto';
  let dx: Float64Array | null = opts.widths ? Float64Array.from(opts.widths.dx) : null;
  let dy: Float64Array | null = opts.widths ? Float64Array.from(opts.widths.dy) : null;
  const smoothers: ('line' | 'point')[] = [];
  const pivots: (LinePivots | null)[] = [];
  while (bandCost(lv) > coarseCost && (lv.nx > 1 || lv.ny > 1)) {
    const sm = mode === 'auto' ? (dx && dy && maxAspect(dx, dy) <= POINT_ASPECT ? 'point' : 'line') : mode;
    smoothers.push(sm);
    if (sm === 'line') { const pv = linePivots(lv); pivots.push(pv); bytes += pv.x.byteLength + pv.y.byteLength; }
    else { pivots.push(null); bytes += inverseDiagonal(lv).byteLength; }
    if (dx && dy) { dx = coarserWidths(dx); dy = coarserWidths(dy); }
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
    levels, prolongators, smoothers, pivots, gridOf, coarse,
    sizes: [a.n, ...levels.slice(1).map((l) => l.nx * l.ny)],
    operatorComplexity: (nz - nzFineGrid + nz0) / nz0,
    bytes,
  };
}
