/**
 * Units: SI inside, SI or inch-pound on screen. Every factor is derived from exact definitions:
 * 1 in = 25.4 mm, 1 ft = 0.3048 m (exact by the 1959 international yard and pound agreement),
 * the International Table Btu = 1055.05585262 J, 1 h = 3600 s, a difference of 1 F = 5/9 K.
 */

export type UnitSystem = 'si' | 'ip';

export const INCH = 0.0254;
export const FOOT = 0.3048;
export const BTU_IT = 1055.05585262;
export const HOUR = 3600;
export const F_PER_K = 9 / 5;

/** 1 W expressed in Btu/h. */
const BTUH_PER_W = HOUR / BTU_IT;

export type QuantityKind =
  | 'length'
  | 'temperature'
  | 'temperature-difference'
  | 'conductivity'
  | 'r-value'
  | 'u-value'
  | 'heat-flow-per-length'
  | 'psi'
  | 'heat-flux'
  | 'density'
  | 'vapour-pressure'
  | 'sd'
  | 'relative-humidity'
  | 'ratio';

interface Unit {
  symbol: string;
  /** display = si * factor + offset */
  factor: number;
  offset?: number;
  digits: number;
}

/** The display unit of each quantity, SI and inch-pound. */
export const UNITS: Record<QuantityKind, Record<UnitSystem, Unit>> = {
  length: { si: { symbol: 'mm', factor: 1000, digits: 0 }, ip: { symbol: 'in', factor: 1 / INCH, digits: 2 } },
  temperature: { si: { symbol: '°C', factor: 1, digits: 1 }, ip: { symbol: '°F', factor: F_PER_K, offset: 32, digits: 1 } },
  'temperature-difference': { si: { symbol: 'K', factor: 1, digits: 2 }, ip: { symbol: '°F', factor: F_PER_K, digits: 2 } },
  // W/(m K) -> Btu in/(h ft2 F): W -> Btu/h, m -> in (thickness), per m2 -> per ft2, per K -> per F
  conductivity: { si: { symbol: 'W/(m·K)', factor: 1, digits: 3 }, ip: { symbol: 'Btu·in/(h·ft²·°F)', factor: (BTUH_PER_W / INCH) * FOOT * FOOT / F_PER_K, digits: 3 } },
  // m2 K/W -> h ft2 F/Btu
  'r-value': { si: { symbol: 'm²·K/W', factor: 1, digits: 2 }, ip: { symbol: 'h·ft²·°F/Btu', factor: F_PER_K / (FOOT * FOOT * BTUH_PER_W), digits: 1 } },
  'u-value': { si: { symbol: 'W/(m²·K)', factor: 1, digits: 3 }, ip: { symbol: 'Btu/(h·ft²·°F)', factor: (BTUH_PER_W * FOOT * FOOT) / F_PER_K, digits: 3 } },
  'heat-flow-per-length': { si: { symbol: 'W/m', factor: 1, digits: 2 }, ip: { symbol: 'Btu/(h·ft)', factor: BTUH_PER_W * FOOT, digits: 2 } },
  psi: { si: { symbol: 'W/(m·K)', factor: 1, digits: 3 }, ip: { symbol: 'Btu/(h·ft·°F)', factor: (BTUH_PER_W * FOOT) / F_PER_K, digits: 3 } },
  'heat-flux': { si: { symbol: 'W/m²', factor: 1, digits: 2 }, ip: { symbol: 'Btu/(h·ft²)', factor: BTUH_PER_W * FOOT * FOOT, digits: 2 } },
  // kg/m3 -> lb/ft3, with the international avoirdupois pound = 0.45359237 kg (exact)
  density: { si: { symbol: 'kg/m³', factor: 1, digits: 0 }, ip: { symbol: 'lb/ft³', factor: (FOOT * FOOT * FOOT) / 0.45359237, digits: 1 } },
  'vapour-pressure': { si: { symbol: 'Pa', factor: 1, digits: 0 }, ip: { symbol: 'Pa', factor: 1, digits: 0 } },
  sd: { si: { symbol: 'm', factor: 1, digits: 2 }, ip: { symbol: 'm', factor: 1, digits: 2 } },
  'relative-humidity': { si: { symbol: '%', factor: 1, digits: 0 }, ip: { symbol: '%', factor: 1, digits: 0 } },
  ratio: { si: { symbol: '', factor: 1, digits: 3 }, ip: { symbol: '', factor: 1, digits: 3 } },
};

