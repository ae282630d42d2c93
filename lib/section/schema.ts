/**
 * The section file and snapshot schema (zod). The file is the snapshot: versioned JSON in SI base
 * units (metres, W/(m K), degrees C; relative humidity in per cent), x to the right, y up.
 * Part parameters sit flat on the part record beside the common fields, so an error reads
 * `parts[3].thickness: must be greater than 0, got -0.02 m`.
 */
import { z } from 'zod';
import { FILL_PATTERNS } from '../materials/material';
import type { ParamSpec } from './params';
import { describe, unitSymbol } from './params';
import { PART_KINDS } from './registry';

export const FORMAT_TAG = 'dewline-section';
export const FORMAT_VERSION = 1;

/** Fields every part record has; kind parameters may not reuse these names. */
export const PART_COMMON_FIELDS = ['id', 'kind', 'name', 'material', 'order', 'locked', 'x', 'y', 'join'] as const;

const num = (what = 'a number') => z.number({ error: (iss) => `must be ${what}, got ${describe(iss.input)}` });
const finite = (what?: string) => num(what).refine(Number.isFinite, { error: (iss) => `must be finite, got ${describe(iss.input)}` });
const text = (max: number) => z.string({ error: (iss) => `must be text, got ${describe(iss.input)}` }).max(max, { error: `must be at most ${max} characters` });

export const idSchema = z
  .string({ error: (iss) => `must be an id (text), got ${describe(iss.input)}` })
  .regex(/^[A-Za-z0-9_-]{1,64}$/, { error: 'must be 1 to 64 letters, digits, - or _' });
export const orderSchema = z
  .string({ error: (iss) => `must be a stacking key (text), got ${describe(iss.input)}` })
  .regex(/^[0-9A-Za-z]{1,64}$/, { error: 'must be a stacking key of 1 to 64 letters and digits' });
export const pointSchema = z.tuple([finite(), finite()], { error: (iss) => `must be a point [x, y] in metres, got ${describe(iss.input)}` });

export const ANCHORS = ['bottom-left', 'bottom-center', 'bottom-right', 'middle-left', 'center', 'middle-right', 'top-left', 'top-center', 'top-right'] as const;
export type AnchorName = (typeof ANCHORS)[number];
const anchorSchema = z.enum(ANCHORS, { error: (iss) => `must be one of ${ANCHORS.join(', ')}, got ${describe(iss.input)}` });

/** A join: this part's `self` anchor sits on the target part's `anchor`, offset by (dx, dy). */
export const joinSchema = z
  .object({ to: idSchema, anchor: anchorSchema, self: anchorSchema, dx: finite().default(0), dy: finite().default(0) })
  .strict();

function paramSchema(spec: ParamSpec) {
  switch (spec.type) {
    case 'number': {
      const u = unitSymbol(spec.quantity);
      const lo = spec.minExclusive
        ? num().gt(spec.min, { error: (iss) => `must be greater than ${spec.min}${spec.min === 0 ? '' : u}, got ${iss.input}${u}` })
        : num().min(spec.min, { error: (iss) => `must be at least ${spec.min}${u}, got ${iss.input}${u}` });
      let s = lo.max(spec.max, { error: (iss) => `must be at most ${spec.max}${u}, got ${iss.input}${u}` });
      if (spec.quantity === 'count') s = s.int({ error: 'must be a whole number' });
      return s.default(spec.default).describe(`${spec.label}${u ? ` (${u.trim()})` : ''}`);
    }
    case 'choice':
      return z
        .enum(spec.options.map((o) => o.value) as [string, ...string[]], { error: (iss) => `must be one of ${spec.options.map((o) => `'${o.value}'`).join(', ')}, got ${describe(iss.input)}` })
        .default(spec.default)
        .describe(spec.label);
    case 'flag':
      return z.boolean({ error: (iss) => `must be true or false, got ${describe(iss.input)}` }).default(spec.default).describe(spec.label);
    case 'material':
      return idSchema.default(spec.default).describe(`${spec.label} (material id)`);
    case 'ring':
      return z
        .array(pointSchema, { error: (iss) => `must be a list of [x, y] points, got ${describe(iss.input)}` })
        .max(2000, { error: 'must have at most 2000 points' })
        .default(spec.default.map(([x, y]) => [x, y] as [number, number]))
        .describe(`${spec.label}: closed ring in metres, last point repeats the first`);
  }
}

const partCommon = {
  id: idSchema,
  name: text(200).default(''),
  material: idSchema,
  order: orderSchema,
  locked: z.boolean({ error: 'must be true or false' }).default(false),
  x: finite().optional(),
  y: finite().optional(),
  join: joinSchema.nullable().default(null),
};

