/** Membrane: a thin sheet (vapour retarder, ground cover, waterproofing) with its own sd value. */
import type { Material } from '../../materials/material';
import { defineKind, len, orientationParam, orientedRect, orientedRectHandles } from '../kind';

export const membrane = defineKind({
  kind: 'membrane',
  title: 'Membrane',
  description: 'Thin sheet: vapour retarder, ground cover or waterproofing',
  params: {
    thickness: len('Thickness', 0.00025, 0.02, [0.0001, 0.005]),
    length: len('Length', 2, 30, [0.2, 10]),
    orientation: { ...orientationParam, default: 'horizontal' },
    sd: { type: 'number', label: 'sd value (0: from the material)', quantity: 'sd', default: 0, min: 0, max: 10000, help: 'Equivalent air-layer thickness, m; 0 takes the material\'s own' },
  },
  defaultMaterial: 'poly-sheet-025',
  pieces(p, material, ctx) {
    const base = ctx.material(material);
    const mat: string | Material = p.sd > 0 && base ? { ...base, id: `${base.id}@sd=${p.sd}`, sd: p.sd, name: `${base.name} (sd ${p.sd} m)`, source: { ...base.source, mu: 'sd set on the part' } } : material;
    return [{ polygon: orientedRect(p.orientation, p.thickness, p.length), material: mat, role: 'membrane' }];
  },
  handles: (p) => orientedRectHandles(p.orientation, p.thickness, p.length).filter((h) => h.param === 'length'),
  label: (p, l) => `Membrane ${l(p.thickness)}`,
});
