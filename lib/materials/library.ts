/**
 * The built-in materials: generic names, generic values, and the source of every value.
 * "recalled from memory" means the figure was written down from recollection of that table and
 * has not been re-checked against the printed standard; confirm before relying on it.
 * No value here describes any particular manufacturer's product.
 */
import type { FillPattern, Material } from './material';

const ISO10456 = 'ISO 10456:2007 Table 3, recalled from memory';
const ISO13370 = 'ISO 13370:2017 Table 7 (thermal properties of the ground), recalled from memory';
const ASHRAE = 'ASHRAE Handbook Fundamentals, heat, air and moisture properties of materials, recalled from memory';
const MEMORY = 'from memory (rough generic value; check the product data)';

function m(
  id: string,
  name: string,
  lambda: number,
  vapour: { mu?: number; sd?: number; sdHumid?: number },
  density: number,
  pattern: FillPattern,
  airOpen: boolean,
  source: [lambda: string, mu: string, density: string],
): Material {
  return {
    id,
    name,
    lambda,
    mu: vapour.mu ?? null,
    sd: vapour.sd ?? null,
    sdHumid: vapour.sdHumid ?? null,
    density,
    airOpen,
    pattern,
    source: { lambda: source[0], mu: source[1], density: source[2] },
  };
}

