/** The preconditioner interface PCG uses, and diagonal scaling (Jacobi), the benchmark's baseline. */

export interface Preconditioner {
  /** z = M^-1 r; r is not modified. */
  apply(r: Float64Array, z: Float64Array): void;
}

export class JacobiPreconditioner implements Preconditioner {
  constructor(readonly invDiag: Float64Array) {}
  apply(r: Float64Array, z: Float64Array): void {
    for (let i = 0; i < r.length; i++) z[i] = this.invDiag[i] * r[i];
  }
}
