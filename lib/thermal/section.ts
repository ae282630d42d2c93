/**
 * solveSection: from a section snapshot to results. The one entry the browser worker, the command
 * line and the tests share. Two runs on one mesh and one multigrid hierarchy: the heat-flow run
 * (ISO 6946 surface resistances) and the surface-temperature run (Rsi 0.25 on interior faces).
 * Each run solves one unit problem per zone (that zone at 1 K, the others at 0) but the last,
 * which follows from the others (unit solutions add up to 1); every temperature set is a
 * superposition of them, so the design day and the coldest month cost nothing extra.
 */
import type { Material } from '../materials/material';
import type { Point } from '../section/geometry';
import { resolveSection } from '../section/resolve';
import type { ResolvedSection } from '../section/resolve';
import type { SectionSnapshot } from '../section/schema';
import { GridVCycle } from './gmg/cycle';
import { buildGridHierarchy, meshWidths } from './gmg/hierarchy';
import type { ThermalSystem } from './assemble';
import { assemble, faceConductances, operatorWith, zoneFlows } from './assemble';
import { TemperatureField } from './field';
import { Pcg } from './krylov';
import type { MeshLevel, MeshSpec } from './mesh';
import { MESH_LEVELS, buildMesh } from './mesh';
import { buildPsi } from './psi';
import type { Run, ZoneRule } from './rs';
import { describeRule, interiorKind } from './rs';
import type { CancelToken, StopRule, UnitSolveStats } from './solve';
import { DEFAULT_STOP, PREVIEW_STOP, energyBalance, runAsync, runSync, solveUnit } from './solve';
import type { Assumption, Coupling, SectionResults, UnitSolveReport, ZoneResult } from './types';
import { buildSegments } from './verdict';

export interface SolveOptions {
  mesh?: MeshLevel | MeshSpec;
  signal?: CancelToken;
  /** Results of an earlier solve of (nearly) the same section: its solutions start this one. */
  warmStart?: SectionResults | null;
  /** Points where temperatures are reported (results.probes). */
  probes?: readonly Point[];
  stop?: Partial<StopRule>;
  /** Leave out the per-cell field (smaller results). */
  omitField?: boolean;
}

/** What a warm start needs, kept beside the results object (not in its JSON). */
interface WarmState {
  xs: Float64Array;
  ys: Float64Array;
  nx: number;
  unknownOf: Int32Array;
  owner: Int32Array;
  zoneIds: string[];
  unit: Record<Run, Map<string, Float64Array>>;
}
const warmStates = new WeakMap<object, WarmState>();

export class SectionInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SectionInputError';
  }
}

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

export function solveSectionSync(snapshot: SectionSnapshot, options: SolveOptions = {}): SectionResults {
  return runSync(solveSectionSteps(snapshot, options));
}

export function solveSection(snapshot: SectionSnapshot, options: SolveOptions = {}): Promise<SectionResults> {
  return runAsync(solveSectionSteps(snapshot, options), options.signal);
}

function isGround(m: Material | undefined): boolean {
  return !!m && (m.pattern === 'earth' || m.pattern === 'rock');
}

function mapWarm(prev: WarmState, sys: ThermalSystem, zoneId: string, run: Run): Float64Array | null {
  const old = prev.unit[run].get(zoneId) ?? prev.unit.heat.get(zoneId);
  if (!old) return null;
  const { nx, ny, xc, yc } = sys.mesh;
  const out = new Float64Array(sys.n);
  const onx = prev.nx, ony = prev.ys.length - 1;
  const zi = prev.zoneIds.indexOf(zoneId);
  const find = (lines: Float64Array, v: number, n: number) => {
    let lo = 0, hi = n;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (lines[mid] <= v) lo = mid;
      else hi = mid;
    }
    return lo;
  };
  const ix = new Int32Array(nx), jy = new Int32Array(ny);
  for (let i = 0; i < nx; i++) ix[i] = find(prev.xs, xc[i], onx);
  for (let j = 0; j < ny; j++) jy[j] = find(prev.ys, yc[j], ony);
  let mean = 0;
  for (let k = 0; k < old.length; k++) mean += old[k];
  mean = old.length ? mean / old.length : 0.5;
  for (let u = 0; u < sys.n; u++) {
    const c = sys.cellOf[u];
    const i = c % nx, j = (c - i) / nx;
    const oc = jy[j] * onx + ix[i];
    const ou = prev.unknownOf[oc];
    if (ou >= 0) out[u] = old[ou];
    else {
      const o = prev.owner[oc];
      out[u] = o <= -2 ? (-2 - o === zi ? 1 : 0) : mean;
    }
  }
  return out;
}

