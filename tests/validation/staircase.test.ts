/**
 * The documented staircase error of sloped edges (docs/solver.md): a tilted plane wall against its
 * exact 1-D heat flow (ISO 6946 series resistances). Conduction alone (prescribed surface
 * temperatures) converges with the mesh; with surface resistances the error is bounded by the
 * staircase's extra face length, Rs acting as Rs / (|cos a| + |sin a|) (at most a factor sqrt 2).
 */
import { describe, expect, it } from 'vitest';
import { MESH_LEVELS } from '../../lib/thermal/mesh';
import { tiltedExactPhi, tiltedRatio, tiltedStaircasePhi } from '../../lib/validation/sloped';

const base = { L: 2, d: 0.2, lambda: 1 };

describe('sloped edges: staircase error', () => {
  it('axis-aligned walls are exact (no staircase)', () => {
    expect(Math.abs(tiltedRatio({ ...base, degrees: 0, rsi: 0.13, rse: 0.04 }, 'default') - 1)).toBeLessThan(1e-6);
  });
  for (const degrees of [15, 30, 45])
    it(`conduction only at ${degrees} degrees: error falls with the mesh, within 1.5 % at default and 1 % at fine`, () => {
      const w = { ...base, degrees, rsi: 0, rse: 0 };
      const e = (m: keyof typeof MESH_LEVELS) => Math.abs(tiltedRatio(w, MESH_LEVELS[m]) - 1);
      const ePreview = e('preview'), eDefault = e('default'), eFine = e('fine');
      expect(eDefault).toBeLessThan(0.015);
      expect(eFine).toBeLessThan(0.01);
      expect(eFine).toBeLessThan(ePreview);
    });
  for (const degrees of [15, 45])
    it(`with Rsi 0.13 and Rse 0.04 at ${degrees} degrees: Phi lies between exact and the staircase bound (within the conduction error)`, () => {
      const w = { ...base, degrees, rsi: 0.13, rse: 0.04 };
      const ratio = tiltedRatio(w, 'default');
      const bound = tiltedStaircasePhi(w) / tiltedExactPhi(w);
      expect(bound).toBeLessThanOrEqual(Math.SQRT2);
      expect(ratio).toBeGreaterThan(1 - 0.015);
      expect(ratio).toBeLessThan(bound * 1.015);
    });
});
