// Aeration of the water that falls over the existing weir, by more than one model, so the results can show the
// chosen figure with the range between models beside it (ENGINE.md §10), and the weir's crest hydraulics (§13).
import { G } from './constants'
import type { SourcedValue } from './defaults'
import { checkNumber, EngineInputError } from './errors'
import { downstreamFromDeficitRatio, WEIR_SHAPE_B, weirDeficitRatio, type WeirShapeClass } from './oxygen'
import { waterKinematicViscosity } from './water'

const v = (value: number, unit: string, source: string): SourcedValue => ({ value, unit, source })

const AN = 'Avery & Novak (1978), J. Hydraul. Div. ASCE 104(HY11)'
const GTR = 'Gulliver, Thene & Rindels (1990), J. Environ. Eng. 116(3)'

/** Defaults of the weir aeration models, each with its origin. */
export const WEIR_AERATION_DEFAULTS = {
  averyNovakK: v(0.627e-4, '-', `${AN}: k for tap water (from memory; the same 0.627×10⁻⁴, exponents 1.78 and 0.53 and Fr_j = (gH³/2q²)^¼ appear in the published source of a public river water-quality model, which takes Re = q/ν rather than q/2ν)`),
  averyNovakReferenceTemperature: v(15, '°C', `${AN}: the relation gives the deficit ratio at 15 °C`),
  temperatureLinear: v(0.02103, '1/K', `${GTR}: f = 1 + 0.02103(T − 20) + 8.261×10⁻⁵(T − 20)² (from memory)`),
  temperatureQuadratic: v(8.261e-5, '1/K²', `${GTR} (from memory)`),
  temperatureReference: v(20, '°C', `${GTR}: f(20 °C) = 1 (from memory)`),
} as const satisfies Record<string, SourcedValue>

/** The weir aeration models the engine offers. */
export type WeirAerationModel = 'butts-evans' | 'avery-novak' | 'measured'

/** Water temperatures the temperature correction is used over, °C: f(T) is a quadratic fit, so beyond river temperatures it is extrapolation. */
export const TEMPERATURE_CORRECTION_RANGE_C = { min: 0, max: 40 } as const

/**
 * Largest deficit ratio returned: the deficit closed to within one part in a million. A trickle over a high
 * weir drives Avery & Novak past any meaningful figure (r₁₅ − 1 ∝ q^−0.36), and a stored result cannot hold Infinity.
 */
export const MAX_DEFICIT_RATIO = 1e6

function clampRatio(r: number): number {
  return Math.min(MAX_DEFICIT_RATIO, Math.max(1, r))
}

/**
 * Temperature factor f(T) = 1 + 0.02103(T − 20) + 8.261×10⁻⁵(T − 20)² of E_T = 1 − (1 − E₂₀)^f, T clamped to 0–40 °C
 * (Gulliver, Thene & Rindels 1990; from memory). Chosen over the simpler ln r_T = ln r₁₅·(1 + 0.02(T − 15)) because it
 * is the correction Gulliver, Wilhelms & Parkhill (1998) used when they compared relations and found Avery & Novak
 * best for weirs: their 20 °C form of Avery & Novak carries the exponent 1/f(15) ≈ 1.115 (from memory).
 */
export function temperatureFactor(tC: number): number {
  const t = Math.min(TEMPERATURE_CORRECTION_RANGE_C.max, Math.max(TEMPERATURE_CORRECTION_RANGE_C.min, tC))
  const d = t - WEIR_AERATION_DEFAULTS.temperatureReference.value
  return 1 + WEIR_AERATION_DEFAULTS.temperatureLinear.value * d + WEIR_AERATION_DEFAULTS.temperatureQuadratic.value * d * d
}

/**
 * A deficit ratio known at `fromC` carried to `toC`: 1 − E = 1/r, so ln r_to = ln r_from · f(to)/f(from)
 * (Gulliver, Thene & Rindels 1990). Ratios below 1 are taken as 1 (a weir does not move water away from saturation).
 */
export function correctDeficitRatio(r: number, fromC: number, toC: number): number {
  if (!(r > 1)) return 1
  const scale = temperatureFactor(toC) / temperatureFactor(fromC)
  // exp(ln r) need not give back r exactly, so a ratio at its own temperature is returned as it came.
  return clampRatio(scale === 1 ? r : Math.exp(Math.log(r) * scale))
}

