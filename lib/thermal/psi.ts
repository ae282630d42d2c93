/**
 * Linear thermal transmittance. Flanking elements are given by reference cuts: a line through a
 * 1-D layer stack, whose U = 1 / (Rsi + sum d/lambda + Rse) follows ISO 6946 with the surface
 * resistances of the zones at the two ends of the cut (heat-flow rules, by the cut's direction).
 * psi = L2D - sum U_j l_j (ISO 10211 / ISO 14683 convention chosen by the user's l_j).
 * At the ground: psi_g = L2D - 0.5 B' U_floor - h_w U_wall, U_floor from ISO 13370 for a slab on
 * ground: d_t = w + lambda_g (Rsi + Rf + Rse); U = 2 lambda / (pi B' + d_t) ln(pi B' / d_t + 1) when
 * d_t < B', else lambda / (0.457 B' + d_t) (ISO 13370, clause 9.1, recalled from memory).
 * Heated basement (ISO 13370 clause on heated basements, formulas recalled from memory), with z the
 * depth of the basement floor below grade: psi_g = L2D - 0.5 B' U_bf - z U_bw - h_w U_wall, where
 * U_bf is the slab formula with d_t replaced by d_t + 0.5 z, and
 * U_bw = 2 lambda / (pi z) (1 + 0.5 d_t / (d_t + z)) ln(z / d_w + 1), d_w = lambda (Rsi + Rw + Rse).
 * Checked by derivation: z -> 0 gives U_bf -> slab U, and z U_bw -> (2 lambda / pi)(1.5)(z / d_w) -> 0,
 * so psi_g reduces to the slab value; for z >> d_w, z U_bw grows like ln z (the 2-D far field of a
 * buried wall, not linear in z) (our own checks, not from the standard).
 */
import type { Material } from '../materials/material';
import type { Point } from '../section/geometry';
import { pointInPolygon } from '../section/geometry';
import type { ResolvedSection } from '../section/resolve';
import type { SectionSnapshot } from '../section/schema';
import type { FaceSide, ZoneRule } from './rs';
import { RSE, RSI_DOWNWARD, RSI_HORIZONTAL, surfaceResistance } from './rs';
import type { Assumption, Layer, PsiGroundResult, PsiResult, ReferenceCut } from './types';

function segIntersect(a: Point, b: Point, c: Point, d: Point): number | null {
  const rx = b[0] - a[0], ry = b[1] - a[1], sx = d[0] - c[0], sy = d[1] - c[1];
  const den = rx * sy - ry * sx;
  if (Math.abs(den) < 1e-15) return null;
  const t = ((c[0] - a[0]) * sy - (c[1] - a[1]) * sx) / den;
  const u = ((c[0] - a[0]) * ry - (c[1] - a[1]) * rx) / den;
  return t >= 0 && t <= 1 && u >= -1e-12 && u <= 1 + 1e-12 ? t : null;
}

/** Index of the top solid covering a point, -1 when none. */
export function solidAt(resolved: ResolvedSection, x: number, y: number): number {
  for (let s = resolved.solids.length - 1; s >= 0; s--) if (pointInPolygon(x, y, resolved.solids[s].polygon)) return s;
  return -1;
}

export function zoneAt(resolved: ResolvedSection, x: number, y: number): number {
  for (let z = resolved.zones.length - 1; z >= 0; z--) if (pointInPolygon(x, y, resolved.zones[z].polygon)) return z;
  return -1;
}

export interface StackResult {
  layers: Layer[];
  /** Ground layers (soil, rock) flagged so ISO 13370 can leave them out. */
  ground: boolean[];
  gaps: number;
}

