/** `dewline solve` on every template, as a person runs it; the JSON equals solveSectionSync on the same file. */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { TEMPLATES } from '../../lib/section/templates';
import { solveSectionSync } from '../../lib/thermal/section';

const root = path.resolve(__dirname, '../..');
const run = (...args: string[]) => spawnSync(process.execPath, [path.join(root, 'bin/dewline.mjs'), ...args], { cwd: root, encoding: 'utf8', maxBuffer: 1 << 28 });
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-solve-'));

describe('dewline solve', () => {
  for (const t of TEMPLATES) {
    it(`solves ${t.name} as text and JSON, and the JSON equals the in-process solve`, () => {
      const file = path.join(dir, `${t.name}.json`);
      fs.writeFileSync(file, JSON.stringify(t.build()));
      const text = run('solve', file, '--mesh', 'preview');
      expect(text.status, text.stderr).toBe(0);
      expect(text.stdout).toMatch(/energy balance \(ISO 10211\): /);
      expect(text.stdout).toMatch(/verdict: (fine|mould risk|condensation)/);
      expect(text.stdout).toMatch(/Screening aid/);
      const json = run('solve', file, '--json', '--mesh', 'preview');
      expect(json.status, json.stderr).toBe(0);
      const r = JSON.parse(json.stdout);
      const ref = solveSectionSync(t.build(), { mesh: 'preview' });
      expect(r.energyBalance).toBeLessThan(1e-4);
      for (const z of ref.zones) expect(r.zones.find((x: { id: string }) => x.id === z.id).phi).toBeCloseTo(z.phi, 9);
      expect(r.coldest?.t).toBeCloseTo(ref.coldest!.t, 9);
    }, 120_000);
  }
  it('exits 2 for a bad mesh level and for a file with no zones', () => {
    const file = path.join(dir, 'nozones.json');
    const s = TEMPLATES[0].build();
    s.zones = [];
    fs.writeFileSync(file, JSON.stringify(s));
    expect(run('solve', file, '--mesh', 'huge').status).toBe(2);
    const r = run('solve', file);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/zones: the section has no zones/);
  });
});
