/** Board insulation: a rigid board standing or lying, placed outside, inside, under the slab or as a slab-edge break. */
import { defineKind, len, orientationParam, orientedRect, orientedRectHandles } from '../kind';

export const board = defineKind({
  kind: 'board',
  title: 'Board insulation',
  description: 'Rigid insulation board',
  params: {
    thickness: len('Thickness', 0.05, 1, [0.025, 0.15], 'Common practice: 50 to 100 mm under a slab'),
    length: len('Length', 1.2, 30, [0.2, 10]),
    orientation: orientationParam,
    placement: {
      type: 'choice',
      label: 'Placement',
      options: [
        { value: 'outside', label: 'Outside the wall' },
        { value: 'inside', label: 'Inside the wall' },
        { value: 'under-slab', label: 'Under the slab' },
        { value: 'slab-edge', label: 'Slab-edge break' },
        { value: 'other', label: 'Other' },
      ],
      default: 'outside',
    },
  },
  defaultMaterial: 'xps',
  pieces: (p, material) => [{ polygon: orientedRect(p.orientation, p.thickness, p.length), material, role: `board (${p.placement})` }],
  handles: (p) => orientedRectHandles(p.orientation, p.thickness, p.length),
  label: (p, l) => `${p.placement === 'slab-edge' ? 'Slab-edge break' : p.placement === 'under-slab' ? 'Sub-slab board' : 'Board'} ${l(p.thickness)}`,
});
