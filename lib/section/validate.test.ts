/**
 * validateEdit (only what an edit touched) against validateSection (the whole section), and the named
 * operations' kept snapshot against reading the document back, on random edit sequences.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { LIBRARY_MATERIALS } from '../materials/library';
import { docFromSnapshot, readSection } from './doc';
import { SectionError } from './errors';
import * as ops from './ops';
import { partKind } from './registry';
import { resolveSection } from './resolve';
import type { SectionSnapshot } from './schema';
import { TEMPLATES } from './templates';
import { createUndoManager } from './undo';
import type { Validation } from './validate';
import { plainEqual, validateEdit, validateSection } from './validate';

const valid = (s: unknown): SectionSnapshot => {
  const v = validateSection(s);
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.section;
};
const BASE = TEMPLATES.map((t) => valid(t.build()));
const copy = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

function expectSame(a: Validation, b: Validation) {
  expect(a.ok).toBe(b.ok);
  if (a.ok && b.ok) {
    expect(a.section).toEqual(b.section);
    expect(JSON.stringify(a.section)).toBe(JSON.stringify(b.section));
    expect(a.migratedFrom).toBe(b.migratedFrom);
  } else if (!a.ok && !b.ok) expect(a.problems).toEqual(b.problems);
}

/** Every path into a plain value (objects and arrays), the root excluded. */
function paths(v: unknown, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  if (prefix.length) out.push(prefix);
  if (Array.isArray(v)) v.forEach((x, i) => paths(x, [...prefix, i], out));
  else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) paths(x, [...prefix, k], out);
  return out;
}

/** A value for a field that was `old`: mostly nearby values of the same type, sometimes hostile ones. */
const nearby = (old: unknown, r: number, pick: number): unknown => {
  const hostile = [null, undefined, -0, 0, -0.02, 1e308, Number.NaN, '', 'x', [], {}, [[0, 0]], true, new Date(0)];
  if (pick % 5 === 0) return hostile[pick % hostile.length];
  if (typeof old === 'number') return [old + (r - 0.5) * 0.2, old * (0.5 + r), -old, old + 1e-9, Math.round(old * 100) / 100][pick % 5];
  if (typeof old === 'string') return [old + 'b', LIBRARY_MATERIALS[pick % LIBRARY_MATERIALS.length].id, old, 'no-such-id'][pick % 4];
  if (typeof old === 'boolean') return !old;
  return hostile[pick % hostile.length];
};

interface Step { where: number; within: number; r: number; pick: number; remove: boolean }
const arbStep: fc.Arbitrary<Step> = fc.record({ where: fc.nat(), within: fc.nat(), r: fc.double({ min: 0, max: 1, noNaN: true }), pick: fc.nat(), remove: fc.boolean() });

/** Edit one field of `s`: most steps inside one part (like a drag), some in a zone, some anywhere. */
function edit(s: SectionSnapshot, st: Step): unknown {
  const out = copy(s) as unknown as Record<string, unknown>;
  const scope = st.where % 10;
  const root: (string | number)[] = scope < 6 && s.parts.length ? ['parts', st.within % s.parts.length] : scope < 8 && s.zones.length ? ['zones', st.within % s.zones.length] : [];
  let base: unknown = out;
  for (const seg of root) base = (base as Record<string | number, unknown>)[seg];
  const all = paths(base);
  const path = [...root, ...all[st.pick % all.length]];
  let target = out as Record<string | number, unknown>;
  for (const seg of path.slice(0, -1)) target = target[seg] as Record<string | number, unknown>;
  const last = path[path.length - 1];
  if (st.remove && st.pick % 7 === 0 && !Array.isArray(target)) delete target[last];
  else target[last] = nearby(target[last], st.r, st.pick);
  return out;
}

