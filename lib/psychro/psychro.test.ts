import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { dewPoint, fRsiMin, mouldLimit, pSat, satTemperature, surfaceRH } from './index';

const require = createRequire(import.meta.url);
// psychrolib (npm): ASHRAE Handbook Fundamentals formulas.
const psychrolib = require('psychrolib');
psychrolib.SetUnitSystem(psychrolib.SI);

describe('ISO 13788 saturation pressure against psychrolib (ASHRAE Handbook Fundamentals)', () => {
  it('agrees within 0.2 % from 0 to 40 C (source: psychrolib)', () => {
    for (let t = 0; t <= 40; t += 0.5) {
      const ref = psychrolib.GetSatVapPres(t);
      expect(Math.abs(pSat(t) / ref - 1)).toBeLessThan(0.002);
    }
  });
  it('agrees within 1.1 % from -30 to 0 C, over ice (source: psychrolib)', () => {
    for (let t = -30; t < 0; t += 0.5) {
      const ref = psychrolib.GetSatVapPres(t);
      expect(Math.abs(pSat(t) / ref - 1)).toBeLessThan(0.011);
    }
  });
  it('has both branches meeting at 0 C and the inverse exact on both', () => {
    expect(pSat(0)).toBeCloseTo(610.5, 9);
    for (const t of [-30, -10, -0.5, 0.5, 9.27, 25, 40]) expect(satTemperature(pSat(t))).toBeCloseTo(t, 9);
  });
  it('dew points agree with psychrolib within 0.01 K between 5 and 12 C (source: psychrolib)', () => {
    for (const rh of [0.4, 0.5, 0.6, 0.7]) {
      const t = 20;
      const ours = dewPoint(t, rh);
      if (ours < 5 || ours > 12) continue;
      expect(Math.abs(ours - psychrolib.GetTDewPointFromRelHum(t, rh))).toBeLessThan(0.01);
    }
  });
  it('20 C and 50 % RH: dew point 9.27 C, mould limit 12.6 C (ISO 13788 formulas, values in DESIGN.md section 5)', () => {
    expect(dewPoint(20, 0.5)).toBeCloseTo(9.27, 2);
    expect(mouldLimit(20, 0.5)).toBeCloseTo(12.6, 1);
    expect(surfaceRH(0.5 * pSat(20), mouldLimit(20, 0.5))).toBeCloseTo(0.8, 9);
    expect(fRsiMin(20, 0.5, 0)).toBeCloseTo(mouldLimit(20, 0.5) / 20, 12);
  });
  it('rejects a non-positive vapour pressure where it enters', () => {
    expect(() => satTemperature(0)).toThrow(/greater than 0/);
  });
});
