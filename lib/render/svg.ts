/**
 * The section drawing as an SVG string (pure: no DOM). Parts with their material fills, optionally the
 * temperature field (cividis, the board's scale), isotherms, verdict marks with shapes as well as colours,
 * the coldest point, a legend with the dew point and the mould limit, dimensions of the main parts and
 * the saved cuts. Drawn at a true scale 1:N at 96 px per inch, so the SVG prints to scale.
 */
import { interpolateCividis } from 'd3-scale-chromatic';
import type { FillPattern, Material } from '../materials/material';
import type { Box, Point } from '../section/geometry';
import { resolveSection, type ResolvedSection } from '../section/resolve';
import type { SectionSnapshot } from '../section/schema';
import type { SectionResults, SurfaceState } from '../thermal/types';
import { formatLength, formatQuantity, type UnitSystem } from '../units';
import { FILL_STYLES } from '../materials/fill-colours';

/** Base and edge colours per fill (the board's palette). */
export const FILL_COLOURS = FILL_STYLES;

/** Verdict states: colour, dash and glyph (the board's styles). */
export const STATE_STYLES: Record<SurfaceState, { stroke: string; width: number; dash: string; glyph: 'ring' | 'diamond' | 'cross'; label: string }> = {
  fine: { stroke: '#2b8a6e', width: 3, dash: '', glyph: 'ring', label: 'fine' },
  'mould risk': { stroke: '#d97a00', width: 4, dash: '10 5', glyph: 'diamond', label: 'mould risk (surface RH at or above 80 %)' },
  condensation: { stroke: '#c0267a', width: 5, dash: '2 5', glyph: 'cross', label: 'condensation (below the dew point)' },
};

export interface RenderOptions {
  /** Drawing scale 1:N (default 10), at 96 px per inch. */
  scale?: number;
  /** Draw the temperature field, isotherms and verdict marks (needs results). Default true. */
  overlay?: boolean;
  /** Isotherm interval, K (default 2; 0 for none). */
  isothermStep?: number;
  units?: UnitSystem;
  /** 'junction': the constructions and 0.4 m around them (default); 'all': the whole model. */
  extent?: 'junction' | 'all';
  /** Show dimensions of the main parts. Default true. */
  dimensions?: boolean;
  title?: string;
}

export interface RenderedSvg {
  svg: string;
  /** Size in CSS pixels (96 per inch). */
  width: number;
  height: number;
  /** World box drawn, m. */
  box: Box;
  /** Temperature range of the colours, C (null without overlay). */
  range: { lo: number; hi: number } | null;
}

const PX_PER_M_AT_1_1 = 96 / 0.0254;
const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const n2 = (v: number) => (Math.round(v * 100) / 100).toString();

/** Colour of a temperature on the cividis scale over a range. */
export function temperatureColour(t: number, lo: number, hi: number): string {
  const f = hi > lo ? Math.max(0, Math.min(1, (t - lo) / (hi - lo))) : 0.5;
  return interpolateCividis(f);
}

/** The box drawn: constructions (not ground) with a margin, within the model. */
export function drawingBox(resolved: ResolvedSection, extent: 'junction' | 'all' = 'junction'): Box {
  if (extent === 'all') return resolved.bounds;
  let b: Box | null = null;
  for (const s of resolved.solids) {
    const m = resolved.materials.get(s.materialId);
    if (m && (m.pattern === 'earth' || m.pattern === 'rock')) continue;
    for (const [x, y] of s.polygon) b = b ? { minX: Math.min(b.minX, x), minY: Math.min(b.minY, y), maxX: Math.max(b.maxX, x), maxY: Math.max(b.maxY, y) } : { minX: x, minY: y, maxX: x, maxY: y };
  }
  if (!b) return resolved.bounds;
  const m = 0.4, w = resolved.bounds;
  const box = { minX: Math.max(w.minX, b.minX - m), minY: Math.max(w.minY, b.minY - m), maxX: Math.min(w.maxX, b.maxX + m), maxY: Math.min(w.maxY, b.maxY + m) };
  // Keep the drawing no wider than 2.5 m: a long floor is cut at its far end (the junction is what matters).
  if (box.maxX - box.minX > 2.5) box.maxX = box.minX + 2.5;
  return box;
}

