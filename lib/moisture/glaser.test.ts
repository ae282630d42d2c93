/**
 * The Glaser check (ISO 13788) on a 1-D wall computed by hand, on the monthly procedure, against
 * psychrolib for the saturation pressures, and on every template's default cut.
 */
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { pSat } from '../psychro';
import type { SectionSnapshot } from '../section/schema';
import { TEMPLATES } from '../section/templates';
import { validateSection } from '../section/validate';
import { solveSectionSync } from '../thermal/section';
import { glaserAlongCut, glaserForSection } from './cut';
import { DELTA0, EXAMPLE_MONTHS, G_PER_M2H, glaserLine, monthlyGlaser } from './glaser';

const require = createRequire(import.meta.url);
// psychrolib (npm): ASHRAE Handbook Fundamentals formulas.
const psychrolib = require('psychrolib');
psychrolib.SetUnitSystem(psychrolib.SI);

const src = { lambda: 'test value', mu: 'test value', density: 'test value' };
/** A 1 m high strip: 100 mm insulation (lambda 0.04, mu 1) then 20 mm board (lambda 0.2, mu 100); room left, outdoor right. */
function strip(): SectionSnapshot {
  const ring = (x0: number, x1: number) => [[x0, 0], [x1, 0], [x1, 1], [x0, 1], [x0, 0]];
  const v = validateSection({
    format: 'dewline-section',
    version: 1,
    name: 'Hand-check strip',
    materials: [
      { id: 'ins', name: 'Insulation', lambda: 0.04, mu: 1, density: 30, source: src },
      { id: 'brd', name: 'Board', lambda: 0.2, mu: 100, density: 600, source: src },
    ],
    parts: [
      { id: 'a', kind: 'polygon', material: 'ins', order: 'a', x: 0, y: 0, points: ring(0, 0.1) },
      { id: 'b', kind: 'polygon', material: 'brd', order: 'b', x: 0, y: 0, points: ring(0.1, 0.12) },
    ],
    zones: [
      { id: 'room', kind: 'indoor', name: 'Room', order: 'a', shape: { type: 'rect', x: -0.5, y: 0, width: 0.5, height: 1 }, design: { t: 20, rh: 50 }, month: { t: 20, rh: 50 } },
      { id: 'out', kind: 'outdoor', name: 'Outdoor', order: 'b', shape: { type: 'rect', x: 0.12, y: 0, width: 0.5, height: 1 }, rs: 0.04, design: { t: -5, rh: 80 }, month: { t: -5, rh: 80 } },
    ],
    cuts: [{ id: 'c', name: 'Across the strip', from: [0.4, 0.5], to: [-0.2, 0.5] }],
  });
  if (!v.ok) throw new Error(JSON.stringify(v.problems));
  return v.section;
}

