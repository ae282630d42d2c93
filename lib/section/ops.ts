/**
 * Named operations: the only way the board, the rooms and scripts change a section document.
 * Each reads the document, computes the edited snapshot, validates it, and writes the difference as
 * one Yjs transaction with the caller's origin (so Y.UndoManager can undo it per person).
 * A refused edit throws a SectionError and leaves the document unchanged.
 */
import type * as Y from 'yjs';
import { anchorPoint } from './anchors';
import { readSection, writeDiff, clone } from './doc';
import { SectionError } from './errors';
import type { Point } from './geometry';
import { newId } from './ids';
import { keyBetween } from './order';
import type { ParamValue } from './params';
import { defaultParams } from './params';
import { partKind } from './registry';
import { resolveSection } from './resolve';
import type { AnalysisSettings, CutRecord, Join, MaterialRecord, PartRecord, SectionSnapshot, ZoneRecord } from './schema';
import { validateEdit } from './validate';

export type Change = (s: SectionSnapshot) => SectionSnapshot;

/**
 * The document's valid snapshot, kept per document until its next transaction (local or remote). The
 * named operations set it after their own write: the write is the difference between the snapshot read
 * and the one validated, field by field, so reading the document back gives the validated snapshot
 * (lib/section/ops.test.ts reads it back after random edit sequences).
 */
interface Known { snapshot: SectionSnapshot; stamp: number }
const known = new WeakMap<Y.Doc, Known>();
const stamps = new WeakMap<Y.Doc, { n: number }>();

function stampOf(doc: Y.Doc): { n: number } {
  let st = stamps.get(doc);
  if (!st) {
    const fresh = { n: 0 };
    doc.on('afterTransaction', () => { fresh.n++; });
    stamps.set(doc, fresh);
    st = fresh;
  }
  return st;
}

/** The shared, read-only snapshot of the document (validated when the document changed since). */
function knownSection(doc: Y.Doc): SectionSnapshot {
  const st = stampOf(doc);
  const k = known.get(doc);
  // Inside someone's open transaction the document may hold writes no operation checked: read it.
  if (k && k.stamp === st.n && doc._transaction === null) return k.snapshot;
  const v = readSection(doc);
  if (!v.ok) throw new SectionError(v.problems.map((p) => ({ ...p, message: `the document itself is invalid here: ${p.message}` })));
  remember(doc, v.section);
  return v.section;
}

function remember(doc: Y.Doc, snapshot: SectionSnapshot) {
  known.set(doc, { snapshot: READ_ONLY ? deepFreeze(snapshot) : snapshot, stamp: stampOf(doc).n });
}

/** Under test the kept snapshots are frozen, so a caller changing a snapshot it was given fails loudly. */
const READ_ONLY = typeof process !== 'undefined' && process.env?.NODE_ENV === 'test';
function deepFreeze<T>(v: T): T {
  if (v && typeof v === 'object' && !Object.isFrozen(v)) {
    Object.freeze(v);
    for (const x of Object.values(v)) deepFreeze(x);
  }
  return v;
}

/** Current valid snapshot of the document (the caller's own copy), or a SectionError. */
export function currentSection(doc: Y.Doc): SectionSnapshot {
  return clone(knownSection(doc));
}

/**
 * Apply a change as one transaction if the result is valid; returns the new snapshot (shared with the
 * next operation on this document: read it, do not change it). Only the parts and zones the change
 * touched are validated again (validateEdit, equivalent to validating the whole section).
 */
export function applyChange(doc: Y.Doc, origin: unknown, change: Change): SectionSnapshot {
  const before = knownSection(doc);
  const proposed = change(clone(before));
  const v = validateEdit(before, proposed);
  if (!v.ok) throw new SectionError(v.problems);
  const st = stampOf(doc), n0 = st.n, open = doc._transaction !== null;
  doc.transact(() => writeDiff(doc, before, v.section), origin);
  // Kept only when this write was the one transaction since the read (no observer wrote in between).
  if (!open && st.n === n0 + 1) remember(doc, v.section);
  return v.section;
}

