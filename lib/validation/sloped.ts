/**
 * Staircase error of sloped edges. A plane wall (thickness d, conductivity lambda, length L) tilted by
 * an angle alpha is one-dimensional in its own frame, so Phi = L (theta_i - theta_e) / (Rsi + d/lambda + Rse)
 * exactly (ISO 6946 series resistances). On the rectilinear mesh its faces become staircases whose
 * total face length is L (|cos alpha| + |sin alpha|): the conduction error falls with the cell size
 * (first order). A full surface resistance on each staircase face would act like
 * Rs / (|cos alpha| + |sin alpha|), which does not fall with the cell size; assembly scales each such
 * face's Rs by |cos alpha| + |sin alpha| (BoundaryFaces.rsScale), which removes it.
 */
import type { Point } from '../section/geometry';
import type { SectionSnapshot } from '../section/schema';
import type { MeshLevel, MeshSpec } from '../thermal/mesh';
import { solveSectionSync } from '../thermal/section';
import { buildSection } from './build';

export interface TiltedWall {
  degrees: number;
  rsi: number;
  rse: number;
  L: number;
  d: number;
  lambda: number;
}

export function tiltedWallSection(w: TiltedWall): SectionSnapshot {
  const a = (w.degrees * Math.PI) / 180, c = Math.cos(a), s = Math.sin(a);
  const n: Point = [-s, c];
  const off = (p: Point, k: number): Point => [p[0] + k * n[0], p[1] + k * n[1]];
  const p0: Point = [0, 0], p1: Point = [w.L * c, w.L * s];
  const p2 = off(p1, w.d), p3 = off(p0, w.d);
  return buildSection([{ id: 'wall', lambda: w.lambda }], [{ material: 'wall', points: [p0, p1, p2, p3] }], [
    { id: 'in', kind: 'indoor', points: [p3, p2, off(p2, 0.5), off(p3, 0.5)], t: 20, rs: w.rsi },
    { id: 'out', kind: 'outdoor', points: [p0, off(p0, -0.5), off(p1, -0.5), p1], t: -10, rs: w.rse },
  ]);
}

/** Exact heat flow of the tilted wall, W/m. */
export function tiltedExactPhi(w: TiltedWall): number {
  return (w.L * 30) / (w.rsi + w.d / w.lambda + w.rse);
}

/** Phi with Rs / (|cos| + |sin|): a full Rs on every staircase face (without assembly's scaling). */
export function tiltedStaircasePhi(w: TiltedWall): number {
  const a = (w.degrees * Math.PI) / 180;
  const k = Math.abs(Math.cos(a)) + Math.abs(Math.sin(a));
  return (w.L * 30) / ((w.rsi + w.rse) / k + w.d / w.lambda);
}

/** Our heat flow divided by the exact one. */
export function tiltedRatio(w: TiltedWall, mesh: MeshLevel | MeshSpec): number {
  const r = solveSectionSync(tiltedWallSection(w), { mesh, omitField: true });
  return r.zones.find((z) => z.id === 'in')!.phi / tiltedExactPhi(w);
}
