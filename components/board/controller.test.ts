/**
 * The board controller on a real Y.Doc, driven by pointer input as the canvas gives it (no browser):
 * the cut-line tool, double-click vertex removal, a locked part refusing a drag, and undo per action.
 */
import { describe, expect, it } from 'vitest';
import { docFromSnapshot } from '@/lib/section/doc';
import { templateByName } from '@/lib/section/templates/index';
import type { PointerInput } from './controller';
import { BoardController } from './controller';

const input = (sx: number, sy: number, more: Partial<PointerInput> = {}): PointerInput => ({ sx, sy, button: 0, shift: false, alt: true, ctrl: false, pointerId: 1, pointerType: 'mouse', detail: 1, ...more });

function board() {
  const doc = docFromSnapshot(templateByName('slab-edge-break')!.build());
  const c = new BoardController(doc, { who: 'test' });
  c.setSize(1000, 800);
  return c;
}

describe('controller', () => {
  it('the cut tool saves the dragged line as a cut, shows it, and undo takes it back', () => {
    const c = board();
    const n0 = c.snapshot().cuts.length;
    c.setTool({ type: 'cut' });
    const a = c.toScreen([-0.3, 1]), b = c.toScreen([0.5, 1]);
    c.pointerDown(input(a[0], a[1]));
    c.applyMove(input(b[0], b[1]));
    expect(c.transient.get().cut).not.toBeNull();
    c.pointerUp(input(b[0], b[1]));
    const cuts = c.snapshot().cuts;
    expect(cuts.length).toBe(n0 + 1);
    const cut = cuts[cuts.length - 1];
    expect(cut.from[0]).toBeCloseTo(-0.3, 5);
    expect(cut.to[0]).toBeCloseTo(0.5, 5);
    expect(cut.from[1]).toBeCloseTo(1, 5);
    expect(c.ui.get().activeCut).toBe(cut.id);
    expect(c.ui.get().tool.type).toBe('select');
    expect(c.transient.get().cut).toBeNull();
    c.undo();
    expect(c.snapshot().cuts.length).toBe(n0);
    c.dispose();
  });

  it('a click with the cut tool is too short and saves nothing', () => {
    const c = board();
    const n0 = c.snapshot().cuts.length;
    c.setTool({ type: 'cut' });
    c.pointerDown(input(400, 300));
    c.pointerUp(input(402, 301));
    expect(c.snapshot().cuts.length).toBe(n0);
    expect(c.ui.get().message?.tone).toBe('error');
    c.dispose();
  });

  it('deleteCut removes a saved cut', () => {
    const c = board();
    const id = c.snapshot().cuts[0].id;
    expect(c.deleteCut(id)).toBeNull();
    expect(c.snapshot().cuts.some((x) => x.id === id)).toBe(false);
    c.dispose();
  });

  it('a double click on a vertex of the selected polygon removes it', () => {
    const c = board();
    c.setTool({ type: 'polygon' });
    for (const p of [[1, 0.6], [1.4, 0.6], [1.4, 1], [1, 1]] as [number, number][]) {
      const s = c.toScreen(p);
      c.pointerDown(input(s[0], s[1]));
      c.pointerUp(input(s[0], s[1]));
    }
    c.keyDown({ key: 'Enter', shift: false, ctrl: false, alt: false });
    const id = c.ui.get().selection.parts[0];
    const ring = () => (c.snapshot().parts.find((p) => p.id === id)!.points as unknown[]).length - 1;
    expect(ring()).toBe(4);
    const v = c.handles().find((h) => h.type === 'vertex' && h.index === 1)!;
    const s = c.toScreen(v.at);
    expect(c.doubleClick(s[0], s[1])).toBeNull();
    expect(ring()).toBe(3);
    // Not on a vertex: nothing happens.
    expect(c.doubleClick(5, 5)).toBeNull();
    expect(ring()).toBe(3);
    c.dispose();
  });

  it('a locked part refuses a drag and says so; the document is unchanged', () => {
    const c = board();
    c.select({ parts: ['footing'] });
    c.toggleLock();
    const before = JSON.stringify(c.snapshot());
    const b = c.section.get().resolved.parts.get('footing')!.box;
    const s = c.toScreen([b.minX + 0.1, (b.minY + b.maxY) / 2]);
    c.pointerDown(input(s[0], s[1]));
    c.applyMove(input(s[0] + 40, s[1]));
    c.pointerUp(input(s[0] + 40, s[1]));
    expect(JSON.stringify(c.snapshot())).toBe(before);
    expect(c.ui.get().message?.text).toMatch(/locked/);
    c.dispose();
  });
});
