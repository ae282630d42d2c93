/** Slab on ground or basement floor slab, optionally with a thickened edge. Origin bottom-left of the flat part. */
import type { Point } from '../geometry';
import { defineKind, len } from '../kind';

export const slab = defineKind({
  kind: 'slab',
  title: 'Slab',
  description: 'Concrete floor slab',
  params: {
    thickness: len('Thickness', 0.1, 1, [0.075, 0.2]),
    width: len('Extent', 4, 50, [1, 20], 'Horizontal extent in the section'),
    thickenedEdge: { type: 'flag', label: 'Thickened edge', default: false },
    edgeSide: { type: 'choice', label: 'Edge side', options: [{ value: 'left', label: 'Left' }, { value: 'right', label: 'Right' }], default: 'left' },
    edgeDepth: len('Edge depth below slab', 0.2, 1.5, [0.1, 0.4]),
    edgeWidth: len('Edge width', 0.3, 3, [0.2, 0.6]),
  },
  defaultMaterial: 'concrete-2300-rc',
  pieces(p, material) {
    const t = p.thickness, w = p.width;
    if (!p.thickenedEdge) return [{ polygon: [[0, 0], [w, 0], [w, t], [0, t]], material, role: 'slab' }];
    const d = p.edgeDepth, e = p.edgeWidth;
    const poly: Point[] = p.edgeSide === 'left'
      ? [[0, -d], [e, -d], [e, 0], [w, 0], [w, t], [0, t]]
      : [[0, 0], [w - e, 0], [w - e, -d], [w, -d], [w, t], [0, t]];
    return [{ polygon: poly, material, role: 'slab with thickened edge' }];
  },
  handles: (p) => [
    { id: 'thickness-top', param: 'thickness', axis: 'y', side: 'max', at: [p.width / 2, p.thickness] },
    { id: 'width-right', param: 'width', axis: 'x', side: 'max', at: [p.width, p.thickness / 2] },
    { id: 'width-left', param: 'width', axis: 'x', side: 'min', at: [0, p.thickness / 2] },
  ],
  label: (p, l) => `Slab ${l(p.thickness)}${p.thickenedEdge ? `, edge ${l(p.thickness + p.edgeDepth)} deep` : ''}`,
  check: (p) => (p.thickenedEdge && p.edgeWidth >= p.width ? [{ param: 'edgeWidth', message: `must be less than the slab extent (${p.width} m), got ${p.edgeWidth} m` }] : []),
});