/** Jet Froude and Reynolds numbers of the nappe, Fr_j = (gH³/(2q²))^¼ and Re = q/(2ν), ν at 15 °C (Avery & Novak 1978); both 0 when no water falls. */
export function averyNovakJet(fall_m: number, q_m2s: number): { froude: number, reynolds: number, nu_m2s: number } {
  const nu = waterKinematicViscosity(WEIR_AERATION_DEFAULTS.averyNovakReferenceTemperature.value)
  const H = Math.max(0, fall_m)
  const q = Math.max(0, q_m2s)
  if (!(q > 0)) return { froude: 0, reynolds: 0, nu_m2s: nu }
  return { froude: ((G * H ** 3) / (2 * q * q)) ** 0.25, reynolds: q / (2 * nu), nu_m2s: nu }
}

/**
 * Avery & Novak (1978) deficit ratio of a free overfall at 15 °C, r₁₅ = 1 + k·Fr_j^1.78·Re^0.53, with Fr_j and Re of
 * `averyNovakJet`. Re is taken with ν at 15 °C, not at the river's temperature, because the relation gives r at 15 °C
 * and the temperature correction then carries all of the temperature effect. Worked in logarithms as
 * k·(gH³/2)^0.445·(2ν)^−0.53·q^−0.36, so a trickle gives a large finite ratio rather than ∞·0. No flow, or no fall: 1.
 */
export function averyNovakDeficitRatio15(fall_m: number, q_m2s: number, k: number = WEIR_AERATION_DEFAULTS.averyNovakK.value): number {
  const H = Math.max(0, fall_m)
  const q = Math.max(0, q_m2s)
  if (!(q > 0) || !(H > 0) || !(k > 0) || !Number.isFinite(q) || !Number.isFinite(H)) return 1
  const { nu_m2s } = averyNovakJet(H, q)
  const lnExcess = Math.log(k)
    + 0.445 * (Math.log(G / 2) + 3 * Math.log(H) - 2 * Math.log(q))
    + 0.53 * (Math.log(q) - Math.log(2 * nu_m2s))
  return clampRatio(1 + Math.exp(lnExcess))
}

/**
 * Avery & Novak (1978) deficit ratio at the water temperature T: r₁₅ from `averyNovakDeficitRatio15`, carried to T by
 * `correctDeficitRatio`. Flow-dependent: at a fixed fall, r₁₅ − 1 ∝ q^−0.36, so less water over the crest is aerated
 * better (per unit of water). Gulliver, Wilhelms & Parkhill (1998) found it the best of the published relations for weirs.
 */
export function averyNovakDeficitRatio(fall_m: number, q_m2s: number, tC: number, k: number = WEIR_AERATION_DEFAULTS.averyNovakK.value): number {
  return correctDeficitRatio(averyNovakDeficitRatio15(fall_m, q_m2s, k), WEIR_AERATION_DEFAULTS.averyNovakReferenceTemperature.value, tC)
}

/** A deficit ratio measured at the site (entered by the user). */
export interface MeasuredDeficitRatio {
  /** Deficit ratio r = (C_s − C_u)/(C_s − C_d), at least 1. */
  r: number
  /** Water temperature when it was measured, °C. */
  tC: number
  /** True if the weir was drowned (tail above crest) when it was measured. */
  drowned?: boolean
}

/** A measured deficit ratio carried from the temperature it was measured at to T (Gulliver, Thene & Rindels 1990); refuses r < 1 naming `field`. */
export function measuredDeficitRatioAt(measured: MeasuredDeficitRatio, tC: number, field = 'measured'): number {
  const r = checkNumber(measured.r, `${field}.r`, { min: 1 })
  const t = checkNumber(measured.tC, `${field}.tC`, TEMPERATURE_CORRECTION_RANGE_C)
  return correctDeficitRatio(r, t, tC)
}

/** The weir is drowned when the tail level stands above the crest (ENGINE.md §13); levels in m on one datum. */
export function isDrowned(tailLevel_m: number, crestLevel_m: number): boolean {
  return tailLevel_m > crestLevel_m
}

