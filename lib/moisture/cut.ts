/**
 * The Glaser check along a cut line through a solved section: the layer stack the cut crosses, the
 * temperature at every interface from the 2-D field, and the ISO 13788 vapour pressure line.
 *
 * Temperatures: the results' cell field (surface-temperature run, design day) is read along the cut.
 * Each cell the cut crosses gives a node at the middle of its stretch; between nodes the temperature is
 * linear in the thermal-resistance coordinate R = integral ds / lambda, and beyond the last node of a
 * run of solids it is extrapolated the same way. For a 1-D stack this reproduces the finite-volume
 * solution's own interface values exactly. Layers are split so that no sub-layer has R above
 * 0.25 m2K/W, as ISO 13788 asks (recalled from memory).
 *
 * Ends: a cut end in a zone takes that zone's air (temperature and RH; a zone without an RH gets an
 * assumed value, said so in the notes); a cut end inside the ground (earth or rock) starts the stack at
 * the first non-ground face, in contact with saturated ground (RH 100 % at the face's temperature).
 */
import { layerSd, type Material } from '../materials/material';
import { pSat } from '../psychro';
import type { Point } from '../section/geometry';
import { pointInPolygon } from '../section/geometry';
import { lookupMaterial, resolveSection, type ResolvedSection } from '../section/resolve';
import type { CutRecord, SectionSnapshot, ZoneKind } from '../section/schema';
import type { SectionResults } from '../thermal/types';
import { DELTA0, G_PER_M2H, glaserLine, monthlyGlaser, type MonthConditions, type MonthlyResult } from './glaser';

/** Largest thermal resistance of one sub-layer, m2K/W (ISO 13788, recalled from memory). */
export const MAX_SUBLAYER_R = 0.25;

/** Assumed RH where a zone at the cold end has none (common practice for winter outdoor air). */
export const ASSUMED_RH: Record<ZoneKind, number> = { indoor: 0.5, outdoor: 0.8, unconditioned: 0.8, 'ground-surface': 1, fixed: 1 };

export interface GlaserLayer {
  materialId: string;
  name: string;
  thickness: number;
  lambda: number;
  mu: number | null;
  /** Vapour resistance of the layer, m. */
  sd: number;
  /** How sd was found. */
  sdFrom: 'mu d' | 'membrane sd' | 'winter sd (variable-permeance retarder)';
  /** d / lambda, m2K/W. */
  r: number;
}

export interface GlaserPoint {
  /** Distance from the warm face along the cut, m. */
  s: number;
  /** Cumulative sd from the warm face, m. */
  sd: number;
  /** Temperature (design day), C. */
  t: number;
  pSat: number;
  /** Vapour pressure on the ISO 13788 line, Pa. */
  p: number;
  /** Temperature factor (t - t_cold) / (t_warm - t_cold). */
  f: number;
  /** Index of the layer boundary this point is (0 = warm face), or -1 for a point inside a layer. */
  boundary: number;
  /** Net moisture rate, g/(m2 h) (positive: condensation). */
  rate: number;
}

export interface GlaserEnd {
  kind: 'zone' | 'ground';
  zoneId: string | null;
  name: string;
  /** Air (or ground face) temperature, C, design day and coldest month. */
  t: number;
  tMonth: number;
  /** Relative humidity, fraction. */
  rh: number;
  rhMonth: number;
  rhAssumed: boolean;
  /** Vapour pressure, Pa (design day). */
  p: number;
}

export interface GlaserCondensation {
  /** Index into points. */
  index: number;
  /** Between which layers ("A | B"). */
  where: string;
  s: number;
  t: number;
  /** g/(m2 h). */
  rate: number;
}

export interface GlaserCheck {
  cutId: string;
  name: string;
  /** Warm end first. */
  from: Point;
  to: Point;
  warm: GlaserEnd;
  cold: GlaserEnd;
  layers: GlaserLayer[];
  points: GlaserPoint[];
  /** Total sd of the stack, m. */
  sdTotal: number;
  condensation: GlaserCondensation[];
  /** Sum of the condensation rates, g/(m2 h). */
  rate: number;
  monthly: MonthlyResult | null;
  notes: string[];
}

export class GlaserCutError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'GlaserCutError';
  }
}

const isGroundMaterial = (m: Material | undefined) => !!m && (m.pattern === 'earth' || m.pattern === 'rock');

