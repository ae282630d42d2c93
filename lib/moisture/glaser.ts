/**
 * The Glaser method of ISO 13788 on a 1-D stack of interfaces, as pure numerics.
 *
 * Interfaces are given warm side first by their cumulative sd (m, sd = mu d summed from the warm face)
 * and their saturation pressure. The vapour pressure line runs straight in sd coordinates from p_i to
 * p_e; where it would exceed p_sat, it is redrawn as the taut line under the p_sat points (the lower
 * convex hull of the end points and the interior p_sat points), and every interior point the line
 * touches is a condensation interface. The rate there is the difference of the vapour flows in and out,
 * g = delta0 (dp_in / dsd_in - dp_out / dsd_out), delta0 = 2.0e-10 kg/(m s Pa) (ISO 13788, recalled
 * from memory). The monthly calculation follows ISO 13788's monthly procedure (recalled from memory):
 * start in the first month with condensation, hold every interface that still holds water at p_sat,
 * add each month's condensation or subtract its evaporation, never below zero.
 */
import { pSat } from '../psychro';

/** Water vapour permeability of still air, ISO 13788 (recalled from memory), kg/(m s Pa). */
export const DELTA0 = 2.0e-10;
/** kg/(m2 s) -> g/(m2 h). */
export const G_PER_M2H = 1000 * 3600;

export interface GlaserLine {
  /** Vapour pressure at each interface, Pa. */
  p: number[];
  /** Net moisture rate at each interface, kg/(m2 s): positive condensation, negative evaporation, 0 elsewhere. */
  rate: number[];
  /** Vapour flow entering at the warm face and leaving at the cold face, kg/(m2 s). */
  flowIn: number;
  flowOut: number;
}

/**
 * The ISO 13788 vapour pressure line. `sd` ascending (cumulative, warm face 0), `ps` the saturation
 * pressures, `pi`/`pe` the pressures of the air at the warm and cold ends; interfaces flagged in `wet`
 * hold liquid water and are fixed at p_sat (monthly calculation).
 */
export function glaserLine(sd: ArrayLike<number>, ps: ArrayLike<number>, pi: number, pe: number, wet?: ArrayLike<boolean>): GlaserLine {
  const n = sd.length;
  if (n < 2) throw new RangeError('a Glaser stack needs at least two interfaces (one layer)');
  for (let k = 1; k < n; k++) if (!(sd[k] >= sd[k - 1])) throw new RangeError(`sd must not decrease along the stack (interface ${k}: ${sd[k]} after ${sd[k - 1]})`);
  // Fixed points: the two ends and every wet interface; between them, the lower hull.
  const fixed: number[] = [0];
  for (let k = 1; k < n - 1; k++) if (wet && wet[k]) fixed.push(k);
  fixed.push(n - 1);
  const value = (k: number) => (k === 0 ? pi : k === n - 1 ? pe : wet && wet[k] ? ps[k] : ps[k]);
  const vertices: number[] = [];
  for (let f = 0; f + 1 < fixed.length; f++) {
    const a = fixed[f], b = fixed[f + 1];
    const hull: number[] = [];
    for (let k = a; k <= b; k++) {
      if (k !== a && k !== b && sd[k] - sd[a] < 1e-12 && ps[k] >= value(a)) continue;
      while (hull.length >= 2) {
        const o = hull[hull.length - 2], m = hull[hull.length - 1];
        // Pop m when it lies on or above the chord from o to k (not a lower-hull vertex).
        const cross = (sd[m] - sd[o]) * (value(k) - value(o)) - (value(m) - value(o)) * (sd[k] - sd[o]);
        if (cross <= 0) hull.pop();
        else break;
      }
      hull.push(k);
    }
    for (const k of hull) if (vertices[vertices.length - 1] !== k) vertices.push(k);
  }
  const p = new Array<number>(n);
  for (let v = 0; v + 1 < vertices.length; v++) {
    const a = vertices[v], b = vertices[v + 1];
    const span = sd[b] - sd[a];
    for (let k = a; k <= b; k++) p[k] = span > 0 ? value(a) + ((value(b) - value(a)) * (sd[k] - sd[a])) / span : Math.min(value(a), value(b));
    p[a] = value(a);
    p[b] = value(b);
  }
  const rate = new Array<number>(n).fill(0);
  const flow = (a: number, b: number) => (sd[b] - sd[a] > 0 ? (DELTA0 * (value(a) - value(b))) / (sd[b] - sd[a]) : 0);
  for (let v = 1; v + 1 < vertices.length; v++) {
    const k = vertices[v];
    rate[k] = flow(vertices[v - 1], k) - flow(k, vertices[v + 1]);
  }
  return { p, rate, flowIn: flow(vertices[0], vertices[1]), flowOut: flow(vertices[vertices.length - 2], vertices[vertices.length - 1]) };
}

