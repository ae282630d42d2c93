/** Compare: the differences between a pinned baseline and the current results. */
import type { SectionResults } from '@/lib/thermal/types';

export interface Headline {
  /** psi_g where the junction meets the ground, else psi, W/(m K). */
  psi: number | null;
  psiKind: 'psi' | 'psi_g' | null;
  /** Coldest verdict surface temperature, C. */
  coldest: number | null;
  /** Heat flow from the indoor zone, W/m. */
  phi: number | null;
  l2d: number | null;
}

export function headline(r: SectionResults): Headline {
  const indoor = r.zones.find((z) => z.id === r.indoorZoneId);
  const psi = r.psiGround ? r.psiGround.psiG : r.psi ? r.psi.psi : null;
  return { psi, psiKind: r.psiGround ? 'psi_g' : r.psi ? 'psi' : null, coldest: r.coldest ? r.coldest.t : null, phi: indoor ? indoor.phi : null, l2d: r.l2d };
}

export interface Difference { psi: number | null; coldest: number | null; phi: number | null; l2d: number | null }

const sub = (a: number | null, b: number | null) => (a === null || b === null ? null : a - b);

/** now - baseline, per headline figure (null where either lacks it). */
export function diffResults(baseline: SectionResults, now: SectionResults): Difference {
  const a = headline(baseline), b = headline(now);
  return { psi: sub(b.psi, a.psi), coldest: sub(b.coldest, a.coldest), phi: sub(b.phi, a.phi), l2d: sub(b.l2d, a.l2d) };
}

/** "+0.012" / "-0.40" / "0" with a sign, for the compare column. */
export function signed(v: number, digits: number): string {
  const s = v.toFixed(digits);
  if (/^-?0\.?0*$/.test(s)) return (0).toFixed(digits);
  return v > 0 ? `+${s}` : s;
}