describe('validateEdit equals validateSection', () => {
  it('on 400 random edit sequences of the templates (each accepted edit is the next one\'s start)', () => {
    let accepted = 0, refused = 0;
    fc.assert(
      fc.property(fc.nat(), fc.array(arbStep, { minLength: 1, maxLength: 12 }), (ti, steps) => {
        let before = BASE[ti % BASE.length];
        for (const st of steps) {
          const proposed = edit(before, st);
          const a = validateEdit(before, proposed), b = validateSection(proposed);
          expectSame(a, b);
          if (a.ok) {
            accepted++;
            before = a.section;
          } else refused++;
        }
      }),
      { numRuns: 400 },
    );
    // Both answers were exercised often enough to mean something.
    expect(accepted).toBeGreaterThan(300);
    expect(refused).toBeGreaterThan(300);
  });

  it('on moves of every part of every template, the way a drag moves them', () => {
    for (const s of BASE)
      for (const p of s.parts) {
        const proposed = copy(s);
        const q = proposed.parts.find((x) => x.id === p.id)!;
        if (q.join) q.join = { ...q.join, dx: q.join.dx + 0.013, dy: q.join.dy - 0.007 };
        else { q.x = (q.x ?? 0) + 0.013; q.y = (q.y ?? 0) - 0.007; }
        expectSame(validateEdit(s, proposed), validateSection(proposed));
      }
  });

  it('an edit that changes nothing gives back the snapshot itself', () => {
    const v = validateEdit(BASE[0], copy(BASE[0]));
    expect(v.ok && v.section).toBe(BASE[0]);
  });

  it('an edit keeps the untouched parts as they were and parses the touched one', () => {
    const s = BASE[0];
    const proposed = copy(s);
    proposed.parts[1].name = 'renamed';
    const v = validateEdit(s, proposed);
    if (!v.ok) throw new Error('refused');
    expect(v.section.parts[0]).toBe(s.parts[0]);
    expect(v.section.parts[1]).not.toBe(s.parts[1]);
    expect(v.section.parts[1].name).toBe('renamed');
    expect(v.section.zones).toBe(s.zones);
  });

  it('refuses a join loop made by one edit, with the same problems as the full check', () => {
    const s = BASE.find((x) => x.parts.some((p) => p.join))!;
    const joined = s.parts.find((p) => p.join)!;
    const proposed = copy(s);
    const target = proposed.parts.find((p) => p.id === joined.join!.to)!;
    target.join = { to: joined.id, anchor: 'top-left', self: 'bottom-left', dx: 0, dy: 0 };
    delete target.x;
    delete target.y;
    const a = validateEdit(s, proposed), b = validateSection(proposed);
    expect(a.ok).toBe(false);
    expectSame(a, b);
    expect(!a.ok && a.problems.some((p) => p.message.includes('loop'))).toBe(true);
  });
});

describe('plainEqual', () => {
  it('is JSON equality for plain values and refuses what is not plain JSON', () => {
    expect(plainEqual({ a: [1, 'x', null, { b: true }] }, { a: [1, 'x', null, { b: true }] })).toBe(true);
    expect(plainEqual({ a: 1, b: 2 }, { b: 2, a: 1 })).toBe(true);
    expect(plainEqual({ a: 1 }, { a: 1, b: undefined })).toBe(false);
    expect(plainEqual([1, 2], [1, 2, 3])).toBe(false);
    expect(plainEqual([1], { 0: 1 })).toBe(false);
    expect(plainEqual(Number.NaN, Number.NaN)).toBe(false);
    expect(plainEqual(new Date(0), new Date(0))).toBe(false);
    expect(plainEqual(undefined, undefined)).toBe(false);
    expect(plainEqual('1', 1)).toBe(false);
  });
});