const topOrder = (items: readonly { order: string }[]) => keyBetween(items.length ? items[items.length - 1].order : null, null);

function mustFind<T extends { id: string }>(items: T[], id: string, what: string): T {
  const x = items.find((p) => p.id === id);
  if (!x) throw new SectionError([{ path: '', message: `no ${what} with id '${id}'` }]);
  return x;
}

function unlocked(p: PartRecord): PartRecord {
  if (p.locked) throw new SectionError([{ path: `part ${p.id}`, message: `'${p.name || p.kind}' is locked; unlock it to change it` }]);
  return p;
}

// ---- parts -------------------------------------------------------------------------------------

export interface NewPart {
  kind: string;
  x?: number;
  y?: number;
  join?: Join | null;
  material?: string;
  name?: string;
  params?: Record<string, ParamValue>;
  id?: string;
}

/** Add a part on top of the stack; returns its id. */
export function addPart(doc: Y.Doc, origin: unknown, np: NewPart): string {
  const kind = partKind(np.kind);
  if (!kind) throw new SectionError([{ path: 'kind', message: `unknown part kind '${np.kind}'` }]);
  const id = np.id ?? newId('p');
  applyChange(doc, origin, (s) => {
    const rec: PartRecord = {
      id,
      kind: np.kind,
      name: np.name ?? '',
      material: np.material ?? kind.defaultMaterial,
      order: topOrder(s.parts),
      locked: false,
      join: np.join ?? null,
      ...(np.join ? {} : { x: np.x ?? 0, y: np.y ?? 0 }),
      ...clone(defaultParams(kind.params) as Record<string, unknown>),
      ...clone(np.params ?? {}),
    };
    return { ...s, parts: [...s.parts, rec] };
  });
  return id;
}

/** Set kind parameters (and/or name, material) of one part. */
export function updatePart(doc: Y.Doc, origin: unknown, id: string, patch: Record<string, unknown>): SectionSnapshot {
  for (const k of ['id', 'kind', 'order']) if (k in patch) throw new SectionError([{ path: k, message: `cannot be changed by an update` }]);
  return applyChange(doc, origin, (s) => {
    const p = unlocked(mustFind(s.parts, id, 'part'));
    Object.assign(p, clone(patch));
    return s;
  });
}

/** Place a part's local origin at a world point, keeping its join (by adjusting the join offset). */
function placeOrigin(s: SectionSnapshot, p: PartRecord, origin: Point, resolved = resolveSection(s)) {
  if (!p.join) {
    p.x = origin[0];
    p.y = origin[1];
    return;
  }
  const target = resolved.parts.get(p.join.to);
  if (!target) return;
  const [ax, ay] = anchorPoint(target.box, p.join.anchor);
  // The part's own box in its local frame, from its resolved world box minus its current origin.
  const me = resolved.parts.get(p.id)!;
  const local = { minX: me.box.minX - me.origin[0], minY: me.box.minY - me.origin[1], maxX: me.box.maxX - me.origin[0], maxY: me.box.maxY - me.origin[1] };
  const [sx, sy] = anchorPoint(local, p.join.self);
  p.join = { ...p.join, dx: origin[0] + sx - ax, dy: origin[1] + sy - ay };
}

/** Move parts by (dx, dy). A joined part slides along its target (its join offset changes). */
export function moveParts(doc: Y.Doc, origin: unknown, ids: readonly string[], dx: number, dy: number): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    const resolved = resolveSection(s);
    const moving = new Set(ids);
    for (const id of ids) {
      const p = unlocked(mustFind(s.parts, id, 'part'));
      // A part joined to another part that moves too follows it without its own offset changing.
      if (p.join && moving.has(p.join.to)) continue;
      const o = resolved.parts.get(id)!.origin;
      if (p.join) p.join = { ...p.join, dx: p.join.dx + dx, dy: p.join.dy + dy };
      else placeOrigin(s, p, [o[0] + dx, o[1] + dy], resolved);
    }
    return s;
  });
}

