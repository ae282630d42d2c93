/**
 * Unvented crawl space: insulated foundation walls, a ground cover on bare soil, spray foam at the rim
 * (invented project: "Willow Bend duplex"). The crawl space is an unconditioned zone with a fixed air
 * temperature and humidity (example values). x = 0 at the outer face of the wall, y = 0 at grade.
 */
import { EXAMPLE_CLIMATE as C, GROUND, exteriorZones, part, rectZone, section } from './build';

export function crawlspaceUnvented() {
  const inner = 0.2 + GROUND.inside;
  const top = 1.8;
  return section({
    name: 'Unvented crawl space, insulated walls',
    description:
      'Example: 200 mm block wall 1.2 m tall, 50 mm XPS inside the wall, 0.25 mm polyethylene ground cover on bare soil 0.4 m below grade, rim joist with 75 mm closed-cell spray foam. Invented scenario; conditions are examples, not code values.',
    parts: [
      part({ id: 'ground', kind: 'soil', name: 'Ground below the crawl floor', material: 'soil-clay-silt', at: [-GROUND.beside, -GROUND.below], width: GROUND.beside + inner, depth: GROUND.below - 0.4 }),
      part({ id: 'ground-out', kind: 'soil', name: 'Ground outside', material: 'soil-clay-silt', at: [-GROUND.beside, -0.4], width: GROUND.beside, depth: 0.4 }),
      part({ id: 'footing', kind: 'footing', name: 'Footing', at: [-0.2, -1.0], width: 0.6, depth: 0.2 }),
      part({ id: 'wall', kind: 'foundation-wall', name: 'Block wall', material: 'masonry-block-hollow', join: { to: 'footing', anchor: 'top-center', self: 'bottom-center' }, thickness: 0.2, height: 1.2, construction: 'block' }),
      part({ id: 'cover', kind: 'membrane', name: 'Ground cover', at: [0.2, -0.4], thickness: 0.00025, length: inner - 0.2 }),
      part({ id: 'foam', kind: 'board', name: 'Wall XPS', join: { to: 'wall', anchor: 'top-right', self: 'top-left' }, orientation: 'vertical', placement: 'inside', thickness: 0.05, length: 0.8 }),
      part({ id: 'sill', kind: 'plate', name: 'Sill plate', join: { to: 'wall', anchor: 'top-left', self: 'bottom-left' }, width: 0.14, role: 'sill' }),
      part({ id: 'rim', kind: 'rim', name: 'Rim joist', join: { to: 'sill', anchor: 'top-left', self: 'bottom-left' }, deckLength: inner, rimInsulation: 0.075 }),
      part({ id: 'upper', kind: 'framed-wall', name: 'Framed wall above', join: { to: 'rim', anchor: 'top-left', self: 'bottom-left' }, studDepth: 0.14, height: top - 0.697 }),
    ],
    zones: [
      ...exteriorZones(top),
      rectZone('crawl', 'unconditioned', 'Crawl space', 0, -0.4, inner, 0.679, [14, 60], [15, 60]),
      rectZone('room', 'indoor', 'Room above', 0, 0.697, inner, top, C.indoor.design, C.indoor.month),
    ],
    analysis: { convention: 'internal', ground: null },
    cuts: [{ id: 'wall-cut', name: 'Through the crawl-space wall', from: [-0.3, 0.2], to: [0.6, 0.2] }],
  });
}
