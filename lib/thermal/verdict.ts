/**
 * Verdict surfaces. Surface segments: runs of boundary faces on one line, one zone, one solid piece,
 * for every zone with a humidity (indoor, and unconditioned spaces given one). Hidden segments:
 * interfaces where an air-open material lies against an airtight one on its cold side, judged as
 * if the indoor air reaches them (the worst case for air leakage). Each is judged with the design
 * day for condensation (below the dew point) and the coldest-month mean for mould (surface RH at or
 * above 80 %, ISO 13788), both from the surface-temperature run.
 */
import type { Material } from '../materials/material';
import { MOULD_RH, dewPoint, mouldLimit, pSat } from '../psychro';
import type { ResolvedSection, ResolvedZone } from '../section/resolve';
import type { ThermalSystem } from './assemble';
import type { TemperatureField } from './field';
import type { Assumption, Segment, SurfaceState } from './types';

export interface SegmentInput {
  sys: ThermalSystem;
  resolved: ResolvedSection;
  materials: Material[];
  zones: ResolvedZone[];
  touch: number[];
  indoor: number | null;
  exterior: number | null;
  twoZone: boolean;
  fieldDesign: TemperatureField;
  fieldMonth: TemperatureField;
  unitSurface(z: number): Float64Array;
  g: Float64Array;
  /** Sub-cells per cell and direction in the corner readings' local solves (field.ts); absent: its default. */
  cornerSplit?: number;
}

export interface SegmentOutput {
  segments: Segment[];
  coldest: { segmentId: string; t: number; at: [number, number]; fRsi: number | null; weights: Record<string, number> } | null;
  verdict: SurfaceState;
  dewPoint: number | null;
  mouldLimit: number | null;
  fRsiMin: number | null;
  warnings: string[];
  assumptions: Assumption[];
}

const RANK: Record<SurfaceState, number> = { fine: 0, 'mould risk': 1, condensation: 2 };

interface Air {
  design: { t: number; rh: number };
  month: { t: number; rh: number };
}

function airOf(z: ResolvedZone): Air | null {
  const d = z.record.design, m = z.record.month;
  if (d.rh === null) return null;
  return { design: { t: d.t, rh: d.rh / 100 }, month: { t: m.t, rh: (m.rh ?? d.rh) / 100 } };
}

interface Run {
  side: number;
  kind: 'surface' | 'hidden';
  zone: number;
  solid: number;
  behind: number;
  horizontal: boolean; // the line is horizontal (a face of constant y)
  line: number;
  lo: number;
  hi: number;
  tDesign: number[];
  tMonth: number[];
  len: number[];
  mid: number[];
  /** Face index or a pair key for weights. */
  ref: number[];
}

