/**
 * `dewline render FILE --svg|--png [--out F] [--scale N] [--no-overlay] [--units si|ip] [--mesh preview|default|fine]`:
 * the section drawing from the same pure renderer the sheet uses (lib/render/svg.ts); PNG by rasterising that
 * SVG in Debian's chromium. SVG goes to stdout unless --out is given; PNG needs --out.
 */
import { renderSectionSvg } from '../render/svg';
import { SectionInputError, solveSectionSync } from '../thermal/section';
import { loadSectionFile } from './check';
import type { CliIO } from './io';
import { EXIT } from './io';

export const RENDER_USAGE = 'usage: dewline render FILE --svg|--png [--out FILE] [--scale N] [--no-overlay] [--units si|ip] [--mesh preview|default|fine]';

export interface RenderIO extends CliIO {
  writeFile?(path: string, data: string | Uint8Array): void;
}

function option(args: string[], name: string): string | undefined {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
}

export async function renderCommand(args: string[], io: RenderIO): Promise<number> {
  const valued = new Set(['--out', '--scale', '--units', '--mesh']);
  const file = args.find((a, i) => !a.startsWith('-') && !valued.has(args[i - 1]));
  const svg = args.includes('--svg'), png = args.includes('--png');
  const bad = (msg: string) => { io.err(msg); return EXIT.badInput; };
  if (!file) return bad(RENDER_USAGE);
  if (svg === png) return bad(`choose one of --svg or --png\n${RENDER_USAGE}`);
  const known = new Set(['--svg', '--png', '--no-overlay', ...valued]);
  for (const a of args) if (a.startsWith('-') && !known.has(a)) return bad(`unknown option '${a}'\n${RENDER_USAGE}`);
  for (const v of valued) if (args.includes(v) && (option(args, v) === undefined || option(args, v)!.startsWith('--'))) return bad(`${v} needs a value`);
  const scaleText = option(args, '--scale');
  const scale = scaleText === undefined ? 10 : Number(scaleText);
  if (!(scale > 0) || !Number.isFinite(scale) || scale > 10000) return bad(`--scale: must be a drawing scale N for 1:N between 0 and 10000, got '${scaleText}'`);
  const units = option(args, '--units') ?? 'si';
  if (units !== 'si' && units !== 'ip') return bad(`--units: must be si or ip, got '${units}'`);
  const mesh = option(args, '--mesh') ?? 'default';
  if (!['preview', 'default', 'fine'].includes(mesh)) return bad(`--mesh: must be one of preview, default, fine, got '${mesh}'`);
  const out = option(args, '--out');
  if (png && !out) return bad('--png writes a binary file: give --out FILE');
  if (out && !io.writeFile) { io.err('dewline render: this build cannot write files'); return EXIT.internal; }
  const section = loadSectionFile(file, io);
  if (!section) return EXIT.badInput;
  const overlay = !args.includes('--no-overlay');
  let results = null;
  if (overlay) {
    try {
      results = solveSectionSync(section, { mesh: mesh as 'preview' | 'default' | 'fine' });
    } catch (e) {
      if (e instanceof SectionInputError) return bad(`${file}: ${e.message}`);
      throw e;
    }
  }
  const r = renderSectionSvg(section, results, { scale, overlay, units });
  if (svg) {
    if (out) io.writeFile!(out, r.svg);
    else io.out(r.svg);
  } else {
    const { svgToPng } = await import('../render/node-chromium');
    const bytes = await svgToPng(r.svg, r.width, r.height);
    io.writeFile!(out!, bytes);
  }
  if (out) io.err(`wrote ${out} (${r.width} x ${r.height} px, 1:${scale}${overlay ? '' : ', no overlay'})`);
  return EXIT.ok;
}
