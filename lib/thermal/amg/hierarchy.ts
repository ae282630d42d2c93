/**
 * Smoothed-aggregation multigrid hierarchy (setup): per level the operator, its inverse diagonal,
 * the prolongator to it from the next coarser level, Galerkin coarse operators A_c = P^T A P, and a
 * dense Cholesky factor on the coarsest level. Work vectors are allocated once here.
 */
import type { Csr } from '../csr';
import { csrBytes, diagonal, spgemm, transpose } from '../csr';
import { standardAggregation } from './aggregate';
import type { DenseCholesky } from './dense';
import { denseCholesky } from './dense';
import { smoothedProlongator } from './prolongator';
import { symmetricStrength } from './strength';

export interface Level {
  a: Csr;
  invDiag: Float64Array;
  /** Prolongator from level + 1 to this level (null on the coarsest). */
  p: Csr | null;
  x: Float64Array;
  b: Float64Array;
}

export interface Hierarchy {
  levels: Level[];
  /** Dense factor of the coarsest level; null when it is too large and is relaxed instead. */
  coarse: DenseCholesky | null;
  /** Sum of nonzeros over all levels divided by those of the finest. */
  operatorComplexity: number;
  /** Bytes held by the hierarchy (operators, prolongators, work vectors, coarse factor), not counting the finest operator. */
  bytes: number;
}

export interface HierarchyOptions {
  /** Strength threshold. */
  theta?: number;
  /** Coarsest size solved directly. */
  coarseSize?: number;
  maxLevels?: number;
}

export function buildHierarchy(a0: Csr, opts: HierarchyOptions = {}): Hierarchy {
  const theta = opts.theta ?? 0.1;
  const coarseSize = opts.coarseSize ?? 300;
  const maxLevels = opts.maxLevels ?? 20;
  const levels: Level[] = [];
  let a = a0;
  let nnz = a0.rowPtr[a0.n];
  let bytes = 0;
  for (;;) {
    const d = diagonal(a);
    const invDiag = new Float64Array(a.n);
    for (let i = 0; i < a.n; i++) invDiag[i] = d[i] > 0 ? 1 / d[i] : 0;
    const level: Level = { a, invDiag, p: null, x: new Float64Array(a.n), b: new Float64Array(a.n) };
    levels.push(level);
    bytes += invDiag.byteLength * 3 + (levels.length > 1 ? csrBytes(a) : 0);
    if (a.n <= coarseSize || levels.length >= maxLevels) break;
    const s = symmetricStrength(a, theta, d);
    const ag = standardAggregation(s);
    if (ag.count === 0 || ag.count >= a.n * 0.9) break; // coarsening stalled: this level is the coarsest
    const p = smoothedProlongator(a, d, s, ag);
    const ac = spgemm(transpose(p), spgemm(a, p));
    level.p = p;
    bytes += csrBytes(p);
    nnz += ac.rowPtr[ac.n];
    a = ac;
  }
  // A coarsest level too big for a dense factor (coarsening stalled) is relaxed instead (see cycle).
  const last = levels[levels.length - 1].a;
  const coarse = last.n <= 4000 ? denseCholesky(last) : null;
  if (coarse) bytes += coarse.l.byteLength;
  return { levels, coarse, operatorComplexity: nnz / a0.rowPtr[a0.n], bytes };
}
