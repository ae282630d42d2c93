/**
 * Solver benchmark (`npm run bench`, `npm run bench -- --quick` skips the 10^6-cell grid).
 * Figures, not a pass/fail test. A multi-material section (a checkerboard of four materials with a
 * conductivity contrast of 10^4, indoor air above, outdoor air below, adiabatic sides) at about
 * 10^4, 10^5 and 10^6 cells, built through the same mesh, assembly, multigrid and PCG code the app
 * runs; then every template at the default mesh through solveSectionSync (both runs).
 * Stop rule for the figures: zone heat flows settled to 1e-5 relative (DESIGN.md section 4); the
 * actual flow error against a tight reference solve is printed beside each figure.
 */
import { JacobiPreconditioner } from '../lib/thermal/preconditioner';
import type { Preconditioner } from '../lib/thermal/preconditioner';
import { GridVCycle } from '../lib/thermal/gmg/cycle';
import { buildGridHierarchy, meshWidths } from '../lib/thermal/gmg/hierarchy';
import type { GridHierarchy } from '../lib/thermal/gmg/hierarchy';
import { assemble, faceConductances, operatorWith, zoneFlows } from '../lib/thermal/assemble';
import type { Csr } from '../lib/thermal/csr';
import { csrBytes, diagonal, spmv } from '../lib/thermal/csr';
import { Pcg } from '../lib/thermal/krylov';
import type { GeometrySolid, GeometryZone, MeshSpec } from '../lib/thermal/mesh';
import { buildMesh } from '../lib/thermal/mesh';
import type { ZoneRule } from '../lib/thermal/rs';
import type { StopRule } from '../lib/thermal/solve';
import { runSync, solveUnit } from '../lib/thermal/solve';
import { solveSectionSync } from '../lib/thermal/section';
import { TEMPLATES } from '../lib/section/templates';
import type { Point } from '../lib/section/geometry';
import { cpus } from 'node:os';

const quick = process.argv.includes('--quick');
const now = () => performance.now();

/** Aluminium, concrete, wood, foam: 230 / 0.023 = 10^4 (values typical of ISO 10456 tables, recalled from memory). */
const LAMBDAS = [230, 1.15, 0.12, 0.023];
const BLOCKS = 10;

function rectPoly(x0: number, y0: number, x1: number, y1: number): Point[] {
  return [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];
}

interface Problem {
  solids: GeometrySolid[];
  zones: GeometryZone[];
  spec: MeshSpec;
  lambda: Float64Array;
  rules: ZoneRule[];
}

/** A 1 m square of BLOCKS x BLOCKS blocks, material (i + 2 j) mod 4, so aluminium touches foam. */
function checkerboard(cells: number, lambdaScale = 1): Problem {
  const h = 1 / Math.sqrt(cells);
  const solids: GeometrySolid[] = [];
  const lambda: number[] = [];
  for (let j = 0; j < BLOCKS; j++)
    for (let i = 0; i < BLOCKS; i++) {
      solids.push({ polygon: rectPoly(i / BLOCKS, j / BLOCKS, (i + 1) / BLOCKS, (j + 1) / BLOCKS), ground: false });
      const m = (i + 2 * j) % 4;
      lambda.push(LAMBDAS[m] * (m === 1 ? lambdaScale : 1));
    }
  const zones: GeometryZone[] = [{ polygon: rectPoly(0, 1, 1, 1.1) }, { polygon: rectPoly(0, -0.1, 1, 0) }];
  const rules: ZoneRule[] = [{ kind: 'indoor', rs: 0.13, flowSign: 1 }, { kind: 'outdoor', rs: 0.04, flowSign: -1 }];
  return { solids, zones, spec: { h0: h, growth: 1, hmax: h, hmaxGround: h }, lambda: Float64Array.from(lambda), rules };
}

const FIG_STOP: StopRule = { rtol: 1e-14, ftol: 1e-5, btol: 1e-5, maxIterations: 1000 };

interface SolveFig {
  ms: number;
  iterations: number;
  flowError: number;
  hitCap: boolean;
  x: Float64Array;
}

function timedSolve(sys: ReturnType<typeof assemble>, a: Csr, g: Float64Array, pre: Preconditioner, stop: StopRule, qRef: Float64Array | null, x0: Float64Array | null = null): SolveFig {
  const b = new Float64Array(sys.n), f1 = new Float64Array(sys.zoneCount), f2 = new Float64Array(sys.zoneCount);
  const pcg = new Pcg(a, pre);
  const t0 = now();
  const st = runSync(solveUnit(sys, a, g, pcg, 0, x0, stop, b, f1, f2));
  const ms = now() - t0;
  let flowError = NaN;
  if (qRef) {
    const t = new Float64Array(sys.zoneCount);
    t[0] = 1;
    const q = zoneFlows(sys, g, pcg.x, t, new Float64Array(sys.zoneCount));
    let big = 0, diff = 0;
    for (let z = 0; z < q.length; z++) { big = Math.max(big, Math.abs(qRef[z])); diff = Math.max(diff, Math.abs(q[z] - qRef[z])); }
    flowError = diff / big;
  }
  return { ms, iterations: st.iterations, flowError, hitCap: st.iterations >= stop.maxIterations, x: pcg.x.slice() };
}

