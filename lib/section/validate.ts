/**
 * Validation where input enters: a file's text, a parsed object, or a snapshot after an edit.
 * Structural checks come from the zod schema; the rest (references, joins, geometry, cross-parameter
 * rules) are checked here. Either a valid snapshot or every problem with its field path.
 */
import { libraryMaterial } from '../materials/library';
import type { Problem } from './errors';
import { SectionError, formatPath } from './errors';
import { polygonProblem, ringToVertices } from './geometry';
import { migrateToCurrent } from './migrate';
import { partKind } from './registry';
import { localPieces, lookupMaterial, materialTable, partParams } from './resolve';
import type { PartRecord, SectionSnapshot } from './schema';
import { sectionSchema } from './schema';

export type Validation = { ok: true; section: SectionSnapshot; migratedFrom: number | null } | { ok: false; problems: Problem[] };

/** Parse the text of a section file. */
export function parseSectionText(text: string): Validation {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    return { ok: false, problems: [{ path: '', message: `not JSON: ${(e as Error).message}` }] };
  }
  return validateSection(raw);
}

/** Validate any value as a section (migrating older versions). */
export function validateSection(raw: unknown): Validation {
  const migrated = migrateToCurrent(raw);
  if (!migrated.ok) return migrated;
  const parsed = sectionSchema.safeParse(migrated.doc);
  if (!parsed.success) {
    return { ok: false, problems: dedupe(parsed.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message }))) };
  }
  const section = normalise(parsed.data as unknown as SectionSnapshot);
  const problems = semanticProblems(section);
  if (problems.length) return { ok: false, problems };
  return { ok: true, section, migratedFrom: migrated.from === 1 ? null : migrated.from };
}

/** Like validateSection, but throws a SectionError. */
export function assertSection(raw: unknown): SectionSnapshot {
  const v = validateSection(raw);
  if (!v.ok) throw new SectionError(v.problems);
  return v.section;
}

function byOrder<T extends { order: string; id: string }>(a: T, b: T): number {
  return a.order < b.order ? -1 : a.order > b.order ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** Canonical form: parts and zones in stacking order, plain JSON values only (so -0 is 0, as in a file). */
export function normalise(s: SectionSnapshot): SectionSnapshot {
  const plain = JSON.parse(JSON.stringify(s)) as SectionSnapshot;
  return { ...plain, parts: plain.parts.sort(byOrder), zones: plain.zones.sort(byOrder) };
}

function dedupe(problems: Problem[]): Problem[] {
  const seen = new Set<string>();
  return problems.filter((p) => {
    const k = `${p.path}\u0000${p.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

/** Problems a schema cannot see. Paths index the snapshot's (sorted) arrays. */
export function semanticProblems(s: SectionSnapshot): Problem[] {
  const problems: Problem[] = [];
  const materials = materialTable(s);
  s.materials.forEach((m, i) => {
    if (libraryMaterial(m.id)) problems.push({ path: `materials[${i}].id`, message: `'${m.id}' is a library material; give your own material another id` });
  });
  uniqueIds(s.materials, 'materials', problems);
  uniqueIds([...s.parts.map((p) => ({ id: p.id })), ...s.zones.map((z) => ({ id: z.id }))], 'parts and zones', problems, (i) => (i < s.parts.length ? `parts[${i}].id` : `zones[${i - s.parts.length}].id`));
  uniqueIds(s.cuts, 'cuts', problems);
  uniqueIds(s.analysis.flanking, 'analysis.flanking', problems);

  const ids = new Map(s.parts.map((p, i) => [p.id, i]));
  s.parts.forEach((p, i) => {
    const at = `parts[${i}]`;
    const kind = partKind(p.kind)!;
    if (!lookupMaterial(materials, p.material)) problems.push({ path: `${at}.material`, message: `unknown material '${p.material}'` });
    for (const [key, spec] of Object.entries(kind.params))
      if (spec.type === 'material' && !lookupMaterial(materials, p[key] as string)) problems.push({ path: `${at}.${key}`, message: `unknown material '${String(p[key])}'` });
    if (p.join) {
      if (p.join.to === p.id) problems.push({ path: `${at}.join.to`, message: 'a part cannot be joined to itself' });
      else if (!ids.has(p.join.to)) problems.push({ path: `${at}.join.to`, message: `no part with id '${p.join.to}'` });
    } else {
      if (p.x === undefined) problems.push({ path: `${at}.x`, message: 'must be a number (m) when the part is not joined to another' });
      if (p.y === undefined) problems.push({ path: `${at}.y`, message: 'must be a number (m) when the part is not joined to another' });
    }
    const params = partParams(p);
    for (const issue of kind.check?.(params as never) ?? []) problems.push({ path: `${at}.${issue.param}`, message: issue.message });
    if (!problems.some((x) => x.path.startsWith(at + '.'))) {
      localPieces(p, { material: (id) => lookupMaterial(materials, id) }).forEach((piece, k) => {
        const why = polygonProblem(piece.polygon);
        if (why) problems.push({ path: at, message: `piece ${k} (${piece.role}): ${why}` });
      });
    }
  });
  for (const cycle of joinCycles(s.parts)) problems.push({ path: `parts[${ids.get(cycle[0])}].join`, message: `joins form a loop: ${cycle.join(' -> ')}` });

  s.zones.forEach((z, i) => {
    if (z.shape.type === 'ring') {
      const v = ringToVertices(z.shape.points);
      if (!v) problems.push({ path: `zones[${i}].shape.points`, message: 'polygon is not closed: the last point must repeat the first' });
      else {
        const why = polygonProblem(v);
        if (why) problems.push({ path: `zones[${i}].shape.points`, message: why });
      }
    }
    if (z.kind === 'indoor' && z.design.rh === null) problems.push({ path: `zones[${i}].design.rh`, message: 'an indoor zone needs a relative humidity for the dew-point and mould checks' });
  });
  return problems;
}

function uniqueIds(items: readonly { id: string }[], what: string, problems: Problem[], pathOf = (i: number) => `${what}[${i}].id`) {
  const seen = new Map<string, number>();
  items.forEach((x, i) => {
    if (seen.has(x.id)) problems.push({ path: pathOf(i), message: `id '${x.id}' is used twice in ${what}` });
    else seen.set(x.id, i);
  });
}

/** Each loop of joins once, as a list of part ids. */
export function joinCycles(parts: readonly PartRecord[]): string[][] {
  const next = new Map(parts.filter((p) => p.join && p.join.to !== p.id).map((p) => [p.id, p.join!.to]));
  const state = new Map<string, 1 | 2>();
  const cycles: string[][] = [];
  for (const start of next.keys()) {
    const path: string[] = [];
    let cur: string | undefined = start;
    while (cur !== undefined && !state.has(cur)) {
      state.set(cur, 1);
      path.push(cur);
      cur = next.get(cur);
    }
    if (cur !== undefined && state.get(cur) === 1) cycles.push([...path.slice(path.indexOf(cur)), cur]);
    for (const p of path) state.set(p, 2);
  }
  return cycles;
}