export function unitOf(kind: QuantityKind, system: UnitSystem): Unit {
  return UNITS[kind][system];
}

export function toDisplay(kind: QuantityKind, si: number, system: UnitSystem): number {
  const u = UNITS[kind][system];
  return si * u.factor + (u.offset ?? 0);
}

export function fromDisplay(kind: QuantityKind, shown: number, system: UnitSystem): number {
  const u = UNITS[kind][system];
  return (shown - (u.offset ?? 0)) / u.factor;
}

function fixed(n: number, digits: number): string {
  const s = n.toFixed(digits);
  return s === '-0' || /^-0\.0*$/.test(s) ? s.slice(1) : s;
}

/** "12.5 W/m", "3.41 Btu/(h·ft)". */
export function formatQuantity(kind: QuantityKind, si: number, system: UnitSystem, digits?: number): string {
  const u = UNITS[kind][system];
  const v = fixed(toDisplay(kind, si, system), digits ?? u.digits);
  return u.symbol ? (u.symbol.startsWith('°') ? `${v} ${u.symbol}` : `${v} ${u.symbol}`) : v;
}

/** Lengths: mm below a metre and m above in SI; inches, or feet and inches from 2 ft up, in inch-pound. */
export function formatLength(m: number, system: UnitSystem): string {
  if (system === 'si') {
    const mm = m * 1000;
    if (Math.abs(mm) >= 1000) return `${fixed(m, 3).replace(/\.?0+$/, '')} m`;
    const d = Math.abs(mm) < 1 ? 2 : 1;
    return `${fixed(mm, d).replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '')} mm`;
  }
  const inches = m / INCH;
  if (Math.abs(inches) >= 24) {
    const sign = inches < 0 ? '-' : '';
    const a = Math.abs(inches);
    let ft = Math.floor(a / 12);
    let rest = Math.round((a - ft * 12) * 8) / 8;
    if (rest >= 12) {
      ft += 1;
      rest -= 12;
    }
    return `${sign}${ft}' ${formatInchFraction(rest)}"`;
  }
  return `${formatInchFraction(inches)}"`;
}

/** Inches to the nearest 1/16 as a mixed fraction: 5.5 -> "5-1/2". */
export function formatInchFraction(inches: number): string {
  const sign = inches < 0 ? '-' : '';
  const a = Math.abs(inches);
  const sixteenths = Math.round(a * 16);
  if (Math.abs(a * 16 - sixteenths) > 1e-6 && a < 1) return `${sign}${Number(a.toFixed(3))}`;
  const whole = Math.floor(sixteenths / 16);
  let num = sixteenths % 16, den = 16;
  while (num && num % 2 === 0) {
    num /= 2;
    den /= 2;
  }
  if (!num) return `${sign}${whole}`;
  return whole ? `${sign}${whole}-${num}/${den}` : `${sign}${num}/${den}`;
}

export class UnitParseError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UnitParseError';
  }
}

const LENGTH_UNITS: Record<string, number> = {
  mm: 0.001, millimetre: 0.001, millimetres: 0.001, millimeter: 0.001, millimeters: 0.001,
  cm: 0.01, m: 1, metre: 1, metres: 1, meter: 1, meters: 1,
  in: INCH, inch: INCH, inches: INCH, '"': INCH, '″': INCH, "''": INCH,
  ft: FOOT, foot: FOOT, feet: FOOT, "'": FOOT, '′': FOOT,
};

