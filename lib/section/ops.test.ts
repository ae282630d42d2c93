import * as Y from 'yjs';
import { describe, expect, it } from 'vitest';
import { docFromSnapshot, docToRaw, readSection } from './doc';
import { SectionError } from './errors';
import * as ops from './ops';
import { resolveSection } from './resolve';
import type { SectionSnapshot } from './schema';
import { templateByName, blankSection } from './templates';
import { createUndoManager } from './undo';

const me = { user: 'test' };
const snap = (doc: Y.Doc): SectionSnapshot => {
  const v = readSection(doc);
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.section;
};
const box = (doc: Y.Doc, id: string) => resolveSection(snap(doc)).parts.get(id)!.box;
const slabDoc = () => docFromSnapshot(templateByName('slab-edge-break')!.build());
const basementDoc = () => docFromSnapshot(templateByName('basement-inside-framed')!.build());

describe('joining rule', () => {
  it('changing the footing width keeps the wall centred on the footing top', () => {
    const doc = slabDoc();
    for (const width of [0.9, 0.45]) {
      ops.updatePart(doc, me, 'footing', { width });
      const f = box(doc, 'footing'), w = box(doc, 'stem');
      expect(w.minY).toBeCloseTo(f.maxY, 12);
      expect((w.minX + w.maxX) / 2).toBeCloseTo((f.minX + f.maxX) / 2, 12);
    }
  });
  it('changing the wall height keeps the plate on top and the framed wall on the plate', () => {
    const doc = slabDoc();
    ops.updatePart(doc, me, 'stem', { height: 1.5 });
    expect(box(doc, 'plate').minY).toBeCloseTo(box(doc, 'stem').maxY, 12);
    expect(box(doc, 'wall').minY).toBeCloseTo(box(doc, 'plate').maxY, 12);
    expect(box(doc, 'edge').maxY).toBeCloseTo(box(doc, 'stem').maxY, 12);
  });
  it('thickening the wall moves the board joined to its inner face', () => {
    const doc = slabDoc();
    ops.updatePart(doc, me, 'stem', { thickness: 0.3 });
    expect(box(doc, 'edge').minX).toBeCloseTo(box(doc, 'stem').maxX, 12);
  });
  it('slab on gravel: a thicker bed lifts the foam and the slab', () => {
    const doc = basementDoc();
    ops.updatePart(doc, me, 'bed', { thickness: 0.25 });
    expect(box(doc, 'subslab').minY).toBeCloseTo(box(doc, 'bed').maxY, 12);
    expect(box(doc, 'slab').minY).toBeCloseTo(box(doc, 'subslab').maxY, 12);
  });
  it('moving a joined part slides it and keeps the join; moving the target carries it', () => {
    const doc = slabDoc();
    ops.moveParts(doc, me, ['stem'], 0.05, 0);
    expect(snap(doc).parts.find((p) => p.id === 'stem')!.join!.dx).toBeCloseTo(0.05, 12);
    const before = box(doc, 'stem');
    ops.moveParts(doc, me, ['footing'], 0.1, -0.2);
    const after = box(doc, 'stem');
    expect(after.minX - before.minX).toBeCloseTo(0.1, 12);
    expect(after.minY - before.minY).toBeCloseTo(-0.2, 12);
  });
  it('refuses a join loop', () => {
    const doc = slabDoc();
    expect(() => ops.joinPart(doc, me, 'footing', { to: 'wall', anchor: 'top-left', self: 'bottom-left', dx: 0, dy: 0 })).toThrow(/loop/);
  });
});

describe('handles', () => {
  it('the slab-edge board right handle changes its thickness, not its position', () => {
    const doc = slabDoc();
    const b0 = box(doc, 'edge');
    ops.dragHandle(doc, me, 'edge', 'thickness-right', 0.025);
    const p = snap(doc).parts.find((x) => x.id === 'edge')!;
    expect(p.thickness).toBeCloseTo(0.05, 12);
    const b1 = box(doc, 'edge');
    expect(b1.minX).toBeCloseTo(b0.minX, 12);
    expect(b1.maxX).toBeCloseTo(b0.maxX + 0.025, 12);
  });
  it('a min-side handle keeps the far side where it was', () => {
    const doc = slabDoc();
    const b0 = box(doc, 'footing');
    ops.dragHandle(doc, me, 'footing', 'width-left', -0.1);
    const b1 = box(doc, 'footing');
    expect(b1.maxX).toBeCloseTo(b0.maxX, 12);
    expect(b1.minX).toBeCloseTo(b0.minX - 0.1, 12);
  });
  it('a handle drag past zero is refused and leaves the document unchanged', () => {
    const doc = slabDoc();
    const before = JSON.stringify(docToRaw(doc));
    expect(() => ops.dragHandle(doc, me, 'edge', 'thickness-right', -1)).toThrow(SectionError);
    expect(JSON.stringify(docToRaw(doc))).toBe(before);
  });
});

