/** Messages between the page and the solver worker. */
import type { SectionResults } from '@/lib/thermal/types';
import type { ScreenView } from './colour';
import type { Isotherm } from './contours';

/** A screen raster of the colour field for one view: RGBA, width x height, row-major. */
export interface Raster { view: ScreenView; width: number; height: number; alpha: number; pixels: Uint8ClampedArray }

/** Where one result's time in the worker went, ms. */
export interface WorkParts { solveMs: number; isoMs: number; rasterMs: number }

export type ToWorker =
  /** isoStep: isotherm interval (K) the worker traces after the solve, so the page never does it; null for none. */
  /** sentAt: the page's clock (performance.timeOrigin + now, ms) when the request was posted. */
  /** raster: the board's view and size when the request was posted; the worker paints the colours for it. */
  | { type: 'solve'; id: number; snapshot: unknown; mesh: 'preview' | 'default' | 'fine'; isoStep?: number | null; sentAt?: number; raster?: { view: ScreenView; width: number; height: number; alpha: number } | null }
  | { type: 'cancel'; id: number };

export type FromWorker =
  | { type: 'progress'; id: number; elapsedMs: number }
  /** startedAt, postedAt: the worker's clock (timeOrigin + now, ms) when it began the solve and posted the result. */
  /** parts: where the worker's `ms` went (the solve itself, tracing isotherms, painting the raster), ms. */
  | { type: 'result'; id: number; results: SectionResults; field: Float64Array; ms: number; iso?: { step: number; lines: Isotherm[] } | null; raster?: Raster | null; sentAt?: number; startedAt?: number; postedAt?: number; parts?: WorkParts }
  | { type: 'cancelled'; id: number }
  | { type: 'error'; id: number; message: string };
