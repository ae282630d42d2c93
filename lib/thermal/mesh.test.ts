/**
 * Mesh rules: grid lines through surface singular points (two zones meeting on a solid surface, a
 * solid touching a zone at one corner) start from h0Point, and uneven grading of an interval is
 * mirror-symmetric (the property tests compare mirrored sections cell by cell).
 */
import { describe, expect, it } from 'vitest';
import { resolveSection } from '../section/resolve';
import { TEMPLATES } from '../section/templates';
import { MESH_LEVELS, buildMesh, gradeInterval, singularPoints } from './mesh';

describe('surface singular points', () => {
  const r = resolveSection(TEMPLATES.find((t) => t.name === 'slab-edge-break')!.build());
  const solids = r.solids.map((s) => ({ polygon: s.polygon, ground: s.materialId.startsWith('soil') }));
  const zones = r.zones.map((z) => ({ polygon: z.polygon }));
  const all = [...r.solids.map((s) => s.polygon), ...r.zones.map((z) => z.polygon)].flat();
  const pts = singularPoints(solids, zones, all.map((p) => p[0]), all.map((p) => p[1]), -1e9, 1e9, -1e9, 1e9);
  const has = (x: number, y: number) => pts.some(([a, b]) => Math.abs(a - x) < 1e-9 && Math.abs(b - y) < 1e-9);

  it('finds the grade / outdoor junction on the stem wall and the stem wall corner touching the room at one point', () => {
    expect(has(0, 0.02)).toBe(true); // ground-surface zone meets outdoor air on the concrete face
    expect(has(0.2, 0.2)).toBe(true); // concrete corner between sill gasket, slab-edge XPS and the room
    expect(has(0.2, -0.1)).toBe(false); // bottom of the slab-edge break: solids only
    expect(has(4.2, 0.2)).toBe(false);
  });

  it('grades the lines through them from h0Point', () => {
    const spec = MESH_LEVELS.default;
    const m = buildMesh(solids, zones, spec);
    const stepAt = (lines: Float64Array, v: number) => {
      const i = lines.findIndex((x) => Math.abs(x - v) < 1e-9);
      return Math.min(lines[i + 1] - lines[i], lines[i] - lines[i - 1]);
    };
    expect(stepAt(m.xs, 0.2)).toBeCloseTo(spec.h0Point!, 4);
    expect(stepAt(m.ys, 0.02)).toBeLessThan(spec.h0);
    // A line through no singular point keeps h0 (within the fit of its interval).
    expect(stepAt(m.ys, -0.1)).toBeGreaterThan(0.9 * spec.h0);
  });
});

describe('uneven grading', () => {
  it('is mirror-symmetric and fills the interval', () => {
    const a = gradeInterval(0.37, 0.001, 1.3, 0.05, true, true, 0.004);
    const b = gradeInterval(0.37, 0.004, 1.3, 0.05, true, true, 0.001);
    expect(a.reduce((s, v) => s + v, 0)).toBeCloseTo(0.37, 12);
    expect(a.length).toBe(b.length);
    a.forEach((v, i) => expect(Math.abs(v - b[b.length - 1 - i])).toBeLessThan(1e-15));
    expect(a[0]).toBeLessThan(a[a.length - 1]);
    for (let i = 1; i < a.length; i++) expect(Math.max(a[i] / a[i - 1], a[i - 1] / a[i])).toBeLessThan(1.3 + 1e-9);
  });
});

describe('growth along y', () => {
  it('grades only the y-lines with growthY, and keeps them within that ratio', () => {
    const r = resolveSection(TEMPLATES.find((t) => t.name === 'basement-inside-framed')!.build());
    const solids = r.solids.map((s) => ({ polygon: s.polygon, ground: s.materialId.startsWith('soil') }));
    const zones = r.zones.map((z) => ({ polygon: z.polygon }));
    const base = { ...MESH_LEVELS.default, growthY: undefined };
    const a = buildMesh(solids, zones, base);
    const b = buildMesh(solids, zones, { ...base, growthY: 1.2 });
    expect(Array.from(b.xs)).toEqual(Array.from(a.xs));
    expect(b.ys.length).toBeGreaterThan(a.ys.length);
    // Neighbouring y-cells differ by at most the y growth wherever neither is capped at hmax or
    // hmaxGround, or fitted to a short interval (those end a graded run; allow the fit's slack).
    let steeper = 0;
    for (let j = 1; j + 1 < b.ys.length; j++) {
      const h1 = b.ys[j] - b.ys[j - 1], h2 = b.ys[j + 1] - b.ys[j];
      if (Math.max(h1 / h2, h2 / h1) > 1.3 - 1e-9) steeper++;
    }
    expect(steeper / b.ys.length).toBeLessThan(0.05);
  });
});
