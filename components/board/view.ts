/**
 * The view transform between the section (metres, y up) and the screen (pixels, y down).
 * screen = (x * k + ox, -y * k + oy). Pure functions.
 */
import type { Box, Point } from '@/lib/section/geometry';
import type { UnitSystem } from '@/lib/units';

export interface View {
  /** Pixels per metre. */
  k: number;
  /** Screen position of the world origin. */
  ox: number;
  oy: number;
}

export const MIN_K = 2; // 2 px per metre: a 200 m site fits on a small screen
export const MAX_K = 200_000; // 200 px per mm

export function toScreen(v: View, p: Point): [number, number] {
  return [p[0] * v.k + v.ox, -p[1] * v.k + v.oy];
}

export function toWorld(v: View, sx: number, sy: number): [number, number] {
  return [(sx - v.ox) / v.k, -(sy - v.oy) / v.k];
}

/** A world box as a screen rectangle (x, y top-left, width, height). */
export function boxToScreen(v: View, b: Box): { x: number; y: number; width: number; height: number } {
  return { x: b.minX * v.k + v.ox, y: -b.maxY * v.k + v.oy, width: (b.maxX - b.minX) * v.k, height: (b.maxY - b.minY) * v.k };
}

/** Zoom by `factor` keeping the world point under (sx, sy) fixed. */
export function zoomAt(v: View, sx: number, sy: number, factor: number): View {
  const k = Math.min(MAX_K, Math.max(MIN_K, v.k * factor));
  const f = k / v.k;
  return { k, ox: sx - (sx - v.ox) * f, oy: sy - (sy - v.oy) * f };
}

export function panBy(v: View, dx: number, dy: number): View {
  return { k: v.k, ox: v.ox + dx, oy: v.oy + dy };
}

/** The view that shows `box` centred in a width x height screen with `margin` pixels around it. */
export function fitBox(b: Box, width: number, height: number, margin = 32): View {
  const w = Math.max(b.maxX - b.minX, 1e-3), h = Math.max(b.maxY - b.minY, 1e-3);
  const k = Math.min(MAX_K, Math.max(MIN_K, Math.min((width - 2 * margin) / w, (height - 2 * margin) / h)));
  const cx = (b.minX + b.maxX) / 2, cy = (b.minY + b.maxY) / 2;
  return { k, ox: width / 2 - cx * k, oy: height / 2 + cy * k };
}

/** The world box visible on a width x height screen. */
export function visibleBox(v: View, width: number, height: number): Box {
  const [x0, y1] = toWorld(v, 0, 0);
  const [x1, y0] = toWorld(v, width, height);
  return { minX: x0, minY: y0, maxX: x1, maxY: y1 };
}

/** Round steps of the unit system, in metres, smallest first. */
const SI_STEPS = [0.001, 0.002, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50, 100];
const IN = 0.0254, FT = 0.3048;
const IP_STEPS = [IN / 16, IN / 8, IN / 4, IN / 2, IN, 2 * IN, 3 * IN, 6 * IN, FT, 2 * FT, 5 * FT, 10 * FT, 20 * FT, 50 * FT, 100 * FT, 200 * FT];

export function steps(system: UnitSystem): readonly number[] {
  return system === 'si' ? SI_STEPS : IP_STEPS;
}

/** The smallest round step that is at least `minPx` pixels on screen. */
export function niceStep(k: number, system: UnitSystem, minPx: number): number {
  const list = steps(system);
  for (const s of list) if (s * k >= minPx) return s;
  return list[list.length - 1];
}

/** Grid spacing: minor lines at least 10 px apart, major lines the next step that is at least 4 minors. */
export function gridSpacing(k: number, system: UnitSystem): { minor: number; major: number } {
  const minor = niceStep(k, system, 10);
  const list = steps(system);
  const major = list.find((s) => s >= minor * 4 - 1e-12 && Math.abs(s / minor - Math.round(s / minor)) < 1e-6) ?? minor * 10;
  return { minor, major };
}

/** Scale bar: a round length between about 60 and 160 pixels. */
export function scaleBar(k: number, system: UnitSystem): { metres: number; pixels: number } {
  const metres = niceStep(k, system, 60);
  return { metres, pixels: metres * k };
}

/**
 * Pattern fills are drawn in screen pixels at one scale per octave of zoom, so a change of zoom within
 * an octave needs no new fill and the hatching stays between 1x and 2x its drawn size.
 */
export function patternBucket(k: number): number {
  return Math.pow(2, Math.floor(Math.log2(k)));
}