function matvecMs(a: Csr): number {
  const x = new Float64Array(a.m).fill(1), y = new Float64Array(a.n);
  const reps = Math.max(5, Math.min(200, Math.round(2e7 / a.rowPtr[a.n])));
  spmv(a, x, y);
  const times: number[] = [];
  for (let r = 0; r < 5; r++) {
    const t0 = now();
    for (let k = 0; k < reps; k++) spmv(a, x, y);
    times.push((now() - t0) / reps);
  }
  times.sort((p, q) => p - q);
  return times[2];
}

function hierarchyDescription(h: GridHierarchy): string {
  return `${h.levels.length} levels (${h.levels.map((l) => `${l.nx}x${l.ny}`).join(', ')}; unknowns ${h.sizes.join(', ')}), smoothers ${h.smoothers.join(', ')}, coarsest factor bandwidth ${h.coarse.bw}, operator complexity ${h.operatorComplexity.toFixed(2)}`;
}

interface GridRow {
  cells: number;
  unknowns: number;
  meshMs: number;
  assembleMs: number;
  precondMs: number;
  solveMs: number;
  iterations: number;
  flowError: number;
  matvecMs: number;
  bytesPerCell: number;
  warmMs: number;
  warmIterations: number;
  warmFlowError: number;
  jacobi: SolveFig;
  jacobiCap: number;
  hierarchy: string;
}

function runGrid(target: number): GridRow {
  const pr = checkerboard(target);
  const t0 = now();
  const mesh = buildMesh(pr.solids, pr.zones, pr.spec);
  const t1 = now();
  const sys = assemble(mesh, pr.lambda, pr.zones.length);
  const g = faceConductances(sys, pr.rules, 'heat', 0.25);
  const a = operatorWith(sys, g);
  const t2 = now();
  const h = buildGridHierarchy(a, sys.cellOf, mesh.nx, mesh.ny, { widths: meshWidths(mesh.xs, mesh.ys) });
  const pre = new GridVCycle(h);
  const t3 = now();
  // Reference flows: the same preconditioner run to a tight residual (not timed).
  const ref = timedSolve(sys, a, g, pre, { rtol: 1e-12, ftol: 0, btol: 0, maxIterations: 400 }, null);
  const tref = new Float64Array(sys.zoneCount);
  tref[0] = 1;
  const qRef = zoneFlows(sys, g, ref.x, tref, new Float64Array(sys.zoneCount));
  const mg = timedSolve(sys, a, g, pre, FIG_STOP, qRef);
  const mv = matvecMs(a);
  const cells = mesh.nx * mesh.ny;
  const bytes = csrBytes(a) + h.bytes + new Pcg(a, pre).bytes() + 8 * sys.n /* right-hand side */ + 8 * g.length + 16 * sys.faces.count + 8 * sys.n /* field copy */;

  // Warm start after a small change: concrete's lambda up 5 %; re-assemble, keep the hierarchy.
  const pr2 = checkerboard(target, 1.05);
  const w0 = now();
  const sys2 = assemble(mesh, pr2.lambda, pr2.zones.length);
  const g2 = faceConductances(sys2, pr2.rules, 'heat', 0.25);
  const a2 = operatorWith(sys2, g2);
  const w1 = now();
  const ref2 = timedSolve(sys2, a2, g2, pre, { rtol: 1e-12, ftol: 0, btol: 0, maxIterations: 400 }, null);
  const qRef2 = zoneFlows(sys2, g2, ref2.x, tref, new Float64Array(sys2.zoneCount));
  const warm = timedSolve(sys2, a2, g2, pre, FIG_STOP, qRef2, mg.x);

  const cap = target >= 1e6 ? 1500 : 5000;
  const jac = timedSolve(sys, a, g, new JacobiPreconditioner(Float64Array.from(diagonal(a), (d) => 1 / d)), { ...FIG_STOP, maxIterations: cap }, qRef);
  return {
    cells, unknowns: sys.n, meshMs: t1 - t0, assembleMs: t2 - t1, precondMs: t3 - t2, solveMs: mg.ms, iterations: mg.iterations, flowError: mg.flowError,
    matvecMs: mv, bytesPerCell: bytes / cells, warmMs: w1 - w0 + warm.ms, warmIterations: warm.iterations, warmFlowError: warm.flowError,
    jacobi: jac, jacobiCap: cap, hierarchy: hierarchyDescription(h),
  };
}