/**
 * Drag a handle by `delta` metres along its axis. A 'max' handle changes the parameter and leaves the
 * origin; a 'min' handle changes it the other way and moves the origin with the pointer, so the far
 * side stays where it was.
 */
export function dragHandle(doc: Y.Doc, origin: unknown, id: string, handleId: string, delta: number): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    const p = unlocked(mustFind(s.parts, id, 'part'));
    const kind = partKind(p.kind)!;
    const resolved = resolveSection(s);
    const params = Object.fromEntries(Object.keys(kind.params).map((k) => [k, p[k]]));
    const h = kind.handles(params as never).find((x) => x.id === handleId);
    if (!h) throw new SectionError([{ path: handleId, message: `no handle '${handleId}' on a ${kind.title.toLowerCase()}` }]);
    const value = p[h.param] as number;
    const o = resolved.parts.get(id)!.origin;
    p[h.param] = h.side === 'max' ? value + delta : value - delta;
    const oldBox = resolved.parts.get(id)!.box;
    if (h.side === 'min') {
      // Keep the far side fixed: after the change, the box edge on the min side must sit at old edge + delta.
      const after = resolveSection(s).parts.get(id)!;
      const shift = h.axis === 'x' ? oldBox.minX + delta - after.box.minX : oldBox.minY + delta - after.box.minY;
      const next: Point = h.axis === 'x' ? [after.origin[0] + shift, after.origin[1]] : [after.origin[0], after.origin[1] + shift];
      placeOrigin(s, p, next, resolveSection(s));
    } else if (p.join) {
      // Keep the near side fixed for a joined part too (its anchor may be centred).
      const after = resolveSection(s).parts.get(id)!;
      const shift = h.axis === 'x' ? oldBox.minX - after.box.minX : oldBox.minY - after.box.minY;
      placeOrigin(s, p, h.axis === 'x' ? [after.origin[0] + shift, after.origin[1]] : [after.origin[0], after.origin[1] + shift], resolveSection(s));
    }
    void o;
    return s;
  });
}

/** Join a part to another: its `self` anchor sits on the target's `anchor`, offset (dx, dy). */
export function joinPart(doc: Y.Doc, origin: unknown, id: string, join: Join): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    const p = unlocked(mustFind(s.parts, id, 'part'));
    mustFind(s.parts, join.to, 'part');
    p.join = { ...join };
    delete p.x;
    delete p.y;
    return s;
  });
}

/** Turn a join into a fixed position where the part now is. */
export function detachPart(doc: Y.Doc, origin: unknown, id: string): SectionSnapshot {
  return applyChange(doc, origin, (s) => detachIn(s, [id]));
}

function detachIn(s: SectionSnapshot, ids: readonly string[]): SectionSnapshot {
  const resolved = resolveSection(s);
  for (const id of ids) {
    const p = s.parts.find((x) => x.id === id);
    if (!p || !p.join) continue;
    const o = resolved.parts.get(id)!.origin;
    p.join = null;
    p.x = o[0];
    p.y = o[1];
  }
  return s;
}

/** Delete parts; parts joined to them keep their place (their joins become fixed positions). */
export function deleteParts(doc: Y.Doc, origin: unknown, ids: readonly string[]): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    const gone = new Set(ids);
    for (const id of ids) unlocked(mustFind(s.parts, id, 'part'));
    detachIn(s, s.parts.filter((p) => p.join && gone.has(p.join.to) && !gone.has(p.id)).map((p) => p.id));
    return { ...s, parts: s.parts.filter((p) => !gone.has(p.id)) };
  });
}