/** The 1-D layer stack along a cut, from `from` to `to`. */
export function layerStack(resolved: ResolvedSection, materials: Material[], from: Point, to: Point): StackResult {
  const ts: number[] = [0, 1];
  for (const s of resolved.solids) {
    const p = s.polygon;
    for (let i = 0, j = p.length - 1; i < p.length; j = i++) {
      const t = segIntersect(from, to, p[j], p[i]);
      if (t !== null) ts.push(t);
    }
  }
  ts.sort((a, b) => a - b);
  const len = Math.hypot(to[0] - from[0], to[1] - from[1]);
  const layers: Layer[] = [];
  const ground: boolean[] = [];
  let gaps = 0;
  let last = -2;
  for (let k = 0; k + 1 < ts.length; k++) {
    const d = (ts[k + 1] - ts[k]) * len;
    if (d < 1e-9) continue;
    const tm = (ts[k] + ts[k + 1]) / 2;
    const s = solidAt(resolved, from[0] + tm * (to[0] - from[0]), from[1] + tm * (to[1] - from[1]));
    if (s < 0) { gaps++; last = -1; continue; }
    const m = materials[s];
    if (s === last || (layers.length && layers[layers.length - 1].materialId === m.id && last >= 0)) {
      const l = layers[layers.length - 1];
      l.thickness += d;
      l.r = l.thickness / l.lambda;
    } else {
      layers.push({ materialId: m.id, name: m.name, thickness: d, lambda: m.lambda, r: d / m.lambda });
      ground.push(m.pattern === 'earth' || m.pattern === 'rock');
    }
    last = s;
  }
  return { layers, ground, gaps };
}

/** Surface resistance at one end of a cut (the zone just beyond the end), heat-flow rules. */
function endResistance(resolved: ResolvedSection, rules: readonly ZoneRule[], end: Point, dir: Point, rsi: number): { rs: number; zone: number } {
  const eps = 1e-6;
  const z = zoneAt(resolved, end[0] + dir[0] * eps, end[1] + dir[1] * eps);
  if (z < 0 || solidAt(resolved, end[0] + dir[0] * eps, end[1] + dir[1] * eps) >= 0) return { rs: 0, zone: -1 };
  // The zone lies beyond the end in direction dir: which side of the construction is it on?
  const side: FaceSide = Math.abs(dir[0]) >= Math.abs(dir[1]) ? (dir[0] < 0 ? 0 : 1) : dir[1] < 0 ? 2 : 3;
  return { rs: surfaceResistance(rules[z], side, 'heat', rsi), zone: z };
}

export function referenceCut(resolved: ResolvedSection, materials: Material[], rules: readonly ZoneRule[], id: string, name: string, from: Point, to: Point, length: number, rsiSurface: number, skipGround = false): { cut: ReferenceCut; gaps: number } {
  const st = layerStack(resolved, materials, from, to);
  const len = Math.hypot(to[0] - from[0], to[1] - from[1]) || 1;
  const dir: Point = [(to[0] - from[0]) / len, (to[1] - from[1]) / len];
  const a = endResistance(resolved, rules, from, [-dir[0], -dir[1]], rsiSurface);
  const b = endResistance(resolved, rules, to, dir, rsiSurface);
  const layers = skipGround ? st.layers.filter((_, i) => !st.ground[i]) : st.layers;
  const sumR = layers.reduce((s, l) => s + l.r, 0);
  // Rsi: the end on an interior zone; Rse the other.
  const aInterior = a.zone >= 0 && (rules[a.zone].kind === 'indoor' || rules[a.zone].kind === 'unconditioned');
  const rsi = aInterior ? a.rs : b.rs, rse = aInterior ? b.rs : a.rs;
  const u = 1 / (rsi + sumR + rse);
  return { cut: { id, name, from: [from[0], from[1]], to: [to[0], to[1]], layers, rsi, rse, u, length, ul: u * length }, gaps: st.gaps };
}

/** ISO 13370 U of a slab on ground (clause 9.1, recalled from memory). */
export function iso13370SlabU(bPrime: number, w: number, lambdaG: number, rf: number, rsi = RSI_DOWNWARD, rse = RSE): { u: number; dt: number; formula: string } {
  const dt = w + lambdaG * (rsi + rf + rse);
  if (dt < bPrime) return { u: ((2 * lambdaG) / (Math.PI * bPrime + dt)) * Math.log((Math.PI * bPrime) / dt + 1), dt, formula: 'U = 2 lambda / (pi B\' + d_t) ln(pi B\' / d_t + 1) (d_t < B\')' };
  return { u: lambdaG / (0.457 * bPrime + dt), dt, formula: 'U = lambda / (0.457 B\' + d_t) (d_t >= B\')' };
}

