/** Foundation wall: poured concrete, masonry block, or an insulated form (foam, core, foam). Origin bottom-left. */
import type { Piece } from '../kind';
import { rectPolygon } from '../geometry';
import { boxHandles, defineKind, len } from '../kind';

export const foundationWall = defineKind({
  kind: 'foundation-wall',
  title: 'Foundation wall',
  description: 'Basement or crawl-space wall on a footing',
  params: {
    thickness: len('Thickness', 0.2, 1.5, [0.15, 0.3], 'Overall, including the form foam of an insulated form'),
    height: len('Height', 2.4, 6, [0.6, 3]),
    construction: {
      type: 'choice',
      label: 'Construction',
      options: [
        { value: 'poured', label: 'Poured concrete' },
        { value: 'block', label: 'Masonry block' },
        { value: 'insulated-form', label: 'Insulated concrete form' },
      ],
      default: 'poured',
    },
    formFoam: len('Form foam, each face', 0.065, 0.3, [0.05, 0.1]),
    formMaterial: { type: 'material', label: 'Form foam', default: 'eps' },
  },
  defaultMaterial: 'concrete-2300-rc',
  pieces(p, material) {
    if (p.construction !== 'insulated-form') return [{ polygon: rectPolygon(0, 0, p.thickness, p.height), material, role: p.construction === 'block' ? 'block wall' : 'wall' }];
    const f = p.formFoam;
    const pieces: Piece[] = [
      { polygon: rectPolygon(0, 0, f, p.height), material: p.formMaterial, role: 'form foam, outside' },
      { polygon: rectPolygon(f, 0, p.thickness - 2 * f, p.height), material, role: 'concrete core' },
      { polygon: rectPolygon(p.thickness - f, 0, f, p.height), material: p.formMaterial, role: 'form foam, inside' },
    ];
    return pieces;
  },
  handles: (p) => boxHandles('thickness', 'height', p.thickness, p.height),
  label: (p, l) => `${p.construction === 'block' ? 'Block' : p.construction === 'insulated-form' ? 'Insulated-form' : 'Concrete'} wall ${l(p.thickness)} × ${l(p.height)}`,
  check(p) {
    if (p.construction === 'insulated-form' && 2 * p.formFoam >= p.thickness)
      return [{ param: 'formFoam', message: `two faces of form foam (${2 * p.formFoam} m) must leave a concrete core inside the ${p.thickness} m wall` }];
    return [];
  },
});
