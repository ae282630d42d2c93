/** Pure geometry for drawing a drag cheaply: is the moving drawing the one at the start of the drag, shifted? */

export interface OutlineItem {
  key: string;
  /** Outline as x0, y0, x1, y1, ... */
  flat: readonly number[];
  pattern: string;
  rank: number;
  locked: boolean;
}

/**
 * The one translation (dx, dy) that takes every item of `base` onto the item of `now` at the same place
 * in the list (same key, fill, rank and lock, every vertex moved by the same amount within `tol`), or
 * null when there is none (a part changed shape, joined or left the list).
 */
export function rigidShift(base: readonly OutlineItem[], now: readonly OutlineItem[], tol = 1e-9): [number, number] | null {
  if (base.length !== now.length || !base.length) return null;
  const b0 = base[0].flat, n0 = now[0].flat;
  if (b0.length < 2 || n0.length !== b0.length) return null;
  const dx = n0[0] - b0[0], dy = n0[1] - b0[1];
  for (let i = 0; i < base.length; i++) {
    const a = base[i], b = now[i];
    if (a.key !== b.key || a.pattern !== b.pattern || a.rank !== b.rank || a.locked !== b.locked || a.flat.length !== b.flat.length) return null;
    for (let k = 0; k < a.flat.length; k += 2)
      if (Math.abs(b.flat[k] - a.flat[k] - dx) > tol || Math.abs(b.flat[k + 1] - a.flat[k + 1] - dy) > tol) return null;
  }
  return [dx, dy];
}
