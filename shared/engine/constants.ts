// Physical constants used across the engine, SI units.

/** Standard gravity g, m/s² (CGPM 1901, ISO 80000-3). */
export const G = 9.80665

/** Standard atmosphere at sea level, Pa (ICAO / ISA). */
export const P_STD = 101325

/** 0 °C in kelvin. */
export const T_ZERO_C = 273.15

/** Specific gas constant of dry air R_air, J/(kg·K) (ISA value). */
export const R_AIR = 287.05

/** Specific heat of air at constant pressure c_p, J/(kg·K), near 20 °C (from memory: 1005–1007). */
export const CP_AIR = 1005

/** Ratio of specific heats of air γ near 20 °C (from memory). */
export const GAMMA_AIR = 1.4

/** Mass fraction of O₂ in dry air (20.946 % by volume, from memory), kg O₂ per kg air. */
export const O2_MASS_FRACTION = 0.2314

/** Mole (volume) fraction of O₂ in dry air (from memory). */
export const O2_MOLE_FRACTION = 0.20946

/** Mole fraction of N₂ plus argon in dry air, the rest after O₂ (CO₂ neglected; from memory). */
export const N2_AR_MOLE_FRACTION = 1 - O2_MOLE_FRACTION

/** Hours in a 365-day year. */
export const HOURS_PER_YEAR = 8760

/** Critical temperature of water T_c, K (IAPWS R12-08 reducing temperature). */
export const T_CRIT_WATER = 647.096

/** Reducing density of water ρ*, kg/m³ (IAPWS R12-08). */
export const RHO_CRIT_WATER = 322
