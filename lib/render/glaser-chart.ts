/**
 * The Glaser chart of one cut as an SVG string (pure): saturation pressure and the ISO 13788 vapour
 * pressure line against the equivalent air-layer thickness sd from the warm face (the line is straight
 * there), layers as labelled bands, condensation interfaces marked with a cross and their rate.
 */
import type { GlaserCheck } from '../moisture/cut';

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const n2 = (v: number) => (Math.round(v * 100) / 100).toString();

export interface GlaserChartOptions {
  width?: number;
  height?: number;
  /** 'sd' (default): x is the cumulative sd; 'thickness': x is the distance through the stack. */
  axis?: 'sd' | 'thickness';
}

export function glaserChartSvg(g: GlaserCheck, options: GlaserChartOptions = {}): string {
  const W = options.width ?? 640, H = options.height ?? 300;
  const axis = options.axis ?? 'sd';
  const ml = 56, mr = 14, mt = 30, mb = 58;
  const pw = W - ml - mr, ph = H - mt - mb;
  const xv = (i: number) => (axis === 'sd' ? g.points[i].sd : g.points[i].s);
  const xMax = Math.max(1e-9, xv(g.points.length - 1));
  const pMax = Math.max(...g.points.map((p) => Math.max(p.pSat, p.p)), g.warm.p) * 1.08;
  const X = (v: number) => ml + (v / xMax) * pw;
  const Y = (p: number) => mt + ph - (p / pMax) * ph;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="Helvetica, Arial, sans-serif" font-size="10" data-chart="glaser" data-cut="${esc(g.cutId)}">`);
  out.push(`<title>${esc(`Glaser chart: ${g.name}`)}</title>`);
  out.push(`<rect width="${W}" height="${H}" fill="#fff"/>`);
  // Layer bands.
  const bounds = g.points.map((p, i) => ({ p, i })).filter((q) => q.p.boundary >= 0);
  for (let b = 0; b + 1 < bounds.length; b++) {
    const x0 = X(xv(bounds[b].i)), x1 = X(xv(bounds[b + 1].i));
    const layer = g.layers[b];
    out.push(`<rect x="${n2(x0)}" y="${mt}" width="${n2(Math.max(0.5, x1 - x0))}" height="${ph}" fill="${b % 2 ? '#f2f4f6' : '#e8ecef'}" stroke="#c5cbd1" stroke-width="0.5"/>`);
    if (x1 - x0 > 28) out.push(`<text x="${n2((x0 + x1) / 2)}" y="${mt + ph + 30}" text-anchor="middle" font-size="9">${esc(layer.name.length > Math.floor((x1 - x0) / 5) ? layer.name.slice(0, Math.max(3, Math.floor((x1 - x0) / 5) - 1)) + '…' : layer.name)}</text>`);
  }
  // Axes and grid.
  const step = pMax > 3000 ? 1000 : pMax > 1200 ? 500 : pMax > 500 ? 200 : 100;
  for (let p = 0; p <= pMax; p += step) out.push(`<path d="M${ml} ${n2(Y(p))}H${ml + pw}" stroke="#d8dde2" stroke-width="0.5"/><text x="${ml - 4}" y="${n2(Y(p) + 3)}" text-anchor="end">${p}</text>`);
  out.push(`<path d="M${ml} ${mt}V${mt + ph}H${ml + pw}" stroke="#333" fill="none"/>`);
  out.push(`<text x="12" y="${mt + ph / 2}" transform="rotate(-90 12 ${mt + ph / 2})" text-anchor="middle">vapour pressure, Pa</text>`);
  out.push(`<text x="${ml + pw / 2}" y="${H - 8}" text-anchor="middle">${axis === 'sd' ? `equivalent air-layer thickness sd from the warm side, m (total ${g.sdTotal.toFixed(2)} m)` : 'distance from the warm face, mm'}</text>`);
  out.push(`<text x="${ml}" y="${mt + ph + 14}" text-anchor="start">0</text><text x="${ml + pw}" y="${mt + ph + 14}" text-anchor="end">${axis === 'sd' ? xMax.toFixed(2) : (xMax * 1000).toFixed(0)}</text>`);
  const line = (vals: number[]) => vals.map((v, i) => `${i ? 'L' : 'M'}${n2(X(xv(i)))} ${n2(Y(v))}`).join('');
  out.push(`<path d="${line(g.points.map((p) => p.pSat))}" fill="none" stroke="#b2182b" stroke-width="2" data-line="psat"/>`);
  out.push(`<path d="${line(g.points.map((p) => p.p))}" fill="none" stroke="#2166ac" stroke-width="2" stroke-dasharray="6 3" data-line="p"/>`);
  for (const c of g.condensation) {
    const x = X(xv(c.index)), y = Y(g.points[c.index].p);
    out.push(`<path d="M${n2(x - 5)} ${n2(y - 5)}L${n2(x + 5)} ${n2(y + 5)}M${n2(x + 5)} ${n2(y - 5)}L${n2(x - 5)} ${n2(y + 5)}" stroke="#000" stroke-width="2" data-condensation="${c.index}"/>`);
    out.push(`<text x="${n2(x + 7)}" y="${n2(y - 7)}" font-size="9">${c.rate.toFixed(3)} g/(m²·h)</text>`);
  }
  // Legend.
  out.push(`<g transform="translate(${ml} 12)"><path d="M0 0H22" stroke="#b2182b" stroke-width="2"/><text x="26" y="3">saturation pressure p_sat (ISO 13788)</text><path d="M220 0H242" stroke="#2166ac" stroke-width="2" stroke-dasharray="6 3"/><text x="246" y="3">vapour pressure p${g.condensation.length ? ' (tangent construction)' : ''}</text>${g.condensation.length ? `<path d="M440 -4L448 4M448 -4L440 4" stroke="#000" stroke-width="2"/><text x="452" y="3">condensation</text>` : ''}</g>`);
  out.push('</svg>');
  return out.join('\n');
}
