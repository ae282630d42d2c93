/**
 * ISO 10211 Annex A reference cases (2-D). A conforming method is within 0.1 K of the reference
 * temperatures and, for case 2, within 0.1 W/m of the heat flow (ISO 10211 Annex A).
 * Both run on explicit fine meshes (not a built-in mesh level) so the check does not move when
 * the mesh defaults change.
 */
import type { Point } from '../section/geometry';
import type { SectionSnapshot } from '../section/schema';
import type { MeshSpec } from '../thermal/mesh';
import { solveSectionSync } from '../thermal/section';
import { buildSection, rect } from './build';
import type { ValidationRow } from './row';
import { absRow } from './row';

/** ISO 10211 Annex A case 1: exact solution by Fourier series (sum over odd sine modes). */
export function case1Exact(x: number, y: number, terms = 400): number {
  // T(x, y) = sum 40/k_n sin(k_n x) sinh(k_n y) / sinh(2 k_n), k_n = (2n + 1) pi / 2: T = 20 at y = 2,
  // 0 at x = 0 and y = 0, dT/dx = 0 at x = 1.
  let t = 0;
  for (let n = 0; n < terms; n++) {
    const k = ((2 * n + 1) * Math.PI) / 2;
    // sinh(k y) / sinh(2 k) without overflow.
    const ratio = Math.exp(k * (y - 2)) * (1 - Math.exp(-2 * k * y)) / (1 - Math.exp(-4 * k));
    t += (40 / k) * Math.sin(k * x) * ratio;
  }
  return t;
}

export const CASE1_MESH: MeshSpec = { h0: 0.005, growth: 1.15, hmax: 0.025, hmaxGround: 0.025 };
export const CASE2_MESH: MeshSpec = { h0: 0.0005, growth: 1.15, hmax: 0.01, hmaxGround: 0.01 };

export function case1Section(): SectionSnapshot {
  return buildSection(
    [{ id: 'unit', lambda: 1 }],
    [{ material: 'unit', points: rect(0, 0, 1, 2) }],
    [
      { id: 'top', kind: 'fixed', rect: [0, 2, 1, 2.1], t: 20, rs: 0 },
      { id: 'left', kind: 'fixed', rect: [-0.1, 0, 0, 2], t: 0, rs: 0 },
      { id: 'bottom', kind: 'fixed', rect: [0, -0.1, 1, 0], t: 0, rs: 0 },
    ],
  );
}

/** The 28 points of the standard's table: a 0.25 m grid, rows from the top (y = 1.75) down. */
export function case1Points(): { at: Point }[] {
  const out: { at: Point }[] = [];
  for (let j = 7; j >= 1; j--) for (let i = 1; i <= 4; i++) out.push({ at: [0.25 * i, 0.25 * j] });
  return out;
}

/** Top row of the standard's table, 0.25 m below the top edge (ISO 10211 Annex A, recalled from memory). */
export const CASE1_TOP_ROW_RECALLED = [9.7, 13.4, 14.7, 15.1];

const mm = (v: number) => v / 1000;
const P = (pts: number[][]): Point[] => pts.map(([x, y]) => [mm(x), mm(y)] as Point);

export function case2Section(): SectionSnapshot {
  return buildSection(
    [{ id: 'concrete', lambda: 1.15 }, { id: 'aluminium', lambda: 230 }, { id: 'wood', lambda: 0.12 }, { id: 'insulation', lambda: 0.029 }],
    [
      { material: 'insulation', points: P([[0, 1.5], [500, 1.5], [500, 41.5], [0, 41.5]]) },
      { material: 'concrete', points: P([[0, 41.5], [500, 41.5], [500, 47.5], [0, 47.5]]) },
      { material: 'wood', points: P([[0, 36.5], [15, 36.5], [15, 41.5], [0, 41.5]]) },
      { material: 'aluminium', points: P([[0, 0], [500, 0], [500, 1.5], [1.5, 1.5], [1.5, 35], [15, 35], [15, 36.5], [0, 36.5]]) },
    ],
    [
      { id: 'outside', kind: 'outdoor', rect: [0, mm(47.5), mm(500), mm(60)], t: 0, rs: 0.06 },
      { id: 'inside', kind: 'indoor', rect: [0, -mm(10), mm(500), 0], t: 20, rs: 0.11 },
    ],
  );
}

/** Points A to I and their reference temperatures (ISO 10211 Annex A case 2, as given in DESIGN.md section 5). */
export function case2Points(): { name: string; at: Point; ref: number }[] {
  const raw: [string, number, number, number][] = [
    ['A', 0, 47.5, 7.1], ['B', 500, 47.5, 0.8], ['C', 0, 41.5, 7.9], ['D', 15, 41.5, 6.3], ['E', 500, 41.5, 0.8],
    ['F', 0, 36.5, 16.4], ['G', 15, 36.5, 16.3], ['H', 0, 0, 16.8], ['I', 500, 0, 18.3],
  ];
  return raw.map(([name, x, y, ref]) => ({ name, at: [mm(x), mm(y)] as Point, ref }));
}

export const CASE2_PHI = 9.5;

const C1 = 'ISO 10211 Annex A case 1';
const C2 = 'ISO 10211 Annex A case 2';

/** Case 1: the 28 points against the Fourier series, plus the energy balance. */
export function case1Rows(): ValidationRow[] {
  const pts = case1Points();
  const r = solveSectionSync(case1Section(), { mesh: CASE1_MESH, probes: pts.map((p) => p.at) });
  const rows = pts.map((p, i) => absRow(C1, `T(${p.at[0].toFixed(2)}, ${p.at[1].toFixed(2)})`, 'Fourier series of the Laplace equation (exact); tolerance ISO 10211 Annex A', case1Exact(p.at[0], p.at[1]), r.probes[i].heat!, 0.1, 'C'));
  CASE1_TOP_ROW_RECALLED.forEach((v, k) => {
    const i = pts.findIndex((p) => p.at[1] === 1.75 && p.at[0] === 0.25 * (k + 1));
    rows.push(absRow(C1, `T(${(0.25 * (k + 1)).toFixed(2)}, 1.75), tabulated`, 'ISO 10211 Annex A table (recalled from memory)', v, r.probes[i].heat!, 0.1, 'C'));
  });
  rows.push(absRow(C1, 'energy balance', 'ISO 10211 (sum of flows / half the sum of their absolute values)', 0, r.energyBalance, 1e-4, ''));
  return rows;
}

/** Case 2: heat flow, points A to I, energy balance. */
export function case2Rows(): ValidationRow[] {
  const pts = case2Points();
  const r = solveSectionSync(case2Section(), { mesh: CASE2_MESH, probes: pts.map((p) => p.at) });
  const phi = r.zones.find((z) => z.id === 'inside')!.phi;
  return [
    absRow(C2, 'Phi, inside', 'ISO 10211 Annex A case 2', CASE2_PHI, phi, 0.1, 'W/m'),
    ...pts.map((p, k) => absRow(C2, `T at ${p.name} (${p.at[0] * 1000}, ${p.at[1] * 1000}) mm`, 'ISO 10211 Annex A case 2', p.ref, r.probes[k].heat!, 0.1, 'C')),
    absRow(C2, 'energy balance', 'ISO 10211 (sum of flows / half the sum of their absolute values)', 0, r.energyBalance, 1e-4, ''),
  ];
}
