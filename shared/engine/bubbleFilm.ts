// Rise velocity and liquid-film coefficients of single air bubbles, for the discrete-bubble model (bubbles.ts).
import { higbieFilmCoefficient } from './oxygen'

/** Liquid-film models the discrete-bubble model offers: the paper's correlation, clean-surface and rigid-sphere bounds. */
export type FilmModel = 'mcginnis-little' | 'higbie' | 'frossling'

/** Every film model, in the order the UI lists them. */
export const FILM_MODELS: readonly FilmModel[] = ['mcginnis-little', 'higbie', 'frossling']

/**
 * Rise (slip) velocity of an air bubble in natural water, m/s, from its equivalent radius r in m:
 * u = 4474·r^1.357 (r < 0.7 mm), 0.23 (0.7 mm ≤ r < 5.1 mm), 4.202·r^0.547 (r ≥ 5.1 mm)
 * (Wüest, Brooks & Imboden 1992, as used by McGinnis & Little 2002; coefficients from memory).
 * The fit jumps by about 2 % at both breaks, as published.
 */
export function riseVelocity(diameter_m: number): number {
  const r = diameter_m / 2
  if (!(r > 0)) return 0
  if (r < 7e-4) return 4474 * r ** 1.357
  if (r < 5.1e-3) return 0.23
  return 4.202 * r ** 0.547
}

/**
 * Liquid-film coefficient of O₂ at 20 °C, m/s: K_L = 0.6·r (r < 0.667 mm), 4×10⁻⁴ above, r in m
 * (McGinnis & Little 2002, after Wüest et al. 1992; coefficients from memory).
 */
export function mcginnisLittleFilmCoefficient(diameter_m: number): number {
  const r = diameter_m / 2
  if (!(r > 0)) return 0
  return Math.min(0.6 * r, 4e-4)
}

/**
 * Liquid-film coefficient of a rigid (fully contaminated) sphere, m/s: K_L = Sh·D/d with
 * Sh = 2 + 0.552·Re^½·Sc^⅓, Re = u·d/ν, Sc = ν/D (Frössling 1938; 0.552 from memory, Ranz & Marshall 1952 use 0.6).
 */
export function frosslingFilmCoefficient(diffusivity: number, diameter_m: number, slip_ms: number, kinematicViscosity: number): number {
  if (!(diffusivity > 0) || !(diameter_m > 0) || !(kinematicViscosity > 0)) return 0
  const re = (Math.max(0, slip_ms) * diameter_m) / kinematicViscosity
  const sc = kinematicViscosity / diffusivity
  return ((2 + 0.552 * Math.sqrt(re) * Math.cbrt(sc)) * diffusivity) / diameter_m
}

/** One gas's film model with its per-temperature constants worked out once (see filmCoefficient). */
export interface FilmParameters {
  readonly model: FilmModel
  readonly diffusivity: number
  /** √(D/D_O₂,20) for McGinnis & Little; 0.552·Sc^⅓/√ν for Frössling; unused by Higbie. */
  readonly factor: number
}

/** Prepares filmCoefficient's constants for one gas at one temperature (D and ν fixed). */
export function filmParameters(model: FilmModel, diffusivity: number, oxygenDiffusivity20: number, kinematicViscosity: number): FilmParameters {
  const ok = diffusivity > 0 && kinematicViscosity > 0
  if (model === 'frossling') {
    return { model, diffusivity, factor: ok ? (0.552 * Math.cbrt(kinematicViscosity / diffusivity)) / Math.sqrt(kinematicViscosity) : 0 }
  }
  if (model === 'higbie') return { model, diffusivity, factor: 0 }
  return { model, diffusivity, factor: ok && oxygenDiffusivity20 > 0 ? Math.sqrt(diffusivity / oxygenDiffusivity20) : 0 }
}

/**
 * Liquid-film coefficient of one gas for a bubble of diameter d rising at u, m/s, by the prepared model.
 * McGinnis & Little is scaled by √(D/D_O₂,20) for temperature and for the gas (penetration-theory
 * scaling: an assumption of this module, the 2002 fit is for O₂ with no temperature term);
 * Higbie (1935) uses t_c = d/u; Frössling as above. All three see the same d and u.
 */
export function filmCoefficientOf(p: FilmParameters, diameter_m: number, slip_ms: number): number {
  if (!(diameter_m > 0)) return 0
  switch (p.model) {
    case 'higbie':
      return higbieFilmCoefficient(p.diffusivity, diameter_m, slip_ms)
    case 'frossling':
      return p.factor > 0 ? ((2 + p.factor * Math.sqrt(Math.max(0, slip_ms) * diameter_m)) * p.diffusivity) / diameter_m : 0
    default:
      return mcginnisLittleFilmCoefficient(diameter_m) * p.factor
  }
}

/** filmCoefficientOf without preparing: the film coefficient of one gas, m/s (same equations and sources). */
export function filmCoefficient(
  model: FilmModel, diameter_m: number, slip_ms: number, diffusivity: number, oxygenDiffusivity20: number, kinematicViscosity: number,
): number {
  return filmCoefficientOf(filmParameters(model, diffusivity, oxygenDiffusivity20, kinematicViscosity), diameter_m, slip_ms)
}
