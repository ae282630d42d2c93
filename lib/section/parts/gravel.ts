/** Gravel or crushed-stone bed (under a slab, around a footing drain). Origin bottom-left. */
import { rectPolygon } from '../geometry';
import { boxHandles, defineKind, len } from '../kind';

export const gravel = defineKind({
  kind: 'gravel',
  title: 'Gravel bed',
  description: 'Gravel or stone bed',
  params: {
    thickness: len('Thickness', 0.1, 2, [0.1, 0.2]),
    width: len('Extent', 4, 50, [0.3, 20]),
  },
  defaultMaterial: 'gravel-bed',
  pieces: (p, material) => [{ polygon: rectPolygon(0, 0, p.width, p.thickness), material, role: 'gravel bed' }],
  handles: (p) => boxHandles('width', 'thickness', p.width, p.thickness),
  label: (p, l) => `Gravel bed ${l(p.thickness)}`,
});
