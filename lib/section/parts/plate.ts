/** Bottom or sill plate on a thin capillary-break layer. Origin bottom-left of the break. */
import { rectPolygon } from '../geometry';
import { defineKind, len } from '../kind';

export const plate = defineKind({
  kind: 'plate',
  title: 'Plate',
  description: 'Bottom or sill plate on a capillary break',
  params: {
    width: len('Width', 0.089, 0.5, [0.089, 0.14]),
    height: len('Height', 0.038, 0.3, [0.038, 0.076]),
    breakThickness: { type: 'number', label: 'Capillary break thickness', quantity: 'length', default: 0.006, min: 0, max: 0.05, help: '0 for none (not recommended: common practice is a capillary break under every plate on concrete)' },
    breakMaterial: { type: 'material', label: 'Capillary break', default: 'sill-gasket' },
    role: { type: 'choice', label: 'Plate', options: [{ value: 'sill', label: 'Sill plate' }, { value: 'bottom', label: 'Bottom plate' }], default: 'sill' },
  },
  defaultMaterial: 'softwood',
  pieces(p, material) {
    const b = p.breakThickness;
    const pieces = [{ polygon: rectPolygon(0, b, p.width, p.height), material, role: p.role === 'sill' ? 'sill plate' : 'bottom plate' }];
    if (b > 0) pieces.unshift({ polygon: rectPolygon(0, 0, p.width, b), material: p.breakMaterial, role: 'capillary break' });
    return pieces;
  },
  handles: (p) => [
    { id: 'width-right', param: 'width', axis: 'x', side: 'max', at: [p.width, p.breakThickness + p.height / 2] },
    { id: 'width-left', param: 'width', axis: 'x', side: 'min', at: [0, p.breakThickness + p.height / 2] },
    { id: 'height-top', param: 'height', axis: 'y', side: 'max', at: [p.width / 2, p.breakThickness + p.height] },
  ],
  label: (p, l) => `${p.role === 'sill' ? 'Sill' : 'Bottom'} plate ${l(p.width)}${p.breakThickness > 0 ? ' on capillary break' : ''}`,
});