/** ISO 13370 U of a heated basement floor at depth z (heated-basement clause, recalled from memory). */
export function iso13370BasementFloorU(bPrime: number, w: number, lambdaG: number, rf: number, z: number, rsi = RSI_DOWNWARD, rse = RSE): { u: number; dt: number; formula: string } {
  const dt = w + lambdaG * (rsi + rf + rse);
  const de = dt + 0.5 * z;
  if (de < bPrime) return { u: ((2 * lambdaG) / (Math.PI * bPrime + de)) * Math.log((Math.PI * bPrime) / de + 1), dt, formula: 'U_bf = 2 lambda / (pi B\' + d_t + 0.5 z) ln(pi B\' / (d_t + 0.5 z) + 1) (d_t + 0.5 z < B\')' };
  return { u: lambdaG / (0.457 * bPrime + de), dt, formula: 'U_bf = lambda / (0.457 B\' + d_t + 0.5 z) (d_t + 0.5 z >= B\')' };
}

/** ISO 13370 U of a heated basement's below-grade wall (heated-basement clause, recalled from memory). */
export function iso13370BasementWallU(z: number, dt: number, lambdaG: number, rw: number, rsi = RSI_HORIZONTAL, rse = RSE): { u: number; dw: number; formula: string } {
  const dw = lambdaG * (rsi + rw + rse);
  const u = ((2 * lambdaG) / (Math.PI * z)) * (1 + (0.5 * dt) / (dt + z)) * Math.log(z / dw + 1);
  return { u, dw, formula: 'U_bw = 2 lambda / (pi z) (1 + 0.5 d_t / (d_t + z)) ln(z / d_w + 1)' };
}

export interface PsiInput {
  resolved: ResolvedSection;
  materials: Material[];
  l2d: number | null;
  indoor: number | null;
  rules: readonly ZoneRule[];
  snapshot: SectionSnapshot;
}