describe('Glaser check on a 1-D wall computed by hand (ISO 13788 Glaser method; ISO 6946 series resistances)', () => {
  /*
   * Hand arithmetic (ISO 6946 for the temperatures, ISO 13788 for pressures and the vapour line):
   *   R_T = Rsi 0.25 + 0.100/0.04 (2.5) + 0.020/0.2 (0.1) + Rse 0.04 = 2.89 m2K/W
   *   q = (20 - (-5)) / 2.89 = 8.6505 W/m2
   *   theta_si = 20 - 0.25 q = 17.837 C; theta_AB = 20 - 2.75 q = -3.789 C; theta_se = 20 - 2.85 q = -4.654 C
   *   sd: insulation 1 x 0.100 = 0.1 m, board 100 x 0.020 = 2.0 m, total 2.1 m
   *   p_i = 0.5 p_sat(20) = 0.5 x 2336.95 = 1168.48 Pa; p_e = 0.8 p_sat(-5) = 0.8 x 401.18 = 320.94 Pa
   *   straight line at the A|B interface: 1168.48 - (1168.48 - 320.94) x 0.1/2.1 = 1128.1 Pa > p_sat(-3.789) = 444.78 Pa: condensation
   *   tangent construction through (0.1 m, 444.78 Pa):
   *   g = 2.0e-10 x ((1168.48 - 444.78)/0.1 - (444.78 - 320.94)/2.0) = 2.0e-10 x (7237.0 - 61.9) = 1.435e-6 kg/(m2 s) = 5.166 g/(m2 h)
   * The 2-D solver on a strip with adiabatic top and bottom is 1-D, and its cell-centred finite volumes
   * are exact for a 1-D layered stack, so the interface temperatures must agree to solver precision.
   */
  const s = strip();
  const r = solveSectionSync(s, { mesh: 'default' });
  const g = glaserAlongCut(s, r, s.cuts[0]);
  const q = 25 / 2.89;
  const at = (boundary: number) => g.points.find((p) => p.boundary === boundary)!;

  it('orients the stack warm side first and finds both layers with sd = mu d', () => {
    expect(g.warm.zoneId).toBe('room');
    expect(g.cold.zoneId).toBe('out');
    expect(g.layers.map((l) => l.name)).toEqual(['Insulation', 'Board']);
    expect(g.layers[0].thickness).toBeCloseTo(0.1, 9);
    expect(g.layers[1].thickness).toBeCloseTo(0.02, 9);
    expect(g.layers[0].sd).toBeCloseTo(0.1, 9);
    expect(g.layers[1].sd).toBeCloseTo(2.0, 9);
    expect(g.sdTotal).toBeCloseTo(2.1, 9);
    // ISO 13788 sub-layers of at most 0.25 m2K/W: the insulation (2.5) splits into 10, the board (0.1) stays one.
    expect(g.points.length).toBe(12);
  });

  it('reads the interface temperatures of the hand calculation from the 2-D field (within 1e-4 K)', () => {
    expect(at(0).t).toBeCloseTo(20 - 0.25 * q, 4);
    expect(at(1).t).toBeCloseTo(20 - 2.75 * q, 4);
    expect(at(2).t).toBeCloseTo(20 - 2.85 * q, 4);
    // A sub-layer point in the insulation: R from the room 0.25 + 0.5 x 2.5.
    const mid = g.points[5];
    expect(mid.s).toBeCloseTo(0.05, 9);
    expect(mid.t).toBeCloseTo(20 - 1.5 * q, 4);
  });

  it('finds condensation at the insulation | board interface at 5.166 g/(m2 h) (hand value above)', () => {
    expect(g.warm.p).toBeCloseTo(1168.48, 1);
    expect(g.cold.p).toBeCloseTo(320.94, 1);
    expect(g.condensation.length).toBe(1);
    expect(g.condensation[0].where).toBe('Insulation | Board');
    expect(g.condensation[0].t).toBeCloseTo(-3.789, 3);
    const hand = 2.0e-10 * ((1168.48 - 444.78) / 0.1 - (444.78 - 320.94) / 2.0) * 3600 * 1000;
    expect(Math.abs(g.condensation[0].rate - hand) / hand).toBeLessThan(1e-3);
    expect(g.rate).toBeCloseTo(g.condensation[0].rate, 12);
    // The line never exceeds saturation and meets it at the condensation interface.
    for (const p of g.points) expect(p.p).toBeLessThanOrEqual(p.pSat + 1e-9);
    expect(at(1).p).toBeCloseTo(at(1).pSat, 9);
  });

  it('has no condensation with the layers swapped (tight board on the warm side)', () => {
    const t = strip();
    t.zones[0].design = { t: 20, rh: 50 };
    // Mirror: the room on the right, so the board is now on the warm side.
    t.zones[0].shape = { type: 'rect', x: 0.12, y: 0, width: 0.5, height: 1 };
    t.zones[1].shape = { type: 'rect', x: -0.5, y: 0, width: 0.5, height: 1 };
    const g2 = glaserAlongCut(t, solveSectionSync(t, { mesh: 'default' }), t.cuts[0]);
    expect(g2.layers.map((l) => l.name)).toEqual(['Board', 'Insulation']);
    expect(g2.condensation).toEqual([]);
    for (const p of g2.points) expect(p.p).toBeLessThan(p.pSat);
  });

  it('saturation pressures at the interfaces agree with psychrolib (0.2 % above 0 C, 1.1 % below; DESIGN.md section 5)', () => {
    for (const p of g.points) {
      const ref = psychrolib.GetSatVapPres(p.t);
      expect(Math.abs(p.pSat / ref - 1)).toBeLessThan(p.t >= 0 ? 0.002 : 0.011);
    }
  });

  it('refuses a cut that ends inside a construction, with the part named', () => {
    expect(() => glaserAlongCut(s, r, { id: 'x', name: '', from: [-0.2, 0.5], to: [0.05, 0.5] })).toThrow(/ends inside a .*Insulation|ends inside a/);
  });
});

