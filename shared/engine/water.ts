// Properties of liquid water near atmospheric pressure, SI units, temperatures in °C.
import { rememberRecent } from './memo'
import { RHO_CRIT_WATER, T_CRIT_WATER, T_ZERO_C } from './constants'

/** Density of air-free water at 1 atm, kg/m³: Kell (1975) eq. 16, J. Chem. Eng. Data 20:97; valid 0–150 °C. */
export const waterDensity = rememberRecent(function waterDensity(tC: number): number {
  const t = tC
  const num = 999.83952 + 16.945176 * t - 7.9870401e-3 * t ** 2 - 46.170461e-6 * t ** 3
    + 105.56302e-9 * t ** 4 - 280.54253e-12 * t ** 5
  return num / (1 + 16.87985e-3 * t)
}, 1)

// IAPWS R12-08, eq. 11 (dilute-gas part) and eq. 12 (residual part) coefficients.
const H0 = [1.67752, 2.20462, 0.6366564, -0.241605]
const H1: ReadonlyArray<ReadonlyArray<number>> = [
  [5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0],
  [8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0],
  [-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0],
  [-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3],
  [0, 0, -2.5704e-1, 0, 0, 8.72102e-3, 0],
  [0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4],
]

/** Dynamic viscosity μ(T, ρ), Pa·s: IAPWS R12-08 eqs. 10–12 without the critical enhancement (negligible for liquid below 100 °C). */
export function waterViscosityAt(tK: number, rho: number): number {
  const tr = tK / T_CRIT_WATER
  const dr = rho / RHO_CRIT_WATER
  let s0 = 0
  for (let i = 0; i < H0.length; i++) s0 += (H0[i] ?? 0) / tr ** i
  const mu0 = (100 * Math.sqrt(tr)) / s0
  let s1 = 0
  for (let i = 0; i < H1.length; i++) {
    const row = H1[i] ?? []
    for (let j = 0; j < row.length; j++) s1 += (row[j] ?? 0) * (1 / tr - 1) ** i * (dr - 1) ** j
  }
  const mu1 = Math.exp(dr * s1)
  return mu0 * mu1 * 1e-6
}

/** Dynamic viscosity of water at 1 atm, Pa·s: IAPWS R12-08 evaluated at the Kell (1975) density. */
export const waterViscosity = rememberRecent(function waterViscosity(tC: number): number {
  return waterViscosityAt(tC + T_ZERO_C, waterDensity(tC))
}, 1)

/** Kinematic viscosity ν = μ/ρ of water at 1 atm, m²/s (IAPWS R12-08 with Kell 1975). */
export function waterKinematicViscosity(tC: number): number {
  return waterViscosity(tC) / waterDensity(tC)
}

const N = [
  1167.0521452767, -724213.16703206, -17.073846940092, 12020.82470247, -3232555.0322333,
  14.91510861353, -4823.2657361591, 405113.40542057, -0.23855557567849, 650.17534844798,
] as const

/** Saturation (vapour) pressure of water p_v(T), Pa: IAPWS-IF97 Region 4 saturation-pressure equation (eq. 30); valid 273.15–647.096 K. */
export const vapourPressure = rememberRecent(function vapourPressure(tC: number): number {
  const T = tC + T_ZERO_C
  const th = T + N[8] / (T - N[9])
  const A = th * th + N[0] * th + N[1]
  const B = N[2] * th * th + N[3] * th + N[4]
  const C = N[5] * th * th + N[6] * th + N[7]
  const p = (2 * C / (-B + Math.sqrt(B * B - 4 * A * C))) ** 4
  return p * 1e6
}, 1)
