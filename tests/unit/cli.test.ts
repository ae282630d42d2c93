/** The command line as a person runs it: real process, real files, exit codes and streams. */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '../..');
const bin = path.join(root, 'bin/dewline.mjs');
const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8' });
let dir: string;

beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-cli-'));
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function templateJson(name = 'slab-edge-break') {
  const r = run('template', name);
  expect(r.status).toBe(0);
  return JSON.parse(r.stdout);
}

function write(name: string, content: unknown) {
  const p = path.join(dir, name);
  fs.writeFileSync(p, typeof content === 'string' ? content : JSON.stringify(content));
  return p;
}

describe('dewline templates / template / check', () => {
  it('lists at least four templates, one per line: name then description, and each passes check', () => {
    const r = run('templates');
    expect(r.status).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines.length).toBeGreaterThanOrEqual(4);
    for (const line of lines) {
      const [name, ...desc] = line.split(/\s{2,}/);
      expect(name).toMatch(/^[a-z0-9-]+$/);
      expect(desc.join(' ').length).toBeGreaterThan(10);
      const file = write(`${name}.json`, run('template', name).stdout);
      const c = run('check', file);
      expect(c.status, c.stderr).toBe(0);
      expect(c.stdout).toMatch(/parts: \d+/);
      expect(c.stdout).toMatch(/zones: [1-9]/);
      expect(c.stdout).toMatch(/extent: x/);
    }
  });

  it('refuses an unknown template with exit 2 and a message on stderr', () => {
    const r = run('template', 'no-such-thing');
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/unknown template 'no-such-thing'/);
  });

  const broken: [string, (s: any) => unknown, RegExp][] = [
    ['negative thickness', (s) => { s.parts.find((p: any) => p.kind === 'slab').thickness = -0.02; return s; }, /parts\[\d+\]\.thickness: must be greater than 0, got -0\.02 m/],
    ['zero conductivity', (s) => { s.materials.push({ id: 'my-foam', name: 'My foam', lambda: 0, density: 30, source: { lambda: 'x', mu: 'x', density: 'x' } }); return s; }, /materials\[0\]\.lambda: must be greater than 0, got 0 W\/\(m K\)/],
    ['unknown material', (s) => { s.parts[2].material = 'unobtainium'; return s; }, /parts\[\d+\]\.material: unknown material 'unobtainium'/],
    ['unclosed polygon', (s) => { s.parts.push({ id: 'poly', kind: 'polygon', material: 'xps', order: 'z', x: 0, y: 0, points: [[0, 0], [1, 0], [1, 1]] }); return s; }, /parts\[\d+\]\.points: polygon is not closed/],
    ['self-crossing polygon', (s) => { s.parts.push({ id: 'poly', kind: 'polygon', material: 'xps', order: 'z', x: 0, y: 0, points: [[0, 0], [1, 1], [1, 0], [0, 1], [0, 0]] }); return s; }, /parts\[\d+\]\.points: edges \d+ and \d+ cross/],
    ['newer version', (s) => { s.version = 99; return s; }, /version: this file is format version 99, written by a newer Dewline/],
    ['wrong format tag', (s) => { s.format = 'something-else'; return s; }, /format: must be 'dewline-section'/],
    ['unknown part kind', (s) => { s.parts[0].kind = 'chimney'; return s; }, /parts\[0\]\.kind: unknown part kind 'chimney'/],
    ['join to a missing part', (s) => { s.parts.find((p: any) => p.id === 'stem').join.to = 'gone'; return s; }, /parts\[\d+\]\.join\.to: no part with id 'gone'/],
  ];
  for (const [what, mutate, message] of broken) {
    it(`exits 2 naming the file and field for ${what}`, () => {
      const file = write(`${what.replace(/\s/g, '-')}.json`, mutate(templateJson()));
      const r = run('check', file);
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toContain(file + ': ');
      expect(r.stderr).toMatch(message);
    });
  }

  it('exits 2 for a file that is not JSON', () => {
    const file = write('not-json.json', '{ "format": "dewline-section", ');
    const r = run('check', file);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/not-json\.json: not JSON/);
  });

  it('exits 2 for a missing file', () => {
    const r = run('check', path.join(dir, 'nope.json'));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/cannot read the file/);
  });

  it('migrates a version-0 file (humidity as a fraction, positions as at) and reports it', () => {
    const s = templateJson();
    s.version = 0;
    for (const p of s.parts) if (p.x !== undefined) { p.at = [p.x, p.y]; delete p.x; delete p.y; }
    for (const z of s.zones) for (const c of [z.design, z.month]) if (c.rh !== null) c.rh = c.rh / 100;
    const r = run('check', write('v0.json', s));
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/migrated/);
    expect(r.stdout).toMatch(/20 C 50 %/);
  });

  it('prints usage and exits 2 for an unknown command', () => {
    const r = run('frobnicate');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/unknown command 'frobnicate'/);
  });
});
