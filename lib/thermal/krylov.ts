/**
 * Preconditioned conjugate gradient (flexible form, so a nonlinear preconditioner such as a K-cycle is fine), one iteration per step() so the caller can watch its own
 * stopping quantities (zone heat flows) and cancel between iterations.
 */
import type { Preconditioner } from './preconditioner';
import type { Csr } from './csr';
import { residual, spmvDot } from './csr';

export class Pcg {
  readonly n: number;
  readonly x: Float64Array;
  readonly r: Float64Array;
  private z: Float64Array;
  private p: Float64Array;
  private q: Float64Array;
  private rz = 0;
  private bNorm = 1;
  iterations = 0;
  relativeResidual = 1;

  constructor(readonly a: Csr, readonly m: Preconditioner) {
    this.n = a.n;
    this.x = new Float64Array(this.n);
    this.r = new Float64Array(this.n);
    this.z = new Float64Array(this.n);
    this.p = new Float64Array(this.n);
    this.q = new Float64Array(this.n);
  }

  bytes(): number {
    return 5 * 8 * this.n;
  }

  /** Begin from x0 (zeros when null). Returns the relative residual of the start. */
  start(b: Float64Array, x0: Float64Array | null): number {
    const { x, r, z, p } = this;
    if (x0) x.set(x0);
    else x.fill(0);
    residual(this.a, x, b, r);
    let bb = 0;
    for (let i = 0; i < this.n; i++) bb += b[i] * b[i];
    this.bNorm = Math.sqrt(bb) || 1;
    this.m.apply(r, z);
    let rz = 0;
    for (let i = 0; i < this.n; i++) rz += r[i] * z[i];
    this.rz = rz;
    p.set(z);
    this.iterations = 0;
    this.relativeResidual = this.norm(r) / this.bNorm;
    return this.relativeResidual;
  }

  /** One iteration; returns the relative residual ||b - A x|| / ||b||. */
  step(): number {
    const { n, x, r, z, p, q } = this;
    const pq = spmvDot(this.a, p, q);
    if (!(pq > 0)) return this.relativeResidual; // converged to round-off (or lost positivity)
    const alpha = this.rz / pq;
    let rr = 0;
    for (let i = 0; i < n; i++) {
      x[i] += alpha * p[i];
      const ri = r[i] - alpha * q[i];
      r[i] = ri;
      rr += ri * ri;
    }
    this.m.apply(r, z);
    // Flexible CG: beta = -z.q / p.q (equal to the classical rz / rz_old for a fixed preconditioner,
    // and correct when the preconditioner is itself an iteration, as in the K-cycle).
    let rz = 0, zq = 0;
    for (let i = 0; i < n; i++) { rz += r[i] * z[i]; zq += z[i] * q[i]; }
    const beta = -zq / pq;
    this.rz = rz;
    for (let i = 0; i < n; i++) p[i] = z[i] + beta * p[i];
    this.iterations++;
    this.relativeResidual = Math.sqrt(rr) / this.bNorm;
    return this.relativeResidual;
  }

  private norm(v: Float64Array): number {
    let s = 0;
    for (let i = 0; i < v.length; i++) s += v[i] * v[i];
    return Math.sqrt(s);
  }
}
