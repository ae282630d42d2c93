/**
 * Standard aggregation (Vanek, Mandel and Brezina): pass 1 makes an aggregate of every node whose
 * strong neighbours are all free, pass 2 attaches the rest to a neighbouring pass-1 aggregate,
 * pass 3 groups what is left. Nodes without strong neighbours stay out (-1): the smoother alone
 * handles them (their row is dominated by the diagonal).
 */
import type { Csr } from '../csr';

export interface Aggregation {
  /** Aggregate of each node, -1 when the node is left out. */
  agg: Int32Array;
  count: number;
}

export function standardAggregation(s: Csr): Aggregation {
  const { n, rowPtr, col } = s;
  const agg = new Int32Array(n).fill(-1);
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (agg[i] !== -1) continue;
    const b = rowPtr[i], e = rowPtr[i + 1];
    if (b === e) continue;
    let free = true;
    for (let k = b; k < e; k++) if (agg[col[k]] !== -1) { free = false; break; }
    if (!free) continue;
    agg[i] = count;
    for (let k = b; k < e; k++) agg[col[k]] = count;
    count++;
  }
  // Pass 2: attach to a pass-1 aggregate (marked -2 - a so attachments do not chain).
  for (let i = 0; i < n; i++) {
    if (agg[i] !== -1) continue;
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
      const a = agg[col[k]];
      if (a >= 0) { agg[i] = -2 - a; break; }
    }
  }
  for (let i = 0; i < n; i++) if (agg[i] < -1) agg[i] = -2 - agg[i];
  // Pass 3: the rest, with their free neighbours.
  for (let i = 0; i < n; i++) {
    if (agg[i] !== -1 || rowPtr[i] === rowPtr[i + 1]) continue;
    agg[i] = count;
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) if (agg[col[k]] === -1) agg[col[k]] = count;
    count++;
  }
  return { agg, count };
}
