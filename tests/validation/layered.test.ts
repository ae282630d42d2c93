/**
 * 1-D layered walls: the 2-D solver reproduces ISO 6946's U = 1/(Rsi + sum d/lambda + Rse) and the
 * surface temperatures of the series-resistance model to 1e-6 relative (ISO 6946; exact in 1-D),
 * with ISO 6946's Rsi by the direction of heat flow in the heat-flow run and ISO 13788's Rsi 0.25
 * in the surface-temperature run. Cases from lib/validation/layered.ts (also in `dewline validate`).
 */
import { describe, expect, it } from 'vitest';
import { solveSectionSync } from '../../lib/thermal/section';
import { ISO6946, LAYERED_MESH, LAYERED_STOP, LAYERED_TOL, STACKS, layeredRows, layeredSection, layeredU, layeredWallRows } from '../../lib/validation/layered';

describe('ISO 6946 layered walls through the 2-D solver', () => {
  const rows = layeredWallRows();
  it('covers 2 to 5 layers and conductivity contrasts up to 10^3', () => {
    const sizes = STACKS.map((s) => s.layers.length);
    expect(Math.min(...sizes)).toBe(2);
    expect(Math.max(...sizes)).toBe(5);
    const contrast = Math.max(...STACKS.map((s) => Math.max(...s.layers.map((l) => l.lambda)) / Math.min(...s.layers.map((l) => l.lambda))));
    expect(contrast).toBeGreaterThanOrEqual(1e3);
  });
  for (const r of rows)
    it(`${r.name} within ${r.tolerance} relative (${r.source})`, () => {
      expect(r.tolerance).toBe(LAYERED_TOL);
      expect(Number.isFinite(r.ours)).toBe(true);
      expect(Math.abs(r.ours - r.reference) / r.scale).toBeLessThanOrEqual(1e-6);
    });

  it('is exact on every built-in mesh level, not only the one in the table (1-D: harmonic face conductances are exact)', () => {
    const st = STACKS[2];
    for (const mesh of ['preview', 'default', 'fine'] as const) {
      const r = solveSectionSync(layeredSection(st, 'wall', 20, -10), { mesh, stop: LAYERED_STOP, omitField: true });
      const u = r.zones.find((z) => z.id === 'in')!.phi / 30;
      expect(Math.abs(u / layeredU(st, ISO6946.horizontal) - 1), mesh).toBeLessThan(1e-6);
    }
  });

  it('hand check of one U: 3-layer wall, Rsi 0.13, Rse 0.04 (ISO 6946)', () => {
    // 0.0125/0.25 + 0.1/0.035 + 0.2/2.0 = 0.05 + 2.857142857 + 0.1 = 3.007142857; + 0.17 -> U = 1/3.177142857
    expect(layeredU(STACKS[1], ISO6946.horizontal)).toBeCloseTo(1 / 3.177142857142857, 12);
  });

  it('the heat-flow run distinguishes the direction of heat flow: up 0.10, horizontal 0.13, down 0.17 (ISO 6946)', () => {
    const u = (o: 'wall' | 'floor' | 'ceiling') => layeredRows(STACKS[1], o, 20, -10, false)[0].ours;
    const up = u('ceiling'), flat = u('wall'), down = u('floor');
    expect(up).toBeGreaterThan(flat);
    expect(flat).toBeGreaterThan(down);
    // Back out Rsi from the solver's U: 1/U - R - Rse.
    const R = STACKS[1].layers.reduce((s, l) => s + l.d / l.lambda, 0);
    expect(1 / up - R - ISO6946.rse).toBeCloseTo(0.1, 9);
    expect(1 / flat - R - ISO6946.rse).toBeCloseTo(0.13, 9);
    expect(1 / down - R - ISO6946.rse).toBeCloseTo(0.17, 9);
  });

  it('reports the rules it used per zone and run (ISO 6946 heat flow, ISO 13788 surface)', () => {
    const r = solveSectionSync(layeredSection(STACKS[0], 'floor', 20, -10), { mesh: LAYERED_MESH, stop: LAYERED_STOP, omitField: true });
    const z = r.zones.find((x) => x.id === 'in')!;
    expect(z.rsHeat).toMatch(/0\.17 downward/);
    expect(z.rsHeat).toMatch(/from the zone into the construction/);
    expect(z.rsSurface).toMatch(/Rsi = 0\.25/);
    expect(r.zones.find((x) => x.id === 'out')!.rsHeat).toMatch(/Rse = 0\.04/);
  });
});
