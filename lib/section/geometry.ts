/** Plain 2-D geometry over [x, y] tuples in metres (x to the right, y up). Pure functions. */

export type Point = readonly [number, number];
export type Polygon = readonly Point[];

export interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** Axis-aligned rectangle as a counter-clockwise polygon. */
export function rectPolygon(x: number, y: number, width: number, height: number): Point[] {
  return [
    [x, y],
    [x + width, y],
    [x + width, y + height],
    [x, y + height],
  ];
}

/** Signed area (positive when counter-clockwise). */
export function signedArea(poly: Polygon): number {
  let a = 0;
  for (let i = 0, n = poly.length; i < n; i++) {
    const [x1, y1] = poly[i];
    const [x2, y2] = poly[(i + 1) % n];
    a += x1 * y2 - x2 * y1;
  }
  return a / 2;
}

export function boxOfPoints(points: Iterable<Point>): Box {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const [x, y] of points) {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY };
}

export function unionBox(a: Box, b: Box): Box {
  return { minX: Math.min(a.minX, b.minX), minY: Math.min(a.minY, b.minY), maxX: Math.max(a.maxX, b.maxX), maxY: Math.max(a.maxY, b.maxY) };
}

export function translatePolygon(poly: Polygon, dx: number, dy: number): Point[] {
  return poly.map(([x, y]) => [x + dx, y + dy] as Point);
}

/** Even-odd point-in-polygon test; points on the boundary may fall either way. */
export function pointInPolygon(px: number, py: number, poly: Polygon): boolean {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i];
    const [xj, yj] = poly[j];
    if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

function orient(a: Point, b: Point, c: Point): number {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

function onSegment(a: Point, b: Point, p: Point): boolean {
  return Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1]);
}

/** True when the closed segments ab and cd share a point. */
export function segmentsIntersect(a: Point, b: Point, c: Point, d: Point): boolean {
  const o1 = orient(a, b, c), o2 = orient(a, b, d), o3 = orient(c, d, a), o4 = orient(c, d, b);
  if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) return true;
  if (o1 === 0 && onSegment(a, b, c)) return true;
  if (o2 === 0 && onSegment(a, b, d)) return true;
  if (o3 === 0 && onSegment(c, d, a)) return true;
  if (o4 === 0 && onSegment(c, d, b)) return true;
  return false;
}

/**
 * Why a vertex list (implicitly closed) is not a simple polygon, or null when it is:
 * at least 3 vertices, no repeated consecutive vertex, non-zero area, no two non-adjacent edges touching.
 */
export function polygonProblem(poly: Polygon): string | null {
  const n = poly.length;
  if (n < 3) return `a polygon needs at least 3 distinct vertices, got ${n}`;
  for (let i = 0; i < n; i++) {
    const [x, y] = poly[i];
    if (!Number.isFinite(x) || !Number.isFinite(y)) return `vertex ${i} is not a finite number`;
    const [nx, ny] = poly[(i + 1) % n];
    if (x === nx && y === ny) return `vertices ${i} and ${(i + 1) % n} coincide`;
  }
  for (let i = 0; i < n; i++) {
    const a = poly[i], b = poly[(i + 1) % n];
    for (let j = i + 1; j < n; j++) {
      if (j === i || (j + 1) % n === i || j === (i + 1) % n) continue; // adjacent edges share a vertex
      const c = poly[j], d = poly[(j + 1) % n];
      if (segmentsIntersect(a, b, c, d)) return `edges ${i} and ${j} cross or touch (self-intersecting polygon)`;
    }
  }
  if (Math.abs(signedArea(poly)) < 1e-12) return 'the polygon has no area';
  return null;
}

/** Closed ring (first point repeated last, as in GeoJSON) to an open vertex list; null when not closed. */
export function ringToVertices(ring: readonly Point[]): Point[] | null {
  if (ring.length < 2) return null;
  const first = ring[0], last = ring[ring.length - 1];
  if (first[0] !== last[0] || first[1] !== last[1]) return null;
  return ring.slice(0, -1).map(([x, y]) => [x, y] as Point);
}

export function verticesToRing(vertices: Polygon): Point[] {
  if (vertices.length === 0) return [];
  return [...vertices.map(([x, y]) => [x, y] as Point), [vertices[0][0], vertices[0][1]]];
}
