// Commissioning check: flow from a measured throat differential (ISO 5167-1/-2/-4).
import { G } from './constants'
import { circleArea } from './venturi'

/** Differential from a U-tube manometer reading, Δp = (ρ_m − ρ)·g·h, Pa (ISO 5167-1 differential-pressure measurement; hydrostatics). */
export function manometerDifferential(reading_m: number, manometerFluidDensity: number, flowingFluidDensity: number): number {
  return (manometerFluidDensity - flowingFluidDensity) * G * reading_m
}

/** Flow through a differential-pressure meter Q = C·E·A_t·√(2Δp/ρ), E = 1/√(1 − β⁴), m³/s (ISO 5167-1:2003 eq. 1, ε = 1 for liquids). */
export function flowFromDifferential(C: number, throatDiameter_m: number, pipeDiameter_m: number, dp_Pa: number, rho: number): number {
  const beta = pipeDiameter_m > 0 ? throatDiameter_m / pipeDiameter_m : 0
  const e4 = 1 - beta ** 4
  if (!(dp_Pa > 0) || !(e4 > 0) || !(rho > 0)) return 0
  return C * circleArea(throatDiameter_m) * Math.sqrt((2 * dp_Pa) / (rho * e4))
}

/** Reader-Harris/Gallagher discharge coefficient of an orifice plate (ISO 5167-2:2003 eq. 4, with the D < 71.12 mm term). */
export function orificeDischargeCoefficient(D_m: number, d_m: number, Re_D: number, taps: 'corner' | 'D-D/2' | 'flange'): number {
  const beta = d_m / D_m
  let L1: number
  let L2: number
  if (taps === 'corner') { L1 = 0; L2 = 0 } else if (taps === 'D-D/2') { L1 = 1; L2 = 0.47 } else { L1 = 0.0254 / D_m; L2 = 0.0254 / D_m }
  const A = (19000 * beta / Re_D) ** 0.8
  const M2 = (2 * L2) / (1 - beta)
  let C = 0.5961 + 0.0261 * beta ** 2 - 0.216 * beta ** 8 + 0.000521 * ((1e6 * beta) / Re_D) ** 0.7
    + (0.0188 + 0.0063 * A) * beta ** 3.5 * (1e6 / Re_D) ** 0.3
    + (0.043 + 0.08 * Math.exp(-10 * L1) - 0.123 * Math.exp(-7 * L1)) * (1 - 0.11 * A) * beta ** 4 / (1 - beta ** 4)
    - 0.031 * (M2 - 0.8 * M2 ** 1.1) * beta ** 1.3
  if (D_m < 0.07112) C += 0.011 * (0.75 - beta) * (2.8 - D_m / 0.0254)
  return C
}

/** Classical venturi discharge coefficients C by convergent type (ISO 5167-4:2003 §5.5.4). */
export const VENTURI_DISCHARGE_COEFFICIENT = {
  'as-cast': 0.984,
  'machined': 0.995,
  'rough-welded': 0.985,
} as const

/** Unit a manometer reading was written down in. */
export type ReadingUnit = 'm-of-manometer-fluid' | 'm-of-water'

/** Input of a commissioning flow check. */
export interface MeteringInput {
  reading_m: number
  readingUnit: ReadingUnit
  manometerFluidDensity: number
  waterDensity: number
  dischargeCoefficient: number
  throatDiameter_m: number
  pipeDiameter_m: number
}

/** Result of a commissioning flow check. */
export interface MeteringResult {
  differential_Pa: number
  flow_m3s: number
  warnings: string[]
}

/** Flow from a manometer reading (ISO 5167-1 with Δp = (ρ_m − ρ)gh), warning when a head in metres of water was read on another fluid. */
export function flowFromManometer(m: MeteringInput): MeteringResult {
  const warnings: string[] = []
  let dp: number
  if (m.readingUnit === 'm-of-water') {
    dp = m.waterDensity * G * m.reading_m
    const rel = Math.abs(m.manometerFluidDensity - m.waterDensity) / m.waterDensity
    if (rel > 0.01) {
      const asColumn = manometerDifferential(m.reading_m, m.manometerFluidDensity, m.waterDensity)
      warnings.push(
        `The reading was entered in metres of water, but the manometer fluid has density ${m.manometerFluidDensity.toFixed(0)} kg/m³. `
        + `If ${m.reading_m} m is the column read on that fluid, the differential is ${(asColumn / 1000).toFixed(2)} kPa, `
        + `not ${(dp / 1000).toFixed(2)} kPa: enter it as metres of manometer fluid.`,
      )
    }
  } else {
    dp = manometerDifferential(m.reading_m, m.manometerFluidDensity, m.waterDensity)
  }
  if (!(dp > 0)) warnings.push('The differential is not positive, so no flow can be computed from it.')
  const flow = flowFromDifferential(m.dischargeCoefficient, m.throatDiameter_m, m.pipeDiameter_m, dp, m.waterDensity)
  return { differential_Pa: dp, flow_m3s: flow, warnings }
}
