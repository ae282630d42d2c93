/**
 * psi and psi_g against hand calculations: flanking U by ISO 6946 series resistances along a
 * reference cut, lengths under the internal / overall internal / external conventions
 * (ISO 10211 and ISO 14683 definitions of psi = L2D - sum U_j l_j), and
 * psi_g = L2D - 0.5 B' U_floor - h_w U_wall with U_floor from ISO 13370 (DESIGN.md sections 4 and 5).
 */
import { describe, expect, it } from 'vitest';
import type { Point } from '../section/geometry';
import type { AnalysisSettings } from '../section/schema';
import { resolveSection } from '../section/resolve';
import { buildSection, rect } from '../validation/build';
import { iso13370BasementFloorU, iso13370BasementWallU, iso13370SlabU, layerStack } from './psi';
import { solveSectionSync } from './section';

type Convention = AnalysisSettings['convention'];

/**
 * An outside corner of two 0.2 m walls (lambda 1.0), legs 1.2 m long outside, 1.0 m inside; the
 * room in the quadrant x, y > 0.2, outdoors around the outer faces; the leg ends are adiabatic cuts.
 * The lower leg has the room above it (heat flows down through it: Rsi 0.17, ISO 6946).
 */
function corner(convention: Convention, lengths: { v: number; h: number }) {
  const ring = (pts: Point[]) => pts;
  return buildSection(
    [{ id: 'wall', lambda: 1.0 }],
    [{ material: 'wall', points: ring([[0, 0], [1.2, 0], [1.2, 0.2], [0.2, 0.2], [0.2, 1.2], [0, 1.2]]) }],
    [
      { id: 'room', kind: 'indoor', rect: [0.2, 0.2, 1.2, 1.2], t: 20 },
      { id: 'out', kind: 'outdoor', points: [[-0.1, -0.1], [1.2, -0.1], [1.2, 0], [0, 0], [0, 1.2], [-0.1, 1.2]], t: -10 },
    ],
    {
      convention,
      flanking: [
        { id: 'v', name: 'upright leg', from: [0.2, 1.0], to: [0, 1.0], length: lengths.v },
        { id: 'h', name: 'lower leg', from: [1.0, 0.2], to: [1.0, 0], length: lengths.h },
      ],
    },
  );
}

// Hand calculation (ISO 6946): U = 1 / (Rsi + d/lambda + Rse).
const U_V = 1 / (0.13 + 0.2 / 1.0 + 0.04); // horizontal heat flow: 1/0.37 = 2.7027 W/(m2 K)
const U_H = 1 / (0.17 + 0.2 / 1.0 + 0.04); // downward heat flow: 1/0.41 = 2.4390 W/(m2 K)

describe('psi: flanking elements and dimension conventions', () => {
  const internal = solveSectionSync(corner('internal', { v: 1.0, h: 1.0 }), { mesh: 'preview', omitField: true });
  const overall = solveSectionSync(corner('overall-internal', { v: 1.0, h: 1.0 }), { mesh: 'preview', omitField: true });
  const external = solveSectionSync(corner('external', { v: 1.2, h: 1.2 }), { mesh: 'preview', omitField: true });

  it('U of each flanking element by series resistances, Rsi by the direction of heat flow (ISO 6946, hand calculation)', () => {
    const [v, h] = internal.psi!.flanking;
    expect(v.layers).toHaveLength(1);
    expect(v.layers[0].thickness).toBeCloseTo(0.2, 12);
    expect(v.layers[0].r).toBeCloseTo(0.2, 12);
    expect(v.rsi).toBe(0.13);
    expect(v.rse).toBe(0.04);
    expect(v.u).toBeCloseTo(U_V, 12);
    expect(h.rsi).toBe(0.17);
    expect(h.u).toBeCloseTo(U_H, 12);
    expect(v.ul).toBeCloseTo(U_V * 1.0, 12);
  });

  it('psi = L2D - sum U_j l_j under each convention (ISO 10211 definition)', () => {
    for (const r of [internal, overall, external]) {
      const sum = r.psi!.flanking.reduce((s, c) => s + c.u * c.length, 0);
      expect(r.psi!.psi).toBeCloseTo(r.l2d! - sum, 12);
      expect(r.psi!.l2d).toBe(r.l2d);
    }
    expect(internal.psi!.convention).toBe('internal');
    expect(overall.psi!.convention).toBe('overall-internal');
    expect(external.psi!.convention).toBe('external');
  });

  it('external lengths are longer by the wall thickness on each leg: psi_e = psi_i - 0.2 (U_v + U_h) (hand calculation)', () => {
    expect(external.l2d).toBeCloseTo(internal.l2d!, 9); // the same section, so the same L2D
    expect(external.psi!.psi - internal.psi!.psi).toBeCloseTo(-0.2 * (U_V + U_H), 9);
    // An outside corner loses more than its internal lengths say and less than its external lengths say
    // (ISO 14683 tabulates positive internal and negative external psi for outside corners; recalled from memory).
    expect(internal.psi!.psi).toBeGreaterThan(0);
    expect(external.psi!.psi).toBeLessThan(0);
  });
});

