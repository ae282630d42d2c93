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
import { pointInPolygon } from '../section/geometry';

export type MeshLevel = 'preview' | 'default' | 'fine';

export interface MeshSpec {
  /** Size of the first cell next to each grid line, m. */
  h0: number;
  /** Geometric growth factor away from a line. */
  growth: number;
  /**
   * Growth factor away from horizontal lines (the spacing of the y-lines), when it differs: the ground
   * surface is horizontal, and the net flow of a ground-surface zone (heat into the ground near the
   * building, most of it back out further away) converges with the vertical spacing there.
   */
  growthY?: number;
  /** Largest cell in intervals spanned by a construction solid, m. */
  hmax: number;
  /** Largest cell in intervals spanned by ground only, m. */
  hmaxGround: number;
  /**
   * First cell next to the grid lines through a surface singular point (two zones meeting on a solid
   * surface, or a solid touching a zone at a single corner), m; absent: h0 there too.
   */
  h0Point?: number;
  /**
   * Sub-cells per cell and direction in the local solves that read a surface's end nodes (field.ts,
   * nodeTemperatures); absent: NODE_PATCH_SPLIT (4). Not a mesh property as such, but set per level.
   */
  cornerSplit?: number;
}

export const MESH_LEVELS: Record<MeshLevel, MeshSpec> = {
  // For dragging: a few thousand cells on the templates (2 400 to 3 800; docs/bench-ui.md), so a preview
  // solve fits between two board refreshes. Every layer still spans at least one cell whatever the
  // sizes: the grid lines include every vertex, so a membrane is its own row (see gradeInterval).
  // No finer lines through surface singular points here (the release solves at the default mesh).
  // Corner readings split each cell in 2, not 4: a fifth of the cost (3-9 ms a preview instead of
  // 11-35), and the coldest point moves by 0.01 to 0.15 K on the templates (docs/solver.md, section 5).
  preview: { h0: 0.016, growth: 2.0, hmax: 0.1, hmaxGround: 2.0, cornerSplit: 2 },
  default: { h0: 0.004, growth: 1.3, growthY: 1.25, hmax: 0.05, hmaxGround: 1.0, h0Point: 0.001 },
  fine: { h0: 0.002, growth: 1.15, hmax: 0.025, hmaxGround: 0.25, h0Point: 0.0005 },
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
  /**
   * The solids' sloped edges (neither horizontal nor vertical), staircased on this grid: solid index
   * per edge, and its end points (ax, ay, bx, by per edge). Absent when there are none.
   */
  sloped?: { solid: Int32Array; seg: Float64Array };
}

const MERGE = 1e-7;

/**
 * Cell sizes for an interval of length len, graded from both ends, or from one end only when the
 * other is the model's outer edge (an adiabatic cut plane, where nothing changes abruptly).
 */
