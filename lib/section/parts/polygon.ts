/** Free polygon: any simple polygon, given as a closed ring of vertices in the local frame. */
import type { Point } from '../geometry';
import { boxOfPoints, polygonProblem, ringToVertices } from '../geometry';
import { defineKind } from '../kind';

const DEFAULT_RING: readonly Point[] = [[0, 0], [0.5, 0], [0.5, 0.3], [0, 0.3], [0, 0]];

export const polygon = defineKind({
  kind: 'polygon',
  title: 'Free polygon',
  description: 'Any shape, drawn vertex by vertex',
  params: {
    points: { type: 'ring', label: 'Vertices', default: DEFAULT_RING, help: 'Closed ring: the last point repeats the first' },
  },
  defaultMaterial: 'concrete-2300-rc',
  pieces(p, material) {
    const v = ringToVertices(p.points);
    return v ? [{ polygon: v, material, role: 'polygon' }] : [];
  },
  handles: () => [],
  label(p, l) {
    const v = ringToVertices(p.points) ?? [];
    const b = boxOfPoints(v);
    return `Polygon, ${v.length} vertices, ${l(b.maxX - b.minX)} × ${l(b.maxY - b.minY)}`;
  },
  check(p) {
    const ring = p.points;
    if (ring.length > 0) {
      const f = ring[0], z = ring[ring.length - 1];
      if (ring.length < 2 || f[0] !== z[0] || f[1] !== z[1])
        return [{ param: 'points', message: `polygon is not closed: the last point ${JSON.stringify(z)} must repeat the first ${JSON.stringify(f)}` }];
    }
    const v = ringToVertices(ring);
    const problem = v ? polygonProblem(v) : 'a polygon needs at least 3 distinct vertices, got 0';
    return problem ? [{ param: 'points', message: problem }] : [];
  },
});
