/**
 * Surface resistances, m2K/W.
 * Heat-flow run, ISO 6946 (clause 6.8 and Annex, recalled from memory): chosen by the direction of
 * heat flow: horizontal 0.13, upward 0.10, downward 0.17 inside; 0.04 outside (any direction).
 * Surface-temperature run, ISO 13788 (clause 4.3) and ISO 10211: Rsi = analysis.rsiSurface (0.25)
 * on interior faces; 0.35 is a documented option for surfaces low in a room or behind furniture
 * (recalled from memory, to be confirmed). A zone with a numeric rs uses it in both runs; rs = 0
 * prescribes the surface temperature.
 */
import type { ZoneKind } from '../section/schema';

export type Run = 'heat' | 'surface';

/** Side of the solid cell the zone touches: 0 west, 1 east, 2 south (zone below), 3 north (zone above). */
export type FaceSide = 0 | 1 | 2 | 3;

export const RSI_HORIZONTAL = 0.13;
export const RSI_UPWARD = 0.1;
export const RSI_DOWNWARD = 0.17;
export const RSE = 0.04;
/** ISO 13788 and ISO 10211: interior surface resistance for surface temperatures. */
export const RSI_SURFACE = 0.25;
/** Option for surfaces low in a room or behind furniture (recalled from memory; verify). */
export const RSI_SURFACE_SHELTERED = 0.35;

export interface ZoneRule {
  kind: ZoneKind;
  rs: 'auto' | number;
  /** +1 when heat flows from the zone into the construction, -1 the other way, 0 unknown. */
  flowSign: number;
}

/** True when the zone is interior air (its faces count as interior surfaces). */
export function interiorKind(kind: ZoneKind): boolean {
  return kind === 'indoor' || kind === 'unconditioned';
}

/** ISO 6946 interior value for a face by the direction of heat flow. */
export function rsiByDirection(side: FaceSide, flowSign: number): number {
  if (side === 0 || side === 1 || flowSign === 0) return RSI_HORIZONTAL;
  // Zone above the solid (side 3): heat from the zone into the solid flows downward.
  const downward = side === 3 ? flowSign > 0 : flowSign < 0;
  return downward ? RSI_DOWNWARD : RSI_UPWARD;
}

export function surfaceResistance(zone: ZoneRule, side: FaceSide, run: Run, rsiSurface: number): number {
  if (zone.rs !== 'auto') return zone.rs;
  switch (zone.kind) {
    case 'outdoor':
    case 'ground-surface':
      return RSE;
    case 'fixed':
      return 0;
    case 'indoor':
    case 'unconditioned':
      return run === 'surface' ? rsiSurface : rsiByDirection(side, zone.flowSign);
  }
}

/** A human-readable description of the rule used for a zone in a run. */
export function describeRule(zone: ZoneRule, run: Run, rsiSurface: number): string {
  if (zone.rs !== 'auto') return zone.rs === 0 ? 'prescribed surface temperature (Rs = 0)' : `fixed Rs = ${zone.rs} m2K/W (set on the zone)`;
  switch (zone.kind) {
    case 'outdoor':
    case 'ground-surface':
      return `Rse = ${RSE} m2K/W (ISO 6946)`;
    case 'fixed':
      return 'prescribed temperature (Rs = 0)';
    default:
      return run === 'surface'
        ? `Rsi = ${rsiSurface} m2K/W on every face (ISO 13788, ISO 10211 surface-temperature value)`
        : `Rsi by direction of heat flow: ${RSI_HORIZONTAL} horizontal, ${RSI_UPWARD} upward, ${RSI_DOWNWARD} downward m2K/W (ISO 6946); heat flows ${zone.flowSign > 0 ? 'from the zone into the construction' : zone.flowSign < 0 ? 'from the construction into the zone' : 'either way (horizontal value)'}`;
  }
}
