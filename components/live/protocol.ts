/** Messages between the page and the solver worker. */
import type { SectionResults } from '@/lib/thermal/types';
import type { Isotherm } from './contours';

export type ToWorker =
  /** isoStep: isotherm interval (K) the worker traces after the solve, so the page never does it; null for none. */
  /** sentAt: the page's clock (performance.timeOrigin + now, ms) when the request was posted. */
  | { type: 'solve'; id: number; snapshot: unknown; mesh: 'preview' | 'default' | 'fine'; isoStep?: number | null; sentAt?: number }
  | { type: 'cancel'; id: number };

export type FromWorker =
  | { type: 'progress'; id: number; elapsedMs: number }
  /** startedAt, postedAt: the worker's clock (timeOrigin + now, ms) when it began the solve and posted the result. */
  | { type: 'result'; id: number; results: SectionResults; field: Float64Array; ms: number; iso?: { step: number; lines: Isotherm[] } | null; sentAt?: number; startedAt?: number; postedAt?: number }
  | { type: 'cancelled'; id: number }
  | { type: 'error'; id: number; message: string };