function topSolidAt(resolved: ResolvedSection, x: number, y: number): number {
  for (let s = resolved.solids.length - 1; s >= 0; s--) if (pointInPolygon(x, y, resolved.solids[s].polygon)) return s;
  return -1;
}
function topZoneAt(resolved: ResolvedSection, x: number, y: number): number {
  for (let z = resolved.zones.length - 1; z >= 0; z--) if (pointInPolygon(x, y, resolved.zones[z].polygon)) return z;
  return -1;
}

function crossings(a: Point, b: Point, polys: Point[][]): number[] {
  const out: number[] = [];
  const rx = b[0] - a[0], ry = b[1] - a[1];
  for (const p of polys)
    for (let i = 0, j = p.length - 1; i < p.length; j = i++) {
      const c = p[j], d = p[i];
      const sx = d[0] - c[0], sy = d[1] - c[1];
      const den = rx * sy - ry * sx;
      if (Math.abs(den) < 1e-15) continue;
      const t = ((c[0] - a[0]) * sy - (c[1] - a[1]) * sx) / den;
      const u = ((c[0] - a[0]) * ry - (c[1] - a[1]) * rx) / den;
      if (t > 0 && t < 1 && u >= -1e-12 && u <= 1 + 1e-12) out.push(t);
    }
  return out;
}

function sdOf(m: Material, d: number): { sd: number; from: GlaserLayer['sdFrom'] } {
  if (m.sd !== null) return { sd: layerSd(m, d), from: m.sdHumid !== null ? 'winter sd (variable-permeance retarder)' : 'membrane sd' };
  return { sd: layerSd(m, d), from: 'mu d' };
}

interface Stretch { s0: number; s1: number; solid: number }

/** The solids along the cut as stretches (s in metres from `a`), merged where the same solid continues. */
function stretchesAlong(resolved: ResolvedSection, a: Point, b: Point): Stretch[] {
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const ts = [0, 1, ...crossings(a, b, resolved.solids.map((s) => s.polygon))].sort((x, y) => x - y);
  const out: Stretch[] = [];
  for (let k = 0; k + 1 < ts.length; k++) {
    if ((ts[k + 1] - ts[k]) * len < 1e-9) continue;
    const tm = (ts[k] + ts[k + 1]) / 2;
    const solid = topSolidAt(resolved, a[0] + tm * (b[0] - a[0]), a[1] + tm * (b[1] - a[1]));
    const last = out[out.length - 1];
    if (last && last.solid === solid) last.s1 = ts[k + 1] * len;
    else out.push({ s0: ts[k] * len, s1: ts[k + 1] * len, solid });
  }
  return out;
}

/**
 * The temperature along the cut from the results' cell field: nodes at the middle of each cell's stretch,
 * linear in R between nodes. Returns a function of s (metres from `a`), NaN off the solids.
 */
export function temperatureAlong(field: SectionResults['field'], lambdaAt: (x: number, y: number) => number, a: Point, b: Point): (s: number) => number {
  const { xs, ys, t } = field;
  const nx = xs.length - 1;
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const dx = (b[0] - a[0]) / len, dy = (b[1] - a[1]) / len;
  const ss: number[] = [0, len];
  const cross = (lines: number[], a0: number, d: number) => {
    if (Math.abs(d) < 1e-15) return;
    for (const v of lines) {
      const s = (v - a0) / d;
      if (s > 0 && s < len) ss.push(s);
    }
  };
  cross(xs, a[0], dx);
  cross(ys, a[1], dy);
  ss.sort((p, q) => p - q);
  const find = (lines: number[], v: number) => {
    const n = lines.length - 1;
    if (!(v >= lines[0] && v <= lines[n])) return -1;
    let lo = 0, hi = n;
    while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (lines[mid] <= v) lo = mid; else hi = mid; }
    return lo;
  };
  // Runs of solid cells: per node, s, R and T; R accumulates over each stretch of the run.
  const runs: { s0: number; s1: number; rAtS0: number; nodeS: number[]; nodeR: number[]; nodeT: number[]; edges: { s: number; r: number }[] }[] = [];
  let cur: (typeof runs)[number] | null = null;
  let r = 0;
  for (let k = 0; k + 1 < ss.length; k++) {
    const s0 = ss[k], s1 = ss[k + 1];
    if (s1 - s0 < 1e-12) continue;
    const sm = (s0 + s1) / 2;
    const x = a[0] + sm * dx, y = a[1] + sm * dy;
    const i = find(xs, x), j = find(ys, y);
    const tc = i < 0 || j < 0 ? null : t[j * nx + i];
    if (tc === null || tc === undefined || !Number.isFinite(tc)) { cur = null; continue; }
    const lam = lambdaAt(x, y);
    if (!cur) {
      cur = { s0, s1, rAtS0: r, nodeS: [], nodeR: [], nodeT: [], edges: [{ s: s0, r }] };
      runs.push(cur);
    }
    const rm = r + (sm - s0) / lam;
    r += (s1 - s0) / lam;
    cur.s1 = s1;
    cur.edges.push({ s: s1, r });
    cur.nodeS.push(sm); cur.nodeR.push(rm); cur.nodeT.push(tc);
  }
  return (s: number) => {
    const run = runs.find((q) => s >= q.s0 - 1e-9 && s <= q.s1 + 1e-9);
    if (!run) return NaN;
    // R at s: linear inside the stretch holding s.
    let rs = run.edges[0].r;
    for (let e = 0; e + 1 < run.edges.length; e++) {
      const p = run.edges[e], q = run.edges[e + 1];
      if (s <= q.s + 1e-12 || e + 2 === run.edges.length) { rs = p.r + ((q.r - p.r) * Math.min(Math.max(s - p.s, 0), q.s - p.s)) / (q.s - p.s || 1); break; }
    }
    const { nodeR, nodeT } = run;
    const n = nodeR.length;
    if (n === 1) return nodeT[0];
    let k = 0;
    while (k + 2 < n && nodeR[k + 1] < rs) k++;
    const f = (rs - nodeR[k]) / (nodeR[k + 1] - nodeR[k]);
    return nodeT[k] + f * (nodeT[k + 1] - nodeT[k]);
  };
}