describe('named operations read back what they wrote', () => {
  const me = { user: 'a' }, other = { user: 'b' };
  type Op = (doc: Y.Doc, s: SectionSnapshot, n: number, r: number) => unknown;
  const pickPart = (s: SectionSnapshot, n: number) => s.parts[n % s.parts.length];
  const OPS: Op[] = [
    (doc, s, n, r) => ops.moveParts(doc, me, [pickPart(s, n).id], (r - 0.5) * 0.1, (0.5 - r) * 0.05),
    (doc, s, n, r) => {
      const p = pickPart(s, n);
      const hs = partKind(p.kind)!.handles(p as never);
      if (hs.length) ops.dragHandle(doc, me, p.id, hs[n % hs.length].id, (r - 0.5) * 0.08);
    },
    (doc, s, n, r) => {
      const p = pickPart(s, n);
      const num = Object.entries(p).filter(([k, v]) => typeof v === 'number' && k !== 'x' && k !== 'y');
      if (num.length) ops.updatePart(doc, me, p.id, { [num[n % num.length][0]]: (num[n % num.length][1] as number) * (0.4 + r) });
    },
    (doc, s, n) => ops.setLocked(doc, me, [pickPart(s, n).id], n % 3 === 0),
    (doc, s, n) => ops.setPartMaterial(doc, me, [pickPart(s, n).id], LIBRARY_MATERIALS[n % LIBRARY_MATERIALS.length].id),
    (doc, s, n, r) => ops.moveZone(doc, me, s.zones[n % s.zones.length].id, (r - 0.5) * 0.1, 0),
    (doc, s, n) => ops.restackParts(doc, me, [pickPart(s, n).id], (['up', 'down', 'top', 'bottom'] as const)[n % 4]),
    (doc, _s, n, r) => ops.addPart(doc, me, { kind: 'board', x: r, y: -0.5 - r, params: { orientation: n % 2 ? 'vertical' : 'horizontal', thickness: 0.05, length: 0.2 } }),
    (doc, s, n) => (s.parts.length > 3 ? ops.deleteParts(doc, me, [pickPart(s, n).id]) : undefined),
    (doc, s, n) => ops.detachPart(doc, me, pickPart(s, n).id),
    (doc, s) => ops.renameSection(doc, me, s.name + '+'),
    // Another person's edit, applied as a remote update: the kept snapshot must not survive it.
    (doc, s, n, r) => {
      const peer = new Y.Doc();
      Y.applyUpdate(peer, Y.encodeStateAsUpdate(doc));
      const before = Y.encodeStateVector(doc);
      try {
        ops.moveParts(peer, other, [pickPart(s, n).id], 0, (r - 0.5) * 0.05);
      } finally {
        Y.applyUpdate(doc, Y.encodeStateAsUpdate(peer, before), other);
        peer.destroy();
      }
    },
  ];

  it('after each of 150 random sequences of operations, undo and remote edits, the document reads back as the operations said', () => {
    let done = 0;
    fc.assert(
      fc.property(fc.nat(), fc.array(fc.record({ op: fc.nat(), n: fc.nat(), r: fc.double({ min: 0, max: 1, noNaN: true }) }), { minLength: 1, maxLength: 15 }), (ti, seq) => {
        const doc = docFromSnapshot(TEMPLATES[ti % TEMPLATES.length].build());
        const undo = createUndoManager(doc, me, 0);
        for (const { op, n, r } of seq) {
          const s = ops.currentSection(doc);
          let returned: unknown = undefined;
          try {
            if (op % 8 === 7) returned = n % 2 ? undo.undo() : undo.redo();
            else returned = OPS[op % OPS.length](doc, s, n, r);
            done++;
          } catch (e) {
            if (!(e instanceof SectionError)) throw e;
          }
          const back = readSection(doc);
          if (!back.ok) throw new Error(JSON.stringify(back.problems));
          const kept = ops.currentSection(doc);
          expect(kept).toEqual(back.section);
          expect(JSON.stringify(kept)).toBe(JSON.stringify(back.section));
          if (returned && typeof returned === 'object' && 'parts' in returned) expect(JSON.stringify(returned)).toBe(JSON.stringify(back.section));
          // What the board draws from the returned snapshot is what the document resolves to.
          expect(resolveSection(kept).solids.length).toBe(resolveSection(back.section).solids.length);
        }
        undo.destroy();
        doc.destroy();
      }),
      { numRuns: 150 },
    );
    expect(done).toBeGreaterThan(500);
  });

  it('a snapshot handed out by currentSection is the caller\'s own copy', () => {
    const doc = docFromSnapshot(TEMPLATES[0].build());
    const a = ops.currentSection(doc);
    a.parts[0].name = 'changed by the caller';
    a.name = 'changed too';
    expect(ops.currentSection(doc).parts[0].name).not.toBe('changed by the caller');
    expect(ops.currentSection(doc).name).not.toBe('changed too');
  });

  it('a write made outside the operations, inside an open transaction, is seen by an operation in the same transaction', () => {
    const doc = docFromSnapshot(TEMPLATES[0].build());
    const id = ops.currentSection(doc).parts[0].id;
    doc.transact(() => {
      doc.getMap<Y.Map<unknown>>('parts').get(id)!.set('name', 'raw write');
      ops.setLocked(doc, me, [id], true);
    });
    const back = readSection(doc);
    expect(back.ok && back.section.parts.find((p) => p.id === id)).toMatchObject({ name: 'raw write', locked: true });
    expect(ops.currentSection(doc).parts.find((p) => p.id === id)).toMatchObject({ name: 'raw write', locked: true });
  });
});
