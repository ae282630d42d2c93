/**
 * ISO 10211 Annex A validation cases (2-D). A conforming method is within 0.1 K of the reference
 * temperatures and, for case 2, within 0.1 W/m of the heat flow (ISO 10211 Annex A).
 */
import { describe, expect, it } from 'vitest';
import { solveSectionSync } from '../../lib/thermal/section';
import { CASE1_MESH, CASE2_MESH, case1Exact, case1Points, case1Section, case2Points, case2Section } from './cases';

describe('ISO 10211 Annex A, case 1 (half square column, Laplace, Fourier series computed here)', () => {
  const pts = case1Points();
  const r = solveSectionSync(case1Section(), { mesh: CASE1_MESH, probes: pts.map((p) => p.at) });
  it('all 28 points within 0.1 K of the Fourier-series solution (ISO 10211 Annex A case 1)', () => {
    expect(pts.length).toBe(28);
    pts.forEach((p, i) => {
      const ours = r.probes[i].heat!;
      expect(Math.abs(ours - case1Exact(p.at[0], p.at[1])), `point ${p.at}`).toBeLessThan(0.1);
    });
  });
  it('top row against the tabulated values 9.7, 13.4, 14.7, 15.1 C (ISO 10211 Annex A table, recalled from memory)', () => {
    const recalled = [9.7, 13.4, 14.7, 15.1];
    recalled.forEach((v, k) => {
      const i = pts.findIndex((p) => p.at[1] === 1.75 && p.at[0] === 0.25 * (k + 1));
      expect(Math.abs(r.probes[i].heat! - v)).toBeLessThan(0.1);
      // The series itself reproduces the recalled table to its one decimal.
      expect(Math.abs(case1Exact(0.25 * (k + 1), 1.75) - v)).toBeLessThan(0.051);
    });
  });
  it('balances its energy (ISO 10211 energy balance)', () => {
    expect(r.energyBalance).toBeLessThan(1e-4);
  });
});

describe('ISO 10211 Annex A, case 2 (aluminium section through insulation; geometry in DESIGN.md)', () => {
  const pts = case2Points();
  const r = solveSectionSync(case2Section(), { mesh: CASE2_MESH, probes: pts.map((p) => p.at) });
  it('heat flow 9.5 W/m within 0.1 W/m (ISO 10211 Annex A case 2)', () => {
    const phi = r.zones.find((z) => z.id === 'inside')!.phi;
    expect(Math.abs(phi - 9.5)).toBeLessThan(0.1);
  });
  for (const [k, p] of pts.entries())
    it(`point ${p.name} ${p.ref} C within 0.1 K (ISO 10211 Annex A case 2)`, () => {
      expect(Math.abs(r.probes[k].heat! - p.ref)).toBeLessThan(0.1);
    });
  it('balances its energy', () => expect(r.energyBalance).toBeLessThan(1e-4));
});
