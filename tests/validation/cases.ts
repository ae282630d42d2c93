/** The validation cases, shared by the tests and by `dewline validate`. Each names its source. */
import type { Point } from '../../lib/section/geometry';
import type { SectionSnapshot } from '../../lib/section/schema';
import type { MeshSpec } from '../../lib/thermal/mesh';
import { buildSection, rect } from './helpers';

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

export function case1Points(): { at: Point }[] {
  const out: { at: Point }[] = [];
  for (let j = 7; j >= 1; j--) for (let i = 1; i <= 4; i++) out.push({ at: [0.25 * i, 0.25 * j] });
  return out;
}

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

export function case2Points(): { name: string; at: Point; ref: number }[] {
  const raw: [string, number, number, number][] = [
    ['A', 0, 47.5, 7.1], ['B', 500, 47.5, 0.8], ['C', 0, 41.5, 7.9], ['D', 15, 41.5, 6.3], ['E', 500, 41.5, 0.8],
    ['F', 0, 36.5, 16.4], ['G', 15, 36.5, 16.3], ['H', 0, 0, 16.8], ['I', 500, 0, 18.3],
  ];
  return raw.map(([name, x, y, ref]) => ({ name, at: [mm(x), mm(y)] as Point, ref }));
}

/** ISO 6946 layered wall: U = 1 / (Rsi + sum d/lambda + Rse). */
export const WALL_LAYERS = [
  { id: 'gypsum', d: 0.0125, lambda: 0.25 },
  { id: 'insulation', d: 0.1, lambda: 0.035 },
  { id: 'concrete', d: 0.2, lambda: 2.0 },
];

/**
 * A wall 1 m high, indoor zone on the left (x < 0), outdoor on the right; orientation 'wall'
 * (horizontal heat flow), 'floor' (indoor above, heat flows down) or 'ceiling' (indoor below, heat flows up).
 */
export function layeredSection(orientation: 'wall' | 'floor' | 'ceiling', ti = 20, te = -10): SectionSnapshot {
  const total = WALL_LAYERS.reduce((s, l) => s + l.d, 0);
  const solids: { material: string; points: Point[] }[] = [];
  let s = 0;
  for (const l of WALL_LAYERS) {
    // Position across the wall, from the indoor side.
    const a = s, b = s + l.d;
    s = b;
    if (orientation === 'wall') solids.push({ material: l.id, points: rect(a, 0, b, 1) });
    else if (orientation === 'floor') solids.push({ material: l.id, points: rect(0, -b, 1, -a) });
    else solids.push({ material: l.id, points: rect(0, a, 1, b) });
  }
  const zones = orientation === 'wall'
    ? [{ id: 'in', kind: 'indoor' as const, rect: [-0.1, 0, 0, 1] as [number, number, number, number], t: ti }, { id: 'out', kind: 'outdoor' as const, rect: [total, 0, total + 0.1, 1] as [number, number, number, number], t: te }]
    : orientation === 'floor'
      ? [{ id: 'in', kind: 'indoor' as const, rect: [0, 0, 1, 0.1] as [number, number, number, number], t: ti }, { id: 'out', kind: 'outdoor' as const, rect: [0, -total - 0.1, 1, -total] as [number, number, number, number], t: te }]
      : [{ id: 'in', kind: 'indoor' as const, rect: [0, -0.1, 1, 0] as [number, number, number, number], t: ti }, { id: 'out', kind: 'outdoor' as const, rect: [0, total, 1, total + 0.1] as [number, number, number, number], t: te }];
  return buildSection(WALL_LAYERS.map((l) => ({ id: l.id, lambda: l.lambda })), solids, zones);
}

/**
 * ISO 13370 slab strip: B' = 8 m, so 4 m of floor inside a 0.3 m wall (symmetry plane at x = 0),
 * ground 20 m beside and below (2.5 b, ISO 10211 ground model). Floor: 0.1 m concrete on 0.05 m
 * insulation on the ground; the wall stands on the ground, its top cut adiabatic.
 */
export const SLAB = { bPrime: 8, w: 0.3, lambdaG: 2.0, concrete: { d: 0.1, lambda: 2.0 }, insulation: { d: 0.05, lambda: 0.035 } };

export function slabSection(): SectionSnapshot {
  const half = SLAB.bPrime / 2, w = SLAB.w;
  const tf = SLAB.concrete.d + SLAB.insulation.d;
  return buildSection(
    [{ id: 'ground', lambda: SLAB.lambdaG, pattern: 'earth' }, { id: 'concrete', lambda: SLAB.concrete.lambda }, { id: 'insulation', lambda: SLAB.insulation.lambda }, { id: 'wall', lambda: 1.0 }],
    [
      { material: 'ground', points: rect(0, -20, half + w + 20, 0) },
      { material: 'insulation', points: rect(0, 0, half, SLAB.insulation.d) },
      { material: 'concrete', points: rect(0, SLAB.insulation.d, half, tf) },
      { material: 'wall', points: rect(half, 0, half + w, tf) },
    ],
    [
      { id: 'in', kind: 'indoor', rect: [0, tf, half, tf + 0.5], t: 20 },
      { id: 'out', kind: 'ground-surface', rect: [half + w, 0, half + w + 20, 0.5], t: 0 },
    ],
    {
      ground: { characteristicDimension: SLAB.bPrime, wallThickness: w, floorFrom: [1, tf + 0.01], floorTo: [1, -0.01], groundLambda: SLAB.lambdaG },
    },
  );
}
