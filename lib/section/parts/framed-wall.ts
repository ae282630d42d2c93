/**
 * Framed wall: studs with a filled cavity, reduced to one equivalent conductivity by the parallel-path
 * method (area-weighted conductances of stud and cavity; ISO 6946's upper limit for one layer), plus an
 * interior lining. Origin bottom-left; the lining is on the right (room) face unless mirrored.
 */
import type { Material } from '../../materials/material';
import { rectPolygon } from '../geometry';
import type { KindContext } from '../kind';
import { boxHandles, defineKind, len } from '../kind';

/** Framing fraction from stud width and spacing (one stud per spacing). */
export function framingFraction(studWidth: number, spacing: number): number {
  return Math.min(1, studWidth / spacing);
}

/** Parallel-path equivalent conductivity: lambda_eq = f lambda_stud + (1 - f) lambda_fill. */
export function parallelPathLambda(fraction: number, lambdaStud: number, lambdaFill: number): number {
  return fraction * lambdaStud + (1 - fraction) * lambdaFill;
}

export function equivalentCavityMaterial(partFill: Material, stud: Material, fraction: number): Material {
  const lambda = parallelPathLambda(fraction, stud.lambda, partFill.lambda);
  return {
    id: `equivalent:${stud.id}+${partFill.id}@${fraction.toFixed(4)}`,
    name: `${partFill.name} between studs (${(fraction * 100).toFixed(1)} % framing, parallel path)`,
    lambda,
    mu: partFill.mu,
    sd: null,
    sdHumid: null,
    density: fraction * stud.density + (1 - fraction) * partFill.density,
    airOpen: partFill.airOpen,
    pattern: partFill.pattern,
    source: {
      lambda: `parallel-path method over ${stud.name} and ${partFill.name}`,
      mu: `cavity fill: ${partFill.source.mu}`,
      density: 'area-weighted',
    },
  };
}

export const framedWall = defineKind({
  kind: 'framed-wall',
  title: 'Framed wall',
  description: 'Stud wall with a filled cavity and an interior lining',
  params: {
    studDepth: len('Stud depth', 0.089, 0.4, [0.089, 0.14], 'Common practice: 89 mm (2x4) or 140 mm (2x6)'),
    height: len('Height', 2.4, 6, [0.6, 3]),
    framing: { type: 'choice', label: 'Framing given as', options: [{ value: 'spacing', label: 'Stud spacing' }, { value: 'fraction', label: 'Framing fraction' }], default: 'spacing' },
    studWidth: len('Stud width', 0.038, 0.2, [0.038, 0.089]),
    studSpacing: len('Stud spacing', 0.406, 2, [0.3, 0.61]),
    framingFraction: { type: 'number', label: 'Framing fraction', quantity: 'ratio', default: 0.15, min: 0, max: 1 },
    studMaterial: { type: 'material', label: 'Studs', default: 'softwood' },
    liningThickness: { type: 'number', label: 'Lining thickness', quantity: 'length', default: 0.0125, min: 0, max: 0.1, help: '0 for none' },
    liningMaterial: { type: 'material', label: 'Lining', default: 'gypsum-board' },
    liningSide: { type: 'choice', label: 'Lining side', options: [{ value: 'right', label: 'Right' }, { value: 'left', label: 'Left' }], default: 'right' },
  },
  defaultMaterial: 'mineral-wool-batt',
  pieces(p, material, ctx: KindContext) {
    const fill = ctx.material(material), stud = ctx.material(p.studMaterial);
    const f = p.framing === 'fraction' ? p.framingFraction : framingFraction(p.studWidth, p.studSpacing);
    const cavity: string | Material = fill && stud ? equivalentCavityMaterial(fill, stud, f) : material;
    const d = p.studDepth, t = p.liningThickness, h = p.height;
    const cavityX = p.liningSide === 'left' ? t : 0;
    const pieces = [{ polygon: rectPolygon(cavityX, 0, d, h), material: cavity, role: 'stud cavity (equivalent)' }];
    if (t > 0) pieces.push({ polygon: rectPolygon(p.liningSide === 'left' ? 0 : d, 0, t, h), material: p.liningMaterial, role: 'lining' });
    return pieces;
  },
  handles: (p) => boxHandles('studDepth', 'height', p.studDepth + p.liningThickness, p.height),
  label: (p, l) => `Framed wall ${l(p.studDepth)} studs`,
});
