/**
 * Named versions on the client: read the section a stored version holds, and restore it as a new
 * change (a forward edit of only what differs, with the restorer's origin, so it is one undo step of
 * theirs and nobody's history is rewritten).
 */
import * as Y from 'yjs';
import { docToRaw, readSection, writeDiff } from '@/lib/section/doc';
import { formatProblem } from '@/lib/section/errors';
import type { SectionSnapshot } from '@/lib/section/schema';

function docOfUpdate(update: Uint8Array): Y.Doc {
  const d = new Y.Doc();
  try {
    Y.applyUpdate(d, update);
  } catch (err) {
    d.destroy();
    throw new Error(`the stored version is not a readable document (${(err as Error).message})`);
  }
  return d;
}

/** The section held by a version's document (a Yjs update); throws with the problems when invalid. */
export function sectionOfVersion(update: Uint8Array): SectionSnapshot {
  const d = docOfUpdate(update);
  const v = readSection(d);
  d.destroy();
  if (!v.ok) throw new Error(`the stored version does not hold a valid section: ${v.problems.map(formatProblem).join('; ')}`);
  return v.section;
}

/**
 * Makes `doc` hold the section of `update` by writing only the differences, in one transaction with
 * `origin`. The version must hold a valid section; the current document need not (a broken join
 * someone made is exactly what a restore is for): both are compared as their raw stored records.
 * Returns the number of records (parts, zones, materials, cuts, plus 1 for name, description or
 * analysis) that differed.
 */
export function restoreVersion(doc: Y.Doc, update: Uint8Array, origin: unknown): number {
  sectionOfVersion(update);
  const d = docOfUpdate(update);
  const then = docToRaw(d) as unknown as SectionSnapshot;
  d.destroy();
  const now = docToRaw(doc) as unknown as SectionSnapshot;
  doc.transact(() => writeDiff(doc, now, then), origin);
  return countDifferences(now, then);
}

/** How many records (by id) differ between two sections, plus 1 if the name, description or analysis differ. */
export function countDifferences(a: SectionSnapshot, b: SectionSnapshot): number {
  let n = 0;
  const lists = (x: readonly { id: string }[] = [], y: readonly { id: string }[] = []) => {
    const ya = new Map(y.map((r) => [r.id, JSON.stringify(r)]));
    const seen = new Set<string>();
    for (const r of x) {
      seen.add(r.id);
      if (ya.get(r.id) !== JSON.stringify(r)) n++;
    }
    for (const r of y) if (!seen.has(r.id)) n++;
  };
  lists(a.parts, b.parts);
  lists(a.zones, b.zones);
  lists(a.materials, b.materials);
  lists(a.cuts, b.cuts);
  if (a.name !== b.name || a.description !== b.description || JSON.stringify(a.analysis) !== JSON.stringify(b.analysis)) n++;
  return n;
}
