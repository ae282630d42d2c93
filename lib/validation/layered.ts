/**
 * 1-D layered walls (ISO 6946): a stack of plane layers between two zones, drawn 1 m high (or wide)
 * with adiabatic cut edges, is one-dimensional, so the 2-D finite-volume solution must reproduce
 * U = 1 / (Rsi + sum d/lambda + Rse) and the surface temperatures
 * theta_si = theta_i - U Rsi (theta_i - theta_e), theta_se = theta_e + U Rse (theta_i - theta_e)
 * to rounding (the harmonic face conductances are exact for piecewise-linear profiles).
 * The heat-flow run must use ISO 6946's Rsi by the direction of heat flow (0.13 horizontal, 0.10
 * upward, 0.17 downward; Rse 0.04) and the surface-temperature run Rsi 0.25 (ISO 13788).
 */
import type { Point } from '../section/geometry';
import type { SectionSnapshot } from '../section/schema';
import type { MeshLevel, MeshSpec } from '../thermal/mesh';
import { solveSectionSync } from '../thermal/section';
import type { StopRule } from '../thermal/solve';
import { buildSection, rect } from './build';
import type { ValidationRow } from './row';
import { relRow } from './row';

export interface StackLayer {
  id: string;
  /** Thickness, m. */
  d: number;
  /** W/(m K). */
  lambda: number;
}

export interface Stack {
  name: string;
  /** From the indoor side to the outdoor side. */
  layers: StackLayer[];
}

/** Invented stacks (test values, not product data): 2 to 5 layers, conductivity contrasts up to 10^3. */
export const STACKS: Stack[] = [
  { name: '2 layers: concrete, board insulation', layers: [{ id: 'concrete', d: 0.2, lambda: 2.0 }, { id: 'board', d: 0.1, lambda: 0.035 }] },
  { name: '3 layers: gypsum, insulation, concrete', layers: [{ id: 'gypsum', d: 0.0125, lambda: 0.25 }, { id: 'insulation', d: 0.1, lambda: 0.035 }, { id: 'concrete', d: 0.2, lambda: 2.0 }] },
  { name: '4 layers: steel, insulation, plywood, render (contrast 10^3)', layers: [{ id: 'steel', d: 0.002, lambda: 50 }, { id: 'insulation', d: 0.08, lambda: 0.05 }, { id: 'plywood', d: 0.018, lambda: 0.13 }, { id: 'render', d: 0.01, lambda: 1.0 }] },
  { name: '5 layers: plaster, block, insulation, board, brick', layers: [{ id: 'plaster', d: 0.015, lambda: 0.7 }, { id: 'block', d: 0.2, lambda: 0.4 }, { id: 'insulation', d: 0.12, lambda: 0.032 }, { id: 'board', d: 0.02, lambda: 0.2 }, { id: 'brick', d: 0.1, lambda: 0.9 }] },
  { name: '2 layers: metal skin, thin insulation (contrast 10^3)', layers: [{ id: 'metal', d: 0.01, lambda: 20 }, { id: 'insulation', d: 0.05, lambda: 0.02 }] },
];

/** 'wall': indoor on the left, heat flows horizontally. 'floor': indoor above. 'ceiling': indoor below. */
export type Orientation = 'wall' | 'floor' | 'ceiling';

/** ISO 6946 surface resistances, m2K/W (ISO 6946, table of surface resistances, recalled from memory). */
export const ISO6946 = { horizontal: 0.13, upward: 0.1, downward: 0.17, rse: 0.04 };
/** ISO 13788 interior surface resistance for surface temperatures (recalled from memory). */
export const RSI_SURFACE_ISO13788 = 0.25;

export function stackResistance(stack: Stack): number {
  return stack.layers.reduce((s, l) => s + l.d / l.lambda, 0);
}

/** ISO 6946: U = 1 / (Rsi + sum d/lambda + Rse). */
export function layeredU(stack: Stack, rsi: number, rse = ISO6946.rse): number {
  return 1 / (rsi + stackResistance(stack) + rse);
}

/** ISO 6946 Rsi for the orientation and the direction of heat flow (ti > te: heat leaves the room). */
export function expectedRsi(o: Orientation, ti: number, te: number): number {
  if (o === 'wall') return ISO6946.horizontal;
  const outOfRoom = ti > te;
  // Indoor above the floor: heat leaving the room flows down; indoor below the ceiling: up.
  if (o === 'floor') return outOfRoom ? ISO6946.downward : ISO6946.upward;
  return outOfRoom ? ISO6946.upward : ISO6946.downward;
}

