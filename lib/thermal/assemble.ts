/**
 * Assembly: cell-centred finite volumes on the mesh. Unknowns are the solid cells; the conductance
 * of a face between two solid cells is the series (harmonic) combination of the two half-cells;
 * a face on a zone is its half-cell in series with the surface resistance; faces on void or on the
 * outer edge are adiabatic. The operator is a symmetric positive definite M-matrix in CSR,
 * rows in cell order (5-point stencil). Solid cells in a region that touches no zone have no
 * defined temperature and are left out (reported).
 */
import type { Csr } from './csr';
import type { Mesh } from './mesh';
import type { FaceSide, Run, ZoneRule } from './rs';
import { surfaceResistance } from './rs';

export interface BoundaryFaces {
  count: number;
  /** Unknown index of the solid cell. */
  unknown: Int32Array;
  zone: Int32Array;
  side: Uint8Array;
  /** Face length, m. */
  len: Float64Array;
  /** Half-cell resistance normal to the face, (d/2)/lambda, m2K/W. */
  rHalf: Float64Array;
  /**
   * Factor on the surface resistance: 1, or on a staircased sloped edge at angle a, |cos a| + |sin a|
   * (the staircase's face length over the edge's true length), so the surface conductance summed
   * along the staircase is that of the true surface.
   */
  rsScale: Float64Array;
}

export interface ThermalSystem {
  mesh: Mesh;
  n: number;
  cellOf: Int32Array;
  unknownOf: Int32Array;
  /** Operator without boundary terms (values); the diagonal is at diagPos. */
  interior: Csr;
  diagPos: Int32Array;
  faces: BoundaryFaces;
  /** Solids with cells left out because their region touches no zone. */
  isolatedSolids: number[];
  zoneCount: number;
}

