/** Messages between the page and the solver worker. */
import type { SectionResults } from '@/lib/thermal/types';
import type { Isotherm } from './contours';

export type ToWorker =
  /** isoStep: isotherm interval (K) the worker traces after the solve, so the page never does it; null for none. */
  | { type: 'solve'; id: number; snapshot: unknown; mesh: 'preview' | 'default' | 'fine'; isoStep?: number | null }
  | { type: 'cancel'; id: number };

export type FromWorker =
  | { type: 'progress'; id: number; elapsedMs: number }
  | { type: 'result'; id: number; results: SectionResults; field: Float64Array; ms: number; iso?: { step: number; lines: Isotherm[] } | null }
  | { type: 'cancelled'; id: number }
  | { type: 'error'; id: number; message: string };
