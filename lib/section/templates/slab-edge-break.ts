/**
 * Slab on ground with a slab-edge break and sub-slab foam: a single-storey house on a stem wall
 * and footing (invented project: "Larch Row cottage"). x = 0 at the outer face of the stem wall,
 * y = 0 at grade.
 */
import { EXAMPLE_CLIMATE as C, GROUND, exteriorZones, part, rectZone, section } from './build';

export function slabEdgeBreak() {
  const inner = 0.2 + GROUND.inside; // symmetry plane in the middle of an 8 m floor
  const top = 1.6; // cut plane of the above-ground wall, over 1 m from the junction
  return section({
    name: 'Slab on ground, slab-edge break',
    description:
      'Example: 100 mm slab on 50 mm XPS and a 150 mm stone bed, 25 mm XPS break between the slab edge and a 200 mm stem wall, 2x6 framed wall above, flush with the inner face of the stem wall. Invented scenario; conditions are examples, not code values.',
    parts: [
      part({ id: 'ground', kind: 'soil', name: 'Ground', material: 'soil-clay-silt', at: [-GROUND.beside, -GROUND.below], width: GROUND.beside + inner, depth: GROUND.below }),
      part({ id: 'footing', kind: 'footing', name: 'Footing', at: [-0.2, -1.2], width: 0.6, depth: 0.25 }),
      part({ id: 'stem', kind: 'foundation-wall', name: 'Stem wall', join: { to: 'footing', anchor: 'top-center', self: 'bottom-center' }, thickness: 0.2, height: 1.15 }),
      part({ id: 'subslab', kind: 'board', name: 'Sub-slab XPS', join: { to: 'bed', anchor: 'top-left', self: 'bottom-left' }, orientation: 'horizontal', placement: 'under-slab', thickness: 0.05, length: inner - 0.225 }),
      part({ id: 'slab', kind: 'slab', name: 'Slab', join: { to: 'subslab', anchor: 'top-left', self: 'bottom-left' }, thickness: 0.1, width: inner - 0.225 }),
      part({ id: 'edge', kind: 'board', name: 'Slab-edge break', join: { to: 'stem', anchor: 'top-right', self: 'top-left' }, orientation: 'vertical', placement: 'slab-edge', thickness: 0.025, length: 0.3 }),
      // The floor layers ride on the break: thinning or thickening it moves them, so no gap opens at the slab edge.
      part({ id: 'bed', kind: 'gravel', name: 'Stone bed', join: { to: 'edge', anchor: 'bottom-right', self: 'bottom-left' }, thickness: 0.15, width: inner - 0.225 }),
      part({ id: 'plate', kind: 'plate', name: 'Sill plate', join: { to: 'stem', anchor: 'top-right', self: 'bottom-right' }, width: 0.14, role: 'sill' }),
      part({ id: 'wall', kind: 'framed-wall', name: 'Framed wall', join: { to: 'plate', anchor: 'top-left', self: 'bottom-left' }, studDepth: 0.14, height: top - 0.244 }),
    ],
    zones: [
      ...exteriorZones(top, 0.06),
      rectZone('room', 'indoor', 'Living room', 0.06, 0.2, inner, top, C.indoor.design, C.indoor.month),
    ],
    analysis: {
      convention: 'internal',
      ground: {
        characteristicDimension: 8,
        wallHeight: top - 0.2,
        floorFrom: [2, 0.4],
        floorTo: [2, -0.1],
        wallFrom: [-0.2, 1.3],
        wallTo: [0.4, 1.3],
        wallThickness: 0.2,
        groundLambda: 1.5,
      },
    },
    // From the room down through the slab, sub-slab foam and stone bed into the ground, close to the edge.
    cuts: [{ id: 'edge-cut', name: 'Through the floor near the slab edge', from: [0.35, 0.4], to: [0.35, -0.6] }],
  });
}