export interface GlaserOptions {
  /** Monthly conditions (calendar order) for the ISO 13788 monthly calculation; none: design day only. */
  months?: readonly MonthConditions[];
  /** Take the warm side's temperature and RH from `months` too (default: the warm zone's coldest-month condition all year). */
  warmFromMonths?: boolean;
}

/** The Glaser check along one cut of a solved section. Throws GlaserCutError with a plain reason when the cut cannot be checked. */
export function glaserAlongCut(snapshot: SectionSnapshot, results: SectionResults, cut: Pick<CutRecord, 'id' | 'name' | 'from' | 'to'>, options: GlaserOptions = {}): GlaserCheck {
  const resolved = resolveSection(snapshot);
  const notes: string[] = [];
  const matOf = (solid: number) => {
    const s = resolved.solids[solid];
    const m = resolved.materials.get(s.materialId) ?? lookupMaterial(resolved.materials, s.materialId);
    if (!m) throw new GlaserCutError(`material '${s.materialId}' of part '${s.partId}' is unknown`);
    return m;
  };
  if (!results.field || results.field.t.length === 0) throw new GlaserCutError('the results carry no temperature field (solve without omitField)');
  let a = cut.from as Point, b = cut.to as Point;
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  if (!(len > 1e-6)) throw new GlaserCutError(`cut '${cut.id}': its two ends coincide`);
  const where = (p: Point) => `(${p[0].toFixed(3)}, ${p[1].toFixed(3)}) m`;

  const endAt = (p: Point): { zone: number; ground: boolean } => {
    const s = topSolidAt(resolved, p[0], p[1]);
    if (s >= 0) {
      if (isGroundMaterial(matOf(s))) return { zone: -1, ground: true };
      throw new GlaserCutError(`cut '${cut.id}' ends inside ${resolved.solids[s].partId} (${matOf(s).name}) at ${where(p)}: the Glaser check needs air or ground at both ends`);
    }
    const z = topZoneAt(resolved, p[0], p[1]);
    if (z < 0) throw new GlaserCutError(`cut '${cut.id}' ends at ${where(p)}, outside every zone and solid`);
    return { zone: z, ground: false };
  };
  let ea = endAt(a), eb = endAt(b);
  if (ea.ground && eb.ground) throw new GlaserCutError(`cut '${cut.id}' has ground at both ends: one end must be in a room or outdoor air`);
  // Warm end first: an indoor zone, else the warmer zone at the design day.
  const warmth = (e: { zone: number; ground: boolean }) => (e.ground ? -Infinity : (resolved.zones[e.zone].kind === 'indoor' ? 1000 : 0) + resolved.zones[e.zone].record.design.t);
  if (warmth(eb) > warmth(ea)) { [a, b] = [b, a]; [ea, eb] = [eb, ea]; }

  const field = results.field as SectionResults['field'];
  const lambdaAt = (x: number, y: number) => { const s = topSolidAt(resolved, x, y); return s >= 0 ? matOf(s).lambda : 1; };
  const tAlong = temperatureAlong(field, lambdaAt, a, b);

  // The stack: solid stretches, ground stretches at the cold end left out.
  const stretches = stretchesAlong(resolved, a, b);
  let first = stretches.findIndex((q) => q.solid >= 0);
  let last = stretches.length - 1 - [...stretches].reverse().findIndex((q) => q.solid >= 0);
  if (first < 0) throw new GlaserCutError(`cut '${cut.id}' crosses no solid part`);
  if (eb.ground) while (last >= first && isGroundMaterial(matOf(stretches[last].solid))) last--;
  if (ea.ground) while (first <= last && isGroundMaterial(matOf(stretches[first].solid))) first++;
  if (last < first) throw new GlaserCutError(`cut '${cut.id}' crosses only ground`);
  const layers: GlaserLayer[] = [];
  const bounds: number[] = [stretches[first].s0];
  for (let k = first; k <= last; k++) {
    const q = stretches[k];
    if (q.solid < 0) throw new GlaserCutError(`cut '${cut.id}' crosses a void between ${(q.s0 * 1000).toFixed(0)} and ${(q.s1 * 1000).toFixed(0)} mm along it: the stack must be continuous`);
    const m = matOf(q.solid);
    const d = q.s1 - q.s0;
    const prev = layers[layers.length - 1];
    if (prev && prev.materialId === m.id) {
      prev.thickness += d;
      prev.r = prev.thickness / prev.lambda;
      prev.sd = sdOf(m, prev.thickness).sd;
      bounds[bounds.length - 1] = q.s1;
      continue;
    }
    const v = sdOf(m, d);
    layers.push({ materialId: m.id, name: m.name, thickness: d, lambda: m.lambda, mu: m.mu, sd: v.sd, sdFrom: v.from, r: d / m.lambda });
    bounds.push(q.s1);
  }
  const s0 = bounds[0];

  const zoneEnd = (e: { zone: number; ground: boolean }, faceT: number): GlaserEnd => {
    if (e.ground) {
      const ps = pSat(faceT);
      return { kind: 'ground', zoneId: null, name: 'Ground (saturated at the face)', t: faceT, tMonth: faceT, rh: 1, rhMonth: 1, rhAssumed: true, p: ps };
    }
    const z = resolved.zones[e.zone];
    const rh = z.record.design.rh, rhm = z.record.month.rh;
    const assumed = ASSUMED_RH[z.kind];
    if (rh === null) notes.push(`${z.record.name || z.zoneId} has no relative humidity; ${(assumed * 100).toFixed(0)} % assumed (common practice for ${z.kind === 'indoor' ? 'a heated room' : 'winter air'})`);
    const rhD = rh === null ? assumed : rh / 100;
    return { kind: 'zone', zoneId: z.zoneId, name: z.record.name || z.zoneId, t: z.record.design.t, tMonth: z.record.month.t, rh: rhD, rhMonth: rhm === null ? assumed : rhm / 100, rhAssumed: rh === null, p: rhD * pSat(z.record.design.t) };
  };
  const tFace = (s: number) => tAlong(s);
  const warm = zoneEnd(ea, tFace(bounds[0]));
  const cold = zoneEnd(eb, tFace(bounds[bounds.length - 1]));
  if (ea.ground) notes.push('the warm end is in the ground: saturated ground assumed at the face');
  if (eb.ground) notes.push('the cold end is in the ground: the stack starts at the face against the ground, taken as saturated (RH 100 %) at its temperature from the 2-D field');

  // Points: every boundary, plus sub-layer points so that no sub-layer exceeds MAX_SUBLAYER_R.
  const pts: { s: number; sd: number; boundary: number }[] = [{ s: bounds[0] - s0, sd: 0, boundary: 0 }];
  let sdc = 0;
  layers.forEach((l, i) => {
    const parts = Math.max(1, Math.ceil(l.r / MAX_SUBLAYER_R - 1e-9));
    for (let k = 1; k <= parts; k++) pts.push({ s: bounds[i] - s0 + (l.thickness * k) / parts, sd: sdc + (l.sd * k) / parts, boundary: k === parts ? i + 1 : -1 });
    sdc += l.sd;
  });
  const ts = pts.map((q) => tFace(q.s + s0));
  if (ts.some((x) => !Number.isFinite(x))) throw new GlaserCutError(`cut '${cut.id}': the field has no temperature at some point of the stack`);
  const tWarm = warm.kind === 'zone' ? warm.t : ts[0];
  const tCold = cold.kind === 'zone' ? cold.t : ts[ts.length - 1];
  const ps = ts.map(pSat);
  const sds = pts.map((q) => q.sd);
  const line = glaserLine(sds, ps, warm.p, cold.p);
  const points: GlaserPoint[] = pts.map((q, k) => ({ s: q.s, sd: q.sd, t: ts[k], pSat: ps[k], p: line.p[k], f: (ts[k] - tCold) / (tWarm - tCold), boundary: q.boundary, rate: line.rate[k] * G_PER_M2H }));
  const layerAtS = (s: number) => layers.findIndex((_, i) => s <= bounds[i + 1] - s0 + 1e-9);
  const condensation: GlaserCondensation[] = [];
  points.forEach((q, k) => {
    if (!(q.rate > 0)) return;
    const li = layerAtS(q.s);
    const whereText = q.boundary > 0 && q.boundary < layers.length ? `${layers[q.boundary - 1].name} | ${layers[q.boundary].name}` : `inside ${layers[Math.max(0, li)].name}`;
    condensation.push({ index: k, where: whereText, s: q.s, t: q.t, rate: q.rate });
  });
  if (warm.p > pSat(ts[0])) notes.push('the warm face itself is above saturation: surface condensation (see the surface verdict)');

  let monthly: MonthlyResult | null = null;
  if (options.months?.length) {
    // The warm side keeps the section's own coldest-month air unless told otherwise; the cold side follows the months.
    const months = options.months.map((m) => ({
      ...m,
      ...(options.warmFromMonths ? {} : { ti: warm.tMonth, rhi: warm.rhMonth }),
      ...(cold.kind === 'ground' ? { te: tCold, rhe: 1 } : {}),
    }));
    if (!options.warmFromMonths) notes.push(`monthly: the warm side is held at ${warm.name}'s coldest-month condition (${warm.tMonth} C, ${(warm.rhMonth * 100).toFixed(0)} %) all year`);
    if (cold.kind === 'ground') notes.push('monthly: the ground face is held at its design-day temperature from the 2-D field and saturated (common practice: ground temperatures vary little at depth)');
    monthly = monthlyGlaser(sds, points.map((q) => q.f), months);
  }
  notes.push(`temperatures from the 2-D surface-temperature run (Rsi ${snapshot.analysis?.rsiSurface ?? 0.25} m2K/W inside), read along the cut; vapour flow with delta0 = ${DELTA0} kg/(m s Pa) (ISO 13788, recalled from memory); surface vapour resistances neglected, as ISO 13788 does`);
  return {
    cutId: cut.id,
    name: cut.name || cut.id,
    from: a,
    to: b,
    warm,
    cold,
    layers,
    points,
    sdTotal: sdc,
    condensation,
    rate: condensation.reduce((acc, c) => acc + c.rate, 0),
    monthly,
    notes,
  };
}

