/**
 * The mesh: a non-uniform rectilinear grid whose lines include every vertex coordinate of every
 * solid and zone, graded geometrically away from each line (first cell h0, growth factor g) up to a
 * maximum size, which is smaller where a construction (non-ground) solid spans the interval across its
 * thickness (its shorter side); along its length, and toward the model's outer cut planes, only the
 * grading limits the cells.
 * Each cell takes what covers its centre: the top-ranked solid, else the top-ranked zone, else void.
 * Sloped edges are therefore staircased at cell resolution (see docs/solver.md for the measured error).
 * A thin layer (a 0.25 mm membrane) is one row of cells between its two grid lines: it adds one row,
 * and the grading next to it starts from h0, not from the membrane's thickness.
 */
import type { Point } from '../section/geometry';

export type MeshLevel = 'preview' | 'default' | 'fine';

export interface MeshSpec {
  /** Size of the first cell next to each grid line, m. */
  h0: number;
  /** Geometric growth factor away from a line. */
  growth: number;
  /** Largest cell in intervals spanned by a construction solid, m. */
  hmax: number;
  /** Largest cell in intervals spanned by ground only, m. */
  hmaxGround: number;
}

export const MESH_LEVELS: Record<MeshLevel, MeshSpec> = {
  // For dragging: a few thousand cells on the templates (2 400 to 3 800; docs/bench-ui.md), so a preview
  // solve fits between two board refreshes. Every layer still spans at least one cell whatever the
  // sizes: the grid lines include every vertex, so a membrane is its own row (see gradeInterval).
  preview: { h0: 0.016, growth: 2.0, hmax: 0.1, hmaxGround: 2.0 },
  default: { h0: 0.004, growth: 1.3, hmax: 0.05, hmaxGround: 0.5 },
  fine: { h0: 0.002, growth: 1.15, hmax: 0.025, hmaxGround: 0.25 },
};

export interface GeometrySolid {
  polygon: readonly Point[];
  /** Ground (soil, rock): coarser cells allowed. */
  ground: boolean;
}

export interface GeometryZone {
  polygon: readonly Point[];
}

export interface Mesh {
  nx: number;
  ny: number;
  /** Grid lines, nx + 1 and ny + 1, ascending. */
  xs: Float64Array;
  ys: Float64Array;
  /** Cell centres. */
  xc: Float64Array;
  yc: Float64Array;
  /** Per cell (j nx + i): solid index >= 0, -1 void, -2 - z for zone z. */
  owner: Int32Array;
}

const MERGE = 1e-7;

/**
 * Cell sizes for an interval of length len, graded from both ends, or from one end only when the
 * other is the model's outer edge (an adiabatic cut plane, where nothing changes abruptly).
 */
export function gradeInterval(len: number, h0: number, growth: number, hmax: number, gradeLeft = true, gradeRight = true): number[] {
  const hm = Math.max(hmax, h0);
  if (len <= h0 * 1.5) return [len];
  if (!gradeLeft && !gradeRight) {
    const k = Math.max(1, Math.round(len / hm));
    return new Array<number>(k).fill(len / k);
  }
  if (!gradeLeft || !gradeRight) {
    const one: number[] = [];
    let sum = 0, h = h0;
    while (sum < len) { one.push(h); sum += h; h = Math.min(h * growth, hm); }
    if (one.length > 1 && Math.abs(sum - one[one.length - 1] - len) < Math.abs(sum - len)) sum -= one.pop()!;
    const f = len / sum;
    const sized = one.map((v) => v * f);
    return gradeLeft ? sized : sized.reverse();
  }
  const left: number[] = [], right: number[] = [];
  let sl = 0, sr = 0, hl = h0, hr = h0;
  while (sl + sr < len) {
    if (sl <= sr) { left.push(hl); sl += hl; hl = Math.min(hl * growth, hm); }
    else { right.push(hr); sr += hr; hr = Math.min(hr * growth, hm); }
  }
  const sizes = left.concat(right.reverse());
  const total = sl + sr;
  // Drop the last cell added when that brings the total closer to len, then scale to fit.
  if (sizes.length > 2) {
    const last = left.length >= right.length ? left.length - 1 : left.length;
    const without = total - sizes[last];
    if (Math.abs(without - len) < Math.abs(total - len)) {
      sizes.splice(last, 1);
      const f = len / without;
      return sizes.map((s) => s * f);
    }
  }
  const f = len / total;
  return sizes.map((s) => s * f);
}

function lines(keys: number[], spans: { lo: number; hi: number }[], spec: MeshSpec): Float64Array {
  keys.sort((a, b) => a - b);
  const k: number[] = [];
  for (const v of keys) if (!k.length || v - k[k.length - 1] > MERGE) k.push(v);
  const out: number[] = [k[0]];
  for (let i = 0; i + 1 < k.length; i++) {
    const a = k[i], b = k[i + 1];
    let hmax = spec.hmaxGround;
    for (const s of spans) if (s.lo < b - MERGE && s.hi > a + MERGE) { hmax = Math.min(hmax, spec.hmax); break; }
    let x = a;
    const sizes = gradeInterval(b - a, spec.h0, spec.growth, hmax, i > 0, i + 2 < k.length);
    for (let j = 0; j < sizes.length - 1; j++) out.push((x += sizes[j]));
    out.push(b);
  }
  return Float64Array.from(out);
}

