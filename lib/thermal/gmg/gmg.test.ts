/**
 * The grid multigrid's pieces against their definitions: the Galerkin operator against P^T A P
 * formed densely, the banded factor against the system it factors, the line smoother against an
 * exact 1-D solve, the cycle's symmetry (PCG needs a symmetric positive definite M), and PCG's
 * convergence on graded meshes with conductivity jumps of 10^4 (our own robustness target).
 */
import { describe, expect, it } from 'vitest';
import type { Csr } from '../csr';
import { residual } from '../csr';
import { Pcg } from '../krylov';
import { bandCholesky, bandSolve } from './band';
import { GridVCycle } from './cycle';
import { galerkinCoarse } from './galerkin';
import type { GridLevel } from './grid';
import { fineLevelFromCsr } from './grid';
import { buildGridHierarchy } from './hierarchy';
import { operatorInterpolation, prolongatorRow } from './interpolation';
import { lineSmoothPre, linePivots, xLines } from './lines';
import { restrictResidual } from './smoothers';

function rng(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

/**
 * A random cell-centred 5-point operator on nx x ny cells: cell sizes graded (aspect ratios up to
 * `aspect`), conductivities from {230, 1.15, 0.12, 0.023} in blocks, a few cells left out (holes),
 * boundary conductances on the top and bottom rows. Returns the CSR operator over the kept cells.
 */
function randomOperator(nx: number, ny: number, seed: number, aspect = 1, holes = 0.05): { a: Csr; cellOf: Int32Array; nx: number; ny: number } {
  const r = rng(seed);
  const L = [230, 1.15, 0.12, 0.023];
  // Material blocks: bx x by cells (aspect > 0), or (aspect < 0) blocks between random grid lines
  // with cells graded as the mesh grades them: growth 1.3 away from every block edge, capped at
  // -aspect times the first cell, so that cells are long and thin along the edges.
  const cutsOf = (m: number) => {
    const cuts = [0];
    while (cuts[cuts.length - 1] < m) cuts.push(cuts[cuts.length - 1] + 3 + Math.floor(r() * 30));
    return cuts;
  };
  const xc = cutsOf(nx), yc = cutsOf(ny);
  const sizes = (m: number, cuts: number[]) => {
    if (aspect >= 1) return Array.from({ length: m }, () => 0.01 * (1 + (aspect - 1) * r()));
    return Array.from({ length: m }, (_, i) => 0.002 * Math.min(-aspect, 1.3 ** Math.min(...cuts.map((l) => Math.min(Math.abs(i - l), Math.abs(i + 1 - l))))));
  };
  const dx = sizes(nx, xc), dy = sizes(ny, yc);
  const blockOf = (i: number, cuts: number[], b: number) => (aspect >= 1 ? Math.floor(i / b) : cuts.findIndex((c) => c > i));
  const bx = 1 + Math.floor(r() * 6), by = 1 + Math.floor(r() * 6);
  const lam = new Float64Array(nx * ny);
  const keep = new Uint8Array(nx * ny);
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) {
      lam[j * nx + i] = L[(blockOf(i, xc, bx) + 2 * blockOf(j, yc, by)) % 4];
      keep[j * nx + i] = j === 0 || j === ny - 1 || r() > holes ? 1 : 0;
      // holes < 0: one rectangular void from the top edge down (a room cut into the construction).
      if (holes < 0) keep[j * nx + i] = j > ny / 2 && i > nx / 3 && i < (2 * nx) / 3 ? 0 : 1;
    }
  const unknownOf = new Int32Array(nx * ny).fill(-1);
  const cells: number[] = [];
  for (let c = 0; c < nx * ny; c++) if (keep[c]) { unknownOf[c] = cells.length; cells.push(c); }
  const rows: [number, number][][] = cells.map(() => []);
  const diag = new Float64Array(cells.length);
  for (let u = 0; u < cells.length; u++) {
    const c = cells[u], i = c % nx, j = (c - i) / nx;
    const nb: [number, number, number][] = [];
    if (i > 0) nb.push([c - 1, dy[j], 0.5 * dx[i] / lam[c] + 0.5 * dx[i - 1] / lam[c - 1]]);
    if (i < nx - 1) nb.push([c + 1, dy[j], 0.5 * dx[i] / lam[c] + 0.5 * dx[i + 1] / lam[c + 1]]);
    if (j > 0) nb.push([c - nx, dx[i], 0.5 * dy[j] / lam[c] + 0.5 * dy[j - 1] / lam[c - nx]]);
    if (j < ny - 1) nb.push([c + nx, dx[i], 0.5 * dy[j] / lam[c] + 0.5 * dy[j + 1] / lam[c + nx]]);
    for (const [d, len, res] of nb) {
      if (unknownOf[d] < 0) continue;
      const g = len / res;
      rows[u].push([unknownOf[d], -g]);
      diag[u] += g;
    }
    if (j === 0) diag[u] += dx[i] / (0.04 + 0.5 * dy[j] / lam[c]);
    if (j === ny - 1) diag[u] += dx[i] / (0.13 + 0.5 * dy[j] / lam[c]);
    rows[u].push([u, diag[u]]);
    rows[u].sort((p, q) => p[0] - q[0]);
  }
  const n = cells.length;
  const rowPtr = new Int32Array(n + 1);
  for (let u = 0; u < n; u++) rowPtr[u + 1] = rowPtr[u] + rows[u].length;
  const col = new Int32Array(rowPtr[n]), val = new Float64Array(rowPtr[n]);
  for (let u = 0; u < n; u++) rows[u].forEach(([cc, v], t) => { col[rowPtr[u] + t] = cc; val[rowPtr[u] + t] = v; });
  return { a: { n, m: n, rowPtr, col, val }, cellOf: Int32Array.from(cells), nx, ny };
}