describe('layerStack along a reference cut', () => {
  it('merges touching pieces of one material, keeps others apart and counts gaps', () => {
    const s = buildSection(
      [{ id: 'a', lambda: 0.5 }, { id: 'b', lambda: 0.04 }],
      [
        { material: 'a', points: rect(0, 0, 0.1, 1) },
        { material: 'a', points: rect(0.1, 0, 0.15, 1) },
        { material: 'b', points: rect(0.15, 0, 0.25, 1) },
        { material: 'a', points: rect(0.3, 0, 0.4, 1) },
      ],
      [{ id: 'in', kind: 'indoor', rect: [-0.1, 0, 0, 1], t: 20 }, { id: 'out', kind: 'outdoor', rect: [0.4, 0, 0.5, 1], t: 0 }],
    );
    const r = resolveSection(s);
    const mats = r.solids.map((x) => r.materials.get(x.materialId)!);
    const st = layerStack(r, mats, [0, 0.5], [0.4, 0.5]);
    expect(st.layers.map((l) => l.name)).toEqual(['a', 'b', 'a']);
    expect(st.layers[0].thickness).toBeCloseTo(0.15, 12);
    expect(st.layers[0].r).toBeCloseTo(0.15 / 0.5, 12);
    expect(st.layers[1].r).toBeCloseTo(0.1 / 0.04, 12);
    expect(st.gaps).toBe(1); // 0.25 to 0.3 is empty
  });
});

describe('psi_g at the ground (ISO 10211, ISO 13370)', () => {
  // Slab strip, B' = 8 m: 70 mm insulation (lambda 0.035, Rf = 2.0) on ground (lambda 2.0), a 0.3 m wall
  // (lambda 0.5) standing on the ground up to 2.0 m, room inside, outdoors beside the wall and over the ground.
  const s = buildSection(
    [{ id: 'ground', lambda: 2.0, pattern: 'earth' }, { id: 'ins', lambda: 0.035 }, { id: 'wall', lambda: 0.5 }],
    [
      { material: 'ground', points: rect(0, -20, 24.3, 0) },
      { material: 'ins', points: rect(0, 0, 4, 0.07) },
      { material: 'wall', points: rect(4, 0, 4.3, 2.0) },
    ],
    [
      { id: 'room', kind: 'indoor', rect: [0, 0.07, 4, 2.0], t: 20 },
      { id: 'out', kind: 'outdoor', rect: [4.3, 0, 24.3, 2.0], t: 0 },
    ],
    { ground: { characteristicDimension: 8, wallHeight: 1.93, floorFrom: [2, 0.07], floorTo: [2, -0.01], wallFrom: [4, 1.0], wallTo: [4.3, 1.0], wallThickness: 0.3, groundLambda: 2.0 } },
  );
  const r = solveSectionSync(s, { mesh: 'preview', omitField: true });
  const g = r.psiGround!;

  it('Rf from the floor cut leaves the ground out (ISO 13370)', () => {
    expect(g.floorCut.layers.map((l) => l.name)).toEqual(['ins']);
    expect(g.rf).toBeCloseTo(0.07 / 0.035, 12);
  });
  it('U_floor by ISO 13370: d_t = 0.3 + 2.0 (0.17 + 2.0 + 0.04) = 4.72 m < B\' (hand calculation)', () => {
    expect(g.dt).toBeCloseTo(4.72, 12);
    const u = ((2 * 2.0) / (Math.PI * 8 + 4.72)) * Math.log((Math.PI * 8) / 4.72 + 1);
    expect(g.uFloor).toBeCloseTo(u, 12);
    expect(g.uFloor).toBeCloseTo(0.24714, 5);
  });
  it('U_wall by series resistances: 1 / (0.13 + 0.3/0.5 + 0.04) (ISO 6946, hand calculation)', () => {
    expect(g.uWall!).toBeCloseTo(1 / 0.77, 12);
  });
  it('psi_g = L2D - 0.5 B\' U_floor - h_w U_wall', () => {
    expect(g.l2d).toBe(r.l2d);
    expect(g.psiG).toBeCloseTo(r.l2d! - 0.5 * 8 * g.uFloor - 1.93 / 0.77, 12);
  });
  it('ISO 13370 branch for a well-insulated floor: d_t >= B\' gives lambda / (0.457 B\' + d_t) (hand calculation)', () => {
    const x = iso13370SlabU(4, 0.3, 2.0, 2.0);
    expect(x.dt).toBeCloseTo(4.72, 12);
    expect(x.u).toBeCloseTo(2.0 / (0.457 * 4 + 4.72), 12);
    expect(x.formula).toMatch(/0\.457/);
  });
  it('without a wall cut, a wall height is reported and left out of psi_g', () => {
    const s2 = structuredClone(s);
    s2.analysis.ground!.wallFrom = null;
    s2.analysis.ground!.wallTo = null;
    const r2 = solveSectionSync(s2, { mesh: 'preview', omitField: true });
    expect(r2.psiGround!.uWall).toBeNull();
    expect(r2.psiGround!.psiG).toBeCloseTo(r2.l2d! - 0.5 * 8 * r2.psiGround!.uFloor, 12);
    expect(r2.warnings.join('\n')).toMatch(/wallHeight > 0 needs wallFrom and wallTo/);
  });
});

