/** Build validated section snapshots from plain polygons (free-polygon parts) for the validation cases (tests and `dewline validate`). */
import type { Point } from '../section/geometry';
import type { SectionSnapshot, ZoneKind } from '../section/schema';
import { validateSection } from '../section/validate';

export interface TestMaterial {
  id: string;
  lambda: number;
  airOpen?: boolean;
  pattern?: string;
}
export interface TestSolid {
  material: string;
  points: readonly Point[];
}
export interface TestZone {
  id?: string;
  kind: ZoneKind;
  points?: readonly Point[];
  rect?: [number, number, number, number];
  t: number;
  rh?: number | null;
  tMonth?: number;
  rhMonth?: number | null;
  rs?: 'auto' | number;
}

const key = (i: number) => `k${String(i).padStart(5, '0')}`;

export function rect(x0: number, y0: number, x1: number, y1: number): Point[] {
  return [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];
}

export function buildSection(materials: TestMaterial[], solids: TestSolid[], zones: TestZone[], analysis: Record<string, unknown> = {}): SectionSnapshot {
  const raw = {
    format: 'dewline-section',
    version: 1,
    name: 'test section',
    materials: materials.map((m) => ({
      id: `t-${m.id}`,
      name: m.id,
      lambda: m.lambda,
      density: 1000,
      airOpen: m.airOpen ?? false,
      pattern: m.pattern ?? 'plain',
      source: { lambda: 'test value', mu: 'test value', density: 'test value' },
    })),
    parts: solids.map((s, i) => ({ id: `p${i}`, kind: 'polygon', material: `t-${s.material}`, order: key(i), x: 0, y: 0, points: [...s.points.map(([x, y]) => [x, y]), [s.points[0][0], s.points[0][1]]] })),
    zones: zones.map((z, i) => ({
      id: z.id ?? `z${i}`,
      kind: z.kind,
      order: key(i),
      shape: z.rect ? { type: 'rect', x: z.rect[0], y: z.rect[1], width: z.rect[2] - z.rect[0], height: z.rect[3] - z.rect[1] } : { type: 'ring', points: [...z.points!.map(([x, y]) => [x, y]), [z.points![0][0], z.points![0][1]]] },
      rs: z.rs ?? 'auto',
      design: { t: z.t, rh: z.rh ?? (z.kind === 'indoor' ? 50 : null) },
      month: { t: z.tMonth ?? z.t, rh: z.rhMonth ?? z.rh ?? (z.kind === 'indoor' ? 50 : null) },
    })),
    analysis,
  };
  const v = validateSection(raw);
  if (!v.ok) throw new Error('test section invalid: ' + v.problems.map((p) => `${p.path}: ${p.message}`).join('; '));
  return v.section;
}