/** Copy parts, offset by (dx, dy), on top of the stack; joins between copied parts are kept. Returns the new ids. */
export function duplicateParts(doc: Y.Doc, origin: unknown, ids: readonly string[], dx = 0.1, dy = -0.1): string[] {
  const fresh = new Map(ids.map((id) => [id, newId('p')]));
  applyChange(doc, origin, (s) => {
    const resolved = resolveSection(s);
    let order = s.parts.length ? s.parts[s.parts.length - 1].order : null;
    const copies: PartRecord[] = [];
    for (const p of s.parts.filter((x) => fresh.has(x.id))) {
      const c = clone(p);
      c.id = fresh.get(p.id)!;
      c.locked = false;
      order = keyBetween(order, null);
      c.order = order;
      if (c.join && fresh.has(c.join.to)) c.join = { ...c.join, to: fresh.get(c.join.to)! };
      else {
        const o = resolved.parts.get(p.id)!.origin;
        c.join = null;
        c.x = o[0] + dx;
        c.y = o[1] + dy;
      }
      copies.push(c);
    }
    return { ...s, parts: [...s.parts, ...copies] };
  });
  return [...fresh.values()];
}

/** Move parts one step up (+1) or down (-1) the stack, or to the top / bottom. */
export function restackParts(doc: Y.Doc, origin: unknown, ids: readonly string[], where: 'up' | 'down' | 'top' | 'bottom'): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    const chosen = new Set(ids);
    const list = [...s.parts];
    const keys = () => list.map((p) => p.order);
    const reorder = (i: number) => {
      const p = list[i];
      if (where === 'top') p.order = keyBetween(keys()[list.length - 1], null);
      else if (where === 'bottom') p.order = keyBetween(null, keys()[0]);
      else if (where === 'up' && i < list.length - 1) p.order = keyBetween(list[i + 1].order, i + 2 < list.length ? list[i + 2].order : null);
      else if (where === 'down' && i > 0) p.order = keyBetween(i - 2 >= 0 ? list[i - 2].order : null, list[i - 1].order);
      list.sort((a, b) => (a.order < b.order ? -1 : a.order > b.order ? 1 : 0));
    };
    const targets = list.filter((p) => chosen.has(p.id));
    if (where === 'up' || where === 'top') targets.reverse();
    for (const t of targets) {
      if (t.order === list[where === 'up' || where === 'top' ? list.length - 1 : 0].order && (where === 'top' || where === 'bottom')) continue;
      reorder(list.indexOf(t));
    }
    return { ...s, parts: list };
  });
}

export function setLocked(doc: Y.Doc, origin: unknown, ids: readonly string[], locked: boolean): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    for (const id of ids) mustFind(s.parts, id, 'part').locked = locked;
    return s;
  });
}

export function setPartMaterial(doc: Y.Doc, origin: unknown, ids: readonly string[], material: string): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    for (const id of ids) unlocked(mustFind(s.parts, id, 'part')).material = material;
    return s;
  });
}

// ---- free polygons -----------------------------------------------------------------------------

function ringEdit(doc: Y.Doc, origin: unknown, id: string, edit: (v: Point[]) => Point[]): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    const p = unlocked(mustFind(s.parts, id, 'part'));
    if (p.kind !== 'polygon') throw new SectionError([{ path: 'kind', message: 'only a free polygon has vertices to edit' }]);
    const ring = p.points as Point[];
    const v = edit(ring.slice(0, -1).map(([x, y]) => [x, y] as Point));
    p.points = [...v, v[0]];
    return s;
  });
}

export const moveVertex = (doc: Y.Doc, origin: unknown, id: string, index: number, to: Point) =>
  ringEdit(doc, origin, id, (v) => {
    if (index < 0 || index >= v.length) throw new SectionError([{ path: 'points', message: `no vertex ${index}` }]);
    v[index] = [to[0], to[1]];
    return v;
  });

export const insertVertex = (doc: Y.Doc, origin: unknown, id: string, afterIndex: number, at: Point) =>
  ringEdit(doc, origin, id, (v) => {
    v.splice(afterIndex + 1, 0, [at[0], at[1]]);
    return v;
  });

export const removeVertex = (doc: Y.Doc, origin: unknown, id: string, index: number) =>
  ringEdit(doc, origin, id, (v) => {
    if (v.length <= 3) throw new SectionError([{ path: 'points', message: 'a polygon needs at least 3 vertices' }]);
    v.splice(index, 1);
    return v;
  });

