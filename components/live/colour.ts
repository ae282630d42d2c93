/**
 * Temperature colours: a perceptually uniform, colour-blind-safe scale (cividis from d3-scale-chromatic)
 * over a range that follows the zones' temperatures, and a screen raster of the cell field.
 */
import { interpolateCividis } from 'd3-scale-chromatic';

export interface Range { lo: number; hi: number }

/** The colour range: coldest to warmest zone temperature (design day), widened when they coincide. */
export function rangeOf(temps: readonly number[]): Range {
  const ok = temps.filter((t) => Number.isFinite(t));
  if (!ok.length) return { lo: 0, hi: 20 };
  let lo = Math.min(...ok), hi = Math.max(...ok);
  if (hi - lo < 1e-6) { lo -= 1; hi += 1; }
  return { lo, hi };
}

/** 256 RGB entries, cold first. */
export function buildLut(n = 256): Uint8ClampedArray {
  const lut = new Uint8ClampedArray(n * 3);
  for (let i = 0; i < n; i++) {
    const m = /rgb\((\d+), ?(\d+), ?(\d+)\)/.exec(interpolateCividis(i / (n - 1)));
    const [r, g, b] = m ? [+m[1], +m[2], +m[3]] : [0, 0, 0];
    lut[i * 3] = r; lut[i * 3 + 1] = g; lut[i * 3 + 2] = b;
  }
  return lut;
}

export function lutIndex(t: number, r: Range, n = 256): number {
  const f = (t - r.lo) / (r.hi - r.lo);
  return Math.max(0, Math.min(n - 1, Math.round(f * (n - 1))));
}

export function colourOf(t: number, r: Range, lut: Uint8ClampedArray): string {
  const i = lutIndex(t, r, lut.length / 3) * 3;
  return `rgb(${lut[i]}, ${lut[i + 1]}, ${lut[i + 2]})`;
}

/** Index of the interval of ascending `lines` holding v, or -1 outside. */
export function intervalOf(lines: ArrayLike<number>, v: number): number {
  const n = lines.length - 1;
  if (!(v >= lines[0] && v <= lines[n])) return -1;
  let lo = 0, hi = n;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (lines[mid] <= v) lo = mid; else hi = mid;
  }
  return lo;
}

export interface GridField { xs: ArrayLike<number>; ys: ArrayLike<number>; nx: number; ny: number; /** per cell, row-major j nx + i, NaN outside the solids */ t: Float64Array }

/** Temperature at a world point (the cell's value), NaN outside the solids or the model. */
export function fieldAt(f: GridField, x: number, y: number): number {
  const i = intervalOf(f.xs, x), j = intervalOf(f.ys, y);
  return i < 0 || j < 0 ? NaN : f.t[j * f.nx + i];
}

export interface ScreenView { k: number; ox: number; oy: number }

/**
 * Paint the field into an RGBA buffer of width x height screen pixels for a view (screen x = ox + k x,
 * screen y = oy - k y), cell-constant colours, transparent outside the solids.
 */
export function rasterize(f: GridField, r: Range, lut: Uint8ClampedArray, v: ScreenView, width: number, height: number, out: Uint8ClampedArray, alpha = 255): void {
  const col = new Int32Array(width), row = new Int32Array(height);
  for (let sx = 0; sx < width; sx++) col[sx] = intervalOf(f.xs, (sx + 0.5 - v.ox) / v.k);
  for (let sy = 0; sy < height; sy++) row[sy] = intervalOf(f.ys, (v.oy - sy - 0.5) / v.k);
  const n = lut.length / 3, span = r.hi - r.lo;
  let p = 0;
  for (let sy = 0; sy < height; sy++) {
    const j = row[sy];
    for (let sx = 0; sx < width; sx++, p += 4) {
      const i = col[sx];
      const t = i < 0 || j < 0 ? NaN : f.t[j * f.nx + i];
      if (t !== t) { out[p + 3] = 0; continue; }
      let q = Math.round(((t - r.lo) / span) * (n - 1));
      q = q < 0 ? 0 : q >= n ? n - 1 : q;
      out[p] = lut[q * 3]; out[p + 1] = lut[q * 3 + 1]; out[p + 2] = lut[q * 3 + 2]; out[p + 3] = alpha;
    }
  }
}

/** Isotherm levels at a fixed interval inside a range. */
export function levels(r: Range, step: number): number[] {
  if (!(step > 0)) return [];
  const out: number[] = [];
  for (let v = Math.ceil(r.lo / step) * step; v <= r.hi + 1e-9; v += step) if (v > r.lo && v < r.hi) out.push(Math.round(v * 1e6) / 1e6);
  return out;
}

/** Resolution of the colour layer while a preview is shown (a drag): half the screen's pixels each way. */
export const PREVIEW_RASTER_SCALE = 0.5;

export interface RasterFrame { view: ScreenView; width: number; height: number }

/**
 * The raster for a screen of width x height px drawn at `scale` of its resolution: its size in whole
 * pixels and the view that maps world points onto it (pixel i covers screen pixels i/scale to
 * (i + 1)/scale, so a pixel's centre falls on the centre of the block of screen pixels it stands for).
 */
export function rasterFrame(view: ScreenView, width: number, height: number, scale = 1): RasterFrame {
  return {
    view: scale === 1 ? view : { k: view.k * scale, ox: view.ox * scale, oy: view.oy * scale },
    width: Math.max(1, Math.floor(width * scale)),
    height: Math.max(1, Math.floor(height * scale)),
  };
}