export function assemble(mesh: Mesh, lambda: ArrayLike<number>, zoneCount: number): ThermalSystem {
  const { nx, ny, xs, ys, owner } = mesh;
  const nc = nx * ny;
  // Regions of solid cells and whether each touches a zone.
  const region = new Int32Array(nc).fill(-1);
  const queue = new Int32Array(nc);
  const regionTouches: boolean[] = [];
  for (let c0 = 0; c0 < nc; c0++) {
    if (owner[c0] < 0 || region[c0] >= 0) continue;
    const id = regionTouches.length;
    let touches = false, head = 0, tail = 0;
    queue[tail++] = c0;
    region[c0] = id;
    while (head < tail) {
      const c = queue[head++];
      const i = c % nx, j = (c - i) / nx;
      for (let s = 0; s < 4; s++) {
        const ii = s === 0 ? i - 1 : s === 1 ? i + 1 : i;
        const jj = s === 2 ? j - 1 : s === 3 ? j + 1 : j;
        if (ii < 0 || jj < 0 || ii >= nx || jj >= ny) continue;
        const d = jj * nx + ii;
        const o = owner[d];
        if (o <= -2) touches = true;
        else if (o >= 0 && region[d] < 0) {
          region[d] = id;
          queue[tail++] = d;
        }
      }
    }
    regionTouches.push(touches);
  }
  const unknownOf = new Int32Array(nc).fill(-1);
  let n = 0;
  const isolated = new Set<number>();
  for (let c = 0; c < nc; c++) {
    if (owner[c] < 0) continue;
    if (regionTouches[region[c]]) unknownOf[c] = n++;
    else isolated.add(owner[c]);
  }
  if (n === 0) throw new Error(regionTouches.length ? 'no solid part touches a zone: every temperature would be undefined (add a zone along a surface)' : 'the section has no solid cells to compute');
  const cellOf = new Int32Array(n);
  for (let c = 0; c < nc; c++) if (unknownOf[c] >= 0) cellOf[unknownOf[c]] = c;

  const rowPtr = new Int32Array(n + 1);
  let nf = 0;
  for (let u = 0; u < n; u++) {
    const c = cellOf[u];
    const i = c % nx, j = (c - i) / nx;
    let k = 1;
    if (j > 0) { if (unknownOf[c - nx] >= 0) k++; else if (owner[c - nx] <= -2) nf++; }
    if (i > 0) { if (unknownOf[c - 1] >= 0) k++; else if (owner[c - 1] <= -2) nf++; }
    if (i < nx - 1) { if (unknownOf[c + 1] >= 0) k++; else if (owner[c + 1] <= -2) nf++; }
    if (j < ny - 1) { if (unknownOf[c + nx] >= 0) k++; else if (owner[c + nx] <= -2) nf++; }
    rowPtr[u + 1] = rowPtr[u] + k;
  }
  const col = new Int32Array(rowPtr[n]);
  const val = new Float64Array(rowPtr[n]);
  const diagPos = new Int32Array(n);
  const fUnknown = new Int32Array(nf), fZone = new Int32Array(nf), fSide = new Uint8Array(nf);
  const fLen = new Float64Array(nf), fHalf = new Float64Array(nf);
  const fScale = new Float64Array(nf).fill(1);
  const faces: BoundaryFaces = { count: nf, unknown: fUnknown, zone: fZone, side: fSide, len: fLen, rHalf: fHalf, rsScale: fScale };
  let f = 0;
  for (let u = 0; u < n; u++) {
    const c = cellOf[u];
    const i = c % nx, j = (c - i) / nx;
    const rp = 1 / lambda[owner[c]];
    const dx = xs[i + 1] - xs[i], dy = ys[j + 1] - ys[j];
    const hx = 0.5 * dx * rp, hy = 0.5 * dy * rp; // half-cell resistances across x and y
    let p = rowPtr[u];
    let diag = 0;
    // Columns ascending: south, west, self, east, north. No closures or allocation per cell.
    if (j > 0) {
      const d = c - nx, q = unknownOf[d];
      if (q >= 0) { const g = dx / (hy + (0.5 * (ys[j] - ys[j - 1])) / lambda[owner[d]]); diag += g; col[p] = q; val[p++] = -g; }
      else if (owner[d] <= -2) { fUnknown[f] = u; fZone[f] = -2 - owner[d]; fSide[f] = 2; fLen[f] = dx; fHalf[f] = hy; f++; }
    }
    if (i > 0) {
      const d = c - 1, q = unknownOf[d];
      if (q >= 0) { const g = dy / (hx + (0.5 * (xs[i] - xs[i - 1])) / lambda[owner[d]]); diag += g; col[p] = q; val[p++] = -g; }
      else if (owner[d] <= -2) { fUnknown[f] = u; fZone[f] = -2 - owner[d]; fSide[f] = 0; fLen[f] = dy; fHalf[f] = hx; f++; }
    }
    const dp = p++;
    if (i < nx - 1) {
      const d = c + 1, q = unknownOf[d];
      if (q >= 0) { const g = dy / (hx + (0.5 * (xs[i + 2] - xs[i + 1])) / lambda[owner[d]]); diag += g; col[p] = q; val[p++] = -g; }
      else if (owner[d] <= -2) { fUnknown[f] = u; fZone[f] = -2 - owner[d]; fSide[f] = 1; fLen[f] = dy; fHalf[f] = hx; f++; }
    }
    if (j < ny - 1) {
      const d = c + nx, q = unknownOf[d];
      if (q >= 0) { const g = dx / (hy + (0.5 * (ys[j + 2] - ys[j + 1])) / lambda[owner[d]]); diag += g; col[p] = q; val[p++] = -g; }
      else if (owner[d] <= -2) { fUnknown[f] = u; fZone[f] = -2 - owner[d]; fSide[f] = 3; fLen[f] = dx; fHalf[f] = hy; f++; }
    }
    col[dp] = u;
    val[dp] = diag;
    diagPos[u] = dp;
  }
  if (mesh.sloped) slopeFactors(mesh, mesh.sloped, cellOf, faces);
  return { mesh, n, cellOf, unknownOf, interior: { n, m: n, rowPtr, col, val }, diagPos, faces, isolatedSolids: [...isolated].sort((a, b) => a - b), zoneCount };
}

