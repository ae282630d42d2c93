/** `dewline solve FILE [--json] [--mesh preview|default|fine]`: the same solveSection the browser runs. */
import { formatLength } from '../units';
import { solveSectionSync, SectionInputError } from '../thermal/section';
import type { SectionResults } from '../thermal/types';
import { loadSectionFile } from './check';
import type { CliIO } from './io';
import { EXIT } from './io';

const LEVELS = ['preview', 'default', 'fine'] as const;

export function summariseResults(r: SectionResults): string {
  const f = (n: number | null | undefined, d = 3) => (n === null || n === undefined ? 'n/a' : n.toFixed(d));
  const lines = [`section: ${r.name}`, `mesh: ${r.mesh.level}, ${r.mesh.cells} cells; solver ${r.solver.iterations} iterations, residual ${r.solver.residual.toExponential(2)}`, 'heat flows (design day, W/m):'];
  for (const z of r.zones) lines.push(`  ${z.name || z.id} (${z.kind}, ${z.design.t} C): ${f(z.phi, 2)}`);
  lines.push(`energy balance (ISO 10211): ${r.energyBalance.toExponential(2)}`);
  if (r.l2d !== null) lines.push(`L2D: ${f(r.l2d)} W/(m K)`);
  if (r.psi) lines.push(`psi: ${f(r.psi.psi)} W/(m K) (${r.psi.convention} dimensions)`);
  if (r.psiGround) lines.push(`psi_g: ${f(r.psiGround.psiG)} W/(m K) (B' ${r.psiGround.characteristicDimension} m, U_floor ${f(r.psiGround.uFloor)} W/(m2 K))`);
  if (r.conditions) lines.push(`dew point: ${f(r.conditions.design.dewPoint, 2)} C; mould limit: ${f(r.conditions.month.mouldLimit, 2)} C; fRsi,min: ${f(r.conditions.month.fRsiMin)}`);
  if (r.coldest) lines.push(`coldest surface: ${f(r.coldest.t, 2)} C at (${formatLength(r.coldest.at[0], 'si')}, ${formatLength(r.coldest.at[1], 'si')})${r.coldest.fRsi !== null ? `, fRsi ${f(r.coldest.fRsi)}` : ''}`);
  lines.push(`verdict: ${r.verdict}`, 'surfaces:');
  for (const s of r.surfaces) lines.push(`  ${s.state.padEnd(12)} ${s.kind === 'hidden' ? 'hidden ' : ''}${s.partId} ${f(s.tMin, 2)} C, surface RH ${(s.rhSurfaceMax * 100).toFixed(0)} %`);
  lines.push('assumptions:');
  for (const a of r.assumptions) lines.push(`  ${a.topic}: ${a.text} (${a.source})`);
  for (const w of r.warnings) lines.push(`warning: ${w}`);
  lines.push('Screening aid: steady 2-D conditions; local codes, manufacturers\' instructions and licensed professionals govern.');
  return lines.join('\n');
}

export async function solveCommand(args: string[], io: CliIO): Promise<number> {
  const file = args.find((a, i) => !a.startsWith('-') && args[i - 1] !== '--mesh');
  const mi = args.indexOf('--mesh');
  const mesh = mi >= 0 ? args[mi + 1] : 'default';
  if (!file) {
    io.err('usage: dewline solve FILE [--json] [--mesh preview|default|fine]');
    return EXIT.badInput;
  }
  if (!(LEVELS as readonly string[]).includes(mesh)) {
    io.err(`--mesh: must be one of ${LEVELS.join(', ')}, got '${mesh}'`);
    return EXIT.badInput;
  }
  const s = loadSectionFile(file, io);
  if (!s) return EXIT.badInput;
  let r: SectionResults;
  try {
    r = solveSectionSync(s, { mesh: mesh as (typeof LEVELS)[number], omitField: !args.includes('--json') });
  } catch (e) {
    if (e instanceof SectionInputError) {
      io.err(`${file}: ${e.message}`);
      return EXIT.badInput;
    }
    throw e;
  }
  io.out(args.includes('--json') ? JSON.stringify(r) : summariseResults(r));
  return EXIT.ok;
}
