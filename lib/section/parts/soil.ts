/** Soil region: the ground as a solid (ISO 13370 conductivities by soil type). Usually the bottom of the stack. */
import { rectPolygon } from '../geometry';
import { boxHandles, defineKind, len } from '../kind';

export const soil = defineKind({
  kind: 'soil',
  title: 'Soil',
  description: 'Ground region',
  params: {
    width: len('Width', 24, 200, [5, 40], 'ISO 10211: 2.5 b beyond the wall plus the half floor inside'),
    depth: len('Depth', 20, 200, [5, 40], 'ISO 10211: 2.5 b below grade'),
  },
  defaultMaterial: 'soil-sand-gravel',
  pieces: (p, material) => [{ polygon: rectPolygon(0, 0, p.width, p.depth), material, role: 'ground' }],
  handles: (p) => boxHandles('width', 'depth', p.width, p.depth),
  label: (p, l) => `Soil ${l(p.width)} × ${l(p.depth)}`,
});