describe('cut ends in the ground, membranes and a variable-permeance retarder', () => {
  const ring = (x0: number, x1: number, y0 = 0, y1 = 1) => [[x0, y0], [x1, y0], [x1, y1], [x0, y1], [x0, y0]];
  /** Soil on the left (x -1..0), 200 mm concrete, a variable-permeance retarder (drawn 1 mm), 50 mm board, the room on the right. */
  function wallAgainstGround(): SectionSnapshot {
    const v = validateSection({
      format: 'dewline-section',
      version: 1,
      name: 'Wall against the ground',
      materials: [{ id: 'brd', name: 'Board', lambda: 0.035, mu: 30, density: 30, source: src }],
      parts: [
        { id: 'soil', kind: 'polygon', material: 'soil-sand-gravel', order: 'a', x: 0, y: 0, points: ring(-1, 0) },
        { id: 'wall', kind: 'polygon', material: 'concrete-2000', order: 'b', x: 0, y: 0, points: ring(0, 0.2) },
        { id: 'vr', kind: 'polygon', material: 'vapour-retarder-variable', order: 'c', x: 0, y: 0, points: ring(0.2, 0.201) },
        { id: 'brd', kind: 'polygon', material: 'brd', order: 'd', x: 0, y: 0, points: ring(0.201, 0.251) },
      ],
      zones: [
        { id: 'deep', kind: 'fixed', name: 'Deep ground', order: 'a', shape: { type: 'rect', x: -1.5, y: 0, width: 0.5, height: 1 }, rs: 0, design: { t: 5, rh: null }, month: { t: 5, rh: null } },
        { id: 'room', kind: 'indoor', name: 'Room', order: 'b', shape: { type: 'rect', x: 0.251, y: 0, width: 0.5, height: 1 }, design: { t: 20, rh: 60 }, month: { t: 20, rh: 60 } },
      ],
      cuts: [{ id: 'c', name: 'Through the wall', from: [-0.5, 0.5], to: [0.5, 0.5] }],
    });
    if (!v.ok) throw new Error(JSON.stringify(v.problems));
    return v.section;
  }
  const s = wallAgainstGround();
  const r = solveSectionSync(s, { mesh: 'default' });
  const g = glaserAlongCut(s, r, s.cuts[0]);
  it('starts at the face against the ground, saturated at its temperature, with the soil left out of the stack', () => {
    expect(g.warm.zoneId).toBe('room');
    expect(g.cold.kind).toBe('ground');
    expect(g.layers.map((l) => l.materialId)).toEqual(['brd', 'vapour-retarder-variable', 'concrete-2000']);
    const face = g.points[g.points.length - 1];
    expect(g.cold.t).toBeCloseTo(face.t, 12);
    expect(g.cold.p).toBeCloseTo(pSat(face.t), 9);
    // 1-D hand check of the face temperature (ISO 6946 series resistances; Rsi 0.25 of the surface run):
    // R = 0.25 + 0.05/0.035 + 0.001/0.4 + 0.2/1.35 + 1.0/2.0 (soil) and the fixed zone at 5 C with Rs 0.
    const R = [0.25, 0.05 / 0.035, 0.001 / 0.4, 0.2 / 1.35, 1.0 / 2.0];
    const q = 15 / R.reduce((a, b) => a + b, 0);
    expect(face.t).toBeCloseTo(5 + q * 0.5, 3);
  });
  it('takes the membrane by its own winter sd, whatever its drawn thickness', () => {
    const vr = g.layers[1];
    expect(vr.sd).toBe(4);
    expect(vr.sdFrom).toBe('winter sd (variable-permeance retarder)');
    expect(g.layers[0].sd).toBeCloseTo(30 * 0.05, 12);
    expect(g.layers[2].sd).toBeCloseTo(60 * 0.2, 12); // concrete-2000: mu 60 (ISO 10456 in the library)
  });
});