export const partSchemas = PART_KINDS.map((k) => {
  const params: Record<string, z.ZodType> = {};
  for (const [key, spec] of Object.entries(k.params)) params[key] = paramSchema(spec);
  return z
    .object({ kind: z.literal(k.kind), ...partCommon, ...params })
    .strict()
    .describe(`${k.title}: ${k.description}`);
});

export const partSchema = z.discriminatedUnion('kind', partSchemas as unknown as [z.ZodObject, ...z.ZodObject[]], {
  error: (iss) => `unknown part kind ${describe((iss.input as { kind?: unknown })?.kind)}; expected one of ${PART_KINDS.map((k) => k.kind).join(', ')}`,
});

export const materialSchema = z
  .object({
    id: idSchema,
    name: text(200),
    lambda: num().gt(0, { error: (iss) => `must be greater than 0, got ${iss.input} W/(m K)` }).max(1000, { error: (iss) => `must be at most 1000 W/(m K), got ${iss.input}` }).describe('Thermal conductivity, W/(m K)'),
    mu: num().min(1, { error: (iss) => `must be at least 1, got ${iss.input}` }).max(1e7).nullable().default(null).describe('Vapour diffusion resistance factor'),
    sd: num().min(0, { error: (iss) => `must be at least 0 m, got ${iss.input} m` }).max(1e5).nullable().default(null).describe('sd value of the product as supplied, m'),
    sdHumid: num().min(0).max(1e5).nullable().default(null).describe('Humid-season sd of a variable-permeance retarder, m'),
    density: num().gt(0, { error: (iss) => `must be greater than 0, got ${iss.input} kg/m3` }).max(25000).describe('kg/m3'),
    airOpen: z.boolean({ error: 'must be true or false' }).default(false),
    pattern: z.enum(FILL_PATTERNS as [string, ...string[]], { error: (iss) => `must be one of ${FILL_PATTERNS.join(', ')}, got ${describe(iss.input)}` }).default('plain'),
    source: z.object({ lambda: text(400), mu: text(400), density: text(400) }).strict(),
  })
  .strict();

export const ZONE_KINDS = ['indoor', 'outdoor', 'ground-surface', 'unconditioned', 'fixed'] as const;
export type ZoneKind = (typeof ZONE_KINDS)[number];

const conditionSchema = z
  .object({
    t: finite().refine((t) => t >= -80 && t <= 100, { error: (iss) => `must be between -80 and 100 C, got ${describe(iss.input)}` }).describe('Temperature, C'),
    rh: num().gt(0, { error: (iss) => `must be greater than 0 %, got ${iss.input}` }).max(100, { error: (iss) => `must be at most 100 %, got ${iss.input}` }).nullable().default(null).describe('Relative humidity, %'),
  })
  .strict();

export const zoneShapeSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('rect'), x: finite(), y: finite(), width: num().gt(0, { error: (iss) => `must be greater than 0, got ${iss.input} m` }), height: num().gt(0, { error: (iss) => `must be greater than 0, got ${iss.input} m` }) }).strict(),
  z.object({ type: z.literal('ring'), points: z.array(pointSchema).max(2000) }).strict(),
], { error: (iss) => `must be a shape with type 'rect' or 'ring', got ${describe(iss.input)}` });

export const zoneSchema = z
  .object({
    id: idSchema,
    kind: z.enum(ZONE_KINDS, { error: (iss) => `must be one of ${ZONE_KINDS.join(', ')}, got ${describe(iss.input)}` }),
    name: text(200).default(''),
    order: orderSchema,
    shape: zoneShapeSchema,
    /** 'auto': ISO 6946 by the direction of heat flow; a number: a fixed surface resistance in m2K/W (0: prescribed surface temperature). */
    rs: z.union([z.literal('auto'), num().min(0, { error: (iss) => `must be 'auto' or at least 0 m2K/W, got ${iss.input}` }).max(10)], { error: (iss) => `must be 'auto' or a resistance in m2K/W, got ${describe(iss.input)}` }).default('auto'),
    design: conditionSchema.describe('Design day: for the condensation verdict'),
    month: conditionSchema.describe('Coldest month mean: for the mould verdict'),
  })
  .strict();

export const cutSchema = z.object({ id: idSchema, name: text(200).default(''), from: pointSchema, to: pointSchema }).strict();

export const flankingSchema = z
  .object({
    id: idSchema,
    name: text(200).default(''),
    /** The reference cut through the 1-D layer stack of the flanking element. */
    from: pointSchema,
    to: pointSchema,
    /** l_j: the element's length in the section under the chosen dimension convention, m. */
    length: num().min(0, { error: (iss) => `must be at least 0 m, got ${iss.input} m` }).max(1000),
  })
  .strict();