describe('psi_g of a heated basement (ISO 13370 heated-basement convention; formulas recalled from memory)', () => {
  it('U_bf and U_bw against hand calculation (formulas as recalled from ISO 13370, heated basements)', () => {
    // B' = 8, w = 0.3, lambda 2, Rf = 2: d_t = 0.3 + 2 (0.17 + 2 + 0.04) = 4.72; z = 2: d_t + 0.5 z = 5.72 < B'.
    const f = iso13370BasementFloorU(8, 0.3, 2.0, 2.0, 2.0);
    expect(f.dt).toBeCloseTo(4.72, 12);
    expect(f.u).toBeCloseTo(((2 * 2) / (Math.PI * 8 + 5.72)) * Math.log((Math.PI * 8) / 5.72 + 1), 12);
    expect(f.u).toBeCloseTo(0.21849, 4); // by hand: 4 / 30.853 * ln(5.3938) = 0.12965 * 1.6853
    // Rw = 3: d_w = 2 (0.13 + 3 + 0.04) = 6.34; U_bw = 2*2/(pi 2) (1 + 0.5*4.72/6.72) ln(2/6.34 + 1).
    const w = iso13370BasementWallU(2.0, 4.72, 2.0, 3.0);
    expect(w.dw).toBeCloseTo(6.34, 12);
    expect(w.u).toBeCloseTo((4 / (2 * Math.PI)) * (1 + 2.36 / 6.72) * Math.log(2 / 6.34 + 1), 12);
    expect(w.u).toBeCloseTo(0.23585, 4); // by hand: 0.63662 * 1.35119 * 0.27419
    // The well-insulated branch: d_t + 0.5 z >= B'.
    const g = iso13370BasementFloorU(4, 0.3, 2.0, 2.0, 2.0);
    expect(g.u).toBeCloseTo(2.0 / (0.457 * 4 + 5.72), 12);
  });

  it('z -> 0 tends to the slab formula: U_bf -> U_slab and z U_bw -> 0 (our derivation from the formulas)', () => {
    const slab = iso13370SlabU(8, 0.3, 2.0, 2.0).u;
    let prevGap = Infinity;
    for (const z of [0.1, 0.01, 0.001, 1e-5]) {
      const gap = Math.abs(iso13370BasementFloorU(8, 0.3, 2.0, 2.0, z).u - slab);
      expect(gap).toBeLessThan(prevGap);
      prevGap = gap;
    }
    expect(prevGap / slab).toBeLessThan(1e-5);
    const zu = (z: number) => z * iso13370BasementWallU(z, 4.72, 2.0, 3.0).u;
    // Small z: z U_bw ~ (2 lambda / pi)(1.5) z / d_w, linear in z.
    expect(zu(1e-4) / 1e-4).toBeCloseTo((2 * 2.0 / Math.PI) * 1.5 / 6.34, 3);
    expect(zu(1e-6)).toBeLessThan(1e-5);
  });

  // A plain heated basement built with the ISO 10211 ground extents (2.5 B' beside, 2.5 B' below the
  // floor, 0.5 B' inside; ISO 10211, recalled from memory): B' = 8, z = 2.0 m, a uniform 0.3 m wall
  // (lambda 0.1, Rw = 3) from below the floor to 1.0 m above grade, 70 mm floor insulation (Rf = 2) on
  // ground of lambda 2.0; no junction detail, so psi_g should be small.
  const z = 2.0;
  const s = buildSection(
    [{ id: 'ground', lambda: 2.0, pattern: 'earth' }, { id: 'ins', lambda: 0.035 }, { id: 'wall', lambda: 0.1 }],
    [
      { material: 'ground', points: rect(0, -z - 0.07 - 20, 4.3, -z - 0.07) },
      { material: 'ground', points: rect(4.3, -z - 0.07 - 20, 24.3, 0) },
      { material: 'ins', points: rect(0, -z - 0.07, 4, -z) },
      { material: 'wall', points: rect(4, -z - 0.07, 4.3, 1.0) },
    ],
    [
      { id: 'room', kind: 'indoor', rect: [0, -z, 4, 1.0], t: 20 },
      { id: 'out', kind: 'outdoor', rect: [4.3, 0, 24.3, 1.0], t: 0 },
    ],
    { ground: { characteristicDimension: 8, wallHeight: 1.0, floorFrom: [2, -z], floorTo: [2, -z - 0.1], wallFrom: [4, 0.5], wallTo: [4.3, 0.5], wallThickness: 0.3, groundLambda: 2.0, basementDepth: z, basementWallFrom: [4, -1], basementWallTo: [4.6, -1] } },
  );
  const r = solveSectionSync(s, { mesh: 'default', omitField: true });
  const g = r.psiGround!;

  it('the basement terms come from the cuts: Rw without the ground, U_wall by ISO 6946 (hand calculation)', () => {
    expect(g.basement).not.toBeNull();
    expect(g.basement!.wallCut.layers.map((l) => l.name)).toEqual(['wall']);
    expect(g.basement!.rw).toBeCloseTo(3, 9);
    expect(g.basement!.dw).toBeCloseTo(2.0 * (0.13 + 3 + 0.04), 9);
    expect(g.uWall!).toBeCloseTo(1 / (0.13 + 3 + 0.04), 9);
    expect(g.psiG).toBeCloseTo(r.l2d! - 0.5 * 8 * g.uFloor - z * g.basement!.uWall - 1.0 * g.uWall!, 12);
    expect(r.assumptions.find((a) => a.topic === 'psi_g')!.text).toMatch(/Heated-basement convention/);
  });

  it('a plain basement with a uniform wall gives |psi_g| within 5 % of L2D (the ISO 13370 formulas are a fit)', () => {
    // Tolerance: the ISO 13370 expressions are fitted to 2-D/3-D solutions (recalled from memory), so a
    // junction-free section leaves a residue of a few per cent of L2D; 5 % is our stated bound.
    console.log(`plain basement: L2D ${r.l2d!.toFixed(4)} W/(m K), psi_g ${g.psiG.toFixed(4)} W/(m K), ratio ${(g.psiG / r.l2d!).toFixed(4)}`);
    expect(Math.abs(g.psiG)).toBeLessThan(0.05 * r.l2d!);
  });

  it('files without basementDepth keep the slab convention; a half-given basement is refused naming the field', () => {
    const s2 = structuredClone(s) as unknown as { analysis: { ground: Record<string, unknown> } };
    delete s2.analysis.ground.basementDepth;
    delete s2.analysis.ground.basementWallFrom;
    delete s2.analysis.ground.basementWallTo;
    const r2 = solveSectionSync(s2 as unknown as typeof s, { mesh: 'preview', omitField: true });
    expect(r2.psiGround!.basement).toBeNull();
    expect(r2.assumptions.find((a) => a.topic === 'psi_g')!.text).toMatch(/Slab-on-ground convention/);
    expect(() => buildSection([{ id: 'a', lambda: 1 }], [{ material: 'a', points: rect(0, 0, 1, 1) }], [{ id: 'room', kind: 'indoor', rect: [-1, 0, 0, 1], t: 20 }], { ground: { characteristicDimension: 8, floorFrom: [0, 0], floorTo: [0, 1], wallThickness: 0.3, basementDepth: 2 } })).toThrow(/basementWallFrom is needed/);
    expect(() => buildSection([{ id: 'a', lambda: 1 }], [{ material: 'a', points: rect(0, 0, 1, 1) }], [{ id: 'room', kind: 'indoor', rect: [-1, 0, 0, 1], t: 20 }], { ground: { characteristicDimension: 8, floorFrom: [0, 0], floorTo: [0, 1], wallThickness: 0.3, basementDepth: -1, basementWallFrom: [0, 0], basementWallTo: [1, 0] } })).toThrow(/basementDepth must be greater than 0/);
  });
});