export function buildPsi(inp: PsiInput): { psi: PsiResult | null; psiGround: PsiGroundResult | null; warnings: string[]; assumptions: Assumption[] } {
  const an = inp.snapshot.analysis;
  const warnings: string[] = [];
  const assumptions: Assumption[] = [];
  const rsi = an?.rsiSurface ?? 0.25;
  let psi: PsiResult | null = null;
  let psiGround: PsiGroundResult | null = null;
  if (inp.l2d === null) {
    if (an && (an.flanking.length || an.ground)) warnings.push('psi needs an indoor zone touching the construction');
    return { psi, psiGround, warnings, assumptions };
  }
  if (an && an.flanking.length) {
    const flanking = an.flanking.map((fl, i) => {
      const { cut, gaps } = referenceCut(inp.resolved, inp.materials, inp.rules, fl.id, fl.name, fl.from, fl.to, fl.length, rsi);
      if (gaps) warnings.push(`analysis.flanking[${i}]: the reference cut crosses ${gaps} gap(s) with no solid; they are left out of U`);
      if (!cut.layers.length) warnings.push(`analysis.flanking[${i}]: the reference cut crosses no solid`);
      return cut;
    });
    psi = { l2d: inp.l2d, psi: inp.l2d - flanking.reduce((s, c) => s + c.ul, 0), convention: an.convention, flanking };
    assumptions.push({ topic: 'psi', text: `psi = L2D - sum U_j l_j with ${flanking.length} flanking element(s), dimensions ${an.convention}; U_j from the layer stack along each reference cut with ISO 6946 surface resistances.`, source: 'ISO 10211 (clause 10, recalled from memory), ISO 6946, ISO 14683 dimension conventions' });
  }
  if (an && an.ground) {
    const gr = an.ground;
    const floor = referenceCut(inp.resolved, inp.materials, inp.rules, 'floor', 'floor construction', gr.floorFrom, gr.floorTo, 0.5 * gr.characteristicDimension, rsi, true);
    const rf = floor.cut.layers.reduce((s, l) => s + l.r, 0);
    const z = gr.basementDepth;
    const iso = z === undefined ? iso13370SlabU(gr.characteristicDimension, gr.wallThickness, gr.groundLambda, rf) : iso13370BasementFloorU(gr.characteristicDimension, gr.wallThickness, gr.groundLambda, rf, z);
    let wallCut: ReferenceCut | null = null;
    let uWall: number | null = null;
    if (gr.wallHeight > 0) {
      if (gr.wallFrom && gr.wallTo) {
        wallCut = referenceCut(inp.resolved, inp.materials, inp.rules, 'wall', 'wall above ground', gr.wallFrom, gr.wallTo, gr.wallHeight, rsi).cut;
        uWall = wallCut.u;
      } else warnings.push('analysis.ground: wallHeight > 0 needs wallFrom and wallTo (the wall reference cut); the wall term is left out');
    }
    let basement: PsiGroundResult['basement'] = null;
    if (z !== undefined && gr.basementWallFrom && gr.basementWallTo) {
      const bw = referenceCut(inp.resolved, inp.materials, inp.rules, 'basement-wall', 'basement wall below ground', gr.basementWallFrom, gr.basementWallTo, z, rsi, true);
      const rw = bw.cut.layers.reduce((s, l) => s + l.r, 0);
      if (!bw.cut.layers.length) warnings.push('analysis.ground: the basement wall reference cut crosses no solid other than ground');
      const w = iso13370BasementWallU(z, iso.dt, gr.groundLambda, rw);
      basement = { depth: z, uWall: w.u, dw: w.dw, rw, formula: w.formula, wallCut: bw.cut };
    }
    const psiG = inp.l2d - 0.5 * gr.characteristicDimension * iso.u - (basement ? basement.depth * basement.uWall : 0) - (uWall !== null ? gr.wallHeight * uWall : 0);
    psiGround = { l2d: inp.l2d, psiG, characteristicDimension: gr.characteristicDimension, uFloor: iso.u, dt: iso.dt, rf, wallThickness: gr.wallThickness, groundLambda: gr.groundLambda, formula: iso.formula, floorCut: floor.cut, wallHeight: gr.wallHeight, uWall, wallCut, basement };
    if (basement) {
      assumptions.push({ topic: 'psi_g', text: `Heated-basement convention: psi_g = L2D - 0.5 B' U_bf - z U_bw - h_w U_wall with B' = ${gr.characteristicDimension} m, z = ${+basement.depth.toFixed(4)} m, U_bf = ${iso.u.toFixed(4)} W/(m2 K) (d_t = ${iso.dt.toFixed(3)} m, Rf = ${rf.toFixed(3)} m2K/W, Rsi ${RSI_DOWNWARD}, Rse ${RSE}), U_bw = ${basement.uWall.toFixed(4)} W/(m2 K) (d_w = ${basement.dw.toFixed(3)} m, Rw = ${basement.rw.toFixed(3)} m2K/W from the below-grade wall cut without ground layers, Rsi ${RSI_HORIZONTAL}, Rse ${RSE}), h_w = ${+gr.wallHeight.toFixed(4)} m.`, source: 'ISO 10211 and ISO 13370 (heated basement; formulas recalled from memory)' });
    } else {
      assumptions.push({ topic: 'psi_g', text: `Slab-on-ground convention: psi_g = L2D - 0.5 B' U_floor - h_w U_wall with B' = ${gr.characteristicDimension} m, U_floor = ${iso.u.toFixed(4)} W/(m2 K) from ISO 13370 (d_t = ${iso.dt.toFixed(3)} m, Rf = ${rf.toFixed(3)} m2K/W from the floor cut without ground layers, Rsi ${RSI_DOWNWARD}, Rse ${RSE}), h_w = ${+gr.wallHeight.toFixed(4)} m.`, source: 'ISO 10211 and ISO 13370 (slab on ground, clause 9.1; recalled from memory)' });
    }
  }
  return { psi, psiGround, warnings, assumptions };
}
