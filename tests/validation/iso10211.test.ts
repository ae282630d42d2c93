/**
 * ISO 10211 Annex A validation cases (2-D). A conforming method is within 0.1 K of the reference
 * temperatures and, for case 2, within 0.1 W/m of the heat flow (ISO 10211 Annex A).
 * The cases are defined once in lib/validation (also run by `dewline validate`).
 */
import { describe, expect, it } from 'vitest';
import { CASE1_TOP_ROW_RECALLED, case1Exact, case1Rows, case2Rows } from '../../lib/validation/iso10211';

describe('ISO 10211 Annex A, case 1 (half square column, Laplace, Fourier series computed here)', () => {
  const rows = case1Rows();
  const points = rows.filter((r) => r.name.startsWith('T(') && !r.name.includes('tabulated'));
  it('all 28 points within 0.1 K of the Fourier-series solution (ISO 10211 Annex A case 1)', () => {
    expect(points.length).toBe(28);
    for (const r of points) {
      expect(r.tolerance).toBe(0.1);
      expect(Math.abs(r.ours - r.reference), r.name).toBeLessThan(0.1);
    }
  });
  it('top row against the tabulated values 9.7, 13.4, 14.7, 15.1 C (ISO 10211 Annex A table, recalled from memory)', () => {
    const tab = rows.filter((r) => r.name.includes('tabulated'));
    expect(tab.map((r) => r.reference)).toEqual(CASE1_TOP_ROW_RECALLED);
    tab.forEach((r, k) => {
      expect(Math.abs(r.ours - r.reference)).toBeLessThan(0.1);
      // The series itself reproduces the recalled table to its one decimal.
      expect(Math.abs(case1Exact(0.25 * (k + 1), 1.75) - r.reference)).toBeLessThan(0.051);
    });
  });
  it('the Fourier series meets its boundary conditions (20 C on top, 0 C left and bottom)', () => {
    expect(case1Exact(0.5, 2)).toBeCloseTo(20, 0); // the series converges slowly on the jump line; mid-edge to 0.5 K
    expect(case1Exact(0, 1)).toBeCloseTo(0, 12);
    expect(case1Exact(0.5, 0)).toBeCloseTo(0, 12);
  });
  it('balances its energy (ISO 10211 energy balance)', () => {
    const b = rows.find((r) => r.name === 'energy balance')!;
    expect(b.ours).toBeLessThan(1e-4);
  });
});

describe('ISO 10211 Annex A, case 2 (aluminium section through insulation; geometry in DESIGN.md)', () => {
  const rows = case2Rows();
  it('heat flow 9.5 W/m within 0.1 W/m (ISO 10211 Annex A case 2)', () => {
    const r = rows.find((x) => x.name.startsWith('Phi'))!;
    expect(r.reference).toBe(9.5);
    expect(Math.abs(r.ours - 9.5)).toBeLessThan(0.1);
  });
  for (const name of ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H', 'I'])
    it(`point ${name} within 0.1 K (ISO 10211 Annex A case 2)`, () => {
      const r = rows.find((x) => x.name.startsWith(`T at ${name} `))!;
      expect(Math.abs(r.ours - r.reference)).toBeLessThan(0.1);
    });
  it('balances its energy', () => expect(rows.find((r) => r.name === 'energy balance')!.ours).toBeLessThan(1e-4));
});