export function buildSegments(inp: SegmentInput): SegmentOutput {
  const { sys, zones, fieldDesign, fieldMonth, materials, resolved } = inp;
  const { nx, xs, ys, owner } = sys.mesh;
  const f = sys.faces;
  const warnings: string[] = [];
  const assumptions: Assumption[] = [];
  type Item = { kind: 'surface' | 'hidden'; zone: number; solid: number; behind: number; side: number; line: number; pos: number; lo: number; hi: number; mid: number; tD: number; tM: number; len: number; ref: number };
  const items: Item[] = [];
  const airs = zones.map(airOf);
  for (let k = 0; k < f.count; k++) {
    const z = f.zone[k];
    const kind = zones[z].kind;
    if (!airs[z] || !(kind === 'indoor' || kind === 'unconditioned')) continue;
    const c = sys.cellOf[f.unknown[k]];
    const i = c % nx, j = (c - i) / nx;
    const s = f.side[k];
    const vertical = s < 2; // face of constant x
    const line = vertical ? (s === 0 ? i : i + 1) : s === 2 ? j : j + 1;
    const pos = vertical ? j : i;
    const lo = vertical ? ys[j] : xs[i], hi = vertical ? ys[j + 1] : xs[i + 1];
    items.push({ kind: 'surface', zone: z, solid: owner[c], behind: -1, side: s, line, pos, lo, hi, mid: (lo + hi) / 2, tD: fieldDesign.surface(k), tM: fieldMonth.surface(k), len: f.len[k], ref: k });
  }
  // Hidden surfaces.
  const indoor = inp.indoor;
  if (indoor !== null && airs[indoor]) {
    let tLo = Infinity, tHi = -Infinity;
    for (const z of inp.touch) { tLo = Math.min(tLo, fieldDesign.tz[z]); tHi = Math.max(tHi, fieldDesign.tz[z]); }
    const drop = 1e-3 * Math.max(tHi - tLo, 1e-9);
    const ny = sys.mesh.ny;
    for (let j = 0; j < ny; j++)
      for (let i = 0; i < nx; i++) {
        const c = j * nx + i;
        if (sys.unknownOf[c] < 0) continue;
        for (const s of [1, 3]) {
          const d = s === 1 ? (i + 1 < nx ? c + 1 : -1) : j + 1 < ny ? c + nx : -1;
          if (d < 0 || sys.unknownOf[d] < 0) continue;
          const oa = materials[owner[c]].airOpen, ob = materials[owner[d]].airOpen;
          if (oa === ob) continue;
          const open = oa ? c : d, tight = oa ? d : c;
          const tOpen = fieldDesign.cell(open), tTight = fieldDesign.cell(tight);
          if (!(tOpen - tTight > drop)) continue;
          const sideFromOpen = open === c ? s : s - 1; // side of the open cell facing the tight one
          const vertical = s === 1;
          const line = vertical ? i + 1 : j + 1;
          const pos = vertical ? j : i;
          const lo = vertical ? ys[j] : xs[i], hi = vertical ? ys[j + 1] : xs[i + 1];
          items.push({ kind: 'hidden', zone: indoor, solid: owner[open], behind: owner[tight], side: sideFromOpen + 10, line, pos, lo, hi, mid: (lo + hi) / 2, tD: fieldDesign.face(open, sideFromOpen), tM: fieldMonth.face(open, sideFromOpen), len: hi - lo, ref: -1 - (open * 4 + sideFromOpen) });
        }
      }
  }
  items.sort((a, b) => a.zone - b.zone || a.side - b.side || a.line - b.line || a.solid - b.solid || a.behind - b.behind || a.pos - b.pos);
  const runs: Run[] = [];
  let cur: Run | null = null;
  let lastPos = -2;
  for (const it of items) {
    const horizontal = it.side % 10 >= 2;
    if (!cur || cur.kind !== it.kind || cur.zone !== it.zone || cur.solid !== it.solid || cur.behind !== it.behind || cur.horizontal !== horizontal || cur.line !== it.line || it.pos !== lastPos + 1 || cur.side !== it.side) {
      cur = { side: it.side, kind: it.kind, zone: it.zone, solid: it.solid, behind: it.behind, horizontal, line: it.line, lo: it.lo, hi: it.hi, tDesign: [], tMonth: [], len: [], mid: [], ref: [] };
      runs.push(cur);
    }
    cur.hi = it.hi;
    cur.tDesign.push(it.tD);
    cur.tMonth.push(it.tM);
    cur.len.push(it.len);
    cur.mid.push(it.mid);
    cur.ref.push(it.ref);
    lastPos = it.pos;
  }

  const segments: Segment[] = [];
  const unitCache = new Map<number, Float64Array>();
  const unit = (z: number) => {
    let u = unitCache.get(z);
    if (!u) { u = inp.unitSurface(z); unitCache.set(z, u); }
    return u;
  };
  const unitTemp = (ref: number, z: number): number => {
    const tz = new Float64Array(zones.length);
    tz[z] = 1;
    const u = unit(z);
    if (ref >= 0) return fieldDesign.surfaceWith(ref, u, tz);
    const code = -1 - ref;
    const c = code >> 2, s = code & 3;
    return faceTempWith(fieldDesign, c, s, u);
  };
  let verdict: SurfaceState = 'fine';
  const [dLo, dHi] = fieldDesign.range(), [mLo, mHi] = fieldMonth.range();
  // Node readings are linear in the temperature set, so one patch solve per node with the unit
  // solutions (each touching zone at 1 K, the others at 0) gives the temperature weighting factors
  // there, and the design-day and coldest-month readings are their superpositions. Each node is
  // solved once, however many segments end on it.
  const unitSets = inp.touch.map((z) => {
    const tz = new Float64Array(zones.length);
    tz[z] = 1;
    return { x: unit(z), tz };
  });
  const nodeCache = new Map<string, number[]>();
  const nodeWeights = (i0: number, j0: number, c: number): number[] => {
    const key = `${i0},${j0},${c}`;
    let w = nodeCache.get(key);
    if (!w) { w = fieldDesign.nodeTemperatures(i0, j0, c, unitSets, inp.cornerSplit); nodeCache.set(key, w); }
    return w;
  };
  const superpose = (w: readonly number[], tz: ArrayLike<number>): number => {
    let v = 0;
    inp.touch.forEach((z, q) => { v += w[q] * tz[z]; });
    return v;
  };
  runs.forEach((r, idx) => {
    const air = airs[r.zone]!;
    let kMin = 0, kMinM = 0, sum = 0, L = 0;
    for (let k = 0; k < r.tDesign.length; k++) {
      if (r.tDesign[k] < r.tDesign[kMin]) kMin = k;
      if (r.tMonth[k] < r.tMonth[kMinM]) kMinM = k;
      sum += r.tDesign[k] * r.len[k];
      L += r.len[k];
    }
    let tMin = r.tDesign[kMin], tMinMonth = r.tMonth[kMinM];
    let at: [number, number] = r.horizontal ? [r.mid[kMin], ys[r.line]] : [xs[r.line], r.mid[kMin]];
    let weightsAt: number[] | null = null;
    // A visible surface's coldest point is often where it ends (a corner, or where it meets another
    // part): read the surface temperature at the end nodes too (TemperatureField.nodeTemperatures),
    // at each end where the surface does not get warmer toward the end over its last two faces
    // (there the end cannot be the coldest point), and not on the steps of a staircased sloped edge.
    if (r.kind === 'surface') {
      const nf = r.ref.length;
      for (const first of [true, false]) {
        const e = first ? 0 : nf - 1, nb = first ? 1 : nf - 2;
        if (nf > 1 && r.tDesign[e] > r.tDesign[nb] && r.tMonth[e] > r.tMonth[nb]) continue;
        const k = r.ref[e], c = sys.cellOf[f.unknown[k]];
        // The steps of a staircased sloped edge are not corners of the real surface.
        if (f.rsScale[k] !== 1) continue;
        const ci = c % nx, cj = (c - ci) / nx;
        const i0 = r.horizontal ? (first ? ci : ci + 1) : r.line;
        const j0 = r.horizontal ? r.line : first ? cj : cj + 1;
        const wn = nodeWeights(i0, j0, c);
        const tD = superpose(wn, fieldDesign.tz), tM = superpose(wn, fieldMonth.tz);
        if (!Number.isFinite(tD)) continue;
        const d = Math.min(Math.max(tD, dLo), dHi), m = Math.min(Math.max(tM, mLo), mHi);
        if (m < tMinMonth) tMinMonth = m;
        if (d < tMin) {
          tMin = d;
          at = [xs[i0], ys[j0]];
          weightsAt = wn;
        }
      }
    }
    const dp = dewPoint(air.design.t, air.design.rh);
    const ml = mouldLimit(air.month.t, air.month.rh);
    const rhS = (air.month.rh * pSat(air.month.t)) / pSat(tMinMonth);
    const state: SurfaceState = tMin < dp ? 'condensation' : rhS >= MOULD_RH ? 'mould risk' : 'fine';
    if (RANK[state] > RANK[verdict]) verdict = state;
    const weights: Record<string, number> = {};
    if (weightsAt) {
      const w = weightsAt;
      inp.touch.forEach((z, q) => { weights[zones[z].zoneId] = w[q]; });
    } else for (const z of inp.touch) weights[zones[z].zoneId] = unitTemp(r.ref[kMin], z);
    const fRsi = inp.twoZone && inp.indoor !== null ? weights[zones[inp.indoor].zoneId] : null;
    const from: [number, number] = r.horizontal ? [r.lo, ys[r.line]] : [xs[r.line], r.lo];
    const to: [number, number] = r.horizontal ? [r.hi, ys[r.line]] : [xs[r.line], r.hi];
    const solid = resolved.solids[r.solid];
    segments.push({
      id: `${r.kind === 'hidden' ? 'h' : 's'}${idx + 1}`,
      kind: r.kind,
      zoneId: zones[r.zone].zoneId,
      partId: solid.partId,
      materialId: solid.materialId,
      behindPartId: r.behind >= 0 ? resolved.solids[r.behind].partId : null,
      from, to, length: L,
      tMin, tMean: sum / L, at,
      tMinMonth, rhSurfaceMax: rhS,
      fRsi, weights,
      dewPoint: dp, mouldLimit: ml, state,
    });
  });
  const surfaceSegs = segments.filter((s) => s.kind === 'surface');
  const pool = surfaceSegs.length ? surfaceSegs : segments;
  const c = pool.length ? pool.reduce((a, b) => (b.tMin < a.tMin ? b : a)) : null;
  let dpOut: number | null = null, mlOut: number | null = null, fmin: number | null = null;
  if (indoor !== null && airs[indoor]) {
    const air = airs[indoor]!;
    dpOut = dewPoint(air.design.t, air.design.rh);
    mlOut = mouldLimit(air.month.t, air.month.rh);
    if (inp.exterior !== null) {
      const te = zones[inp.exterior].record.month.t;
      fmin = air.month.t !== te ? (mlOut - te) / (air.month.t - te) : null;
    }
    if (zones[indoor].record.month.rh === null) warnings.push(`zone '${zones[indoor].zoneId}' has no coldest-month humidity: the design-day humidity is used for the mould check`);
  }
  if (segments.some((s) => s.kind === 'hidden'))
    assumptions.push({ topic: 'hidden surfaces', text: 'Interfaces where an air-open layer meets an airtight one on its cold side are judged as if indoor air reaches them (worst case for air leakage); their temperature is the conduction-only interface temperature.', source: 'ISO 13788 criteria applied to a worst-case air path (common practice)' });
  return {
    segments,
    coldest: c ? { segmentId: c.id, t: c.tMin, at: c.at, fRsi: c.fRsi, weights: c.weights } : null,
    verdict,
    dewPoint: dpOut,
    mouldLimit: mlOut,
    fRsiMin: fmin,
    warnings,
    assumptions,
  };
}

/** Interface temperature on side s of cell c for another solution u (unit field, zone temperatures only via u). */
function faceTempWith(field: TemperatureField, c: number, s: number, u: Float64Array): number {
  const { sys, lambda } = field;
  const { nx, xs, ys, owner } = sys.mesh;
  const i = c % nx, j = (c - i) / nx;
  const d = s === 0 ? c - 1 : s === 1 ? c + 1 : s === 2 ? c - nx : c + nx;
  const ii = d % nx, jj = (d - ii) / nx;
  const hp = s < 2 ? (xs[i + 1] - xs[i]) / 2 : (ys[j + 1] - ys[j]) / 2;
  const hq = s < 2 ? (xs[ii + 1] - xs[ii]) / 2 : (ys[jj + 1] - ys[jj]) / 2;
  const kp = lambda[owner[c]] / hp, kq = lambda[owner[d]] / hq;
  return (kp * u[sys.unknownOf[c]] + kq * u[sys.unknownOf[d]]) / (kp + kq);
}