describe('edits refused where they enter', () => {
  it('a negative thickness names the field and leaves the document unchanged', () => {
    const doc = slabDoc();
    const before = JSON.stringify(docToRaw(doc));
    try {
      ops.updatePart(doc, me, 'slab', { thickness: -0.02 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(SectionError);
      expect((e as SectionError).problems[0].path).toMatch(/^parts\[\d+\]\.thickness$/);
      expect((e as SectionError).message).toMatch(/must be greater than 0, got -0\.02 m/);
    }
    expect(JSON.stringify(docToRaw(doc))).toBe(before);
  });
  it('a locked part cannot move', () => {
    const doc = slabDoc();
    ops.setLocked(doc, me, ['slab'], true);
    expect(() => ops.moveParts(doc, me, ['slab'], 1, 0)).toThrow(/locked/);
  });
});

describe('free polygons', () => {
  it('adds, moves, inserts and removes vertices; refuses a self-crossing result', () => {
    const doc = docFromSnapshot(blankSection());
    const id = ops.addPolygon(doc, me, [[0, 0], [1, 0], [1, 1], [0, 1]], 'xps');
    ops.moveVertex(doc, me, id, 2, [1.5, 1.2]);
    ops.insertVertex(doc, me, id, 0, [0.5, -0.2]);
    let p = snap(doc).parts[0];
    expect(p.points).toEqual([[0, 0], [0.5, -0.2], [1, 0], [1.5, 1.2], [0, 1], [0, 0]]);
    ops.removeVertex(doc, me, id, 1);
    p = snap(doc).parts[0];
    expect((p.points as unknown[]).length).toBe(5);
    expect(() => ops.moveVertex(doc, me, id, 1, [0, 2])).toThrow(/cross/);
  });
});

describe('stacking, duplicate, delete', () => {
  it('raise and lower change only order keys, and the order is what the solver sees', () => {
    const doc = slabDoc();
    const rank = () => snap(doc).parts.map((p) => p.id);
    ops.restackParts(doc, me, ['ground'], 'top');
    expect(rank().at(-1)).toBe('ground');
    ops.restackParts(doc, me, ['ground'], 'down');
    expect(rank().at(-2)).toBe('ground');
    ops.restackParts(doc, me, ['ground'], 'bottom');
    expect(rank()[0]).toBe('ground');
    ops.restackParts(doc, me, ['footing'], 'up');
    expect(rank().indexOf('footing')).toBe(2);
  });
  it('deleting a part keeps the parts joined to it where they were', () => {
    const doc = slabDoc();
    const before = box(doc, 'stem');
    ops.deleteParts(doc, me, ['footing']);
    const s = snap(doc);
    expect(s.parts.find((p) => p.id === 'footing')).toBeUndefined();
    expect(s.parts.find((p) => p.id === 'stem')!.join).toBeNull();
    expect(box(doc, 'stem')).toEqual(before);
  });
  it('duplicates keep joins among the copies', () => {
    const doc = slabDoc();
    const [f, w] = ops.duplicateParts(doc, me, ['footing', 'stem'], 1, 0);
    const s = snap(doc);
    expect(s.parts.find((p) => p.id === w)!.join!.to).toBe(f);
    expect(box(doc, f).minX).toBeCloseTo(box(doc, 'footing').minX + 1, 12);
  });
});

describe('undo and redo through Y.UndoManager', () => {
  const cases: [string, (doc: Y.Doc) => void][] = [
    ['addPart', (d) => ops.addPart(d, me, { kind: 'board', x: 1, y: 1 })],
    ['updatePart', (d) => ops.updatePart(d, me, 'slab', { thickness: 0.15 })],
    ['moveParts', (d) => ops.moveParts(d, me, ['footing'], 0.1, 0)],
    ['dragHandle', (d) => ops.dragHandle(d, me, 'edge', 'thickness-right', 0.01)],
    ['joinPart', (d) => ops.joinPart(d, me, 'bed', { to: 'stem', anchor: 'bottom-right', self: 'bottom-left', dx: 0, dy: 0 })],
    ['detachPart', (d) => ops.detachPart(d, me, 'stem')],
    ['deleteParts', (d) => ops.deleteParts(d, me, ['footing'])],
    ['duplicateParts', (d) => ops.duplicateParts(d, me, ['slab'])],
    ['restackParts', (d) => ops.restackParts(d, me, ['ground'], 'top')],
    ['setLocked', (d) => ops.setLocked(d, me, ['slab'], true)],
    ['setPartMaterial', (d) => ops.setPartMaterial(d, me, ['edge'], 'eps')],
    ['addPolygon', (d) => ops.addPolygon(d, me, [[0, 0], [1, 0], [0, 1]])],
    ['addZone', (d) => ops.addZone(d, me, { kind: 'fixed', name: 'deep', shape: { type: 'rect', x: -20, y: -21, width: 24, height: 1 }, rs: 0, design: { t: 8, rh: null }, month: { t: 8, rh: null } })],
    ['updateZone', (d) => ops.updateZone(d, me, 'room', { design: { t: 22, rh: 40 } })],
    ['moveZone', (d) => ops.moveZone(d, me, 'room', 0, 0.1)],
    ['deleteZones', (d) => ops.deleteZones(d, me, ['grade'])],
    ['putMaterial', (d) => ops.putMaterial(d, me, { id: 'my-eps', name: 'My EPS', lambda: 0.033, mu: 50, sd: null, sdHumid: null, density: 25, airOpen: false, pattern: 'board', source: { lambda: 'product sheet', mu: 'x', density: 'x' } })],
    ['putCut', (d) => ops.putCut(d, me, { name: 'c', from: [0, 0], to: [1, 0] })],
    ['renameSection', (d) => ops.renameSection(d, me, 'Renamed')],
    ['setAnalysis', (d) => ops.setAnalysis(d, me, { convention: 'external' })],
    ['replaceSection', (d) => ops.replaceSection(d, me, templateByName('basement-outside')!.build())],
  ];
  for (const [name, edit] of cases) {
    it(`${name} is undone and redone exactly`, () => {
      const doc = slabDoc();
      const um = createUndoManager(doc, me);
      const before = JSON.stringify(snap(doc));
      edit(doc);
      const after = JSON.stringify(snap(doc));
      expect(after).not.toBe(before);
      um.undo();
      expect(JSON.stringify(snap(doc))).toBe(before);
      um.redo();
      expect(JSON.stringify(snap(doc))).toBe(after);
    });
  }
  it("undo never removes another person's edit", () => {
    const doc = slabDoc();
    const other = { user: 'other' };
    const um = createUndoManager(doc, me);
    ops.updatePart(doc, me, 'slab', { thickness: 0.12 });
    ops.updatePart(doc, other, 'footing', { width: 0.8 });
    um.undo();
    const s = snap(doc);
    expect(s.parts.find((p) => p.id === 'slab')!.thickness).toBe(0.1);
    expect(s.parts.find((p) => p.id === 'footing')!.width).toBe(0.8);
  });
});

describe('concurrent edits merge field by field', () => {
  it('two documents editing different parameters of one part converge with both changes', () => {
    const a = slabDoc();
    const b = new Y.Doc();
    Y.applyUpdate(b, Y.encodeStateAsUpdate(a));
    ops.updatePart(a, me, 'slab', { thickness: 0.12 });
    ops.updatePart(b, me, 'slab', { width: 3 });
    Y.applyUpdate(a, Y.encodeStateAsUpdate(b));
    Y.applyUpdate(b, Y.encodeStateAsUpdate(a));
    for (const d of [a, b]) {
      const s = snap(d).parts.find((p) => p.id === 'slab')!;
      expect(s.thickness).toBe(0.12);
      expect(s.width).toBe(3);
    }
  });
});
