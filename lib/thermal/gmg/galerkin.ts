/**
 * Galerkin coarse operator A_c = P^T A P on the structured grid. With the black-box prolongator
 * every coarse point couples only to its eight coarse neighbours, so A_c is a 9-point stencil;
 * only the diagonal and the lower couplings are accumulated (A_c is symmetric).
 */
import type { GridLevel } from './grid';
import { emptyLevel, finishDiagonal } from './grid';
import type { Prolongator } from './interpolation';
import { prolongatorRow } from './interpolation';

export function galerkinCoarse(f: GridLevel, p: Prolongator): GridLevel {
  const cl = emptyLevel(p.nx, p.ny, true);
  const cs = p.stride;
  const C = cl.c, W = cl.w, S = cl.s, SW = cl.sw!, SE = cl.se!;
  const { nx, ny, stride: st } = f;
  const len = f.c.length;
  // The prolongator's rows at every fine point (transient).
  const pk = new Int32Array(4 * len), pw = new Float64Array(4 * len), pn = new Uint8Array(len);
  const ks = new Int32Array(4), ws = new Float64Array(4);
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) {
      const k = (j + 1) * st + i + 1;
      const m = prolongatorRow(p, i, j, ks, ws);
      pn[k] = m;
      for (let q = 0; q < m; q++) { pk[4 * k + q] = ks[q]; pw[4 * k + q] = ws[q]; }
    }
  const fw = f.w, fs = f.s, fsw = f.sw, fse = f.se, fc = f.c;
  const off = new Int32Array([0, -1, 1, -st, st, -st - 1, -st + 1, st - 1, st + 1]);
  const a = new Float64Array(9);
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) {
      const k = (j + 1) * st + i + 1;
      a[0] = fc[k]; a[1] = fw[k]; a[2] = fw[k + 1]; a[3] = fs[k]; a[4] = fs[k + st];
      a[5] = fsw ? fsw[k] : 0; a[6] = fse ? fse[k] : 0; a[7] = fse ? fse[k + st - 1] : 0; a[8] = fsw ? fsw[k + st + 1] : 0;
      const mf = pn[k];
      for (let t = 0; t < 9; t++) {
        const v = a[t];
        if (v === 0) continue;
        const g = k + off[t];
        const mg = pn[g];
        for (let qf = 0; qf < mf; qf++) {
          const Kf = pk[4 * k + qf], vf = pw[4 * k + qf] * v;
          for (let qg = 0; qg < mg; qg++) {
            const d = pk[4 * g + qg] - Kf;
            const val = vf * pw[4 * g + qg];
            if (d === 0) C[Kf] += val;
            else if (d === -1) W[Kf] += val;
            else if (d === -cs) S[Kf] += val;
            else if (d === -cs - 1) SW[Kf] += val;
            else if (d === -cs + 1) SE[Kf] += val;
          }
        }
      }
    }
  finishDiagonal(cl);
  return cl;
}