/**
 * rsScale for zone faces on the staircase of a sloped solid edge: a face whose centre lies within one
 * cell (the larger side of its solid cell) of a sloped edge of that cell's own solid takes the nearest
 * such edge's |cos a| + |sin a| = (|bx - ax| + |by - ay|) / length. The staircase of a straight edge
 * stays within one cell of it, so every face of it is found; a face of an axis-aligned edge within one
 * cell of a sloped edge's end (at a corner) takes the factor too, which is the method's error there.
 */
function slopeFactors(mesh: Mesh, sl: NonNullable<Mesh['sloped']>, cellOf: Int32Array, faces: BoundaryFaces): void {
  const { nx, xs, ys, owner } = mesh;
  const ne = sl.solid.length;
  for (let f = 0; f < faces.count; f++) {
    const c = cellOf[faces.unknown[f]];
    const i = c % nx, j = (c - i) / nx, s = faces.side[f];
    const px = s === 0 ? xs[i] : s === 1 ? xs[i + 1] : 0.5 * (xs[i] + xs[i + 1]);
    const py = s === 2 ? ys[j] : s === 3 ? ys[j + 1] : 0.5 * (ys[j] + ys[j + 1]);
    const h = Math.max(xs[i + 1] - xs[i], ys[j + 1] - ys[j]);
    let best = h * h, k = 1;
    for (let e = 0; e < ne; e++) {
      if (sl.solid[e] !== owner[c]) continue;
      const ax = sl.seg[4 * e], ay = sl.seg[4 * e + 1], bx = sl.seg[4 * e + 2], by = sl.seg[4 * e + 3];
      const ex = bx - ax, ey = by - ay, l2 = ex * ex + ey * ey;
      const t = Math.min(1, Math.max(0, ((px - ax) * ex + (py - ay) * ey) / l2));
      const dx = px - ax - t * ex, dy = py - ay - t * ey, d2 = dx * dx + dy * dy;
      if (d2 <= best) { best = d2; k = (Math.abs(ex) + Math.abs(ey)) / Math.sqrt(l2); }
    }
    faces.rsScale[f] = k;
  }
}

/** Conductance of each boundary face for a run, W/(m K) per metre run. */
export function faceConductances(sys: ThermalSystem, rules: readonly ZoneRule[], run: Run, rsiSurface: number): Float64Array {
  const { faces } = sys;
  const g = new Float64Array(faces.count);
  for (let f = 0; f < faces.count; f++) {
    const rs = surfaceResistance(rules[faces.zone[f]], faces.side[f] as FaceSide, run, rsiSurface) * faces.rsScale[f];
    g[f] = faces.len[f] / (rs + faces.rHalf[f]);
  }
  return g;
}

/** The operator with the boundary conductances on the diagonal (shares the pattern of sys.interior). */
export function operatorWith(sys: ThermalSystem, g: Float64Array, out?: Csr): Csr {
  const a = sys.interior;
  const val = out ? out.val : new Float64Array(a.val.length);
  val.set(a.val);
  for (let f = 0; f < sys.faces.count; f++) val[sys.diagPos[sys.faces.unknown[f]]] += g[f];
  return out ?? { n: a.n, m: a.m, rowPtr: a.rowPtr, col: a.col, val };
}

/** Right-hand side for zone temperatures t (per zone). */
export function rhs(sys: ThermalSystem, g: Float64Array, t: ArrayLike<number>, out: Float64Array): Float64Array {
  out.fill(0);
  for (let f = 0; f < sys.faces.count; f++) out[sys.faces.unknown[f]] += g[f] * t[sys.faces.zone[f]];
  return out;
}

/** Heat flow from each zone into the construction, W/m, for cell temperatures x and zone temperatures t. */
export function zoneFlows(sys: ThermalSystem, g: Float64Array, x: Float64Array, t: ArrayLike<number>, out: Float64Array): Float64Array {
  out.fill(0);
  const { faces } = sys;
  for (let f = 0; f < faces.count; f++) {
    const z = faces.zone[f];
    out[z] += g[f] * (t[z] - x[faces.unknown[f]]);
  }
  return out;
}
