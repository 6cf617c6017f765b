// The air turbines' sound at the nearest dwelling, for the consents list's noise check: free-field
// spherical spreading from a point source, with no ground, air or barrier attenuation (a screening
// figure on the loud side of a full ISO 9613-2 calculation, which only ever subtracts more).
import { checkNumber } from './errors'

/** Shortest distance the spreading law is used at, m (its reference distance d0 = 1 m). */
export const MIN_NOISE_DISTANCE_M = 1
/** Longest distance accepted, m. */
export const MAX_NOISE_DISTANCE_M = 100_000

/**
 * The noise limit at a dwelling when the site sets none, dB(A): a night-time figure, illustrative
 * only; the local planning authority's figure replaces it.
 */
export const DEFAULT_NOISE_LIMIT = {
  value: 40,
  unit: 'dB(A)',
  source: 'illustrative night-time figure (common practice, no source); the local planning authority\'s figure replaces it',
} as const

/**
 * Geometric divergence of a point source, dB: A_div = 20·lg(d/d0) + 11 with d0 = 1 m
 * (ISO 9613-2:1996, 7.1, equation 7).
 */
export function geometricDivergence(distance_m: number): number {
  const d = checkNumber(distance_m, 'distance_m', { min: MIN_NOISE_DISTANCE_M, max: MAX_NOISE_DISTANCE_M })
  return 20 * Math.log10(d / 1) + 11
}

/**
 * Sound power level of `units` identical sources run together, dB(A): L_W + 10·lg(n), the
 * energetic sum of incoherent sources (common practice, no source).
 */
export function combinedSoundPower(soundPower_dBA: number, units: number): number {
  const lw = checkNumber(soundPower_dBA, 'soundPower_dBA', { min: 0, max: 200 })
  const n = checkNumber(units, 'units', { min: 1, integer: true })
  return lw + 10 * Math.log10(n)
}

/** Sound pressure level at `distance_m` from a point source of sound power `soundPower_dBA`: L_p = L_W − A_div (ISO 9613-2:1996, 7.1). */
export function soundPressureAt(soundPower_dBA: number, distance_m: number): number {
  const lw = checkNumber(soundPower_dBA, 'soundPower_dBA', { min: 0, max: 200 })
  return lw - geometricDivergence(distance_m)
}

/** The noise check of one scheme at its nearest dwelling. */
export interface NoiseCheck {
  /** Sound power of all the units' turbines together, dB(A). */
  combinedSoundPower_dBA: number
  /** Sound pressure level at the dwelling, dB(A). */
  atDwelling_dBA: number
  limit_dBA: number
  /** True when the level at the dwelling is above the limit. */
  aboveLimit: boolean
  /** How far above (positive) or below (negative) the limit, dB. */
  margin_dB: number
}

/** The level every unit's air turbine gives at the nearest dwelling, against the limit. */
export function noiseCheck(input: { soundPower_dBA: number; units: number; distance_m: number; limit_dBA: number }): NoiseCheck {
  const limit = checkNumber(input.limit_dBA, 'limit_dBA', { min: 0, max: 200 })
  const combined = combinedSoundPower(input.soundPower_dBA, input.units)
  const atDwelling = soundPressureAt(combined, input.distance_m)
  return { combinedSoundPower_dBA: combined, atDwelling_dBA: atDwelling, limit_dBA: limit, aboveLimit: atDwelling > limit, margin_dB: atDwelling - limit }
}
