/** A material as the section model and the solver see it. SI units throughout. */

/** Section-drafting fill, by the trade's conventions; the board draws each one its own way. */
export type FillPattern =
  | 'concrete'
  | 'masonry'
  | 'earth'
  | 'gravel'
  | 'rock'
  | 'wood'
  | 'sheet'
  | 'gypsum'
  | 'board'
  | 'foam'
  | 'batt'
  | 'membrane'
  | 'metal'
  | 'plain';

export const FILL_PATTERNS: readonly FillPattern[] = [
  'concrete', 'masonry', 'earth', 'gravel', 'rock', 'wood', 'sheet', 'gypsum', 'board', 'foam', 'batt', 'membrane', 'metal', 'plain',
];

export interface MaterialSource {
  lambda: string;
  mu: string;
  density: string;
}

export interface Material {
  id: string;
  name: string;
  /** Thermal conductivity, W/(m K). */
  lambda: number;
  /** Water vapour diffusion resistance factor (dimensionless, >= 1); null when only sd is known. */
  mu: number | null;
  /** Equivalent air-layer thickness of the product as supplied, m (thin membranes); winter value for a variable-permeance retarder. */
  sd: number | null;
  /** Summer (humid side) sd of a variable-permeance retarder, m. */
  sdHumid: number | null;
  /** Density, kg/m3. */
  density: number;
  /** Air can move through it (batts, open-cell foam): an airtight layer behind it is judged as a hidden surface. */
  airOpen: boolean;
  pattern: FillPattern;
  source: MaterialSource;
}

/** The vapour resistance of a layer of this material, as sd = mu d in metres (ISO 13788), or its own sd. */
export function layerSd(m: Material, thickness: number): number {
  if (m.sd !== null) return m.sd;
  return (m.mu ?? 1) * thickness;
}
