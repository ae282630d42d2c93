/** Small helpers to write templates as plain snapshots with readable ids. */
import { keysBetween } from '../order';
import { defaultParams } from '../params';
import { partKind } from '../registry';
import type { AnalysisSettings, Join, PartRecord, SectionSnapshot, ZoneCondition, ZoneRecord } from '../schema';
import { FORMAT_TAG, FORMAT_VERSION } from '../schema';

export interface PartSpec {
  id: string;
  kind: string;
  name?: string;
  material?: string;
  at?: [number, number];
  join?: Partial<Join> & Pick<Join, 'to' | 'anchor' | 'self'>;
  [param: string]: unknown;
}

export function part(spec: PartSpec): Omit<PartRecord, 'order'> {
  const { id, kind, name, material, at, join, ...params } = spec;
  const k = partKind(kind);
  if (!k) throw new Error(`template uses unknown kind ${kind}`);
  return {
    id,
    kind,
    name: name ?? '',
    material: material ?? k.defaultMaterial,
    locked: false,
    join: join ? { dx: 0, dy: 0, ...join } : null,
    ...(join ? {} : { x: at?.[0] ?? 0, y: at?.[1] ?? 0 }),
    ...(defaultParams(k.params) as Record<string, unknown>),
    ...params,
  };
}

const cond = (t: number, rh: number | null = null): ZoneCondition => ({ t, rh });

export function rectZone(id: string, kind: ZoneRecord['kind'], name: string, x0: number, y0: number, x1: number, y1: number, design: [number, number | null], month: [number, number | null]): Omit<ZoneRecord, 'order'> {
  return { id, kind, name, shape: { type: 'rect', x: x0, y: y0, width: x1 - x0, height: y1 - y0 }, rs: 'auto', design: cond(...design), month: cond(...month) };
}

/** Assemble a snapshot; parts and zones are stacked in the order given (first = bottom). */
export function section(o: {
  name: string;
  description: string;
  parts: Omit<PartRecord, 'order'>[];
  zones: Omit<ZoneRecord, 'order'>[];
  analysis: Partial<AnalysisSettings>;
  cuts?: SectionSnapshot['cuts'];
}): SectionSnapshot {
  const pk = keysBetween(null, null, o.parts.length);
  const zk = keysBetween(null, null, o.zones.length);
  return {
    format: FORMAT_TAG,
    version: FORMAT_VERSION,
    name: o.name,
    description: o.description,
    materials: [],
    parts: o.parts.map((p, i) => ({ ...p, order: pk[i] }) as PartRecord),
    zones: o.zones.map((z, i) => ({ ...z, order: zk[i] }) as ZoneRecord),
    cuts: o.cuts ?? [],
    analysis: { rsiSurface: 0.25, convention: 'internal', flanking: [], ground: null, ...o.analysis },
  };
}

/**
 * Example conditions for a cold-climate house (invented, not code values): indoor 20 C and 50 %,
 * design-day air -18 C, coldest-month mean air -6 C; the ground surface at annual-mean-like values.
 */
export const EXAMPLE_CLIMATE = {
  indoor: { design: [20, 50] as [number, number], month: [20, 50] as [number, number] },
  outdoor: { design: [-18, null] as [number, null], month: [-6, null] as [number, null] },
  ground: { design: [4, null] as [number, null], month: [2, null] as [number, null] },
};

/** Ground extents per ISO 10211 for a floor width b of 8 m: 4 m inside, 20 m beside and below. */
export const GROUND = { inside: 4, beside: 20, below: 20 };

/**
 * The two exterior zones every template has: outdoor air above grade up to the model's top cut (out to
 * `airEdge`, the building's outer face above grade), and a thin ground-surface zone on the soil outside.
 */
export function exteriorZones(top: number, airEdge = 0): Omit<ZoneRecord, 'order'>[] {
  return [
    rectZone('outdoor', 'outdoor', 'Outdoor air', -GROUND.beside, 0, airEdge, top, EXAMPLE_CLIMATE.outdoor.design, EXAMPLE_CLIMATE.outdoor.month),
    rectZone('grade', 'ground-surface', 'Ground surface', -GROUND.beside, 0, 0, 0.02, EXAMPLE_CLIMATE.ground.design, EXAMPLE_CLIMATE.ground.month),
  ];
}
