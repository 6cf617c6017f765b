// Oxygen: the per-metre field transfer in the units (the cross-check beside the bubble model),
// aeration over the existing weir (Butts & Evans), film-theory helpers, mixing downstream.
import { G, O2_MASS_FRACTION, P_STD, T_ZERO_C } from './constants'
import { oxygenSaturation } from './oxygenSaturation'
import { waterViscosity } from './water'

/** A tabulated coefficient with its origin. */
export interface ClassValue {
  readonly value: number
  readonly label: string
  readonly source: string
}

const BE = 'Butts & Evans (1983), J. Environ. Eng. 109(1)'

/** Water-quality factor a of the weir formula, by class (Butts & Evans 1983). */
export const WATER_QUALITY_A = {
  'clean': { value: 1.8, label: 'Clean', source: BE },
  'slightly-polluted': { value: 1.6, label: 'Slightly polluted', source: BE },
  'moderately-polluted': { value: 1.0, label: 'Moderately polluted', source: BE },
  'grossly-polluted': { value: 0.65, label: 'Grossly polluted', source: BE },
} as const satisfies Record<string, ClassValue>

/** Name of a water-quality class. */
export type WaterQualityClass = keyof typeof WATER_QUALITY_A

/** Structure (weir shape) factor b of the weir formula, by class (Butts & Evans 1983). */
export const WEIR_SHAPE_B = {
  'flat-broad-crested-regular-step': { value: 0.7, label: 'Flat broad-crested, regular step', source: `${BE} (table from memory)` },
  'flat-broad-crested-irregular-step': { value: 0.8, label: 'Flat broad-crested, irregular step', source: `${BE} (table from memory)` },
  'flat-broad-crested-vertical-face': { value: 0.6, label: 'Flat broad-crested, vertical face', source: `${BE} (table from memory)` },
  'flat-broad-crested-straight-slope': { value: 0.75, label: 'Flat broad-crested, straight slope face', source: `${BE} (table from memory)` },
  'flat-broad-crested-curved-face': { value: 0.45, label: 'Flat broad-crested, curved face', source: `${BE} (table from memory)` },
  'round-broad-crested-curved-face': { value: 0.75, label: 'Round broad-crested, curved face', source: `${BE} (table from memory)` },
  'sharp-crested-straight-slope': { value: 1.05, label: 'Sharp-crested, straight slope face', source: `${BE} (1.00 in another table)` },
  'sharp-crested-vertical-face': { value: 0.8, label: 'Sharp-crested, vertical face', source: BE },
  'sluice-gate-submerged': { value: 0.05, label: 'Sluice gate, submerged discharge', source: BE },
} as const satisfies Record<string, ClassValue>

/** Name of a weir-shape class. */
export type WeirShapeClass = keyof typeof WEIR_SHAPE_B

/** Fall beyond which the weir formula is not extrapolated (H(1 − 0.11H) peaks at about 4.5 m). */
export const WEIR_FORMULA_MAX_FALL_m = 4.5

/** Weir deficit ratio r = 1 + 0.38·a·b·H·(1 − 0.11H)·(1 + 0.046T), H in m clamped to 0–4.5, T in °C (Butts & Evans 1983; Gameson 1957). */
export function weirDeficitRatio(a: number, b: number, fall_m: number, tC: number): number {
  const H = Math.min(Math.max(0, fall_m), WEIR_FORMULA_MAX_FALL_m)
  return 1 + 0.38 * a * b * H * (1 - 0.11 * H) * (1 + 0.046 * tC)
}

/** Concentration below a weir from the deficit ratio, C_d = C_s − (C_s − C_u)/r, mg/L (definition of r, river water-quality modelling). */
export function downstreamFromDeficitRatio(Cs: number, Cu: number, r: number): number {
  return r > 0 ? Cs - (Cs - Cu) / r : Cu
}

/** Exponential approach to saturation C_out = C* − (C* − C_in)·e^(−x); never passes C* (first-order transfer). */
export function exponentialApproach(cStar: number, cIn: number, x: number): number {
  return cStar - (cStar - cIn) * Math.exp(-Math.max(0, x))
}

/** Oxygen mass flow carried by an air mass flow, ṁ_O₂ = 0.2314·ṁ_air, kg/s (composition of dry air). */
export function oxygenSupply(airMassFlow_kgs: number): number {
  return O2_MASS_FRACTION * Math.max(0, airMassFlow_kgs)
}

/** Saturation in the unit at mid-submergence, C* = β·C_s(T, p_atm + ρg·d/2, S), mg/L (ASCE/EWRI 2-06 effective mid-depth saturation). */
export function unitSaturation(tC: number, p_atm: number, rho: number, submergence_m: number, beta: number, salinity_gkg: number): number {
  return beta * oxygenSaturation(tC, p_atm + (rho * G * Math.max(0, submergence_m)) / 2, salinity_gkg)
}