/** Add a free polygon from world vertices (an open list; the ring is closed here). Returns its id. */
export function addPolygon(doc: Y.Doc, origin: unknown, vertices: readonly Point[], material?: string): string {
  return addPart(doc, origin, { kind: 'polygon', x: 0, y: 0, material, params: { points: [...vertices.map(([x, y]) => [x, y] as Point), [vertices[0][0], vertices[0][1]]] } });
}

// ---- zones, materials, cuts, settings ----------------------------------------------------------

export function addZone(doc: Y.Doc, origin: unknown, zone: Omit<ZoneRecord, 'id' | 'order'> & { id?: string }): string {
  const id = zone.id ?? newId('z');
  applyChange(doc, origin, (s) => ({ ...s, zones: [...s.zones, { ...clone(zone), id, order: topOrder(s.zones) } as ZoneRecord] }));
  return id;
}

export function updateZone(doc: Y.Doc, origin: unknown, id: string, patch: Partial<Omit<ZoneRecord, 'id'>>): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    Object.assign(mustFind(s.zones, id, 'zone'), clone(patch));
    return s;
  });
}

export function moveZone(doc: Y.Doc, origin: unknown, id: string, dx: number, dy: number): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    const z = mustFind(s.zones, id, 'zone');
    z.shape = z.shape.type === 'rect' ? { ...z.shape, x: z.shape.x + dx, y: z.shape.y + dy } : { ...z.shape, points: z.shape.points.map(([x, y]) => [x + dx, y + dy] as [number, number]) };
    return s;
  });
}

export function deleteZones(doc: Y.Doc, origin: unknown, ids: readonly string[]): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    for (const id of ids) mustFind(s.zones, id, 'zone');
    return { ...s, zones: s.zones.filter((z) => !ids.includes(z.id)) };
  });
}

/** Add or replace a document material. */
export function putMaterial(doc: Y.Doc, origin: unknown, material: MaterialRecord): SectionSnapshot {
  return applyChange(doc, origin, (s) => ({ ...s, materials: [...s.materials.filter((m) => m.id !== material.id), clone(material)] }));
}

export function deleteMaterial(doc: Y.Doc, origin: unknown, id: string): SectionSnapshot {
  return applyChange(doc, origin, (s) => {
    const users = s.parts.filter((p) => p.material === id || Object.values(p).includes(id));
    if (users.length) throw new SectionError([{ path: `materials.${id}`, message: `is used by ${users.length} part(s); change their material first` }]);
    return { ...s, materials: s.materials.filter((m) => m.id !== id) };
  });
}

export function putCut(doc: Y.Doc, origin: unknown, cut: Omit<CutRecord, 'id'> & { id?: string }): string {
  const id = cut.id ?? newId('c');
  applyChange(doc, origin, (s) => ({ ...s, cuts: [...s.cuts.filter((c) => c.id !== id), { ...clone(cut), id }] }));
  return id;
}

export function deleteCut(doc: Y.Doc, origin: unknown, id: string): SectionSnapshot {
  return applyChange(doc, origin, (s) => ({ ...s, cuts: s.cuts.filter((c) => c.id !== id) }));
}

export function renameSection(doc: Y.Doc, origin: unknown, name: string): SectionSnapshot {
  return applyChange(doc, origin, (s) => ({ ...s, name }));
}

export function setDescription(doc: Y.Doc, origin: unknown, description: string): SectionSnapshot {
  return applyChange(doc, origin, (s) => ({ ...s, description }));
}

export function setAnalysis(doc: Y.Doc, origin: unknown, patch: Partial<AnalysisSettings>): SectionSnapshot {
  return applyChange(doc, origin, (s) => ({ ...s, analysis: { ...s.analysis, ...clone(patch) } }));
}

/** Replace everything with another section (opening a file into this document). */
export function replaceSection(doc: Y.Doc, origin: unknown, next: SectionSnapshot): SectionSnapshot {
  return applyChange(doc, origin, () => clone(next));
}
