import { describe, expect, it } from 'vitest';
import { BTU_IT, FOOT, INCH, UNITS, formatInchFraction, formatLength, formatQuantity, fromDisplay, parseLength, parseTemperature, toDisplay } from './index';

describe('conversion factors derived from exact definitions', () => {
  // Handbook figures, recalled from memory (NIST SP 811 Appendix B; ASHRAE Handbook Fundamentals, units chapter).
  it('conductivity: 1 W/(m K) = 6.9335 Btu in/(h ft2 F)', () => {
    expect(UNITS.conductivity.ip.factor).toBeCloseTo(6.9335, 3);
  });
  it('R-value: 1 m2K/W = 5.6783 h ft2 F/Btu (so R-10 IP is RSI 1.761)', () => {
    expect(UNITS['r-value'].ip.factor).toBeCloseTo(5.6783, 3);
    expect(fromDisplay('r-value', 10, 'ip')).toBeCloseTo(1.761, 3);
  });
  it('U-value: 1 Btu/(h ft2 F) = 5.6783 W/(m2 K)', () => {
    expect(1 / UNITS['u-value'].ip.factor).toBeCloseTo(5.6783, 3);
  });
  it('heat flow per length: 1 W/m = 1.0400 Btu/(h ft)', () => {
    expect(UNITS['heat-flow-per-length'].ip.factor).toBeCloseTo(1.04, 3);
  });
  it('psi: 1 W/(m K) = 0.5778 Btu/(h ft F)', () => {
    expect(UNITS.psi.ip.factor).toBeCloseTo(0.5778, 4);
  });
  it('1 W = 3.412142 Btu/h (International Table Btu)', () => {
    expect(3600 / BTU_IT).toBeCloseTo(3.412142, 6);
  });
  it('density: 1 lb/ft3 = 16.0185 kg/m3', () => {
    expect(1 / UNITS.density.ip.factor).toBeCloseTo(16.0185, 3);
  });
  it('temperatures: 20 C = 68 F, -40 C = -40 F, and differences of 1 K = 1.8 F', () => {
    expect(toDisplay('temperature', 20, 'ip')).toBeCloseTo(68, 10);
    expect(toDisplay('temperature', -40, 'ip')).toBeCloseTo(-40, 10);
    expect(toDisplay('temperature-difference', 1, 'ip')).toBeCloseTo(1.8, 12);
  });
  it('every quantity round-trips through its display unit', () => {
    for (const kind of Object.keys(UNITS) as (keyof typeof UNITS)[])
      for (const sys of ['si', 'ip'] as const) expect(fromDisplay(kind, toDisplay(kind, 1.2345, sys), sys)).toBeCloseTo(1.2345, 12);
  });
});

describe('parseLength', () => {
  it('reads the forms people type', () => {
    expect(parseLength('2 in', 'si')).toBeCloseTo(2 * INCH, 12);
    expect(parseLength('50mm', 'ip')).toBeCloseTo(0.05, 12);
    expect(parseLength('5-1/2"', 'si')).toBeCloseTo(5.5 * INCH, 12);
    expect(parseLength("1' 6\"", 'si')).toBeCloseTo(1.5 * FOOT, 12);
    expect(parseLength("1'6\"", 'si')).toBeCloseTo(1.5 * FOOT, 12);
    expect(parseLength('1 ft 6 in', 'si')).toBeCloseTo(1.5 * FOOT, 12);
    expect(parseLength('0.3 m', 'ip')).toBeCloseTo(0.3, 12);
    expect(parseLength('3/4in', 'si')).toBeCloseTo(0.75 * INCH, 12);
    expect(parseLength("2'", 'si')).toBeCloseTo(2 * FOOT, 12);
    expect(parseLength('12.5 cm', 'si')).toBeCloseTo(0.125, 12);
  });
  it('takes a bare number in the display unit', () => {
    expect(parseLength('89', 'si')).toBeCloseTo(0.089, 12);
    expect(parseLength('3.5', 'ip')).toBeCloseTo(3.5 * INCH, 12);
  });
  it('refuses what it cannot read, with a hint', () => {
    expect(() => parseLength('two inches', 'si')).toThrow(/cannot read/);
    expect(() => parseLength('', 'si')).toThrow(/enter a length/);
    expect(() => parseLength('1/0 in', 'si')).toThrow(/cannot read/);
  });
});

describe('formatting', () => {
  it('formats lengths in mm, m, inches and feet-inches', () => {
    expect(formatLength(0.05, 'si')).toBe('50 mm');
    expect(formatLength(0.0125, 'si')).toBe('12.5 mm');
    expect(formatLength(2.4, 'si')).toBe('2.4 m');
    expect(formatLength(5.5 * INCH, 'ip')).toBe('5-1/2"');
    expect(formatLength(1.5 * FOOT + 4 * FOOT / 12 * 3, 'ip')).toBe(`2' 6"`);
  });
  it('reduces inch fractions', () => {
    expect(formatInchFraction(0.75)).toBe('3/4');
    expect(formatInchFraction(3.5)).toBe('3-1/2');
    expect(formatInchFraction(4)).toBe('4');
  });
  it('formats quantities with their symbol', () => {
    expect(formatQuantity('temperature', 20, 'ip')).toBe('68.0 °F');
    expect(formatQuantity('heat-flow-per-length', 10, 'si')).toBe('10.00 W/m');
    expect(parseTemperature('68 F', 'si')).toBeCloseTo(20, 12);
    expect(parseTemperature('20', 'si')).toBe(20);
  });
});