/** Inputs of the field-transfer method. */
export interface FieldTransferInput {
  cIn_mgL: number
  tC: number
  unitFlow_m3s: number
  airMassFlow_kgs: number
  submergence_m: number
  sotePerMetre: number
  /** Depth-independent share of the O₂ supplied that the device itself transfers (SOTE at zero submergence). */
  inDeviceTransfer: number
  alpha: number
  beta: number
  theta: number
  p_atm: number
  rho: number
  salinity_gkg: number
}

/** Result of a transfer method for one unit. */
export interface TransferResult {
  cStar_mgL: number
  cOut_mgL: number
  /** Exponent of the approach (φ or K_L·a·t). */
  exponent: number
  /** Fraction of the deficit to C* removed, 1 − e^(−exponent) after any cap. */
  fractionApproached: number
  /** O₂ mass transferred, kg/s. */
  transfer_kgs: number
}

/** Field transfer as an exponential approach, φ = SOTR·α·θ^(T−20)/(C*₂₀·Q_u), SOTR = SOTE·ṁ_O₂ with SOTE = per-metre efficiency × submergence + in-device term (ASCE/EWRI 2-06 field correction). */
export function fieldTransfer(f: FieldTransferInput): TransferResult {
  const cStar = unitSaturation(f.tC, f.p_atm, f.rho, f.submergence_m, f.beta, f.salinity_gkg)
  if (!(f.unitFlow_m3s > 0)) return { cStar_mgL: cStar, cOut_mgL: f.cIn_mgL, exponent: 0, fractionApproached: 0, transfer_kgs: 0 }
  const cStar20 = oxygenSaturation(20, P_STD + (f.rho * G * Math.max(0, f.submergence_m)) / 2, f.salinity_gkg) * 1e-3
  const sote = Math.min(1, Math.max(0, f.sotePerMetre * f.submergence_m + f.inDeviceTransfer))
  const sotr = sote * oxygenSupply(f.airMassFlow_kgs)
  // A unit flow so small that C*₂₀·Q underflows to 0 takes up no oxygen (and would give 0/0 = NaN).
  const carried = cStar20 * f.unitFlow_m3s
  const phi = carried > 0 ? (sotr * f.alpha * f.theta ** (f.tC - 20)) / carried : 0
  const cOut = exponentialApproach(cStar, f.cIn_mgL, phi)
  return {
    cStar_mgL: cStar, cOut_mgL: cOut, exponent: phi, fractionApproached: 1 - Math.exp(-phi),
    transfer_kgs: (cOut - f.cIn_mgL) * 1e-3 * f.unitFlow_m3s,
  }
}

const MU_20 = waterViscosity(20)

/** Diffusivity of O₂ in water, D(T) = D₂₀·(T/293.15 K)·μ(20 °C)/μ(T), m²/s (Stokes–Einstein scaling; D₂₀ from memory). */
export function oxygenDiffusivity(tC: number, d20: number): number {
  return d20 * ((tC + T_ZERO_C) / 293.15) * (MU_20 / waterViscosity(tC))
}

/** Liquid-film coefficient K_L = 2·√(D/(π·t_c)), t_c = d_b/u_slip, m/s (Higbie 1935 penetration theory). */
export function higbieFilmCoefficient(diffusivity: number, bubbleDiameter_m: number, slipVelocity_ms: number): number {
  if (!(bubbleDiameter_m > 0) || !(slipVelocity_ms > 0) || !(diffusivity > 0)) return 0
  const tc = bubbleDiameter_m / slipVelocity_ms
  return 2 * Math.sqrt(diffusivity / (Math.PI * tc))
}

/** Length of a conical diffuser L = (D_o − D_t)/(2·tan θ_half), m (geometry). */
export function diffuserLength(throatDiameter_m: number, outletDiameter_m: number, halfAngle_deg: number): number {
  const t = Math.tan((halfAngle_deg * Math.PI) / 180)
  return t > 0 ? Math.max(0, outletDiameter_m - throatDiameter_m) / (2 * t) : 0
}

/** Two streams mixed by flow weight, (Q₁C₁ + Q₂C₂)/(Q₁ + Q₂), mg/L (mass balance); a stream without flow counts as none, and with no water at all the fallback stands. */
export function mixTwoStreams(q1: number, c1: number, q2: number, c2: number, fallback_mgL: number): number {
  const a = q1 > 0 ? q1 : 0
  const b = q2 > 0 ? q2 : 0
  return a + b > 0 ? (a * c1 + b * c2) / (a + b) : fallback_mgL
}
