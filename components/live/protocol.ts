/** Messages between the page and the solver worker. */
import type { SectionResults } from '@/lib/thermal/types';

export type ToWorker =
  | { type: 'solve'; id: number; snapshot: unknown; mesh: 'preview' | 'default' | 'fine' }
  | { type: 'cancel'; id: number };

export type FromWorker =
  | { type: 'progress'; id: number; elapsedMs: number }
  | { type: 'result'; id: number; results: SectionResults; field: Float64Array; ms: number }
  | { type: 'cancelled'; id: number }
  | { type: 'error'; id: number; message: string };