export function gradeInterval(len: number, h0: number, growth: number, hmax: number, gradeLeft = true, gradeRight = true, h0Right = h0): number[] {
  if (h0Right !== h0) return gradeUneven(len, h0, h0Right, growth, hmax, gradeLeft, gradeRight);
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

/**
 * gradeInterval with different first cells at the two ends (hl0 at the left, hr0 at the right): the
 * end with the smaller next cell grows first, so the two sequences meet at matching sizes; scaled to
 * fit. Computed with the smaller end on the left and reversed otherwise, so a mirrored interval gets
 * mirrored cells.
 */
function gradeUneven(len: number, hl0: number, hr0: number, growth: number, hmax: number, gradeLeft: boolean, gradeRight: boolean): number[] {
  if (!gradeLeft || !gradeRight) return gradeInterval(len, gradeLeft ? hl0 : hr0, growth, hmax, gradeLeft, gradeRight);
  if (hl0 > hr0) return gradeUneven(len, hr0, hl0, growth, hmax, true, true).reverse();
  if (len <= hl0 * 1.5) return [len];
  const hm = Math.max(hmax, hl0);
  const left: number[] = [], right: number[] = [];
  let sl = 0, sr = 0, hl = hl0, hr = hr0;
  while (sl + sr < len) {
    if (hl <= hr) { left.push(hl); sl += hl; hl = Math.min(hl * growth, hm); }
    else { right.push(hr); sr += hr; hr = Math.min(hr * growth, hm); }
  }
  const sizes = left.concat(right.reverse());
  const f = len / (sl + sr);
  return sizes.map((v) => v * f);
}

function lines(keys: number[], spans: { lo: number; hi: number }[], spec: MeshSpec, points: number[] = []): Float64Array {
  keys.sort((a, b) => a - b);
  const hp = spec.h0Point ?? spec.h0;
  const h0At = (v: number) => (points.some((p) => Math.abs(p - v) <= MERGE) ? Math.min(hp, spec.h0) : spec.h0);
  const k: number[] = [];
  for (const v of keys) if (!k.length || v - k[k.length - 1] > MERGE) k.push(v);
  const out: number[] = [k[0]];
  for (let i = 0; i + 1 < k.length; i++) {
    const a = k[i], b = k[i + 1];
    let hmax = spec.hmaxGround;
    for (const s of spans) if (s.lo < b - MERGE && s.hi > a + MERGE) { hmax = Math.min(hmax, spec.hmax); break; }
    let x = a;
    const sizes = gradeInterval(b - a, h0At(a), spec.growth, hmax, i > 0, i + 2 < k.length, h0At(b));
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
  const sing = spec.h0Point !== undefined && spec.h0Point < spec.h0 ? singularPoints(solids, zones, kx, ky, loX, hiX, loY, hiY) : [];
  const specY = spec.growthY !== undefined ? { ...spec, growth: spec.growthY } : spec;
  const xs = lines(kx, spanX, spec, sing.map((p) => p[0])), ys = lines(ky, spanY, specY, sing.map((p) => p[1]));
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
  const sSolid: number[] = [], sSeg: number[] = [];
  solids.forEach((s, i) => s.polygon.forEach(([ax, ay], k) => {
    const [bx, by] = s.polygon[(k + 1) % s.polygon.length];
    if (Math.abs(bx - ax) > 1e-12 && Math.abs(by - ay) > 1e-12) { sSolid.push(i); sSeg.push(ax, ay, bx, by); }
  }));
  const sloped = sSolid.length ? { solid: Int32Array.from(sSolid), seg: Float64Array.from(sSeg) } : undefined;
  return { nx, ny, xs, ys, xc, yc, owner, ...(sloped ? { sloped } : {}) };
}

/**
 * Surface singular points: grid-line crossings where two different zones meet on a solid's surface
 * (a zone junction: the surface condition jumps there), or where a solid touches a zone at one corner
 * only (the quadrant diagonally opposite is the zone, the two beside it are neither). The field
 * changes over a short distance there (about lambda Rs of the parts around the point, 1 to 10 mm),
 * so the lines through them start from h0Point. Quadrants are sampled just off the crossing with the
 * mesh's own rule (top solid, else top zone, else void).
 */
export function singularPoints(solids: readonly GeometrySolid[], zones: readonly GeometryZone[], kx: readonly number[], ky: readonly number[], loX: number, hiX: number, loY: number, hiY: number): Point[] {
  const eps = 1e-6;
  const ownerAt = (x: number, y: number): number => {
    for (let s = solids.length - 1; s >= 0; s--) if (pointInPolygon(x, y, solids[s].polygon)) return s;
    for (let z = zones.length - 1; z >= 0; z--) if (pointInPolygon(x, y, zones[z].polygon)) return -2 - z;
    return -1;
  };
  const ux = uniqueSorted(kx), uy = uniqueSorted(ky);
  const out: Point[] = [];
  const q = [0, 0, 0, 0];
  for (const x of ux) {
    if (x <= loX + MERGE || x >= hiX - MERGE) continue;
    for (const y of uy) {
      if (y <= loY + MERGE || y >= hiY - MERGE) continue;
      // Quadrants counter-clockwise: south-west, south-east, north-east, north-west.
      q[0] = ownerAt(x - eps, y - eps); q[1] = ownerAt(x + eps, y - eps); q[2] = ownerAt(x + eps, y + eps); q[3] = ownerAt(x - eps, y + eps);
      let hit = false;
      const anySolid = q[0] >= 0 || q[1] >= 0 || q[2] >= 0 || q[3] >= 0;
      for (let i = 0; i < 4 && !hit; i++) {
        const a = q[i], b = q[(i + 1) & 3], c = q[(i + 2) & 3], d = q[(i + 3) & 3];
        if (anySolid && a <= -2 && b <= -2 && a !== b) hit = true;
        else if (a >= 0 && c <= -2 && b !== a && b !== c && d !== a && d !== c) hit = true;
      }
      if (hit) out.push([x, y]);
    }
  }
  return out;
}

function uniqueSorted(v: readonly number[]): number[] {
  const s = [...v].sort((a, b) => a - b);
  const out: number[] = [];
  for (const x of s) if (!out.length || x - out[out.length - 1] > MERGE) out.push(x);
  return out;
}
