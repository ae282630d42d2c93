/**
 * Full-height basement insulated inside: foam board on the concrete, a 2x4 framed wall with mineral
 * wool in front of it, rim joist with spray foam, framed wall above (invented project: "Heron Lane
 * basement refit"). x = 0 at the outer face of the foundation wall, y = 0 at grade.
 */
import { EXAMPLE_CLIMATE as C, GROUND, exteriorZones, part, rectZone, section } from './build';

export function basementInteriorFramed() {
  const inner = 0.2 + GROUND.inside;
  const top = 1.6;
  return section({
    name: 'Basement, insulated inside with a framed wall',
    description:
      'Example: 200 mm poured wall 2.6 m tall, 50 mm XPS against the concrete, 2x4 framed wall with mineral wool, 100 mm slab on 50 mm XPS; rim joist with 50 mm closed-cell spray foam; 2x6 wall above. Invented scenario; conditions are examples, not code values.',
    parts: [
      // Soil under the floor (to the bottom of the stone bed) and beside the wall; the basement itself is air.
      part({ id: 'ground', kind: 'soil', name: 'Ground below the floor', material: 'soil-sand-gravel', at: [-GROUND.beside, -GROUND.below], width: GROUND.beside + inner, depth: GROUND.below - 2.5 }),
      part({ id: 'ground-out', kind: 'soil', name: 'Ground outside', material: 'soil-sand-gravel', at: [-GROUND.beside, -2.5], width: GROUND.beside, depth: 2.5 }),
      part({ id: 'footing', kind: 'footing', name: 'Footing', at: [-0.2, -2.55], width: 0.6, depth: 0.25, keyway: true }),
      part({ id: 'wall', kind: 'foundation-wall', name: 'Foundation wall', join: { to: 'footing', anchor: 'top-center', self: 'bottom-center' }, thickness: 0.2, height: 2.6 }),
      part({ id: 'bed', kind: 'gravel', name: 'Stone bed', at: [0.2, -2.5], thickness: 0.15, width: inner - 0.2 }),
      part({ id: 'subslab', kind: 'board', name: 'Sub-slab XPS', join: { to: 'bed', anchor: 'top-left', self: 'bottom-left' }, orientation: 'horizontal', placement: 'under-slab', thickness: 0.05, length: inner - 0.2 }),
      part({ id: 'slab', kind: 'slab', name: 'Basement slab', join: { to: 'subslab', anchor: 'top-left', self: 'bottom-left' }, thickness: 0.1, width: inner - 0.2 }),
      part({ id: 'foam', kind: 'board', name: 'Wall XPS', join: { to: 'slab', anchor: 'top-left', self: 'bottom-left' }, orientation: 'vertical', placement: 'inside', thickness: 0.05, length: 2.5 }),
      part({ id: 'bplate', kind: 'plate', name: 'Bottom plate', join: { to: 'foam', anchor: 'bottom-right', self: 'bottom-left' }, width: 0.089, role: 'bottom' }),
      part({ id: 'stud', kind: 'framed-wall', name: 'Basement framed wall', join: { to: 'bplate', anchor: 'top-left', self: 'bottom-left' }, studDepth: 0.089, height: 2.4 }),
      part({ id: 'sill', kind: 'plate', name: 'Sill plate', join: { to: 'wall', anchor: 'top-left', self: 'bottom-left' }, width: 0.14, role: 'sill' }),
      part({ id: 'rim', kind: 'rim', name: 'Rim joist', join: { to: 'sill', anchor: 'top-left', self: 'bottom-left' }, deckLength: inner, rimInsulation: 0.05 }),
      part({ id: 'upper', kind: 'framed-wall', name: 'Framed wall above', join: { to: 'rim', anchor: 'top-left', self: 'bottom-left' }, studDepth: 0.14, height: top - 0.597 }),
    ],
    zones: [
      ...exteriorZones(top),
      rectZone('basement', 'indoor', 'Basement', 0, -2.2, inner, 0.579, C.indoor.design, C.indoor.month),
      rectZone('room', 'indoor', 'Room above', 0, 0.597, inner, top, C.indoor.design, C.indoor.month),
    ],
    analysis: {
      convention: 'internal',
      ground: {
        characteristicDimension: 8,
        wallHeight: 1.6,
        floorFrom: [2, -2.0],
        floorTo: [2, -2.5],
        wallFrom: [-0.3, 1.3],
        wallTo: [0.5, 1.3],
        wallThickness: 0.35,
        groundLambda: 2.0,
        basementDepth: 2.2,
        basementWallFrom: [-0.3, -1.0],
        basementWallTo: [0.8, -1.0],
      },
    },
    cuts: [{ id: 'wall-cut', name: 'Through the basement wall', from: [-0.3, -1.0], to: [0.8, -1.0] }],
  });
}
