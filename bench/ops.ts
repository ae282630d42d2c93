/**
 * npx tsx bench/ops.ts: the cost of one drag step's named operation in Node, figures only, never pass/fail.
 *
 * For the slab-edge template (9 parts) and the stress section of bench/ui.ts (200 parts): moveParts of
 * the footing by 1 cm, back and forth (the board runs one per pointer move while dragging), and beside
 * it the two ways to check the edited snapshot: validateSection (the whole section) and validateEdit
 * (only what the edit touched), with the ratio measured in the same run.
 */
import os from 'node:os';
import { docFromSnapshot } from '../lib/section/doc';
import { currentSection, moveParts } from '../lib/section/ops';
import type { SectionSnapshot } from '../lib/section/schema';
import { templateByName } from '../lib/section/templates/index';
import { validateEdit, validateSection } from '../lib/section/validate';
import { stressSection } from './ui';

const N = Number(process.argv.includes('--n') ? process.argv[process.argv.indexOf('--n') + 1] : 300);

function median(f: (i: number) => void): number {
  for (let i = 0; i < 30; i++) f(i);
  const ts: number[] = [];
  for (let i = 0; i < N; i++) {
    const t = performance.now();
    f(i);
    ts.push(performance.now() - t);
  }
  ts.sort((a, b) => a - b);
  return ts[N >> 1];
}

function moved(s: SectionSnapshot, dx: number): SectionSnapshot {
  const p = JSON.parse(JSON.stringify(s)) as SectionSnapshot;
  const f = p.parts.find((x) => x.id === 'footing')!;
  f.x = (f.x ?? 0) + dx;
  return p;
}

console.log(`bench ops: ${os.cpus().length} CPU(s) (${os.cpus()[0]?.model ?? '?'}), load average ${os.loadavg()[0].toFixed(2)}, median of ${N}`);
console.log('section | parts | moveParts ms | validateSection ms | validateEdit ms | ratio');
for (const [name, build] of [['slab-edge-break', () => templateByName('slab-edge-break')!.build()], ['stress-200-parts', () => stressSection(200)]] as const) {
  const doc = docFromSnapshot(build());
  const s = currentSection(doc);
  const move = median((i) => moveParts(doc, { who: 'bench' }, ['footing'], i % 2 ? -0.01 : 0.01, 0));
  const before = validateSection(s);
  if (!before.ok) throw new Error('invalid section');
  const a = moved(before.section, 0.01), b = moved(before.section, -0.01);
  const full = median((i) => validateSection(i % 2 ? a : b));
  const edit = median((i) => validateEdit(before.section, i % 2 ? a : b));
  console.log(`${name} | ${s.parts.length} | ${move.toFixed(2)} | ${full.toFixed(2)} | ${edit.toFixed(2)} | ${(full / edit).toFixed(1)}`);
  doc.destroy();
}
console.log(`load average at the end ${os.loadavg()[0].toFixed(2)}`);
