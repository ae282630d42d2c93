/** The pure section renderer and `dewline render` run as a real process (PNG through Debian's chromium). */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { templateByName } from '../section/templates';
import { resolveSection } from '../section/resolve';
import { solveSectionSync } from '../thermal/section';
import { isothermSegments, isothermValues, renderSectionSvg } from './svg';

const root = path.resolve(__dirname, '../..');
const bin = path.join(root, 'bin/dewline.mjs');
const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8' });
let dir: string;
beforeAll(() => { dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-render-')); });
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const s = templateByName('slab-edge-break')!.build();
const r = solveSectionSync(s, { mesh: 'preview' });

describe('renderSectionSvg', () => {
  it('draws every solid, the field, isotherms, one mark per verdict surface, the legend and the caution', () => {
    const out = renderSectionSvg(s, r, { scale: 10 });
    const count = (re: RegExp) => (out.svg.match(re) ?? []).length;
    expect(out.svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(count(/data-part="/g)).toBe(resolveSection(s).solids.length);
    for (const p of ['footing', 'stem', 'slab', 'edge', 'plate', 'wall']) expect(out.svg).toContain(`data-part="${p}"`);
    expect(count(/data-state="/g)).toBe(r.surfaces.length);
    expect(out.svg).toContain('data-layer="field"');
    expect(count(/data-isotherm="/g)).toBeGreaterThan(3);
    expect(out.svg).toContain('dew point 9.3 °C');
    expect(out.svg).toContain('Screening aid');
    expect(out.range).toEqual({ lo: -18, hi: 20 });
    // 1:10 at 96 px per inch: a metre is 377.95 px.
    expect(out.width).toBe(Math.ceil(Math.max(600, (out.box.maxX - out.box.minX) * (96 / 0.0254) / 10 + 48)));
  });
  it('halves the drawing at 1:20 and leaves the overlay out on request', () => {
    const a = renderSectionSvg(s, r, { scale: 10, overlay: false }), b = renderSectionSvg(s, r, { scale: 20, overlay: false });
    expect(Math.abs((b.width - 48) * 2 - (a.width - 48))).toBeLessThanOrEqual(2);
    expect(Math.abs((b.height - 82) * 2 - (a.height - 82))).toBeLessThanOrEqual(2);
    expect(b.svg).not.toContain('data-layer="field"');
    expect(b.svg).not.toContain('data-state=');
    expect(b.range).toBeNull();
  });
  it('shows inch-pound dimensions when asked', () => {
    const out = renderSectionSvg(s, r, { units: 'ip' });
    // The 100 mm slab is 3.937 in, shown to the nearest 1/16 in (1 in = 25.4 mm exactly).
    expect(out.svg).toContain('>3-15/16&quot;</text>');
    expect(out.svg).not.toContain('>100 mm<');
  });
  it('isotherm segments lie where the field crosses the value', () => {
    const v = isothermValues(-18, 20, 5);
    expect(v).toEqual([-15, -10, -5, 0, 5, 10, 15]);
    const seg = isothermSegments(r.field, 0);
    expect(seg.length).toBeGreaterThan(0);
    expect(seg.length % 4).toBe(0);
  });
  it('refuses a bad scale', () => {
    expect(() => renderSectionSvg(s, r, { scale: 0 })).toThrow(/scale must be a positive number/);
  });
});

describe('dewline render', () => {
  it('writes SVG to stdout and a PNG file from the same drawing', () => {
    const file = path.join(dir, 'slab.json');
    fs.writeFileSync(file, run('template', 'slab-edge-break').stdout);
    const a = run('render', file, '--svg', '--mesh', 'preview');
    expect(a.status, a.stderr).toBe(0);
    expect(a.stdout).toMatch(/^<svg [^>]*width="(\d+)" height="(\d+)"/);
    const [, w, h] = /width="(\d+)" height="(\d+)"/.exec(a.stdout)!;
    const png = path.join(dir, 'slab.png');
    const b = run('render', file, '--png', '--out', png, '--mesh', 'preview');
    expect(b.status, b.stderr).toBe(0);
    const bytes = fs.readFileSync(png);
    // PNG signature and IHDR width/height (PNG specification, ISO/IEC 15948).
    expect(bytes.subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a');
    expect(bytes.readUInt32BE(16)).toBe(Number(w));
    expect(bytes.readUInt32BE(20)).toBe(Number(h));
    expect(b.stderr).toMatch(/wrote .*slab\.png/);
  }, 120_000);
  it('exits 2 on bad input with the reason on stderr and nothing on stdout', () => {
    const file = path.join(dir, 'slab2.json');
    fs.writeFileSync(file, run('template', 'slab-edge-break').stdout);
    for (const [args, re] of [
      [[file], /choose one of --svg or --png/],
      [[file, '--png'], /--png writes a binary file: give --out FILE/],
      [[file, '--svg', '--scale', 'abc'], /--scale: must be a drawing scale/],
      [[file, '--svg', '--bogus'], /unknown option '--bogus'/],
      [[path.join(dir, 'missing.json'), '--svg'], /missing\.json/],
    ] as [string[], RegExp][]) {
      const x = run('render', ...args);
      expect(x.status).toBe(2);
      expect(x.stdout).toBe('');
      expect(x.stderr).toMatch(re);
    }
  }, 60_000);
});

describe('glaserChartSvg', () => {
  it('draws both pressure lines, one cross per condensation interface and a band per layer', async () => {
    const { glaserForSection } = await import('../moisture/cut');
    const { glaserChartSvg } = await import('./glaser-chart');
    const c = templateByName('crawlspace-unvented')!.build();
    const rc = solveSectionSync(c, { mesh: 'preview' });
    const g = glaserForSection(c, rc).find((o) => o.check)!.check!;
    const svg = glaserChartSvg(g);
    expect(svg).toContain('data-line="psat"');
    expect(svg).toContain('data-line="p"');
    expect((svg.match(/data-condensation="/g) ?? []).length).toBe(g.condensation.length);
    expect(g.condensation.length).toBeGreaterThan(0);
    expect((svg.match(/<rect x="[\d.]+" y="30" /g) ?? []).length).toBe(g.layers.length);
    // The p line ends at the cold side's vapour pressure: its last point's y is the chart's y of p_e.
    const d = /d="([^"]+)" fill="none" stroke="#2166ac"/.exec(svg)![1];
    expect(d.split('L').length).toBe(g.points.length);
  });
});
