/**
 * Psychrometrics of ISO 13788 (Annex E): saturation vapour pressure over water (theta >= 0 C)
 * and over ice (theta < 0 C), the dew point as its inverse, surface relative humidity and the
 * mould-limit temperature (surface RH 80 %, ISO 13788 clause 4.2 criterion on monthly means).
 * Temperatures in C, pressures in Pa, relative humidity as a fraction (0..1) unless noted.
 */

/** ISO 13788: p_sat in Pa. */
export function pSat(theta: number): number {
  if (theta >= 0) return 610.5 * Math.exp((17.269 * theta) / (237.3 + theta));
  return 610.5 * Math.exp((21.875 * theta) / (265.5 + theta));
}

/** Inverse of pSat: the temperature at which the saturation pressure equals p (Pa). */
export function satTemperature(p: number): number {
  if (!(p > 0)) throw new RangeError(`vapour pressure must be greater than 0 Pa, got ${p}`);
  const l = Math.log(p / 610.5);
  // Above 0 C when p >= 610.5 Pa (both branches meet at 610.5 Pa, 0 C).
  if (l >= 0) return (237.3 * l) / (17.269 - l);
  return (265.5 * l) / (21.875 - l);
}

/** Vapour pressure of air at theta with relative humidity rh (fraction). */
export function vapourPressure(theta: number, rh: number): number {
  return rh * pSat(theta);
}

/** Dew point of air at theta and relative humidity rh (fraction), C. */
export function dewPoint(theta: number, rh: number): number {
  return satTemperature(vapourPressure(theta, rh));
}

/** Relative humidity (fraction) at a surface at thetaS next to air with vapour pressure p (Pa). */
export function surfaceRH(p: number, thetaS: number): number {
  return p / pSat(thetaS);
}

/** ISO 13788 mould criterion: surface RH at most 80 % (monthly mean). */
export const MOULD_RH = 0.8;

/** Lowest surface temperature keeping surface RH below `limit` (default 80 %), C. */
export function mouldLimit(theta: number, rh: number, limit = MOULD_RH): number {
  return satTemperature(vapourPressure(theta, rh) / limit);
}

/** ISO 13788 fRsi,min = (theta_si,min - theta_e) / (theta_i - theta_e) for the mould limit. */
export function fRsiMin(thetaI: number, rhI: number, thetaE: number, limit = MOULD_RH): number {
  return (mouldLimit(thetaI, rhI, limit) - thetaE) / (thetaI - thetaE);
}
