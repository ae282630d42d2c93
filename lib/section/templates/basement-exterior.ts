/**
 * Basement insulated outside: XPS on the outer face of the wall behind a drainage board, a parge coat
 * over the foam above grade, sub-slab foam (invented project: "Quarry Hill house"). x = 0 at the outer
 * face of the concrete, y = 0 at grade.
 */
import { EXAMPLE_CLIMATE as C, GROUND, exteriorZones, part, rectZone, section } from './build';

export function basementExterior() {
  const inner = 0.2 + GROUND.inside;
  const top = 1.6;
  return section({
    name: 'Basement, insulated outside with sub-slab foam',
    description:
      'Example: 75 mm XPS on the outside of a 200 mm poured wall from the footing to the sill, drainage board below grade, parge coat over the foam above grade, 100 mm slab on 75 mm XPS. Exterior foam also protects the waterproofing (common practice). Invented scenario; conditions are examples, not code values.',
    parts: [
      // Soil under the floor (to the bottom of the stone bed) and beside the wall; the basement itself is air.
      part({ id: 'ground', kind: 'soil', name: 'Ground below the floor', material: 'soil-sand-gravel', at: [-GROUND.beside, -GROUND.below], width: GROUND.beside + inner, depth: GROUND.below - 2.55 }),
      part({ id: 'ground-out', kind: 'soil', name: 'Ground outside', material: 'soil-sand-gravel', at: [-GROUND.beside, -2.55], width: GROUND.beside, depth: 2.55 }),
      part({ id: 'footing', kind: 'footing', name: 'Footing', at: [-0.2, -2.6], width: 0.6, depth: 0.25 }),
      part({ id: 'wall', kind: 'foundation-wall', name: 'Foundation wall', join: { to: 'footing', anchor: 'top-center', self: 'bottom-center' }, thickness: 0.2, height: 2.65 }),
      part({ id: 'xps', kind: 'board', name: 'Exterior XPS', join: { to: 'wall', anchor: 'top-left', self: 'top-right' }, orientation: 'vertical', placement: 'outside', thickness: 0.075, length: 2.65 }),
      part({ id: 'drain', kind: 'drainage-board', name: 'Drainage board', join: { to: 'xps', anchor: 'bottom-left', self: 'bottom-right' }, thickness: 0.008, length: 2.3 }),
      part({ id: 'parge', kind: 'board', name: 'Parge coat over foam', material: 'mortar-parge', join: { to: 'xps', anchor: 'top-left', self: 'top-right' }, orientation: 'vertical', placement: 'other', thickness: 0.012, length: 0.35 }),
      part({ id: 'bed', kind: 'gravel', name: 'Stone bed', at: [0.2, -2.55], thickness: 0.15, width: inner - 0.2 }),
      part({ id: 'subslab', kind: 'board', name: 'Sub-slab XPS', join: { to: 'bed', anchor: 'top-left', self: 'bottom-left' }, orientation: 'horizontal', placement: 'under-slab', thickness: 0.075, length: inner - 0.2 }),
      part({ id: 'slab', kind: 'slab', name: 'Basement slab', join: { to: 'subslab', anchor: 'top-left', self: 'bottom-left' }, thickness: 0.1, width: inner - 0.2 }),
      part({ id: 'sill', kind: 'plate', name: 'Sill plate', join: { to: 'wall', anchor: 'top-left', self: 'bottom-left' }, width: 0.14, role: 'sill' }),
      part({ id: 'rim', kind: 'rim', name: 'Rim joist', join: { to: 'sill', anchor: 'top-left', self: 'bottom-left' }, deckLength: inner, rimInsulation: 0.05 }),
      part({ id: 'upper', kind: 'framed-wall', name: 'Framed wall above', join: { to: 'rim', anchor: 'top-left', self: 'bottom-left' }, studDepth: 0.14, height: top - 0.597 }),
    ],
    zones: [
      ...exteriorZones(top),
      rectZone('basement', 'indoor', 'Basement', 0, -2.225, inner, 0.579, C.indoor.design, C.indoor.month),
      rectZone('room', 'indoor', 'Room above', 0, 0.597, inner, top, C.indoor.design, C.indoor.month),
    ],
    analysis: {
      convention: 'internal',
      ground: {
        characteristicDimension: 8,
        wallHeight: 1.6,
        floorFrom: [2, -2.0],
        floorTo: [2, -2.55],
        wallFrom: [-0.4, 1.3],
        wallTo: [0.5, 1.3],
        wallThickness: 0.28,
        groundLambda: 2.0,
        basementDepth: 2.225,
        basementWallFrom: [-0.4, -1.0],
        basementWallTo: [0.6, -1.0],
      },
    },
    cuts: [{ id: 'wall-cut', name: 'Through the basement wall', from: [-0.4, -1.0], to: [0.6, -1.0] }],
  });
}
