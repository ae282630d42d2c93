/** Colours of the material fills, shared by the board (Konva) and the SVG drawing: our own calm palette, paper-like bases, ink marks a few shades darker. */
import type { FillPattern } from './material';

export interface FillStyle {
  /** Base colour of the fill. */
  base: string;
  /** Colour of the marks. */
  ink: string;
  /** Outline colour of the part. */
  edge: string;
}

export const FILL_STYLES: Record<FillPattern, FillStyle> = {
  concrete: { base: '#dcd9d2', ink: '#7d786e', edge: '#5d5a53' },
  masonry: { base: '#d8cbbb', ink: '#8f7d68', edge: '#65584a' },
  earth: { base: '#d2c2a6', ink: '#8a744f', edge: '#7b6a4e' },
  gravel: { base: '#e1d9c9', ink: '#7f7461', edge: '#6c6352' },
  rock: { base: '#cdc8bf', ink: '#6e6a62', edge: '#5d5952' },
  wood: { base: '#ead7b3', ink: '#ad8750', edge: '#7e5f33' },
  sheet: { base: '#e6d3a6', ink: '#a58651', edge: '#7e6436' },
  gypsum: { base: '#efede7', ink: '#9e9a90', edge: '#6f6c65' },
  board: { base: '#e4ecec', ink: '#6e8f93', edge: '#4d6b6f' },
  foam: { base: '#f1ecd8', ink: '#aa9f78', edge: '#7c7353' },
  batt: { base: '#f5ecea', ink: '#a97f84', edge: '#7d5a5e' },
  membrane: { base: '#3d434b', ink: '#3d434b', edge: '#23272c' },
  metal: { base: '#bac1c8', ink: '#5f6870', edge: '#454c53' },
  plain: { base: '#e4e4e1', ink: '#9a9a96', edge: '#6a6a66' },
};