export const LIBRARY_MATERIALS: readonly Material[] = [
  // Concretes and masonry
  m('concrete-1800', 'Concrete, medium density 1800 kg/m3', 1.15, { mu: 60 }, 1800, 'concrete', false, [ISO10456, ISO10456, ISO10456]),
  m('concrete-2000', 'Concrete, medium density 2000 kg/m3', 1.35, { mu: 60 }, 2000, 'concrete', false, [ISO10456, ISO10456, ISO10456]),
  m('concrete-2300-rc', 'Concrete, reinforced (1 % steel) 2300 kg/m3', 2.3, { mu: 80 }, 2300, 'concrete', false, [ISO10456, ISO10456, ISO10456]),
  m('concrete-2400', 'Concrete, high density 2400 kg/m3', 2.0, { mu: 80 }, 2400, 'concrete', false, [ISO10456, ISO10456, ISO10456]),
  m('masonry-block-hollow', 'Concrete masonry block, hollow, normal weight (equivalent)', 1.0, { mu: 10 }, 1200, 'masonry', false, [ASHRAE + ' (equivalent conductivity of a 190 mm hollow unit)', MEMORY, MEMORY]),
  m('brick-clay', 'Clay brick masonry', 0.8, { mu: 10 }, 1800, 'masonry', false, [MEMORY, MEMORY, MEMORY]),
  m('mortar-parge', 'Cement mortar or parge coat', 0.93, { mu: 20 }, 1800, 'concrete', false, [ISO10456, ISO10456, ISO10456]),
  // Wood and boards
  m('softwood', 'Softwood framing lumber', 0.13, { mu: 50 }, 500, 'wood', false, [ISO10456, ISO10456 + ' (dry cup)', ISO10456]),
  m('plywood', 'Plywood sheathing or subfloor', 0.13, { mu: 200 }, 500, 'sheet', false, [ISO10456, ISO10456 + ' (dry cup)', ISO10456]),
  m('osb', 'Oriented strand board', 0.13, { mu: 50 }, 650, 'sheet', false, [ISO10456, ISO10456 + ' (dry cup)', ISO10456]),
  m('gypsum-board', 'Gypsum board', 0.25, { mu: 10 }, 900, 'gypsum', false, [ISO10456, ISO10456, ISO10456]),
  // Board and spray insulation
  m('eps', 'Expanded polystyrene board (EPS)', 0.037, { mu: 60 }, 20, 'board', false, [ASHRAE, ISO10456, MEMORY]),
  m('xps', 'Extruded polystyrene board (XPS)', 0.029, { mu: 150 }, 32, 'board', false, [ASHRAE, ISO10456, MEMORY]),
  m('polyiso', 'Polyisocyanurate board, foil faced', 0.024, { mu: 60 }, 32, 'board', false, [ASHRAE + ' (aged value)', ISO10456 + ' (core only; foil facings are near vapour-tight)', MEMORY]),
  m('spf-closed', 'Spray foam, closed cell', 0.024, { mu: 100 }, 32, 'foam', false, [ASHRAE, MEMORY, MEMORY]),
  m('spf-open', 'Spray foam, open cell', 0.037, { mu: 3 }, 8, 'foam', true, [ASHRAE, MEMORY, MEMORY]),
  m('mineral-wool-batt', 'Mineral wool batt', 0.035, { mu: 1 }, 35, 'batt', true, [ASHRAE, ISO10456, MEMORY]),
  m('mineral-wool-board', 'Mineral wool board, rigid', 0.034, { mu: 1 }, 130, 'board', true, [ASHRAE, ISO10456, MEMORY]),
  m('glass-fibre-batt', 'Glass-fibre batt', 0.04, { mu: 1 }, 12, 'batt', true, [ASHRAE, ISO10456, MEMORY]),
  m('cellulose', 'Cellulose, dense pack', 0.04, { mu: 1.5 }, 55, 'batt', true, [ASHRAE, MEMORY, MEMORY]),
  // Ground and fill
  m('gravel-bed', 'Gravel or crushed stone bed, clean', 1.3, { mu: 50 }, 1600, 'gravel', false, [MEMORY + ' (dry-to-damp stone bed; measured values vary widely)', MEMORY, MEMORY]),
  m('soil-sand-gravel', 'Ground, sand or gravel', 2.0, { mu: 50 }, 1900, 'earth', false, [ISO13370, MEMORY, MEMORY]),
  m('soil-clay-silt', 'Ground, clay or silt', 1.5, { mu: 50 }, 1500, 'earth', false, [ISO13370, MEMORY, MEMORY]),
  m('rock', 'Ground, homogeneous rock', 3.5, { mu: 50 }, 2700, 'rock', false, [ISO13370, MEMORY, MEMORY]),
  // Metals
  m('steel', 'Steel', 50, { mu: 1e6 }, 7800, 'metal', false, [ISO10456, ISO10456 + ' (practically vapour-tight)', ISO10456]),
  m('aluminium', 'Aluminium alloy', 160, { mu: 1e6 }, 2800, 'metal', false, [ISO10456, ISO10456 + ' (practically vapour-tight)', ISO10456]),
  // Membranes and thin layers
  m('poly-sheet-015', 'Polyethylene sheet, 0.15 mm', 0.33, { sd: 15 }, 920, 'membrane', false, [ISO10456 + ' (low-density polyethylene)', ISO10456 + ' (mu 100 000 times 0.15 mm)', ISO10456]),
  m('poly-sheet-025', 'Polyethylene ground cover, 0.25 mm', 0.33, { sd: 25 }, 920, 'membrane', false, [ISO10456 + ' (low-density polyethylene)', ISO10456 + ' (mu 100 000 times 0.25 mm)', ISO10456]),
  m('bitumen-membrane', 'Bituminous waterproofing membrane', 0.23, { mu: 50000 }, 1100, 'membrane', false, [ISO10456 + ' (bitumen, membrane)', ISO10456, ISO10456]),
  m('bentonite', 'Bentonite clay waterproofing, hydrated', 0.8, { mu: 2000 }, 1000, 'membrane', false, [MEMORY, MEMORY, MEMORY]),
  m('vapour-retarder-variable', 'Vapour retarder, variable permeance', 0.4, { sd: 4, sdHumid: 0.3 }, 950, 'membrane', false, [MEMORY, MEMORY + ' (winter sd about 4 m, humid-season sd about 0.3 m)', MEMORY]),
  m('sill-gasket', 'Sill gasket, closed-cell polyethylene foam', 0.05, { mu: 5000 }, 30, 'membrane', false, [MEMORY, MEMORY, MEMORY]),
  m('drainage-board', 'Drainage board, dimpled polyethylene (equivalent)', 0.15, { mu: 10000 }, 100, 'membrane', false, [MEMORY + ' (equivalent of sheet and enclosed air)', MEMORY, MEMORY]),
];

const BY_ID = new Map(LIBRARY_MATERIALS.map((x) => [x.id, x]));

export function libraryMaterial(id: string): Material | undefined {
  return BY_ID.get(id);
}
