/**
 * Parameter declarations of part kinds: type, unit, limits, default. The same declaration drives
 * validation (file, CLI, editor field), the JSON Schema, the side panel and the handles.
 */
import type { Point } from './geometry';

/** What a number means, so lib/units can show it in SI or inch-pound. */
export type Quantity = 'length' | 'ratio' | 'count' | 'sd';

export interface NumberParam {
  type: 'number';
  label: string;
  quantity: Quantity;
  default: number;
  /** Hard lower limit; `minExclusive` makes it strict (a thickness must be greater than 0). */
  min: number;
  minExclusive?: boolean;
  max: number;
  /** Plausible range for the trade (common practice); outside it the editor warns but accepts. */
  typical?: readonly [number, number];
  help?: string;
}

export interface ChoiceParam {
  type: 'choice';
  label: string;
  options: readonly { value: string; label: string }[];
  default: string;
  help?: string;
}

export interface FlagParam {
  type: 'flag';
  label: string;
  default: boolean;
  help?: string;
}

/** A second material used by part of the geometry (a plate's capillary break, a deck). */
export interface MaterialParam {
  type: 'material';
  label: string;
  default: string;
  help?: string;
}

/** A closed ring of vertices (first point repeated last), in the part's local frame. */
export interface RingParam {
  type: 'ring';
  label: string;
  default: readonly Point[];
  help?: string;
}

export type ParamSpec = NumberParam | ChoiceParam | FlagParam | MaterialParam | RingParam;
export type ParamSpecs = Readonly<Record<string, ParamSpec>>;

export type ParamValue = number | string | boolean | readonly Point[];

/** Values of a kind's parameters, typed from its declaration. */
export type ParamValues<S extends ParamSpecs> = {
  [K in keyof S]: S[K] extends NumberParam
    ? number
    : S[K] extends FlagParam
      ? boolean
      : S[K] extends RingParam
        ? readonly Point[]
        : string;
};

export function unitSymbol(q: Quantity): string {
  return q === 'length' || q === 'sd' ? ' m' : '';
}

function fmt(n: number): string {
  return Number.isFinite(n) ? String(Number(n.toPrecision(6))) : String(n);
}

/** Why a value breaks its declaration, or null. Messages name the limit and the value with its unit. */
export function paramProblem(spec: ParamSpec, value: unknown): string | null {
  switch (spec.type) {
    case 'number': {
      if (typeof value !== 'number' || Number.isNaN(value)) return `must be a number, got ${describe(value)}`;
      if (!Number.isFinite(value)) return `must be finite, got ${value}`;
      const u = unitSymbol(spec.quantity);
      if (spec.minExclusive ? value <= spec.min : value < spec.min)
        return `must be ${spec.minExclusive ? 'greater than' : 'at least'} ${fmt(spec.min)}${spec.min === 0 && spec.minExclusive ? '' : u}, got ${fmt(value)}${u}`;
      if (value > spec.max) return `must be at most ${fmt(spec.max)}${u}, got ${fmt(value)}${u}`;
      if (spec.quantity === 'count' && !Number.isInteger(value)) return `must be a whole number, got ${fmt(value)}`;
      return null;
    }
    case 'choice':
      if (typeof value !== 'string' || !spec.options.some((o) => o.value === value))
        return `must be one of ${spec.options.map((o) => `'${o.value}'`).join(', ')}, got ${describe(value)}`;
      return null;
    case 'flag':
      return typeof value === 'boolean' ? null : `must be true or false, got ${describe(value)}`;
    case 'material':
      return typeof value === 'string' && value.length > 0 ? null : `must be a material id, got ${describe(value)}`;
    case 'ring':
      if (!Array.isArray(value)) return `must be a list of [x, y] points, got ${describe(value)}`;
      for (let i = 0; i < value.length; i++) {
        const p = value[i];
        if (!Array.isArray(p) || p.length !== 2 || typeof p[0] !== 'number' || typeof p[1] !== 'number' || !Number.isFinite(p[0]) || !Number.isFinite(p[1]))
          return `point ${i} must be [x, y] in metres, got ${describe(p)}`;
      }
      return null;
  }
}

export function describe(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (typeof value === 'string') return `'${value.length > 40 ? value.slice(0, 40) + '…' : value}'`;
  try {
    const s = JSON.stringify(value);
    return s.length > 60 ? s.slice(0, 60) + '…' : s;
  } catch {
    return String(value);
  }
}

export function defaultParams<S extends ParamSpecs>(specs: S): ParamValues<S> {
  const out: Record<string, ParamValue> = {};
  for (const [k, s] of Object.entries(specs)) out[k] = s.type === 'ring' ? s.default.map(([x, y]) => [x, y] as Point) : s.default;
  return out as ParamValues<S>;
}