/** A level as a dense matrix over its interior points (row-major j nx + i). */
function denseOf(lv: GridLevel): Float64Array {
  const { nx, ny, stride: st } = lv;
  const n = nx * ny;
  const m = new Float64Array(n * n);
  const at = (k: number) => { const j = Math.floor(k / st) - 1, i = (k % st) - 1; return i >= 0 && i < nx && j >= 0 && j < ny ? j * nx + i : -1; };
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) {
      const k = (j + 1) * st + i + 1, q = j * nx + i;
      const ent: [number, number][] = [[k, lv.c[k]], [k - 1, lv.w[k]], [k + 1, lv.w[k + 1]], [k - st, lv.s[k]], [k + st, lv.s[k + st]]];
      if (lv.sw && lv.se) ent.push([k - st - 1, lv.sw[k]], [k - st + 1, lv.se[k]], [k + st - 1, lv.se[k + st - 1]], [k + st + 1, lv.sw[k + st + 1]]);
      for (const [kk, v] of ent) { const qq = at(kk); if (qq >= 0) m[q * n + qq] += v; }
    }
  return m;
}

function maxAbs(v: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) m = Math.max(m, Math.abs(v[i]));
  return m;
}

describe('Galerkin coarse operator', () => {
  it.each([[9, 7, 1], [12, 10, 2], [8, 13, 3]])('equals P^T A P formed densely (%i x %i, seed %i), on two levels', (nx, ny, seed) => {
    const op = randomOperator(nx, ny, seed, 5);
    let f = fineLevelFromCsr(op.a, op.cellOf, nx, ny).level;
    for (let lev = 0; lev < 2; lev++) {
      const p = operatorInterpolation(f);
      const c = galerkinCoarse(f, p);
      const nf = f.nx * f.ny, nc = c.nx * c.ny;
      const P = new Float64Array(nf * nc);
      const ks = new Int32Array(4), ws = new Float64Array(4);
      for (let j = 0; j < f.ny; j++)
        for (let i = 0; i < f.nx; i++) {
          const m = prolongatorRow(p, i, j, ks, ws);
          for (let t = 0; t < m; t++) {
            const K = ks[t], J = Math.floor(K / p.stride) - 1, I = (K % p.stride) - 1;
            P[(j * f.nx + i) * nc + J * c.nx + I] += ws[t];
          }
        }
      const A = denseOf(f), Ac = denseOf(c);
      // Decoupled coarse rows (no fine couplings) get diagonal 1 by design: compare the rest.
      let err = 0, scale = 0;
      for (let I = 0; I < nc; I++)
        for (let J = 0; J < nc; J++) {
          let v = 0;
          for (let a = 0; a < nf; a++) {
            const pa = P[a * nc + I];
            if (pa === 0) continue;
            for (let b = 0; b < nf; b++) v += pa * A[a * nf + b] * P[b * nc + J];
          }
          if (I === J && v === 0) v = 1;
          err = Math.max(err, Math.abs(v - Ac[I * nc + J]));
          scale = Math.max(scale, Math.abs(v));
        }
      expect(err / scale).toBeLessThan(1e-12);
      f = c;
    }
  });

  it('black-box interpolation keeps a constant at rows without boundary conductance (weights sum to 1)', () => {
    const op = randomOperator(15, 11, 7, 4, 0);
    const f = fineLevelFromCsr(op.a, op.cellOf, 15, 11).level;
    const p = operatorInterpolation(f);
    const ks = new Int32Array(4), ws = new Float64Array(4);
    let checked = 0;
    for (let j = 1; j < 10; j++)
      for (let i = 0; i < 15; i++) {
        if (j === 1 || j === 9) continue; // neighbours of the boundary rows carry their conductance
        const m = prolongatorRow(p, i, j, ks, ws);
        let sum = 0;
        for (let t = 0; t < m; t++) sum += ws[t];
        expect(sum).toBeCloseTo(1, 12);
        checked++;
      }
    expect(checked).toBeGreaterThan(100);
  });
});

