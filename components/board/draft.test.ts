/** Drawing a free polygon: closing on the first vertex or Enter, refusing self-crossing shapes, taking back. */
import { describe, expect, it } from 'vitest';
import type { Draft, DraftResult } from './draft';
import { draftClick, draftClose, draftUndo, emptyDraft } from './draft';

const clicks = (pts: [number, number][], tol = 0.01): DraftResult => {
  let d: Draft = emptyDraft();
  let r: DraftResult = { type: 'continue', draft: d };
  for (const p of pts) {
    r = draftClick(d, p, tol);
    if (r.type === 'continue' || r.type === 'refused') d = r.draft;
  }
  return r;
};

describe('draft', () => {
  it('clicking near the first vertex closes a triangle', () => {
    const r = clicks([[0, 0], [1, 0], [0, 1], [0.004, -0.003]]);
    expect(r).toEqual({ type: 'close', vertices: [[0, 0], [1, 0], [0, 1]] });
  });

  it('with two vertices a click at the first adds a vertex (too few to close); Enter is refused with a reason', () => {
    const r = clicks([[0, 0], [1, 0], [0.001, 0]]);
    expect(r.type).toBe('continue');
    const two: Draft = { vertices: [[0, 0], [1, 0]] };
    const c = draftClose(two);
    expect(c.type).toBe('refused');
    if (c.type === 'refused') {
      expect(c.message).toMatch(/at least 3 vertices; 2 placed/);
      expect(c.draft).toBe(two);
    }
  });

  it('a double click adds the vertex once', () => {
    const r = clicks([[0, 0], [1, 0], [1.001, 0]]);
    expect(r.type === 'continue' && r.draft.vertices).toEqual([[0, 0], [1, 0]]);
  });

  it('a self-crossing bow tie is refused and the draft is kept', () => {
    const bow: Draft = { vertices: [[0, 0], [1, 1], [1, 0], [0, 1]] };
    const r = draftClose(bow);
    expect(r.type).toBe('refused');
    if (r.type === 'refused') {
      expect(r.message).toMatch(/cross/);
      expect(r.draft.vertices).toHaveLength(4);
    }
    // Closing it by clicking the first vertex is refused the same way.
    expect(draftClick(bow, [0, 0], 0.01).type).toBe('refused');
  });

  it('Backspace takes back the last vertex, and cancels an empty draft', () => {
    const r = draftUndo({ vertices: [[0, 0], [1, 0]] });
    expect(r).toEqual({ type: 'continue', draft: { vertices: [[0, 0]] } });
    expect(draftUndo(emptyDraft())).toEqual({ type: 'cancel' });
  });

  it('does not mutate the draft it is given', () => {
    const d: Draft = { vertices: [[0, 0]] };
    draftClick(d, [1, 1], 0.01);
    expect(d.vertices).toEqual([[0, 0]]);
  });
});