/** A drowned weir aerates as a submerged sluice: Butts & Evans (1983) with b = 0.05, H the head-pool to tail difference. */
export function drownedDeficitRatio(a: number, fall_m: number, tC: number): number {
  return Math.max(1, weirDeficitRatio(a, WEIR_SHAPE_B['sluice-gate-submerged'].value, fall_m, tC))
}

/** Inputs of `weirAerationModels`. */
export interface WeirAerationInput {
  /** Fall from head-pool level to tail level, m. */
  fall_m: number
  /** Discharge per metre of crest over the weir, m²/s (`crestDischargePerMetre`). */
  q_m2s: number
  /** Water temperature, °C. */
  tC: number
  /** Butts & Evans water-quality factor a. */
  a: number
  /** Butts & Evans weir-shape factor b. */
  b: number
  /** A measured deficit ratio, if the user has one. */
  measured?: MeasuredDeficitRatio | null
  /** Tail level above the crest (`isDrowned`). */
  drowned: boolean
  /** The model whose figure the results use. */
  chosen: WeirAerationModel
}

/** One model's deficit ratio, with what it stands on. */
export interface WeirModelResult {
  model: WeirAerationModel
  /** Deficit ratio at the water temperature, ≥ 1. */
  r: number
  /** What the figure is, in plain words (e.g. that a drowned weir was taken as a submerged sluice). */
  note: string
}

/** Every applicable model, the chosen one, and the spread between them. */
export interface WeirAerationModels {
  /** The weir was taken as drowned. */
  drowned: boolean
  chosen: WeirModelResult
  all: WeirModelResult[]
  rMin: number
  rMax: number
}

const DROWNED_NOTE = 'weir drowned (tail above crest): taken as a submerged sluice, Butts & Evans (1983) with b = 0.05'

/**
 * The weir's deficit ratio by every applicable model, the chosen one, and the range between them (ENGINE.md §10).
 * Free overfall: Butts & Evans (1983) with the site's a and b; Avery & Novak (1978), flow-dependent; the measured
 * ratio, corrected to T. Drowned: no free jet falls, so Butts & Evans and Avery & Novak both give the submerged-sluice
 * figure, and a measured ratio stands only if it was measured drowned (else the submerged-sluice figure replaces it).
 * Choosing 'measured' without a measurement is refused, naming `measured`.
 */
export function weirAerationModels(input: WeirAerationInput): WeirAerationModels {
  const { fall_m, q_m2s, tC, a, b, measured, drowned, chosen } = input
  const all: WeirModelResult[] = []
  if (drowned) {
    const r = drownedDeficitRatio(a, fall_m, tC)
    all.push({ model: 'butts-evans', r, note: DROWNED_NOTE })
    all.push({ model: 'avery-novak', r, note: `${DROWNED_NOTE}; Avery & Novak (1978) is a relation for a free-falling jet` })
  }
  else {
    all.push({ model: 'butts-evans', r: Math.max(1, weirDeficitRatio(a, b, fall_m, tC)), note: 'Butts & Evans (1983), a and b by class' })
    all.push({ model: 'avery-novak', r: averyNovakDeficitRatio(fall_m, q_m2s, tC), note: 'Avery & Novak (1978), tap-water k, from 15 °C by Gulliver, Thene & Rindels (1990); flow-dependent' })
  }
  if (measured) {
    const usable = !drowned || measured.drowned === true
    all.push(usable
      ? { model: 'measured', r: measuredDeficitRatioAt(measured, tC), note: `measured at ${measured.tC} °C, corrected by Gulliver, Thene & Rindels (1990)` }
      : { model: 'measured', r: drownedDeficitRatio(a, fall_m, tC), note: `${DROWNED_NOTE}; the measurement was taken with the weir free` })
  }
  const picked = all.find(m => m.model === chosen)
  if (!picked) throw new EngineInputError('measured', 'is needed when the chosen weir model is "measured"')
  let rMin = Infinity
  let rMax = -Infinity
  for (const m of all) {
    rMin = Math.min(rMin, m.r)
    rMax = Math.max(rMax, m.r)
  }
  return { drowned, chosen: picked, all, rMin, rMax }
}

