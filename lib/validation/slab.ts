/**
 * ISO 13370 slab on ground, as a 2-D strip (an infinitely long building of floor width B', so the
 * characteristic dimension is B' itself). The ground model follows DESIGN.md section 4 (ISO 10211
 * and ISO 13370 extents, recalled from memory): ground lambda 2.0 W/(m K) (sand or gravel,
 * ISO 13370), the model runs 0.5 b inside to the symmetry plane in the middle of the floor, 2.5 b
 * beside the outer wall face and 2.5 b below the ground surface, every cut adiabatic.
 * B' is measured inside the walls. The wall is its footprint only: a strip of width w on the ground
 * surface with no heat exchange (its own edge loss is a thermal bridge, which ISO 13370 leaves to psi).
 * Floor insulation of resistance Rf lies on the ground under the room; the uninsulated floor has
 * the room air directly on the ground (Rf = 0).
 *
 * Reference (ISO 13370, slab on ground; recalled from memory, as in DESIGN.md section 5):
 *   d_t = w + lambda (Rsi + Rf + Rse), Rsi 0.17 (heat flowing down), Rse 0.04;
 *   U = 2 lambda / (pi B' + d_t) ln(pi B' / d_t + 1)  when d_t < B',
 *   U = lambda / (0.457 B' + d_t)                     otherwise.
 * Ours: U = L2D / (0.5 B'), L2D from the heat-flow run (ISO 6946 Rsi 0.17 on the floor, Rse 0.04).
 */
import type { SectionSnapshot } from '../section/schema';
import type { MeshSpec } from '../thermal/mesh';
import { solveSectionSync } from '../thermal/section';
import { buildSection, rect } from './build';
import type { ValidationRow } from './row';
import { relRow } from './row';

export interface SlabCase {
  /** B', m. */
  bPrime: number;
  /** Wall thickness w, m. */
  w: number;
  /** Floor insulation resistance Rf, m2K/W (0: uninsulated). */
  rf: number;
  /** Ground conductivity, W/(m K). */
  lambdaG: number;
}

/** Insulation conductivity used to build Rf as a layer (test value). */
export const SLAB_INSULATION_LAMBDA = 0.035;

export const SLAB_CASES: SlabCase[] = [
  { bPrime: 8, w: 0.3, rf: 0, lambdaG: 2.0 },
  { bPrime: 8, w: 0.3, rf: 2, lambdaG: 2.0 },
  { bPrime: 16, w: 0.3, rf: 0, lambdaG: 2.0 },
  { bPrime: 4, w: 0.3, rf: 2, lambdaG: 2.0 },
];

/**
 * Tolerance, relative: 4 %. The ISO 13370 expression is a fit to numerical solutions of this very
 * problem, not an exact solution, so a correct 2-D model lands near it, not on it. DESIGN.md records
 * 1 to 2.5 % for an 8 m strip with these extents; the finite extents (adiabatic cuts at 2.5 b) and
 * the wall footprint differ from the model behind the fit, and the discretisation adds a few tenths
 * of a per cent (default to fine mesh: below 0.3 %, measured in tests/validation/iso13370.test.ts).
 * Measured here from B' = 4 to 16 m, both branches of the formula: +1.2 to +3.6 %, always above.
 * Where the gap comes from (B' = 8 m, measured with ground cells up to 1 m): widening the ground to
 * 5 b and 10 b raises U further, to +2.9 / +3.2 % (Rf 0) and +2.9 / +3.1 % (Rf 2) above the formula,
 * so the fit sits about 3 % below an unbounded 2-D ground with this wall footprint, and the
 * adiabatic cuts at 2.5 b take back 1.2 % (Rf 0) and 0.7 % (Rf 2) of it.
 */
export const SLAB_TOL = 0.04;

/** Mesh of the strip: fine in the floor layers, ground cells up to 0.25 m. */
export const SLAB_MESH: MeshSpec = { h0: 0.002, growth: 1.15, hmax: 0.025, hmaxGround: 0.25 };

/** ISO 13370 equivalent thickness and U of a slab on ground (computed here, independently of lib/thermal/psi). */
export function iso13370U(c: SlabCase, rsi = 0.17, rse = 0.04): { u: number; dt: number; branch: 'd_t < B\'' | 'd_t >= B\'' } {
  const dt = c.w + c.lambdaG * (rsi + c.rf + rse);
  if (dt < c.bPrime) return { u: ((2 * c.lambdaG) / (Math.PI * c.bPrime + dt)) * Math.log((Math.PI * c.bPrime) / dt + 1), dt, branch: 'd_t < B\'' };
  return { u: c.lambdaG / (0.457 * c.bPrime + dt), dt, branch: 'd_t >= B\'' };
}

export function slabSection(c: SlabCase): SectionSnapshot {
  const half = c.bPrime / 2, ext = 2.5 * c.bPrime;
  const d = c.rf * SLAB_INSULATION_LAMBDA;
  const solids = [{ material: 'ground', points: rect(0, -ext, half + c.w + ext, 0) }];
  if (d > 0) solids.push({ material: 'insulation', points: rect(0, 0, half, d) });
  return buildSection(
    [{ id: 'ground', lambda: c.lambdaG, pattern: 'earth' }, { id: 'insulation', lambda: SLAB_INSULATION_LAMBDA }],
    solids,
    [
      { id: 'in', kind: 'indoor', rect: [0, d, half, d + 0.5], t: 20 },
      { id: 'out', kind: 'ground-surface', rect: [half + c.w, 0, half + c.w + ext, 0.5], t: 0 },
    ],
    {
      ground: { characteristicDimension: c.bPrime, wallThickness: c.w, floorFrom: [half / 2, d + 0.01], floorTo: [half / 2, -0.01], groundLambda: c.lambdaG },
    },
  );
}

export function slabLabel(c: SlabCase): string {
  return `B' ${c.bPrime} m, w ${c.w} m, Rf ${c.rf} m2K/W, lambda ${c.lambdaG}`;
}

/** U of the strip from the 2-D solve: L2D / (0.5 B'). */
export function slabU2D(c: SlabCase, mesh: MeshSpec = SLAB_MESH): { u: number; l2d: number; balance: number; uFloorReported: number | null; cells: number } {
  const r = solveSectionSync(slabSection(c), { mesh, omitField: true });
  return { u: r.l2d! / (0.5 * c.bPrime), l2d: r.l2d!, balance: r.energyBalance, uFloorReported: r.psiGround?.uFloor ?? null, cells: r.mesh.cells };
}

export function slabRows(): ValidationRow[] {
  return SLAB_CASES.map((c) => {
    const ref = iso13370U(c);
    const ours = slabU2D(c);
    return relRow('ISO 13370 slab on ground (2-D strip)', `U floor, ${slabLabel(c)} (${ref.branch}, d_t ${ref.dt.toFixed(2)} m)`, 'ISO 13370 slab-on-ground formula (a fit; recalled from memory, DESIGN.md section 5); tolerance justified in lib/validation/slab.ts', ref.u, ours.u, SLAB_TOL, 'W/(m2 K)');
  });
}
