// ISA troposphere and ideal-gas air.
import { P_STD, R_AIR, T_ZERO_C } from './constants'

const LAPSE = 0.0065
const T0 = 288.15

/** ISA/ICAO troposphere pressure p = 101325·(1 − 2.25577e-5·h)^5.25588 Pa, h = GEOPOTENTIAL altitude in m (ICAO Doc 7488), valid to 11 km. */
export function isaPressure(geopotentialAltitude_m: number): number {
  const h = Math.min(Math.max(geopotentialAltitude_m, -1000), 11000)
  return P_STD * (1 - 2.25577e-5 * h) ** 5.25588
}

/** ISA/ICAO troposphere temperature T = 288.15 − 0.0065·h K, h = GEOPOTENTIAL altitude in m (ICAO Doc 7488). */
export function isaTemperature(geopotentialAltitude_m: number): number {
  const h = Math.min(Math.max(geopotentialAltitude_m, -1000), 11000)
  return T0 - LAPSE * h
}

/** Dry-air density from the ideal-gas law ρ = p/(R_air·T), kg/m³, with T in °C. */
export function airDensity(p_Pa: number, tC: number): number {
  return p_Pa / (R_AIR * (tC + T_ZERO_C))
}