/**
 * Oxygen below the weir for the chosen model and the range between models, mg/L: C_d = C_s − (C_s − C_u)/r
 * (definition of r). C_d moves monotonically with r (up toward C_s from below, down toward it from above), so the
 * range is spanned by rMin and rMax.
 */
export function downstreamOxygenRange(Cs: number, Cu: number, models: Pick<WeirAerationModels, 'chosen' | 'rMin' | 'rMax'>): { chosen_mgL: number, min_mgL: number, max_mgL: number } {
  const atMin = downstreamFromDeficitRatio(Cs, Cu, models.rMin)
  const atMax = downstreamFromDeficitRatio(Cs, Cu, models.rMax)
  return { chosen_mgL: downstreamFromDeficitRatio(Cs, Cu, models.chosen.r), min_mgL: Math.min(atMin, atMax), max_mgL: Math.max(atMin, atMax) }
}

// ── The crest's hydraulics ─────────────────────────────────────────────────────────────────────────────────────

/** Crest forms the weir equation distinguishes. */
export type CrestForm = 'sharp-crested' | 'broad-crested' | 'round-crested'

/**
 * Coefficient C_d of the weir equation Q = C_d·L·√(2g)·h^1.5 as ENGINE.md §13 writes it (the 2/3 of the sharp-crested
 * form is inside C_d), by crest form, free flow, approach velocity neglected.
 */
export const WEIR_DISCHARGE_COEFFICIENT: Readonly<Record<CrestForm, SourcedValue>> = {
  'sharp-crested': v(0.62 * (2 / 3), '-', "Q = C·(2/3)·√(2g)·L·h^1.5 with C ≈ 0.62 (common practice; Rehbock's C = 0.611 + 0.08h/P at low h/P, from memory): 0.413, i.e. Q ≈ 1.83·L·h^1.5 in SI, close to Francis's 1.84 (from memory)"),
  'broad-crested': v(0.35, '-', "common practice: Q = 0.35·L·√(2g)·h^1.5 for a flat-topped crest, below the ideal critical-depth value (2/3)^1.5/√2 = 0.385 (in Bos 1989's form Q = C_d·(2/3)·√(2g/3)·L·h^1.5 that is C_d ≈ 0.91)"),
  'round-crested': v(0.49, '-', 'from memory: ogee or rounded crest near its design head, Q ≈ 2.2·L·h^1.5 in SI'),
}

/** The crest form of a Butts & Evans weir-shape class, for the weir equation; null for a sluice gate (not a weir crest). */
export function crestFormOf(shape: WeirShapeClass): CrestForm | null {
  if (shape.startsWith('sharp-crested')) return 'sharp-crested'
  if (shape.startsWith('round-')) return 'round-crested'
  if (shape.startsWith('flat-broad-crested')) return 'broad-crested'
  return null
}

/** Discharge per metre of crest q = Q_over/L, m²/s; refuses a crest of no length, naming `crestLength_m`; negative flow counts as none. */
export function crestDischargePerMetre(flowOverCrest_m3s: number, crestLength_m: number): number {
  const L = checkNumber(crestLength_m, 'crestLength_m', { min: 0, minExclusive: true })
  const Q = checkNumber(flowOverCrest_m3s, 'flowOverCrest_m3s')
  return Math.max(0, Q) / L
}

/** Flow over the crest from the head on it, Q = C_d·L·√(2g)·h^1.5, m³/s (weir equation, ENGINE.md §13). */
export function flowOverCrest(head_m: number, crestLength_m: number, cd: number): number {
  if (!(head_m > 0) || !(crestLength_m > 0) || !(cd > 0)) return 0
  return cd * crestLength_m * Math.sqrt(2 * G) * head_m ** 1.5
}

/** Head over the crest from the flow over it, h = (Q/(C_d·L·√(2g)))^(2/3), m (weir equation inverted); refuses L ≤ 0 or C_d ≤ 0. */
export function headOverCrest(flowOverCrest_m3s: number, crestLength_m: number, cd: number): number {
  const q = crestDischargePerMetre(flowOverCrest_m3s, crestLength_m)
  const c = checkNumber(cd, 'dischargeCoefficient', { min: 0, minExclusive: true })
  return q > 0 ? (q / (c * Math.sqrt(2 * G))) ** (2 / 3) : 0
}