export interface MonthConditions {
  /** Short name, e.g. "Jan". */
  month: string;
  days: number;
  /** Warm side: air temperature (C) and relative humidity (fraction). */
  ti: number;
  rhi: number;
  /** Cold side: temperature (C) and relative humidity (fraction). */
  te: number;
  rhe: number;
}

export interface MonthResult {
  month: string;
  ti: number;
  te: number;
  /** Net rate per interface over the month, g/(m2 h). */
  rate: number[];
  /** Water held at each interface at the month's end, kg/m2. */
  held: number[];
  /** Sum over interfaces, kg/m2. */
  total: number;
}

export interface MonthlyResult {
  /** Index of the month the calculation starts in (the first with condensation), or -1 when no month has any. */
  start: number;
  months: MonthResult[];
  /** Largest total held at any month's end, kg/m2, and the month. */
  maxHeld: number;
  maxMonth: string | null;
  /** Whether all the water has evaporated by the end of the twelve months. */
  driesOut: boolean;
}

/**
 * ISO 13788 monthly calculation over a year. Interface temperatures follow the temperature factors
 * f_k = (theta_k - theta_e) / (theta_i - theta_e) of the stack; `months` are in calendar order.
 */
export function monthlyGlaser(sd: ArrayLike<number>, factor: ArrayLike<number>, months: readonly MonthConditions[]): MonthlyResult {
  const n = sd.length;
  const satOf = (m: MonthConditions) => Array.from({ length: n }, (_, k) => pSat(m.te + factor[k] * (m.ti - m.te)));
  const lineOf = (m: MonthConditions, wet?: boolean[]) => glaserLine(sd, satOf(m), m.rhi * pSat(m.ti), m.rhe * pSat(m.te), wet);
  const condenses = months.map((m) => lineOf(m).rate.some((r) => r > 0));
  let start = -1;
  for (let i = 0; i < months.length; i++) {
    if (condenses[i] && !condenses[(i - 1 + months.length) % months.length]) { start = i; break; }
  }
  if (start < 0 && condenses.some(Boolean)) start = 0;
  if (start < 0) {
    const out = months.map((m) => ({ month: m.month, ti: m.ti, te: m.te, rate: new Array<number>(n).fill(0), held: new Array<number>(n).fill(0), total: 0 }));
    return { start: -1, months: out, maxHeld: 0, maxMonth: null, driesOut: true };
  }
  const held = new Array<number>(n).fill(0);
  const results: MonthResult[] = [];
  let maxHeld = 0, maxMonth: string | null = null;
  for (let c = 0; c < months.length; c++) {
    const m = months[(start + c) % months.length];
    const seconds = m.days * 86400;
    const wet = held.map((h) => h > 0);
    const line = lineOf(m, wet);
    for (let k = 0; k < n; k++) held[k] = Math.max(0, held[k] + line.rate[k] * seconds);
    const total = held.reduce((a, b) => a + b, 0);
    if (total > maxHeld) { maxHeld = total; maxMonth = m.month; }
    results.push({ month: m.month, ti: m.ti, te: m.te, rate: line.rate.map((r) => r * G_PER_M2H), held: held.slice(), total });
  }
  return { start, months: results, maxHeld, maxMonth, driesOut: held.every((h) => h === 0) };
}

const DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
const NAMES = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/**
 * Example monthly conditions for an invented cold-climate house (not climate data for any place, not
 * code values): outdoor mean temperature and RH by month, indoor 20 C with a little more humidity in summer.
 */
export const EXAMPLE_MONTHS: readonly MonthConditions[] = (() => {
  const te = [-6, -5, 0, 6, 12, 17, 19, 18, 13, 7, 1, -4];
  const rhe = [0.86, 0.84, 0.79, 0.73, 0.7, 0.72, 0.74, 0.76, 0.8, 0.83, 0.86, 0.87];
  const rhi = [0.5, 0.5, 0.5, 0.5, 0.55, 0.6, 0.6, 0.6, 0.55, 0.5, 0.5, 0.5];
  return NAMES.map((month, i) => ({ month, days: DAYS[i], ti: 20, rhi: rhi[i], te: te[i], rhe: rhe[i] }));
})();