/** Isotherm segments by marching squares over the cell centres; cells outside the solids break the lines. Flat x0,y0,x1,y1 in metres. */
export function isothermSegments(field: SectionResults['field'], value: number): Float64Array {
  const { xs, ys, t } = field;
  const nx = xs.length - 1, ny = ys.length - 1;
  const out: number[] = [];
  const cx = (i: number) => 0.5 * (xs[i] + xs[i + 1]), cy = (j: number) => 0.5 * (ys[j] + ys[j + 1]);
  const T = (i: number, j: number) => t[j * nx + i];
  for (let j = 0; j + 1 < ny; j++)
    for (let i = 0; i + 1 < nx; i++) {
      const a = T(i, j), b = T(i + 1, j), c = T(i + 1, j + 1), d = T(i, j + 1);
      if (a === null || b === null || c === null || d === null) continue;
      // Corners counter-clockwise; edge crossings where the value lies between two corners.
      const cs: [number, number, number][] = [[cx(i), cy(j), a], [cx(i + 1), cy(j), b], [cx(i + 1), cy(j + 1), c], [cx(i), cy(j + 1), d]];
      const pts: number[] = [];
      for (let e = 0; e < 4; e++) {
        const p = cs[e], q = cs[(e + 1) % 4];
        if ((p[2] < value) !== (q[2] < value)) {
          const u = (value - p[2]) / (q[2] - p[2]);
          pts.push(p[0] + u * (q[0] - p[0]), p[1] + u * (q[1] - p[1]));
        }
      }
      if (pts.length === 4) out.push(pts[0], pts[1], pts[2], pts[3]);
      else if (pts.length === 8) out.push(pts[0], pts[1], pts[2], pts[3], pts[4], pts[5], pts[6], pts[7]);
    }
  return Float64Array.from(out);
}

/** Isotherm values at a fixed interval strictly inside a range. */
export function isothermValues(lo: number, hi: number, step: number): number[] {
  if (!(step > 0)) return [];
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v < hi - 1e-9; v += step) if (v > lo + 1e-9) out.push(Math.round(v * 1e6) / 1e6);
  return out;
}

function glyph(kind: 'ring' | 'diamond' | 'cross', x: number, y: number, r: number, stroke: string): string {
  if (kind === 'ring') return `<circle cx="${n2(x)}" cy="${n2(y)}" r="${r}" fill="#fff" stroke="${stroke}" stroke-width="2"/>`;
  if (kind === 'diamond') return `<path d="M${n2(x)} ${n2(y - r)}L${n2(x + r)} ${n2(y)}L${n2(x)} ${n2(y + r)}L${n2(x - r)} ${n2(y)}Z" fill="#fff" stroke="${stroke}" stroke-width="2"/>`;
  return `<path d="M${n2(x - r)} ${n2(y - r)}L${n2(x + r)} ${n2(y + r)}M${n2(x + r)} ${n2(y - r)}L${n2(x - r)} ${n2(y + r)}" stroke="${stroke}" stroke-width="3"/>`;
}