function fitExponent(xs: number[], ys: number[]): number {
  const lx = xs.map(Math.log), ly = ys.map(Math.log);
  const mx = lx.reduce((p, q) => p + q, 0) / lx.length, my = ly.reduce((p, q) => p + q, 0) / ly.length;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < lx.length; i++) { sxy += (lx[i] - mx) * (ly[i] - my); sxx += (lx[i] - mx) ** 2; }
  return sxy / sxx;
}

const f1 = (v: number) => v.toFixed(1);
const e1 = (v: number) => (Number.isFinite(v) ? v.toExponential(1) : '-');

function main() {
  console.log(`# Dewline solver benchmark ${new Date().toISOString()}`);
  console.log(`node ${process.version}, ${cpus().length} cores (${cpus()[0]?.model ?? 'unknown'}); shared machine, figures are noisy${quick ? '; --quick (no 10^6 grid)' : ''}`);
  console.log(`section: ${BLOCKS}x${BLOCKS} checkerboard of lambda ${LAMBDAS.join(', ')} W/(m K) (contrast ${(LAMBDAS[0] / LAMBDAS[3]).toExponential(0)}), uniform cells; stop: zone flows settled to ${FIG_STOP.ftol} relative`);
  // Warm up the JIT on a small grid first.
  runGrid(4e3);
  const targets = quick ? [1e4, 1e5] : [1e4, 1e5, 1e6];
  const rows = targets.map(runGrid);
  console.log('');
  console.log('| cells | unknowns | mesh ms | assembly ms | preconditioner ms | solve ms | iterations | flow error | matvec ms | solve/matvec | total ms | bytes/cell | warm re-solve ms (iterations) | Jacobi-PCG ms (iterations) | Jacobi flow error | Jacobi/multigrid solve |');
  console.log('|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|');
  for (const r of rows) {
    const total = r.meshMs + r.assembleMs + r.precondMs + r.solveMs;
    const jac = `${f1(r.jacobi.ms)} (${r.jacobi.iterations}${r.jacobi.hitCap ? `, hit cap ${r.jacobiCap}` : ''})`;
    console.log(`| ${r.cells} | ${r.unknowns} | ${f1(r.meshMs)} | ${f1(r.assembleMs)} | ${f1(r.precondMs)} | ${f1(r.solveMs)} | ${r.iterations} | ${e1(r.flowError)} | ${r.matvecMs.toFixed(3)} | ${f1(r.solveMs / r.matvecMs)} | ${f1(total)} | ${r.bytesPerCell.toFixed(0)} | ${f1(r.warmMs)} (${r.warmIterations}, error ${e1(r.warmFlowError)}) | ${jac} | ${e1(r.jacobi.flowError)} | ${f1(r.jacobi.ms / r.solveMs)} |`);
  }
  for (const r of rows) console.log(`hierarchy at ${r.cells} cells: ${r.hierarchy}`);
  const cells = rows.map((r) => r.cells);
  console.log(`fitted exponent of total time (mesh + assembly + preconditioner + solve) against cells: ${fitExponent(cells, rows.map((r) => r.meshMs + r.assembleMs + r.precondMs + r.solveMs)).toFixed(2)}; of solve time alone: ${fitExponent(cells, rows.map((r) => r.solveMs)).toFixed(2)}`);

  console.log('');
  console.log('Templates at the default mesh, solveSectionSync (heat-flow and surface-temperature runs), median of 3 after one warm-up:');
  console.log('| template | cells | unknowns | total ms | mesh | assembly | setup | solve | results | unit solves (iterations) | solve ms per iteration | solve ms if every unit solve took 6 iterations |');
  console.log('|---|---|---|---|---|---|---|---|---|---|---|---|');
  for (const t of TEMPLATES) {
    const s = t.build();
    solveSectionSync(s, { omitField: true });
    const runs = [0, 1, 2].map(() => {
      const t0 = now();
      const r = solveSectionSync(s, { omitField: true });
      return { ms: now() - t0, r };
    }).sort((p, q) => p.ms - q.ms);
    const { ms, r } = runs[1];
    const tm = r.solver.timings;
    // What the solve would cost at the benchmark's best iteration count (6 from a zero start, table
    // above) with this cycle: the part of the template time that fewer iterations cannot remove.
    const perIt = tm.solveMs / Math.max(1, r.solver.iterations);
    console.log(`| ${t.name} | ${r.mesh.cells} | ${r.mesh.unknowns} | ${f1(ms)} | ${f1(tm.meshMs)} | ${f1(tm.assembleMs)} | ${f1(tm.setupMs)} | ${f1(tm.solveMs)} | ${f1(tm.resultsMs)} | ${r.solver.solves.map((u) => `${u.run}:${u.iterations}`).join(' ')} | ${perIt.toFixed(2)} | ${f1(perIt * 6 * r.solver.solves.length)} |`);
  }
}

main();
