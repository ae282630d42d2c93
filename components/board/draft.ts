/**
 * Drawing a free polygon vertex by vertex: a small state machine. Clicking near the first vertex
 * (with at least three placed) or pressing Enter closes it; Backspace takes back the last vertex;
 * Escape abandons it. Pure: the board turns a 'close' result into addPolygon.
 */
import type { Point } from '@/lib/section/geometry';
import { polygonProblem } from '@/lib/section/geometry';

export interface Draft {
  vertices: [number, number][];
}

export type DraftResult =
  | { type: 'continue'; draft: Draft }
  | { type: 'close'; vertices: [number, number][] }
  | { type: 'refused'; draft: Draft; message: string }
  | { type: 'cancel' };

export const emptyDraft = (): Draft => ({ vertices: [] });

/** A click at world point p; `closeTol` is the distance (metres) that counts as the first vertex. */
export function draftClick(d: Draft, p: Point, closeTol: number): DraftResult {
  const v = d.vertices;
  if (v.length >= 3 && Math.hypot(p[0] - v[0][0], p[1] - v[0][1]) <= closeTol) return draftClose(d);
  const last = v[v.length - 1];
  if (last && Math.hypot(p[0] - last[0], p[1] - last[1]) <= closeTol * 0.25) return { type: 'continue', draft: d }; // a double click
  return { type: 'continue', draft: { vertices: [...v, [p[0], p[1]]] } };
}

/** Close the ring (Enter): refused with the model's reason when the shape is not a simple polygon. */
export function draftClose(d: Draft): DraftResult {
  if (d.vertices.length < 3) return { type: 'refused', draft: d, message: `a polygon needs at least 3 vertices; ${d.vertices.length} placed` };
  const why = polygonProblem(d.vertices);
  if (why) return { type: 'refused', draft: d, message: why };
  return { type: 'close', vertices: d.vertices };
}

export function draftUndo(d: Draft): DraftResult {
  if (!d.vertices.length) return { type: 'cancel' };
  return { type: 'continue', draft: { vertices: d.vertices.slice(0, -1) } };
}