export function layeredSection(stack: Stack, o: Orientation, ti: number, te: number): SectionSnapshot {
  const total = stack.layers.reduce((s, l) => s + l.d, 0);
  const solids: { material: string; points: Point[] }[] = [];
  let s = 0;
  for (const l of stack.layers) {
    const a = s, b = s + l.d;
    s = b;
    solids.push({ material: l.id, points: o === 'wall' ? rect(a, 0, b, 1) : o === 'floor' ? rect(0, -b, 1, -a) : rect(0, a, 1, b) });
  }
  const R = (x0: number, y0: number, x1: number, y1: number): [number, number, number, number] => [x0, y0, x1, y1];
  const [zin, zout] = o === 'wall' ? [R(-0.1, 0, 0, 1), R(total, 0, total + 0.1, 1)] : o === 'floor' ? [R(0, 0, 1, 0.1), R(0, -total - 0.1, 1, -total)] : [R(0, -0.1, 1, 0), R(0, total, 1, total + 0.1)];
  return buildSection(
    stack.layers.map((l) => ({ id: l.id, lambda: l.lambda })),
    solids,
    [{ id: 'in', kind: 'indoor', rect: zin, t: ti }, { id: 'out', kind: 'outdoor', rect: zout, t: te }],
  );
}

/** Midpoints of the interior and exterior surfaces. */
export function surfacePoints(stack: Stack, o: Orientation): { inner: Point; outer: Point } {
  const total = stack.layers.reduce((s, l) => s + l.d, 0);
  if (o === 'wall') return { inner: [0, 0.5], outer: [total, 0.5] };
  if (o === 'floor') return { inner: [0.5, 0], outer: [0.5, -total] };
  return { inner: [0.5, 0], outer: [0.5, total] };
}

/** Relative tolerance of the 1-D checks. */
export const LAYERED_TOL = 1e-6;
/** Mesh of the 1-D checks: the built-in default (1-D exactness holds on any grid through the layer edges). */
export const LAYERED_MESH: MeshLevel | MeshSpec = 'default';
/** Solved to a tight residual so the comparison measures the discretisation, not the stopping rule. */
export const LAYERED_STOP: Partial<StopRule> = { rtol: 1e-12, ftol: 0, btol: 0 };

const G = 'ISO 6946 layered wall (1-D)';
const SRC_U = 'ISO 6946: U = 1/(Rsi + sum d/lambda + Rse), exact in 1-D';
const SRC_T = 'ISO 6946 series resistances: theta_s = theta - U Rs (theta_i - theta_e), exact in 1-D; Rsi 0.25 from ISO 13788';

/** Rows of one stack in one orientation: U (heat-flow run) and both surface temperatures (surface run). */
export function layeredRows(stack: Stack, o: Orientation, ti = 20, te = -10, withSurface = true): ValidationRow[] {
  const pts = surfacePoints(stack, o);
  const r = solveSectionSync(layeredSection(stack, o, ti, te), { mesh: LAYERED_MESH, stop: LAYERED_STOP, probes: [pts.inner, pts.outer], omitField: true });
  const dT = ti - te;
  const rsi = expectedRsi(o, ti, te);
  const label = `${stack.name}; ${o}, ${ti} / ${te} C`;
  const phi = r.zones.find((z) => z.id === 'in')!.phi;
  const rows: ValidationRow[] = [relRow(G, `U, ${label} (Rsi ${rsi})`, SRC_U, layeredU(stack, rsi), phi / dT, LAYERED_TOL, 'W/(m2 K)')];
  if (withSurface) {
    const us = layeredU(stack, RSI_SURFACE_ISO13788);
    const tsi = ti - us * RSI_SURFACE_ISO13788 * dT, tse = te + us * ISO6946.rse * dT;
    const seg = r.surfaces.find((s) => s.kind === 'surface' && s.zoneId === 'in');
    // Surface temperatures: difference as a fraction of theta_i - theta_e (a temperature factor).
    rows.push(relRow(G, `theta_si, ${label} (surface run, Rsi 0.25)`, SRC_T, tsi, seg ? seg.tMin : NaN, LAYERED_TOL, 'C', Math.abs(dT)));
    rows.push(relRow(G, `theta_se, ${label} (surface run, Rse 0.04)`, SRC_T, tse, r.probes[1].surface ?? NaN, LAYERED_TOL, 'C', Math.abs(dT)));
  }
  return rows;
}

/** Every layered check: each stack as a wall, and one stack as a floor and a ceiling with heat flowing either way. */
export function layeredWallRows(): ValidationRow[] {
  const rows: ValidationRow[] = [];
  for (const s of STACKS) rows.push(...layeredRows(s, 'wall'));
  const s = STACKS[1];
  rows.push(...layeredRows(s, 'floor'), ...layeredRows(s, 'ceiling'));
  rows.push(...layeredRows(s, 'floor', 20, 30, false), ...layeredRows(s, 'ceiling', 20, 30, false));
  return rows;
}