describe('banded Cholesky of the coarsest level', () => {
  it.each([[9, 5], [5, 9], [1, 12], [12, 1]])('solves the level exactly (%i x %i)', (nx, ny) => {
    const op = randomOperator(2 * nx - 1, 2 * ny - 1, nx * 31 + ny, 3);
    const f = fineLevelFromCsr(op.a, op.cellOf, op.nx, op.ny).level;
    const c = galerkinCoarse(f, operatorInterpolation(f));
    const fac = bandCholesky(c);
    expect(fac.bw).toBe(Math.min(c.nx, c.ny) + 1);
    const r = rng(5);
    const b = new Float64Array(c.c.length), x = new Float64Array(c.c.length);
    for (let j = 0; j < c.ny; j++) for (let i = 0; i < c.nx; i++) b[(j + 1) * c.stride + i + 1] = r() - 0.5;
    bandSolve(fac, b, x);
    const A = denseOf(c), n = c.nx * c.ny;
    let err = 0;
    for (let q = 0; q < n; q++) {
      let s = 0;
      for (let t = 0; t < n; t++) s += A[q * n + t] * x[(Math.floor(t / c.nx) + 1) * c.stride + (t % c.nx) + 1];
      err = Math.max(err, Math.abs(s - b[(Math.floor(q / c.nx) + 1) * c.stride + (q % c.nx) + 1]));
    }
    expect(err).toBeLessThan(1e-10);
  });
});

