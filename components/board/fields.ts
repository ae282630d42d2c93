/**
 * Typed values in the side panel: text in the display unit system to an SI value, checked against the
 * parameter's own declaration so a bad entry is refused at the field with the model's message.
 */
import type { ParamSpec } from '@/lib/section/params';
import { paramProblem } from '@/lib/section/params';
import type { QuantityKind, UnitSystem } from '@/lib/units';
import { formatLength, parseLength, parseQuantity, toDisplay, unitOf } from '@/lib/units';

export type FieldResult = { ok: true; value: number } | { ok: false; message: string };

/** Parse a number field of a kind parameter (length, ratio, count or sd). */
export function parseParamField(spec: ParamSpec, text: string, system: UnitSystem): FieldResult {
  if (spec.type !== 'number') return { ok: false, message: 'not a number field' };
  let value: number;
  try {
    if (spec.quantity === 'length') value = parseLength(text, system);
    else {
      const t = text.trim().replace(/\s*m$/, '');
      if (!/^[+-]?(\d+(\.\d*)?|\.\d+)(e[+-]?\d+)?$/i.test(t)) return { ok: false, message: `cannot read '${text}' as a number` };
      value = Number(t);
    }
  } catch (e) {
    return { ok: false, message: (e as Error).message };
  }
  const why = paramProblem(spec, value);
  if (why) return { ok: false, message: spec.quantity === 'length' ? lengthProblem(spec, value, system) : why };
  return { ok: true, value };
}

/** The model's limits, said in the unit system on screen. */
function lengthProblem(spec: ParamSpec & { type: 'number' }, value: number, system: UnitSystem): string {
  const got = formatLength(value, system);
  if (spec.minExclusive ? value <= spec.min : value < spec.min)
    return spec.min === 0 && spec.minExclusive ? `must be greater than 0, got ${got}` : `must be at least ${formatLength(spec.min, system)}, got ${got}`;
  if (value > spec.max) return `must be at most ${formatLength(spec.max, system)}, got ${got}`;
  return paramProblem(spec, value) ?? '';
}

/** The value shown in a field. */
export function showParam(spec: ParamSpec, value: unknown, system: UnitSystem): string {
  if (spec.type !== 'number' || typeof value !== 'number') return String(value ?? '');
  if (spec.quantity === 'length') return formatLength(value, system);
  return String(Number(value.toPrecision(6)));
}

/** A warning when a value is valid but outside the trade's typical range. */
export function typicalWarning(spec: ParamSpec, value: number, system: UnitSystem): string | null {
  if (spec.type !== 'number' || !spec.typical) return null;
  const [lo, hi] = spec.typical;
  if (value >= lo && value <= hi) return null;
  const f = (v: number) => (spec.quantity === 'length' ? formatLength(v, system) : String(v));
  return `unusual: typical ${f(lo)} to ${f(hi)}`;
}

/** A plain coordinate (x, y of a part or zone): any finite length. */
export function parseCoordinate(text: string, system: UnitSystem): FieldResult {
  try {
    const v = parseLength(text, system);
    return Number.isFinite(v) ? { ok: true, value: v } : { ok: false, message: 'must be finite' };
  } catch (e) {
    return { ok: false, message: (e as Error).message };
  }
}

/** A quantity field with a lower bound (material conductivity, density; zone temperatures). */
export function parseQuantityField(kind: QuantityKind, text: string, system: UnitSystem, limits: { gt?: number; min?: number; max?: number } = {}): FieldResult {
  let v: number;
  try {
    v = parseQuantity(kind, text, system);
  } catch (e) {
    return { ok: false, message: (e as Error).message };
  }
  if (!Number.isFinite(v)) return { ok: false, message: `cannot read '${text}' as a number` };
  const u = unitOf(kind, system).symbol;
  const show = (x: number) => `${Number(toDisplay(kind, x, system).toPrecision(4))}${u ? ' ' + u : ''}`;
  if (limits.gt !== undefined && !(v > limits.gt)) return { ok: false, message: `must be greater than ${show(limits.gt)}, got ${show(v)}` };
  if (limits.min !== undefined && v < limits.min) return { ok: false, message: `must be at least ${show(limits.min)}, got ${show(v)}` };
  if (limits.max !== undefined && v > limits.max) return { ok: false, message: `must be at most ${show(limits.max)}, got ${show(v)}` };
  return { ok: true, value: v };
}