export const groundSchema = z
  .object({
    /** B': characteristic floor dimension, m (ISO 13370). */
    characteristicDimension: num().gt(0, { error: (iss) => `must be greater than 0, got ${iss.input} m` }).max(1000),
    /** h_w: height of the wall above the ground surface counted in psi_g, m. */
    wallHeight: num().min(0).max(100).default(0),
    /** The reference cut through the floor construction (for Rf and w in ISO 13370). */
    floorFrom: pointSchema,
    floorTo: pointSchema,
    /** The reference cut through the above-ground wall, when h_w > 0. */
    wallFrom: pointSchema.nullable().default(null),
    wallTo: pointSchema.nullable().default(null),
    /** Total thickness of the walls, w in ISO 13370, m. */
    wallThickness: num().min(0).max(5),
    /** Ground conductivity for ISO 13370, W/(m K). */
    groundLambda: num().gt(0).max(10).default(2.0),
    /** z: depth of the basement floor below the ground surface, m (ISO 13370 heated basement). Absent: slab on ground. */
    basementDepth: num().gt(0, { error: (iss) => `basementDepth must be greater than 0 m (leave it out for a slab on ground), got ${iss.input}` }).max(20, { error: (iss) => `basementDepth must be at most 20 m, got ${iss.input}` }).optional(),
    /** The reference cut through the below-grade basement wall (soil layers are left out), for Rw in ISO 13370. */
    basementWallFrom: pointSchema.optional(),
    basementWallTo: pointSchema.optional(),
  })
  .strict()
  .superRefine((g, ctx) => {
    if (g.basementDepth === undefined) {
      if (g.basementWallFrom || g.basementWallTo) ctx.addIssue({ code: 'custom', path: ['basementDepth'], message: 'basementDepth is needed when basementWallFrom/basementWallTo are given (ISO 13370 heated basement)' });
      return;
    }
    for (const k of ['basementWallFrom', 'basementWallTo'] as const) if (!g[k]) ctx.addIssue({ code: 'custom', path: [k], message: `${k} is needed with basementDepth (the reference cut through the below-grade wall)` });
  });

export const analysisSchema = z
  .object({
    /** Interior surface resistance of the surface-temperature run, m2K/W (ISO 13788 and ISO 10211: 0.25). */
    rsiSurface: num().min(0).max(2).default(0.25),
    convention: z.enum(['internal', 'overall-internal', 'external'], { error: (iss) => `must be internal, overall-internal or external, got ${describe(iss.input)}` }).default('internal'),
    flanking: z.array(flankingSchema).max(20).default([]),
    ground: groundSchema.nullable().default(null),
  })
  .strict();

export const sectionSchema = z
  .object({
    format: z.literal(FORMAT_TAG, { error: (iss) => `must be '${FORMAT_TAG}', got ${describe(iss.input)} (not a Dewline section file)` }),
    version: z.literal(FORMAT_VERSION),
    name: text(200).default('Untitled section'),
    description: text(4000).default(''),
    materials: z.array(materialSchema).max(500).default([]),
    parts: z.array(partSchema).max(5000),
    zones: z.array(zoneSchema).max(200),
    cuts: z.array(cutSchema).max(100).default([]),
    analysis: analysisSchema.default({ rsiSurface: 0.25, convention: 'internal', flanking: [], ground: null }),
  })
  .strict();

export type Join = z.output<typeof joinSchema>;
export type PartRecord = { id: string; kind: string; name: string; material: string; order: string; locked: boolean; x?: number; y?: number; join: Join | null; [param: string]: unknown };
export type ZoneRecord = z.output<typeof zoneSchema>;
export type ZoneShape = z.output<typeof zoneShapeSchema>;
export type ZoneCondition = ZoneRecord['design'];
export type CutRecord = z.output<typeof cutSchema>;
export type FlankingRecord = z.output<typeof flankingSchema>;
export type GroundSettings = z.output<typeof groundSchema>;
export type AnalysisSettings = z.output<typeof analysisSchema>;
export type MaterialRecord = z.output<typeof materialSchema>;
export interface SectionSnapshot {
  format: typeof FORMAT_TAG;
  version: typeof FORMAT_VERSION;
  name: string;
  description: string;
  materials: MaterialRecord[];
  /** Bottom of the stack first (ascending order key). */
  parts: PartRecord[];
  zones: ZoneRecord[];
  cuts: CutRecord[];
  analysis: AnalysisSettings;
}