describe('glaserLine: the tangent construction', () => {
  it('is the straight line when nothing reaches saturation', () => {
    const l = glaserLine([0, 1, 3], [2000, 1500, 1000], 1000, 400);
    expect(l.p[1]).toBeCloseTo(1000 - 600 / 3, 9);
    expect(l.rate).toEqual([0, 0, 0]);
    expect(l.flowIn).toBeCloseTo((DELTA0 * 600) / 3, 20);
  });
  it('touches two interfaces when both are below the chord and gives each its own rate', () => {
    // (0, 1200) -> (1, 500) -> (2, 420) -> (4, 300): hand slopes 700, 80, 60 Pa/m (falling, so both points are on the line).
    const l = glaserLine([0, 1, 2, 4], [2000, 500, 420, 1000], 1200, 300);
    expect(l.p).toEqual([1200, 500, 420, 300]);
    expect(l.rate[1]).toBeCloseTo(DELTA0 * (700 - 80), 20);
    expect(l.rate[2]).toBeCloseTo(DELTA0 * (80 - 60), 20);
    // Raise the second point above the chord from the first to the end (500 - 200/3 = 433.3 Pa at sd 2): it drops off.
    const l2 = glaserLine([0, 1, 2, 4], [2000, 500, 450, 1000], 1200, 300);
    expect(l2.p[2]).toBeCloseTo(500 - 200 / 3, 9);
    expect(l2.rate[2]).toBe(0);
  });
});

describe('ISO 13788 monthly calculation', () => {
  const sd = [0, 0.1, 2.1];
  const f = [1 - 0.25 / 2.89, 1 - 2.75 / 2.89, 1 - 2.85 / 2.89];
  const cold = { month: 'C', days: 30, ti: 20, rhi: 0.5, te: -5, rhe: 0.8 };
  const warm = { month: 'W', days: 30, ti: 20, rhi: 0.5, te: 18, rhe: 0.7 };
  it('accumulates the design rate times the month in a cold month, then dries in warm months', () => {
    const res = monthlyGlaser(sd, f, [cold, warm, warm, warm]);
    expect(res.start).toBe(0);
    const rate = glaserLine(sd, f.map((x) => pSat(-5 + x * 25)), 0.5 * pSat(20), 0.8 * pSat(-5)).rate[1];
    expect(res.months[0].held[1]).toBeCloseTo(rate * 30 * 86400, 12);
    // Warm month: the wet interface sits at p_sat(theta_AB); evaporation = delta0 ((p_i - p_s)/0.1 - (p_s - p_e)/2.0) < 0.
    const tAB = 18 + f[1] * 2;
    const ps = pSat(tAB);
    const evap = DELTA0 * ((0.5 * pSat(20) - ps) / 0.1 - (ps - 0.7 * pSat(18)) / 2.0);
    expect(evap).toBeLessThan(0);
    expect(res.months[1].rate[1]).toBeCloseTo(evap * G_PER_M2H, 9);
    expect(res.months[1].held[1]).toBeCloseTo(Math.max(0, res.months[0].held[1] + evap * 30 * 86400), 12);
    expect(res.maxMonth).toBe('C');
    expect(res.driesOut).toBe(true);
  });
  it('reports no condensation for a year of warm months', () => {
    const res = monthlyGlaser(sd, f, [warm, warm]);
    expect(res.start).toBe(-1);
    expect(res.maxHeld).toBe(0);
  });
});

describe('every template has a default cut the Glaser check can take', () => {
  for (const t of TEMPLATES) {
    it(t.name, () => {
      const s = t.build();
      const r = solveSectionSync(s, { mesh: 'preview' });
      const out = glaserForSection(s, r, { months: EXAMPLE_MONTHS });
      const ok = out.filter((o) => o.check);
      expect(ok.length).toBeGreaterThanOrEqual(1);
      for (const o of out) if (!o.check) expect(o.problem).toMatch(/cut '/);
      for (const { check: g } of ok) {
        expect(g!.layers.length).toBeGreaterThanOrEqual(1);
        expect(g!.warm.t).toBeGreaterThan(g!.cold.t);
        for (let k = 1; k < g!.points.length; k++) expect(g!.points[k].sd).toBeGreaterThanOrEqual(g!.points[k - 1].sd);
        for (const p of g!.points) {
          expect(Number.isFinite(p.t)).toBe(true);
          expect(p.p).toBeLessThanOrEqual(p.pSat + 1e-9);
          expect(p.rate).toBeGreaterThanOrEqual(0);
        }
        expect(g!.monthly!.months.length).toBe(12);
      }
    });
  }
});