/** A cut to check when the section has none that works: the above-grade wall reference cut of psi_g, then flanking cuts. */
export function fallbackCuts(snapshot: SectionSnapshot): Pick<CutRecord, 'id' | 'name' | 'from' | 'to'>[] {
  const out: Pick<CutRecord, 'id' | 'name' | 'from' | 'to'>[] = [];
  const g = snapshot.analysis?.ground;
  if (g?.wallFrom && g.wallTo) out.push({ id: 'wall-reference', name: 'Through the wall above grade (reference cut)', from: g.wallFrom, to: g.wallTo });
  for (const f of snapshot.analysis?.flanking ?? []) out.push({ id: `flanking-${f.id}`, name: f.name || `Flanking element ${f.id}`, from: f.from, to: f.to });
  return out;
}

export interface CutOutcome {
  cut: Pick<CutRecord, 'id' | 'name' | 'from' | 'to'>;
  /** Saved on the section, or taken as the default because no saved cut can be checked. */
  saved: boolean;
  check: GlaserCheck | null;
  problem: string | null;
}

/** The Glaser check on every saved cut; when none can be checked, also on the default cut. */
export function glaserForSection(snapshot: SectionSnapshot, results: SectionResults, options: GlaserOptions = {}): CutOutcome[] {
  const run = (cut: Pick<CutRecord, 'id' | 'name' | 'from' | 'to'>, saved: boolean): CutOutcome => {
    try {
      return { cut, saved, check: glaserAlongCut(snapshot, results, cut, options), problem: null };
    } catch (e) {
      if (e instanceof GlaserCutError) return { cut, saved, check: null, problem: e.message };
      throw e;
    }
  };
  const out = (snapshot.cuts ?? []).map((c) => run(c, true));
  if (!out.some((o) => o.check)) {
    for (const c of fallbackCuts(snapshot)) {
      const o = run(c, false);
      if (o.check) { out.push(o); break; }
    }
  }
  return out;
}
