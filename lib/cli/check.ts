/** `dewline check FILE`: validate a section file and summarise it. */
import { formatLength } from '../units';
import { formatProblem } from '../section/errors';
import { resolveSection } from '../section/resolve';
import type { SectionSnapshot } from '../section/schema';
import { parseSectionText } from '../section/validate';
import type { CliIO } from './io';
import { EXIT } from './io';

/** Read and validate a file; on failure print `FILE: path: reason` lines and return null. */
export function loadSectionFile(file: string, io: CliIO): SectionSnapshot | null {
  let text: string;
  try {
    text = io.readFile(file);
  } catch (e) {
    io.err(`${file}: cannot read the file: ${(e as Error).message}`);
    return null;
  }
  const v = parseSectionText(text);
  if (!v.ok) {
    for (const p of v.problems) io.err(`${file}: ${formatProblem(p)}`);
    return null;
  }
  if (v.migratedFrom !== null) io.err(`${file}: read format version ${v.migratedFrom} and migrated it to the current version`);
  return v.section;
}

export function summarise(s: SectionSnapshot): string {
  const r = resolveSection(s);
  const used = new Set(r.solids.map((x) => x.materialId));
  const lines = [
    `name: ${s.name}`,
    `parts: ${s.parts.length} (${count(s.parts.map((p) => p.kind))})`,
    `materials: ${used.size} in use (${s.materials.length} defined in the file)`,
    `zones: ${s.zones.length}${s.zones.length ? ` (${s.zones.map((z) => `${z.name || z.id}: ${z.kind}, ${z.design.t} C${z.design.rh !== null ? ` ${z.design.rh} %` : ''}`).join('; ')})` : ''}`,
    `extent: x ${fmt(r.bounds.minX)} to ${fmt(r.bounds.maxX)}, y ${fmt(r.bounds.minY)} to ${fmt(r.bounds.maxY)} (${formatLength(r.bounds.maxX - r.bounds.minX, 'si')} by ${formatLength(r.bounds.maxY - r.bounds.minY, 'si')})`,
    `cuts: ${s.cuts.length}`,
  ];
  return lines.join('\n');
}

const fmt = (m: number) => `${Number(m.toFixed(4))} m`;

function count(xs: string[]): string {
  const c = new Map<string, number>();
  for (const x of xs) c.set(x, (c.get(x) ?? 0) + 1);
  return [...c].map(([k, n]) => `${n} ${k}`).join(', ') || 'none';
}

export function checkCommand(args: string[], io: CliIO): number {
  const file = args.find((a) => !a.startsWith('-'));
  if (!file) {
    io.err('usage: dewline check FILE');
    return EXIT.badInput;
  }
  const s = loadSectionFile(file, io);
  if (!s) return EXIT.badInput;
  io.out(summarise(s));
  if (s.zones.length === 0) io.err(`${file}: warning: no zones, so nothing can be solved yet`);
  io.out(`${file}: valid`);
  return EXIT.ok;
}