describe('line smoother', () => {
  it('one x-line sweep solves a single row exactly', () => {
    const op = randomOperator(40, 1, 3, 8, 0);
    const lv = fineLevelFromCsr(op.a, op.cellOf, 40, 1).level;
    const piv = linePivots(lv);
    for (let i = 0; i < 40; i++) lv.b[lv.stride + 1 + i] = Math.sin(i);
    lv.x.fill(0);
    xLines(lv, piv.x, 0);
    const x = new Float64Array(op.a.n), b = new Float64Array(op.a.n), r = new Float64Array(op.a.n);
    for (let u = 0; u < op.a.n; u++) { x[u] = lv.x[lv.stride + 1 + u]; b[u] = Math.sin(u); }
    residual(op.a, x, b, r);
    expect(maxAbs(r)).toBeLessThan(1e-12 * maxAbs(b));
  });

  it('after pre-smoothing the residual on the odd columns is zero, so restricting only the even columns is exact', () => {
    const op = randomOperator(17, 14, 9, 6);
    const lv = fineLevelFromCsr(op.a, op.cellOf, 17, 14).level;
    const p = operatorInterpolation(lv);
    const r = rng(2);
    for (let j = 0; j < 14; j++) for (let i = 0; i < 17; i++) lv.b[(j + 1) * lv.stride + i + 1] = r();
    for (let u = 0; u < op.a.n; u++) void u;
    lv.x.fill(0);
    lineSmoothPre(lv, linePivots(lv));
    const full = new Float64Array((p.nx + 2) * (p.ny + 2)), half = new Float64Array(full.length);
    restrictResidual(lv, p, full, false);
    restrictResidual(lv, p, half, true);
    let d = 0;
    for (let k = 0; k < full.length; k++) d = Math.max(d, Math.abs(full[k] - half[k]));
    expect(d).toBeLessThan(1e-12 * maxAbs(full));
  });
});

describe('grid V-cycle as a PCG preconditioner', () => {
  it.each(['line', 'point'] as const)('is symmetric positive definite (%s smoother)', (smoother) => {
    const op = randomOperator(33, 26, 4, 10);
    const h = buildGridHierarchy(op.a, op.cellOf, op.nx, op.ny, { smoother, coarseCost: 1000 });
    expect(h.levels.length).toBeGreaterThan(2);
    const m = new GridVCycle(h);
    const r = rng(8), n = op.a.n;
    const u = Float64Array.from({ length: n }, () => r() - 0.5), v = Float64Array.from({ length: n }, () => r() - 0.5);
    const mu = new Float64Array(n), mv = new Float64Array(n);
    m.apply(u, mu);
    m.apply(v, mv);
    let vmu = 0, umv = 0, umu = 0;
    for (let i = 0; i < n; i++) { vmu += v[i] * mu[i]; umv += u[i] * mv[i]; umu += u[i] * mu[i]; }
    expect(Math.abs(vmu - umv)).toBeLessThan(1e-10 * Math.abs(umu));
    expect(umu).toBeGreaterThan(0);
    // No state leaks from one application to the next (the pre-smoothers skip clearing x).
    const again = new Float64Array(n);
    m.apply(u, again);
    expect(Array.from(again)).toEqual(Array.from(mu));
  });

  it.each([[1, 60, 50], [2, 90, 70], [3, 128, 33], [4, 200, 150]])('PCG converges to 1e-10 within 20 iterations on graded cells (aspect up to 100) with jumps of 10^4 and a void (seed %i, %i x %i)', (seed, nx, ny) => {
    const op = randomOperator(nx, ny, seed, -100, -1);
    const h = buildGridHierarchy(op.a, op.cellOf, op.nx, op.ny);
    const pcg = new Pcg(op.a, new GridVCycle(h));
    const b = Float64Array.from({ length: op.a.n }, (_, i) => Math.cos(i));
    let rr = pcg.start(b, null);
    while (rr > 1e-10 && pcg.iterations < 100) rr = pcg.step();
    console.log(`graded ${nx} x ${ny}, seed ${seed}: ${pcg.iterations} iterations`);
    expect(pcg.iterations).toBeLessThanOrEqual(20);
    const res = new Float64Array(op.a.n);
    residual(op.a, pcg.x, b, res);
    let rn = 0, bn = 0;
    for (let i = 0; i < op.a.n; i++) { rn += res[i] * res[i]; bn += b[i] * b[i]; }
    expect(Math.sqrt(rn / bn)).toBeLessThan(1e-9);
  });
});