/** The section drawing. `results` are needed for the overlay; without them the drawing shows materials only. */
export function renderSectionSvg(snapshot: SectionSnapshot, results: SectionResults | null, options: RenderOptions = {}): RenderedSvg {
  const scale = options.scale ?? 10;
  if (!(scale > 0) || !Number.isFinite(scale)) throw new RangeError(`scale must be a positive number (1:N), got ${scale}`);
  const units = options.units ?? 'si';
  const overlay = (options.overlay ?? true) && !!results && results.field.t.length > 0;
  const resolved = resolveSection(snapshot);
  const box = drawingBox(resolved, options.extent);
  const k = PX_PER_M_AT_1_1 / scale;
  const pad = 24, legendH = overlay ? 78 : 0, footH = 34;
  const dw = (box.maxX - box.minX) * k, dh = (box.maxY - box.minY) * k;
  // The legend needs about 560 px whatever the scale.
  const width = Math.ceil(Math.max(dw + 2 * pad, overlay ? 600 : 0)), height = Math.ceil(dh + 2 * pad + legendH + footH);
  const X = (x: number) => pad + (x - box.minX) * k;
  const Y = (y: number) => pad + (box.maxY - y) * k;
  const pathOf = (poly: readonly Point[]) => `M${poly.map(([x, y]) => `${n2(X(x))} ${n2(Y(y))}`).join('L')}Z`;
  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="Helvetica, Arial, sans-serif" font-size="11">`);
  parts.push(`<title>${esc(options.title ?? snapshot.name)}</title>`);
  parts.push(`<desc>Dewline section drawing at 1:${scale}${overlay ? ' with temperature field (design day, surface-temperature run)' : ''}. Screening aid only.</desc>`);
  parts.push(`<rect width="${width}" height="${height}" fill="#ffffff"/>`);
  parts.push(`<defs><clipPath id="dl-clip"><rect x="${pad}" y="${pad}" width="${n2(dw)}" height="${n2(dh)}"/></clipPath></defs>`);
  parts.push(`<g clip-path="url(#dl-clip)">`);
  // Zones: pale air colour.
  for (const z of resolved.zones) {
    if (!z.polygon.length) continue;
    const fill = z.kind === 'indoor' ? '#fbf3ea' : z.kind === 'outdoor' ? '#eef3f8' : '#f3f3f3';
    parts.push(`<path d="${pathOf(z.polygon)}" fill="${fill}" stroke="none" data-zone="${esc(z.zoneId)}"/>`);
  }
  // Solids, bottom of the stack first.
  for (const s of resolved.solids) {
    const m: Material | undefined = resolved.materials.get(s.materialId);
    const c = FILL_COLOURS[m?.pattern ?? 'plain'] ?? FILL_COLOURS.plain;
    parts.push(`<path d="${pathOf(s.polygon)}" fill="${c.base}" stroke="${c.edge}" stroke-width="0.8" data-part="${esc(s.partId)}"/>`);
  }
  let range: { lo: number; hi: number } | null = null;
  if (overlay && results) {
    const temps = results.zones.filter((z) => z.touches).map((z) => z.design.t);
    range = temps.length ? { lo: Math.min(...temps), hi: Math.max(...temps) } : { lo: 0, hi: 20 };
    if (range.hi - range.lo < 1e-6) range = { lo: range.lo - 1, hi: range.hi + 1 };
    const { xs, ys, t } = results.field;
    const nx = xs.length - 1, ny = ys.length - 1;
    const bins = 64;
    const bin = (v: number) => Math.max(0, Math.min(bins - 1, Math.floor(((v - range!.lo) / (range!.hi - range!.lo)) * bins)));
    const colours = Array.from({ length: bins }, (_, b) => temperatureColour(range!.lo + ((b + 0.5) / bins) * (range!.hi - range!.lo), range!.lo, range!.hi));
    const cells: string[] = [];
    for (let j = 0; j < ny; j++) {
      if (ys[j + 1] < box.minY || ys[j] > box.maxY) continue;
      let i = 0;
      while (i < nx) {
        const v = t[j * nx + i];
        if (v === null || xs[i + 1] < box.minX || xs[i] > box.maxX) { i++; continue; }
        const b = bin(v);
        let e = i + 1;
        while (e < nx) { const w = t[j * nx + e]; if (w === null || bin(w) !== b || xs[e] > box.maxX) break; e++; }
        const x0 = X(Math.max(xs[i], box.minX)), x1 = X(Math.min(xs[e], box.maxX));
        const y0 = Y(Math.min(ys[j + 1], box.maxY)), y1 = Y(Math.max(ys[j], box.minY));
        cells.push(`<rect x="${n2(x0)}" y="${n2(y0)}" width="${n2(x1 - x0 + 0.3)}" height="${n2(y1 - y0 + 0.3)}" fill="${colours[b]}"/>`);
        i = e;
      }
    }
    parts.push(`<g data-layer="field" opacity="0.92">${cells.join('')}</g>`);
    // Part outlines again, over the field.
    parts.push(`<g fill="none" stroke="#222" stroke-opacity="0.55" stroke-width="0.6">${resolved.solids.map((s) => `<path d="${pathOf(s.polygon)}"/>`).join('')}</g>`);
    const step = options.isothermStep ?? 2;
    const iso: string[] = [];
    for (const v of isothermValues(range.lo, range.hi, step)) {
      const seg = isothermSegments(results.field, v);
      if (!seg.length) continue;
      let d = '';
      for (let q = 0; q < seg.length; q += 4) d += `M${n2(X(seg[q]))} ${n2(Y(seg[q + 1]))}L${n2(X(seg[q + 2]))} ${n2(Y(seg[q + 3]))}`;
      iso.push(`<path d="${d}" data-isotherm="${v}"/>`);
    }
    parts.push(`<g data-layer="isotherms" fill="none" stroke="#ffffff" stroke-opacity="0.85" stroke-width="0.9">${iso.join('')}</g>`);
    // Verdict marks.
    const marks: string[] = [];
    for (const s of results.surfaces) {
      const st = STATE_STYLES[s.state] ?? STATE_STYLES.fine;
      marks.push(`<line x1="${n2(X(s.from[0]))}" y1="${n2(Y(s.from[1]))}" x2="${n2(X(s.to[0]))}" y2="${n2(Y(s.to[1]))}" stroke="${st.stroke}" stroke-width="${st.width}" stroke-linecap="round"${st.dash ? ` stroke-dasharray="${st.dash}"` : ''} data-state="${s.state}" data-segment="${esc(s.id)}"/>`);
      marks.push(glyph(st.glyph, X(s.at[0]), Y(s.at[1]), 4, st.stroke));
    }
    parts.push(`<g data-layer="verdict">${marks.join('')}</g>`);
    if (results.coldest) {
      const [cx, cy] = [X(results.coldest.at[0]), Y(results.coldest.at[1])];
      const label = `coldest ${formatQuantity('temperature', results.coldest.t, units)}${results.coldest.fRsi !== null ? `, fRsi ${results.coldest.fRsi.toFixed(3)}` : ''}`;
      parts.push(`<g data-layer="coldest"><circle cx="${n2(cx)}" cy="${n2(cy)}" r="6" fill="none" stroke="#000" stroke-width="1.5"/><rect x="${n2(cx + 9)}" y="${n2(cy - 9)}" width="${label.length * 6 + 8}" height="16" fill="#ffffff" fill-opacity="0.9"/><text x="${n2(cx + 13)}" y="${n2(cy + 3)}">${esc(label)}</text></g>`);
    }
  }
  // Saved cuts.
  for (const c of snapshot.cuts ?? []) {
    parts.push(`<g data-cut="${esc(c.id)}"><line x1="${n2(X(c.from[0]))}" y1="${n2(Y(c.from[1]))}" x2="${n2(X(c.to[0]))}" y2="${n2(Y(c.to[1]))}" stroke="#1b1b1b" stroke-width="1.2" stroke-dasharray="8 3 2 3"/><text x="${n2(X(c.from[0]) + 3)}" y="${n2(Y(c.from[1]) - 4)}" font-size="10">${esc(c.name || c.id)}</text></g>`);
  }
  parts.push('</g>');
  // Dimensions of the main parts: the thin direction of each construction part inside the box.
  if (options.dimensions ?? true) {
    const dims: string[] = [];
    for (const [, p] of resolved.parts) {
      if (p.record.kind === 'soil' || p.record.kind === 'polygon') continue;
      const b = p.box;
      const w = b.maxX - b.minX, h = b.maxY - b.minY;
      if (b.maxX < box.minX || b.minX > box.maxX || b.maxY < box.minY || b.minY > box.maxY) continue;
      const inX = b.minX >= box.minX - 1e-9 && b.maxX <= box.maxX + 1e-9, inY = b.minY >= box.minY - 1e-9 && b.maxY <= box.maxY + 1e-9;
      if (w <= h && w >= 0.004 && inX) {
        const y = Y(Math.min(b.maxY, box.maxY)) - 6 - (dims.length % 3) * 0;
        const x0 = X(b.minX), x1 = X(b.maxX);
        dims.push(`<g data-dim="${esc(p.id)}"><path d="M${n2(x0)} ${n2(y - 4)}V${n2(y + 4)}M${n2(x1)} ${n2(y - 4)}V${n2(y + 4)}M${n2(x0)} ${n2(y)}H${n2(x1)}" stroke="#333" stroke-width="0.8"/><text x="${n2((x0 + x1) / 2)}" y="${n2(y - 3)}" text-anchor="middle" font-size="9">${esc(formatLength(w, units))}</text></g>`);
      } else if (h < w && h >= 0.004 && inY) {
        const x = X(Math.max(b.minX, box.minX)) + 14;
        const y0 = Y(b.maxY), y1 = Y(b.minY);
        dims.push(`<g data-dim="${esc(p.id)}"><path d="M${n2(x - 4)} ${n2(y0)}H${n2(x + 4)}M${n2(x - 4)} ${n2(y1)}H${n2(x + 4)}M${n2(x)} ${n2(y0)}V${n2(y1)}" stroke="#333" stroke-width="0.8"/><text x="${n2(x + 6)}" y="${n2((y0 + y1) / 2 + 3)}" font-size="9">${esc(formatLength(h, units))}</text></g>`);
      }
    }
    parts.push(`<g data-layer="dimensions">${dims.join('')}</g>`);
  }
  parts.push(`<rect x="${pad}" y="${pad}" width="${n2(dw)}" height="${n2(dh)}" fill="none" stroke="#888" stroke-width="0.6"/>`);
  let y = pad + dh + 14;
  if (overlay && range && results) {
    const lw = 240;
    const stops = Array.from({ length: 11 }, (_, i) => `<stop offset="${i / 10}" stop-color="${temperatureColour(range!.lo + (i / 10) * (range!.hi - range!.lo), range!.lo, range!.hi)}"/>`).join('');
    parts.push(`<defs><linearGradient id="dl-scale">${stops}</linearGradient></defs>`);
    parts.push(`<g data-layer="legend"><text x="${pad}" y="${y}">Temperature, design day (surface-temperature run)</text>`);
    parts.push(`<rect x="${pad}" y="${y + 6}" width="${lw}" height="12" fill="url(#dl-scale)" stroke="#555" stroke-width="0.5"/>`);
    const at = (t: number) => pad + ((t - range!.lo) / (range!.hi - range!.lo)) * lw;
    parts.push(`<text x="${pad}" y="${y + 30}">${esc(formatQuantity('temperature', range.lo, units))}</text><text x="${pad + lw}" y="${y + 30}" text-anchor="end">${esc(formatQuantity('temperature', range.hi, units))}</text>`);
    const c = results.conditions;
    const mark = (t: number | null | undefined, label: string, dy: number) => {
      if (t === null || t === undefined || t < range!.lo || t > range!.hi) return '';
      return `<path d="M${n2(at(t))} ${y + 3}V${y + 21}" stroke="#000" stroke-width="1.5"/><text x="${n2(at(t))}" y="${y + 30 + dy}" text-anchor="middle" font-size="9">${esc(label)} ${esc(formatQuantity('temperature', t, units))}</text>`;
    };
    parts.push(mark(c?.design.dewPoint, 'dew point', 12), mark(c?.month.mouldLimit, 'mould limit', 24));
    let lx = pad + lw + 16;
    for (const st of ['fine', 'mould risk', 'condensation'] as SurfaceState[]) {
      const s = STATE_STYLES[st];
      parts.push(`<line x1="${lx}" y1="${y + 12}" x2="${lx + 26}" y2="${y + 12}" stroke="${s.stroke}" stroke-width="${s.width}"${s.dash ? ` stroke-dasharray="${s.dash}"` : ''}/>${glyph(s.glyph, lx + 13, y + 12, 4, s.stroke)}<text x="${lx + 30}" y="${y + 16}" font-size="9">${st}</text>`);
      lx += 30 + st.length * 6 + 14;
    }
    parts.push('</g>');
    y += legendH;
  }
  parts.push(`<text x="${pad}" y="${y}" font-size="10">${esc(snapshot.name)} · scale 1:${scale}${overlay ? '' : ' · materials only'}</text>`);
  parts.push(`<text x="${pad}" y="${y + 13}" font-size="9" fill="#444">Screening aid: local codes, manufacturers' instructions and licensed professionals govern.</text>`);
  parts.push('</svg>');
  return { svg: parts.join('\n'), width, height, box, range };
}