/** Index of the first centre >= v (binary search). */
function lowerBound(c: Float64Array, v: number): number {
  let lo = 0, hi = c.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (c[mid] < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export function buildMesh(solids: readonly GeometrySolid[], zones: readonly GeometryZone[], spec: MeshSpec): Mesh {
  if (solids.length === 0) throw new Error('the section has no solid parts to compute');
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const s of solids) for (const [x, y] of s.polygon) {
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  if (!(maxX > minX && maxY > minY)) throw new Error('the solid parts have no area');
  // A margin of one cell around the solids catches zones touching their outer faces.
  const m = Math.max(spec.h0, 1e-4);
  let zMinX = Infinity, zMinY = Infinity, zMaxX = -Infinity, zMaxY = -Infinity;
  for (const z of zones) for (const [x, y] of z.polygon) {
    zMinX = Math.min(zMinX, x); zMaxX = Math.max(zMaxX, x); zMinY = Math.min(zMinY, y); zMaxY = Math.max(zMaxY, y);
  }
  const loX = zMinX < minX - MERGE ? Math.max(zMinX, minX - m) : minX;
  const hiX = zMaxX > maxX + MERGE ? Math.min(zMaxX, maxX + m) : maxX;
  const loY = zMinY < minY - MERGE ? Math.max(zMinY, minY - m) : minY;
  const hiY = zMaxY > maxY + MERGE ? Math.min(zMaxY, maxY + m) : maxY;
  const kx: number[] = [loX, hiX, minX, maxX], ky: number[] = [loY, hiY, minY, maxY];
  for (const p of [...solids.map((s) => s.polygon), ...zones.map((z) => z.polygon)])
    for (const [x, y] of p) {
      if (x > loX && x < hiX) kx.push(x);
      if (y > loY && y < hiY) ky.push(y);
    }
  const spanX: { lo: number; hi: number }[] = [], spanY: { lo: number; hi: number }[] = [];
  for (const s of solids) {
    if (s.ground) continue;
    let a = Infinity, b = -Infinity, c = Infinity, d = -Infinity;
    for (const [x, y] of s.polygon) { a = Math.min(a, x); b = Math.max(b, x); c = Math.min(c, y); d = Math.max(d, y); }
    // A construction caps the cell size across its thickness, not along its length: along a slab or
    // a wall the field changes slowly away from the grid lines, where the grading already keeps cells small.
    // A solid with a sloped edge keeps both caps: its staircase error scales with the cell size along it.
    const sloped = s.polygon.some(([x, y], i) => {
      const [x2, y2] = s.polygon[(i + 1) % s.polygon.length];
      return Math.abs(x2 - x) > 1e-12 && Math.abs(y2 - y) > 1e-12;
    });
    if (sloped || b - a <= d - c) spanX.push({ lo: a, hi: b });
    if (sloped || d - c <= b - a) spanY.push({ lo: c, hi: d });
  }
  const xs = lines(kx, spanX, spec), ys = lines(ky, spanY, spec);
  const nx = xs.length - 1, ny = ys.length - 1;
  const xc = new Float64Array(nx), yc = new Float64Array(ny);
  for (let i = 0; i < nx; i++) xc[i] = 0.5 * (xs[i] + xs[i + 1]);
  for (let j = 0; j < ny; j++) yc[j] = 0.5 * (ys[j] + ys[j + 1]);
  const owner = new Int32Array(nx * ny).fill(-1);
  let maxEdges = 0;
  for (const p of [...solids.map((s) => s.polygon), ...zones.map((z) => z.polygon)]) maxEdges = Math.max(maxEdges, p.length);
  const cross = new Float64Array(maxEdges + 1);
  const paint = (poly: readonly Point[], code: number) => {
    const n = poly.length;
    let pmin = Infinity, pmax = -Infinity;
    for (const [, y] of poly) { pmin = Math.min(pmin, y); pmax = Math.max(pmax, y); }
    const j0 = lowerBound(yc, pmin), j1 = lowerBound(yc, pmax);
    for (let j = j0; j < j1; j++) {
      const y = yc[j];
      let c = 0;
      for (let a = 0, b = n - 1; a < n; b = a++) {
        const ya = poly[a][1], yb = poly[b][1];
        if (ya > y !== yb > y) cross[c++] = poly[a][0] + ((y - ya) * (poly[b][0] - poly[a][0])) / (yb - ya);
      }
      const xsorted = cross.subarray(0, c).sort();
      for (let k = 0; k + 1 < c; k += 2) {
        const i0 = lowerBound(xc, xsorted[k]), i1 = lowerBound(xc, xsorted[k + 1]);
        owner.fill(code, j * nx + i0, j * nx + i1);
      }
    }
  };
  zones.forEach((z, i) => paint(z.polygon, -2 - i));
  solids.forEach((s, i) => paint(s.polygon, i));
  return { nx, ny, xs, ys, xc, yc, owner };
}