export function* solveSectionSteps(snapshot: SectionSnapshot, options: SolveOptions = {}): Generator<void, SectionResults> {
  const t0 = now();
  if (!snapshot || typeof snapshot !== 'object' || !Array.isArray(snapshot.parts) || !Array.isArray(snapshot.zones))
    throw new SectionInputError('not a section snapshot (validate it with validateSection first)');
  if (snapshot.zones.length === 0) throw new SectionInputError('zones: the section has no zones, so nothing sets a temperature (add indoor and outdoor zones)');
  if (snapshot.parts.length === 0) throw new SectionInputError('parts: the section has no solid parts to compute');
  const resolved: ResolvedSection = resolveSection(snapshot);
  if (resolved.solids.length === 0) throw new SectionInputError('parts: no part has any solid piece');
  const materials: Material[] = resolved.solids.map((s) => {
    const m = resolved.materials.get(s.materialId);
    if (!m) throw new SectionInputError(`parts: unknown material '${s.materialId}' in part '${s.partId}'`);
    if (!(m.lambda > 0) || !Number.isFinite(m.lambda)) throw new SectionInputError(`materials: '${m.id}' has no valid conductivity (${m.lambda})`);
    return m;
  });
  const lambda = Float64Array.from(materials, (m) => m.lambda);
  const level = options.mesh ?? 'default';
  const spec: MeshSpec = typeof level === 'string' ? MESH_LEVELS[level] : level;
  if (!spec) throw new SectionInputError(`mesh: unknown level '${String(level)}'; expected preview, default or fine`);
  const zones = resolved.zones;
  const zoneIds = zones.map((z) => z.zoneId);

  const mesh = buildMesh(resolved.solids.map((s, i) => ({ polygon: s.polygon, ground: isGround(materials[i]) })), zones.map((z) => ({ polygon: z.polygon })), spec);
  const t1 = now();
  const sys = assemble(mesh, lambda, zones.length);
  const t2 = now();

  // Zone rules: the direction of heat flow from the design temperatures.
  const tDesign = zones.map((z) => z.record.design.t);
  const tMonth = zones.map((z) => z.record.month.t);
  const rules: ZoneRule[] = zones.map((z, i) => {
    const others = tDesign.filter((_, k) => k !== i);
    const mean = others.length ? others.reduce((a, b) => a + b, 0) / others.length : tDesign[i];
    return { kind: z.kind, rs: z.record.rs, flowSign: Math.sign(tDesign[i] - mean) };
  });
  const rsiSurface = snapshot.analysis?.rsiSurface ?? 0.25;
  const touching = new Uint8Array(zones.length);
  for (let f = 0; f < sys.faces.count; f++) touching[sys.faces.zone[f]] = 1;
  const touch = [...touching.keys()].filter((z) => touching[z]);
  // The reference zone (not solved for): the one with most faces.
  const faceCount = new Int32Array(zones.length);
  for (let f = 0; f < sys.faces.count; f++) faceCount[sys.faces.zone[f]]++;
  const reference = touch.reduce((a, b) => (faceCount[b] > faceCount[a] ? b : a), touch[0]);

  const gHeat = faceConductances(sys, rules, 'heat', rsiSurface);
  const gSurf = faceConductances(sys, rules, 'surface', rsiSurface);
  let sameRuns = true;
  for (let f = 0; f < gHeat.length; f++) if (gHeat[f] !== gSurf[f]) { sameRuns = false; break; }
  const aHeat = operatorWith(sys, gHeat);
  const hierarchy = buildGridHierarchy(aHeat, sys.cellOf, mesh.nx, mesh.ny, { widths: meshWidths(mesh.xs, mesh.ys) });
  const pre = new GridVCycle(hierarchy);
  const t3 = now();

  const stop: StopRule = { ...(level === 'preview' ? PREVIEW_STOP : DEFAULT_STOP), ...options.stop };
  const prevState = options.warmStart ? warmStates.get(options.warmStart) ?? null : null;
  const unit: Record<Run, Map<string, Float64Array>> = { heat: new Map(), surface: new Map() };
  const reports: UnitSolveReport[] = [];
  const b = new Float64Array(sys.n);
  const flows = new Float64Array(zones.length), prevFlows = new Float64Array(zones.length);
  const runs: Run[] = sameRuns ? ['heat'] : ['heat', 'surface'];
  for (const run of runs) {
    const g = run === 'heat' ? gHeat : gSurf;
    const a = run === 'heat' ? aHeat : operatorWith(sys, gSurf);
    const pcg = new Pcg(a, pre);
    const sols = new Map<number, Float64Array>();
    for (const z of touch) {
      if (z === reference) continue;
      let x0 = prevState ? mapWarm(prevState, sys, zoneIds[z], run) : null;
      // The surface run starts from the heat-flow run's solution when there is nothing better.
      if (!x0 && run === 'surface') x0 = unit.heat.get(zoneIds[z]) ?? null;
      const st: UnitSolveStats = yield* solveUnit(sys, a, g, pcg, z, x0, stop, b, flows, prevFlows);
      sols.set(z, pcg.x.slice());
      reports.push({ run, zoneId: zoneIds[z], iterations: st.iterations, relativeResidual: st.relativeResidual, flowChange: st.flowChange, balance: st.balance, converged: st.converged, warm: st.warm });
    }
    const ref = new Float64Array(sys.n).fill(1);
    for (const s of sols.values()) for (let u = 0; u < sys.n; u++) ref[u] -= s[u];
    sols.set(reference, ref);
    for (const [z, s] of sols) unit[run].set(zoneIds[z], s);
  }
  if (sameRuns) unit.surface = unit.heat;
  const t4 = now();

  // Superposition.
  const combine = (run: Run, t: ArrayLike<number>) => {
    const x = new Float64Array(sys.n);
    for (const z of touch) {
      const s = unit[run].get(zoneIds[z])!;
      const tz = t[z];
      for (let u = 0; u < sys.n; u++) x[u] += tz * s[u];
    }
    return x;
  };
  const xHeat = combine('heat', tDesign);
  const xSurf = sameRuns ? xHeat : combine('surface', tDesign);
  const xSurfMonth = combine('surface', tMonth);
  const xHeatMonth = combine('heat', tMonth);
  const qDesign = zoneFlows(sys, gHeat, xHeat, tDesign, new Float64Array(zones.length));
  const qMonth = zoneFlows(sys, gHeat, xHeatMonth, tMonth, new Float64Array(zones.length));
  // Coupling coefficients from the unit solutions: F[z][k] = flow from z into the construction with k at 1 K.
  const F: number[][] = zones.map(() => zones.map(() => 0));
  for (const k of touch) {
    const t = new Float64Array(zones.length);
    t[k] = 1;
    const q = zoneFlows(sys, gHeat, unit.heat.get(zoneIds[k])!, t, new Float64Array(zones.length));
    for (let z = 0; z < zones.length; z++) F[z][k] = q[z];
  }
  const couplings: Coupling[] = [];
  for (let i = 0; i < touch.length; i++)
    for (let j = i + 1; j < touch.length; j++) {
      const a = touch[i], c = touch[j];
      couplings.push({ a: zoneIds[a], b: zoneIds[c], l: -0.5 * (F[a][c] + F[c][a]) });
    }

  const fieldSurf = new TemperatureField(sys, lambda, gSurf, xSurf, tDesign);
  const fieldHeat = new TemperatureField(sys, lambda, gHeat, xHeat, tDesign);
  const fieldSurfMonth = new TemperatureField(sys, lambda, gSurf, xSurfMonth, tMonth);

  // Indoor zone: the warmest indoor zone that touches the construction.
  const indoorCandidates = touch.filter((z) => zones[z].kind === 'indoor');
  const indoor = indoorCandidates.length ? indoorCandidates.reduce((a, c) => (tDesign[c] > tDesign[a] ? c : a)) : null;
  const twoZone = touch.length === 2 && indoor !== null;
  const exterior = twoZone ? touch.find((z) => z !== indoor)! : null;
  // Indoor zones at the same design temperature act as one interior environment (ISO 10211 treats a
  // junction between two rooms at one temperature as one boundary): L2D is the flow out of all of them
  // together at 1 K, so a floor deck between a basement and the room above adds nothing to it.
  const interior = indoor !== null ? indoorCandidates.filter((z) => Math.abs(tDesign[z] - tDesign[indoor]) < 1e-9) : [];
  const l2d = indoor !== null ? interior.reduce((sum, i) => sum + interior.reduce((s, k) => s + F[i][k], 0), 0) : null;

  const segs = buildSegments({
    sys, resolved, materials, zones, touch, indoor, exterior, twoZone,
    fieldDesign: fieldSurf, fieldMonth: fieldSurfMonth,
    unitSurface: (z) => unit.surface.get(zoneIds[z])!,
    g: gSurf,
    cornerSplit: spec.cornerSplit,
  });

  const psiOut = buildPsi({ resolved, materials, l2d, indoor, rules, snapshot });

  const zoneResults: ZoneResult[] = zones.map((z, i) => ({
    id: z.zoneId,
    name: z.record.name,
    kind: z.kind,
    design: { t: z.record.design.t, rh: z.record.design.rh },
    month: { t: z.record.month.t, rh: z.record.month.rh },
    touches: touching[i] === 1,
    rsHeat: describeRule(rules[i], 'heat', rsiSurface),
    rsSurface: describeRule(rules[i], 'surface', rsiSurface),
    phi: qDesign[i],
    phiMonth: qMonth[i],
  }));

  const warnings: string[] = [...psiOut.warnings, ...segs.warnings];
  for (const s of sys.isolatedSolids) {
    const sol = resolved.solids[s];
    warnings.push(`part '${sol.partId}' (${sol.role}) has cells that touch no zone, directly or through other parts: their temperature is undefined and they were left out`);
  }
  for (const z of zones) if (!touching[zones.indexOf(z)]) warnings.push(`zone '${z.zoneId}' touches no solid part and takes no part in the heat flow`);
  if (touch.length < 2) warnings.push('fewer than two zones touch the construction: there is no heat flow');
  for (const r of reports) if (!r.converged) warnings.push(`the ${r.run} solve for zone '${r.zoneId}' stopped at ${r.iterations} iterations before meeting its tolerance (residual ${r.relativeResidual.toExponential(2)})`);

  const assumptions: Assumption[] = [
    { topic: 'method', text: 'Steady-state two-dimensional heat conduction, cell-centred finite volumes on a rectilinear grid through every part and zone edge; harmonic face conductances; adiabatic on the outer edge of the model and on void.', source: 'ISO 10211 (numerical method requirements, clauses 5 and 6; recalled from memory)' },
    { topic: 'mesh', text: `Mesh level ${typeof level === 'string' ? level : 'custom'}: ${mesh.nx} x ${mesh.ny} = ${mesh.nx * mesh.ny} cells, ${sys.n} solid; first cell ${spec.h0 * 1000} mm, growth ${spec.growth}${spec.growthY !== undefined && spec.growthY !== spec.growth ? ` (${spec.growthY} away from horizontal lines)` : ''}, at most ${spec.hmax * 1000} mm in constructions and ${spec.hmaxGround * 1000} mm in ground. Sloped edges are staircased at cell resolution.`, source: 'Dewline mesh (docs/solver.md)' },
    { topic: 'solver', text: `Preconditioned conjugate gradient with a geometric multigrid V-cycle on the mesh grid; ${reports.length} unit solves, largest final relative residual ${Math.max(0, ...reports.map((r) => r.relativeResidual)).toExponential(2)}; each stopped at a relative residual of ${stop.rtol.toExponential(0)} or once no zone flow changed by more than ${stop.ftol.toExponential(0)} of the largest in an iteration with the flows balanced to ${stop.btol.toExponential(0)}.`, source: 'Dewline solver (docs/solver.md)' },
    ...zones.map((z, i) => ({ topic: `surface resistance: ${z.zoneId}`, text: `Heat-flow run: ${zoneResults[i].rsHeat}. Surface-temperature run: ${zoneResults[i].rsSurface}.`, source: interiorKind(z.kind) && z.record.rs === 'auto' ? 'ISO 6946 (heat flow); ISO 13788 clause 4.3 and ISO 10211 (surface temperature, Rsi 0.25; 0.35 behind furniture is an option, recalled from memory)' : 'ISO 6946 (Rse 0.04), or the zone\'s own value' })),
    { topic: 'psychrometrics', text: 'Saturation pressure over water (>= 0 C) and ice (< 0 C) as in ISO 13788; condensation when a surface is below the dew point of the design day; mould risk when the surface RH reaches 80 % at the coldest-month mean.', source: 'ISO 13788 (Annex E formulas; clause 4.2 criterion)' },
    { topic: 'screening', text: 'Results are a screening aid: local codes, manufacturers\' instructions and licensed professionals govern (frost protection, drainage and waterproofing, radon, fire protection of foam plastics, structure).', source: 'common practice' },
    ...psiOut.assumptions,
    ...segs.assumptions,
  ];
  const seenMat = new Set<string>();
  materials.forEach((m) => {
    if (seenMat.has(m.id)) return;
    seenMat.add(m.id);
    assumptions.push({ topic: `material: ${m.id}`, text: `${m.name}: lambda ${m.lambda} W/(m K)${m.airOpen ? ', air-open' : ''}`, source: m.source.lambda });
  });

  // ISO 10211 energy balance. With every touching zone at one design temperature the design flows are
  // rounding noise and their balance means nothing (up to 2): report the largest balance of the unit
  // solutions (each zone at 1 K, others 0; columns of F), or 0 when there is no unit solve.
  const designSpread = touch.length ? Math.max(...touch.map((z) => tDesign[z])) - Math.min(...touch.map((z) => tDesign[z])) : 0;
  let balanceOut = energyBalance(qDesign);
  if (designSpread < 1e-9) {
    const col = new Float64Array(zones.length);
    balanceOut = 0;
    if (touch.length >= 2) for (const k of touch) { for (let z = 0; z < zones.length; z++) col[z] = F[z][k]; balanceOut = Math.max(balanceOut, energyBalance(col)); }
    assumptions.push({ topic: 'energy balance', text: touch.length >= 2 ? 'Every zone touching the construction has the same design temperature, so there is no net heat flow; the energy balance given is the largest of the unit solutions (one zone at 1 K, the others at 0).' : 'No temperature difference across the construction (fewer than two zones touch it): energy balance reported as 0.', source: 'ISO 10211 (energy balance criterion; recalled from memory)' });
  }
  const design = indoor !== null ? zones[indoor].record.design : null;
  const month = indoor !== null ? zones[indoor].record.month : null;
  const results: SectionResults = {
    format: 'dewline-results',
    version: 1,
    name: snapshot.name,
    mesh: { level: typeof level === 'string' ? level : 'custom', spec, nx: mesh.nx, ny: mesh.ny, cells: mesh.nx * mesh.ny, unknowns: sys.n, minCell: minStep(mesh.xs, mesh.ys), maxCell: maxStep(mesh.xs, mesh.ys) },
    solver: {
      method: 'PCG, geometric multigrid V(1,1) preconditioner on the mesh grid (operator-dependent interpolation, Galerkin coarse operators, Gauss-Seidel forward and backward)',
      levels: hierarchy.sizes,
      operatorComplexity: hierarchy.operatorComplexity,
      solves: reports,
      residual: Math.max(0, ...reports.map((r) => r.relativeResidual)),
      iterations: reports.reduce((a, r) => a + r.iterations, 0),
      timings: { meshMs: t1 - t0, assembleMs: t2 - t1, setupMs: t3 - t2, solveMs: t4 - t3, resultsMs: 0 },
    },
    zones: zoneResults,
    energyBalance: balanceOut,
    couplings,
    indoorZoneId: indoor !== null ? zoneIds[indoor] : null,
    l2d,
    psi: psiOut.psi,
    psiGround: psiOut.psiGround,
    conditions: indoor !== null ? {
      design: { ti: design!.t, te: exterior !== null ? tDesign[exterior] : null, rh: design!.rh, dewPoint: segs.dewPoint },
      month: { ti: month!.t, te: exterior !== null ? tMonth[exterior] : null, rh: month!.rh ?? design!.rh, mouldLimit: segs.mouldLimit, fRsiMin: segs.fRsiMin },
    } : null,
    surfaces: segs.segments,
    coldest: segs.coldest,
    verdict: segs.verdict,
    field: options.omitField ? { xs: [], ys: [], t: [] } : fieldJson(sys, xSurf),
    probes: (options.probes ?? []).map(([x, y]) => ({ at: [x, y] as [number, number], heat: nullIfNaN(fieldHeat.at(x, y)), surface: nullIfNaN(fieldSurf.at(x, y)) })),
    assumptions,
    warnings,
  };
  results.solver.timings.resultsMs = now() - t4;
  warmStates.set(results, { xs: mesh.xs, ys: mesh.ys, nx: mesh.nx, unknownOf: sys.unknownOf, owner: mesh.owner, zoneIds, unit });
  return results;
}

function nullIfNaN(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

function fieldJson(sys: ThermalSystem, x: Float64Array): SectionResults['field'] {
  const t: (number | null)[] = new Array(sys.mesh.nx * sys.mesh.ny).fill(null);
  for (let u = 0; u < sys.n; u++) t[sys.cellOf[u]] = x[u];
  return { xs: Array.from(sys.mesh.xs), ys: Array.from(sys.mesh.ys), t };
}

function minStep(xs: Float64Array, ys: Float64Array): number {
  let m = Infinity;
  for (const a of [xs, ys]) for (let i = 0; i + 1 < a.length; i++) m = Math.min(m, a[i + 1] - a[i]);
  return m;
}
function maxStep(xs: Float64Array, ys: Float64Array): number {
  let m = 0;
  for (const a of [xs, ys]) for (let i = 0; i + 1 < a.length; i++) m = Math.max(m, a[i + 1] - a[i]);
  return m;
}
