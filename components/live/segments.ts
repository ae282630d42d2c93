/** How each verdict state is drawn: shape (dash pattern and glyph) as well as colour, so it reads without colour. */
import type { SurfaceState } from '@/lib/thermal/types';

export interface SegmentStyle { stroke: string; width: number; dash: number[]; glyph: 'ring' | 'diamond' | 'cross'; label: string }

export const SEGMENT_STYLES: Record<SurfaceState, SegmentStyle> = {
  fine: { stroke: '#2b8a6e', width: 3, dash: [], glyph: 'ring', label: 'fine' },
  'mould risk': { stroke: '#d97a00', width: 4, dash: [10, 5], glyph: 'diamond', label: 'mould risk (surface RH at or above 80 %)' },
  condensation: { stroke: '#c0267a', width: 5, dash: [2, 5], glyph: 'cross', label: 'condensation (below the dew point)' },
};

export function styleFor(state: SurfaceState): SegmentStyle {
  return SEGMENT_STYLES[state] ?? SEGMENT_STYLES.fine;
}

/** Worst state first. */
export const STATE_RANK: Record<SurfaceState, number> = { condensation: 2, 'mould risk': 1, fine: 0 };

export function worst(states: readonly SurfaceState[]): SurfaceState {
  return states.reduce<SurfaceState>((a, s) => (STATE_RANK[s] > STATE_RANK[a] ? s : a), 'fine');
}