/** "5", "5.5", "5-1/2", "5 1/2", "1/2" -> number */
function parseMixed(s: string): number | null {
  const t = s.trim();
  let m = /^([+-]?\d+(?:\.\d+)?)$/.exec(t) ?? /^([+-]?\.\d+)$/.exec(t);
  if (m) return Number(m[1]);
  m = /^([+-]?)(\d+)[-\s]+(\d+)\/(\d+)$/.exec(t);
  if (m) {
    const v = Number(m[2]) + Number(m[3]) / Number(m[4]);
    return Number(m[4]) === 0 ? null : m[1] === '-' ? -v : v;
  }
  m = /^([+-]?)(\d+)\/(\d+)$/.exec(t);
  if (m) {
    const v = Number(m[2]) / Number(m[3]);
    return Number(m[3]) === 0 ? null : m[1] === '-' ? -v : v;
  }
  return null;
}

/**
 * A typed length to metres. Accepts "2 in", "50mm", "5-1/2\"", "1' 6\"", "1 ft 6 in", "0.3 m", "3/4in";
 * a bare number is in the display unit of the system (mm for SI, inches for inch-pound).
 */
export function parseLength(text: string, system: UnitSystem): number {
  const s = text.trim().replace(/\s+/g, ' ');
  if (!s) throw new UnitParseError('enter a length, such as 50 mm or 2 in');
  // feet and inches: 1' 6", 1'6", 1 ft 6 in, 1' 6-1/2"
  const fi = /^([+-]?\d+(?:\.\d+)?)\s*(?:'|′|ft|feet|foot)\s*(?:(.+?)\s*(?:"|″|''|in|inch|inches)?)?$/.exec(s);
  if (fi && fi[2] !== undefined && fi[2] !== '') {
    const inches = parseMixed(fi[2]);
    if (inches === null) throw new UnitParseError(`cannot read '${text}' as a length; try 1' 6" or 0.46 m`);
    const sign = fi[1].startsWith('-') ? -1 : 1;
    return sign * (Math.abs(Number(fi[1])) * FOOT + inches * INCH);
  }
  const m = /^(.+?)\s*(mm|millimet(?:re|er)s?|cm|m|met(?:re|er)s?|in|inch|inches|"|″|''|ft|feet|foot|'|′)$/i.exec(s);
  if (m) {
    const v = parseMixed(m[1]);
    if (v === null) throw new UnitParseError(`cannot read '${text}' as a length; try 50 mm or 2 in`);
    return v * LENGTH_UNITS[m[2].toLowerCase()];
  }
  const v = parseMixed(s);
  if (v === null) throw new UnitParseError(`cannot read '${text}' as a length; try 50 mm, 2 in, 5-1/2" or 1' 6"`);
  return system === 'si' ? v * 0.001 : v * INCH;
}

/** A typed temperature to C; a bare number is in the system's unit; "68 F" or "20 C" say theirs. */
export function parseTemperature(text: string, system: UnitSystem): number {
  const m = /^\s*([+-]?\d+(?:\.\d+)?)\s*(°?\s*[CF])?\s*$/i.exec(text);
  if (!m) throw new UnitParseError(`cannot read '${text}' as a temperature; try 20 or 68 F`);
  const v = Number(m[1]);
  const unit = m[2] ? m[2].replace(/[°\s]/g, '').toUpperCase() : system === 'si' ? 'C' : 'F';
  return unit === 'C' ? v : (v - 32) / F_PER_K;
}

/** A typed value of any quantity in the system's display unit (or SI when the text says the SI symbol). */
export function parseQuantity(kind: QuantityKind, text: string, system: UnitSystem): number {
  if (kind === 'length') return parseLength(text, system);
  if (kind === 'temperature') return parseTemperature(text, system);
  const m = /^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?)\s*(.*)$/i.exec(text);
  if (!m) throw new UnitParseError(`cannot read '${text}' as a number`);
  const v = Number(m[1]);
  const rest = m[2].trim();
  if (rest && rest === UNITS[kind].si.symbol) return v;
  return fromDisplay(kind, v, system);
}
