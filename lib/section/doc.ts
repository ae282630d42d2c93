/**
 * The live document: a Yjs document holding the section. Layout:
 *   'section'   Y.Map: name, description, analysis (plain JSON)
 *   'parts'     Y.Map id -> Y.Map of the part's fields (common fields and kind parameters, flat)
 *   'zones'     Y.Map id -> Y.Map of the zone's fields
 *   'materials' Y.Map id -> plain material record
 *   'cuts'      Y.Map id -> plain cut record
 * Stacking order is the `order` key on each part and zone. Everything else is derived.
 */
import * as Y from 'yjs';
import type { Validation } from './validate';
import { validateSection } from './validate';
import type { SectionSnapshot } from './schema';
import { FORMAT_TAG, FORMAT_VERSION } from './schema';

export type SectionDoc = Y.Doc;

export const docMaps = (doc: Y.Doc) => ({
  section: doc.getMap<unknown>('section'),
  parts: doc.getMap<Y.Map<unknown>>('parts'),
  zones: doc.getMap<Y.Map<unknown>>('zones'),
  materials: doc.getMap<unknown>('materials'),
  cuts: doc.getMap<unknown>('cuts'),
});

/** Deep copy of plain JSON (Yjs stores plain values by reference on the local side). */
export function clone<T>(v: T): T {
  return v === undefined ? v : (JSON.parse(JSON.stringify(v)) as T);
}

function mapToObject(m: Y.Map<unknown>): Record<string, unknown> {
  const o: Record<string, unknown> = {};
  m.forEach((v, k) => {
    o[k] = v instanceof Y.AbstractType ? v.toJSON() : clone(v);
  });
  return o;
}

/** The document as a plain, unvalidated object in file layout. */
export function docToRaw(doc: Y.Doc): Record<string, unknown> {
  const m = docMaps(doc);
  const parts: unknown[] = [];
  m.parts.forEach((p, id) => parts.push({ ...(p instanceof Y.Map ? mapToObject(p) : {}), id }));
  const zones: unknown[] = [];
  m.zones.forEach((z, id) => zones.push({ ...(z instanceof Y.Map ? mapToObject(z) : {}), id }));
  const materials: unknown[] = [];
  m.materials.forEach((v) => materials.push(clone(v)));
  const cuts: unknown[] = [];
  m.cuts.forEach((v) => cuts.push(clone(v)));
  const raw: Record<string, unknown> = { format: FORMAT_TAG, version: FORMAT_VERSION, parts, zones, materials, cuts };
  for (const key of ['name', 'description', 'analysis']) if (m.section.has(key)) raw[key] = clone(m.section.get(key));
  return raw;
}

/** Read and validate the document. */
export function readSection(doc: Y.Doc): Validation {
  return validateSection(docToRaw(doc));
}

function writeRecord(target: Y.Map<unknown>, record: Record<string, unknown>) {
  for (const [k, v] of Object.entries(record)) if (k !== 'id' && v !== undefined) target.set(k, clone(v));
}

/** Replace the whole document with a snapshot, as one transaction. */
export function writeSnapshot(doc: Y.Doc, s: SectionSnapshot, origin: unknown = null): void {
  const m = docMaps(doc);
  doc.transact(() => {
    m.parts.clear();
    m.zones.clear();
    m.materials.clear();
    m.cuts.clear();
    m.section.set('name', s.name);
    m.section.set('description', s.description);
    m.section.set('analysis', clone(s.analysis));
    for (const p of s.parts) {
      const ym = new Y.Map<unknown>();
      writeRecord(ym, p);
      m.parts.set(p.id, ym);
    }
    for (const z of s.zones) {
      const ym = new Y.Map<unknown>();
      writeRecord(ym, z as unknown as Record<string, unknown>);
      m.zones.set(z.id, ym);
    }
    for (const mat of s.materials) m.materials.set(mat.id, clone(mat));
    for (const c of s.cuts) m.cuts.set(c.id, clone(c));
  }, origin);
}

export function docFromSnapshot(s: SectionSnapshot): Y.Doc {
  const doc = new Y.Doc();
  writeSnapshot(doc, s);
  return doc;
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/**
 * Write only what differs between two snapshots, inside the caller's transaction: changed fields of a
 * part or zone are set one by one (so concurrent edits to different fields merge), removed records
 * deleted, new ones added.
 */
export function writeDiff(doc: Y.Doc, before: SectionSnapshot, after: SectionSnapshot): void {
  const m = docMaps(doc);
  if (before === after) return;
  for (const key of ['name', 'description', 'analysis'] as const) if (before[key] !== after[key] && !same(before[key], after[key])) m.section.set(key, clone(after[key]));
  const records = <T extends { id: string }>(target: Y.Map<Y.Map<unknown>>, a: readonly T[], b: readonly T[]) => {
    const old = new Map(a.map((r) => [r.id, r]));
    const next = new Set(b.map((r) => r.id));
    for (const r of a) if (!next.has(r.id)) target.delete(r.id);
    for (const r of b) {
      const prev = old.get(r.id);
      if (prev === r) continue; // the same record object: nothing to write (edits share unchanged records)
      let ym = target.get(r.id);
      if (!prev || !(ym instanceof Y.Map)) {
        ym = new Y.Map<unknown>();
        writeRecord(ym, r as unknown as Record<string, unknown>);
        target.set(r.id, ym);
        continue;
      }
      const pr = prev as unknown as Record<string, unknown>, nr = r as unknown as Record<string, unknown>;
      for (const k of new Set([...Object.keys(pr), ...Object.keys(nr)])) {
        if (k === 'id') continue;
        if (nr[k] === undefined) ym.delete(k);
        else if (!same(pr[k], nr[k])) ym.set(k, clone(nr[k]));
      }
    }
  };
  records(m.parts, before.parts, after.parts);
  records(m.zones, before.zones, after.zones);
  const plain = <T extends { id: string }>(target: Y.Map<unknown>, a: readonly T[], b: readonly T[]) => {
    if (a === b) return;
    const next = new Map(b.map((r) => [r.id, r]));
    for (const r of a) if (!next.has(r.id)) target.delete(r.id);
    const old = new Map(a.map((r) => [r.id, r]));
    for (const r of b) if (!same(old.get(r.id), r)) target.set(r.id, clone(r));
  };
  plain(m.materials, before.materials, after.materials);
  plain(m.cuts, before.cuts, after.cuts);
}
