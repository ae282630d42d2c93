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
import type { PartRecord, SectionSnapshot, ZoneRecord } from './schema';
import { partSchema, sectionSchema, zoneSchema } from './schema';

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

/**
 * validateSection(proposed) for an edit of `before`, a snapshot validateSection returned, checking only
 * the parts and zones that differ from it. It gives the same answer as validateSection(proposed)
 * (lib/section/validate.test.ts compares the two on random edit sequences) because, when it takes the
 * short way:
 *   - everything but parts and zones is plainly equal to `before`, which passed;
 *   - parts and zones keep their ids and stacking keys index by index, so the sorted order, the paths,
 *     the id checks and every join target are those of `before`;
 *   - each record checks only itself against the material table (unchanged) and the ids (unchanged):
 *     an unchanged record passes as it did in `before` (a normalised record parses to itself), a
 *     changed one goes through the same schema, JSON round trip and checks as in validateSection;
 *   - join loops are looked for over all parts again.
 * Anything else, and any problem at all, goes to validateSection, so refusals read exactly the same.
 */
export function validateEdit(before: SectionSnapshot, proposed: unknown): Validation {
  return editedSection(before, proposed) ?? validateSection(proposed);
}

function editedSection(before: SectionSnapshot, proposed: unknown): Validation | null {
  if (!isPlainObject(proposed)) return null;
  const keys = Object.keys(before) as (keyof SectionSnapshot)[];
  if (Object.keys(proposed).length !== keys.length) return null;
  for (const k of keys) if (!Object.hasOwn(proposed, k) || (k !== 'parts' && k !== 'zones' && !plainEqual(proposed[k], before[k]))) return null;
  const parts = editedRecords(before.parts, proposed.parts, (v) => partSchema.safeParse(v));
  if (!parts) return null;
  const zones = editedRecords(before.zones, proposed.zones, (v) => zoneSchema.safeParse(v));
  if (!zones) return null;
  if (parts.changed.length) {
    const materials = materialTable(before);
    const ids = new Map(parts.records.map((p, i) => [p.id, i]));
    for (const i of parts.changed) if (partProblems(parts.records[i], `parts[${i}]`, materials, ids).length) return null;
    if (joinCycles(parts.records).length) return null;
  }
  for (const i of zones.changed) if (zoneProblems(zones.records[i], `zones[${i}]`).length) return null;
  if (!parts.changed.length && !zones.changed.length) return { ok: true, section: before, migratedFrom: null };
  return { ok: true, section: { ...before, parts: parts.records, zones: zones.records }, migratedFrom: null };
}

/** Records index by index with the same id and stacking key; unchanged ones are `before`'s own, changed ones parsed. */
function editedRecords<T extends { id: string; order: string }>(before: readonly T[], proposed: unknown, parse: (v: unknown) => { success: boolean; data?: unknown }): { records: T[]; changed: number[] } | null {
  if (!Array.isArray(proposed) || proposed.length !== before.length) return null;
  const records: T[] = new Array<T>(before.length);
  const changed: number[] = [];
  for (let i = 0; i < before.length; i++) {
    const r: unknown = proposed[i], b = before[i];
    if (!isPlainObject(r) || r.id !== b.id || r.order !== b.order) return null;
    if (plainEqual(r, b)) {
      records[i] = b;
      continue;
    }
    const parsed = parse(r);
    if (!parsed.success) return null;
    records[i] = JSON.parse(JSON.stringify(parsed.data)) as T;
    changed.push(i);
  }
  return { records: changed.length ? records : (before as T[]), changed };
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v) as unknown;
  return proto === Object.prototype || proto === null;
}

/** Equality of plain JSON values (strings, numbers by ===, booleans, null, arrays, plain objects); anything else (undefined, dates, functions) is unequal. */
export function plainEqual(a: unknown, b: unknown): boolean {
  if (typeof a === 'string' || typeof a === 'number' || typeof a === 'boolean' || a === null) return a === b;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!plainEqual(a[i], b[i])) return false;
    return true;
  }
  if (Array.isArray(b) || !isPlainObject(a) || !isPlainObject(b)) return false;
  const ka = Object.keys(a);
  if (ka.length !== Object.keys(b).length) return false;
  for (const k of ka) if (!Object.hasOwn(b, k) || !plainEqual(a[k], b[k])) return false;
  return true;
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
    // A part with a problem already reported on one of its fields (a repeated id) skips the geometry check.
    problems.push(...partProblems(p, at, materials, ids, problems.some((x) => x.path.startsWith(at + '.'))));
  });
  for (const cycle of joinCycles(s.parts)) problems.push({ path: `parts[${ids.get(cycle[0])}].join`, message: `joins form a loop: ${cycle.join(' -> ')}` });

  s.zones.forEach((z, i) => problems.push(...zoneProblems(z, `zones[${i}]`)));
  return problems;
}

/**
 * One part's own problems at path `at`: its materials, its join target (by id), its cross-parameter
 * rules and, when none of those failed and `blocked` is false, the shapes of its pieces. Reads nothing
 * of the section but the material table and the set of part ids.
 */
export function partProblems(p: PartRecord, at: string, materials: ReturnType<typeof materialTable>, ids: ReadonlyMap<string, number>, blocked = false): Problem[] {
  const problems: Problem[] = [];
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
  if (!blocked && !problems.length) {
    localPieces(p, { material: (id) => lookupMaterial(materials, id) }).forEach((piece, k) => {
      const why = polygonProblem(piece.polygon);
      if (why) problems.push({ path: at, message: `piece ${k} (${piece.role}): ${why}` });
    });
  }
  return problems;
}

/** One zone's own problems at path `at`: a closed, simple ring; a humidity for an indoor zone. */
export function zoneProblems(z: ZoneRecord, at: string): Problem[] {
  const problems: Problem[] = [];
  if (z.shape.type === 'ring') {
    const v = ringToVertices(z.shape.points);
    if (!v) problems.push({ path: `${at}.shape.points`, message: 'polygon is not closed: the last point must repeat the first' });
    else {
      const why = polygonProblem(v);
      if (why) problems.push({ path: `${at}.shape.points`, message: why });
    }
  }
  if (z.kind === 'indoor' && z.design.rh === null) problems.push({ path: `${at}.design.rh`, message: 'an indoor zone needs a relative humidity for the dew-point and mould checks' });
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
