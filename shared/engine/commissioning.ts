// Commissioning check: what a built unit was measured doing, set against what its stored assessment
// said it would do at the same conditions. Three parts: the unit's flow from a manometer on its
// throat differential (ISO 5167-1/-4 through metering.ts), the share of the oxygen deficit the water
// lost on its way through (measured upstream and downstream), and the comparison with the engine's
// own state at that one river flow, temperature and upstream oxygen.
import type { AssessInput } from '../schemas/assess'
import { isaPressure } from './atmosphere'
import { EngineInputError } from './errors'
import type { SourcedValue } from './defaults'
import { flowFromDifferential, manometerDifferential, type ReadingUnit } from './metering'
import { oxygenSaturation } from './oxygenSaturation'
import { basisScheme, runBasis } from './runBasis'
import { flowState } from './scheme'
import { constrictionDefaults } from './venturi'
import { waterDensity } from './water'
import { G } from './constants'

/** The manometer fluids offered, with their densities. */
export type ManometerFluid = 'water' | 'mercury' | 'gauge-oil' | 'custom'

/**
 * Density of the fluid that meets the water in the manometer, kg/m³. "Water" means the columns are
 * the flowing water itself, with air above (two piezometer tubes, or an air-over-water inverted
 * U-tube): the other fluid is air. A fluid lighter than water sits above it in an inverted U-tube.
 */
export const MANOMETER_FLUIDS: Readonly<Record<Exclude<ManometerFluid, 'custom'>, SourcedValue & { label: string }>> = {
  'water': { label: 'Water columns, air above (piezometer tubes or an inverted U-tube)', value: 1.204, unit: 'kg/m³', source: 'dry air at 20 °C and 101.325 kPa from the ideal-gas law (R = 287.05 J/(kg·K)); its weight barely matters' },
  'mercury': { label: 'Mercury (U-tube below the meter)', value: 13546, unit: 'kg/m³', source: 'mercury at 20 °C, CRC Handbook of Chemistry and Physics (from memory)' },
  'gauge-oil': { label: 'Light gauge oil (inverted U-tube above the meter)', value: 827, unit: 'kg/m³', source: 'from memory: red gauge oil of specific gravity about 0.827; read the bottle' },
}

/** How far a measured figure may sit from the assessed one and still "perform as assessed", as a fraction. */
export const AS_ASSESSED_TOLERANCE: SourcedValue = {
  value: 0.1, unit: '-', source: 'illustrative: about the spread of a field manometer reading, the discharge coefficient and two oxygen probes together',
}

/** Where the downstream oxygen was measured. */
export type OxygenPoint = 'unit-outlet' | 'below-weir'

/** A measured unit flow from a manometer reading. */
export interface ManometerFlowInput {
  /** The reading, in `readingUnit`. */
  reading_m: number
  readingUnit: ReadingUnit
  /** Density of the manometer fluid meeting the water, kg/m³ (MANOMETER_FLUIDS, or the one measured). */
  manometerDensity_kgm3: number
  /** Whether the fluid chosen was plain water columns (no other liquid): a head in metres of water then needs no warning. */
  manometerFluid: ManometerFluid
  waterTemp_C: number
  throatDiameter_m: number
  /** Bore at the upstream pressure tap, m; null when the tap is in the head pool (approach velocity negligible, β = 0). */
  upstreamTapDiameter_m: number | null
  dischargeCoefficient: number
}

/** The measured unit flow and what it stands on. */
export interface ManometerFlow {
  differential_Pa: number
  flow_m3s: number
  beta: number
  warnings: string[]
}

/**
 * Unit flow from a throat-differential reading (ISO 5167-1:2003 eq. 1 with ε = 1 for a liquid;
 * ISO 5167-4:2003 for the classical venturi): Δp = |ρ_m − ρ|·g·h for a column of manometer fluid
 * (hydrostatics; a fluid lighter than water reads in an inverted U-tube, so ρ − ρ_m), Δp = ρ·g·h for a
 * head in metres of water, then Q = C·A_t·√(2Δp/(ρ(1 − β⁴))). Warns when a head "in metres of water"
 * was read on another fluid (ENGINE.md §2).
 */
export function manometerFlow(m: ManometerFlowInput): ManometerFlow {
  const rho = waterDensity(m.waterTemp_C)
  const warnings: string[] = []
  let dp: number
  if (m.readingUnit === 'm-of-water') {
    dp = rho * G * m.reading_m
    if (m.manometerFluid !== 'water') {
      const asColumn = Math.abs(manometerDifferential(m.reading_m, m.manometerDensity_kgm3, rho))
      warnings.push(
        `The reading was entered in metres of water, but the manometer holds a fluid of ${Math.round(m.manometerDensity_kgm3).toLocaleString('en-GB')} kg/m³. `
        + `If ${m.reading_m} m is the column read on that fluid, the differential is ${(asColumn / 1000).toFixed(2)} kPa, not ${(dp / 1000).toFixed(2)} kPa: enter it as metres of manometer fluid.`,
      )
    }
  } else {
    dp = Math.abs(manometerDifferential(m.reading_m, m.manometerDensity_kgm3, rho))
  }
  const D = m.upstreamTapDiameter_m
  if (D !== null && !(D > m.throatDiameter_m)) {
    throw new EngineInputError('upstreamTapDiameter_m', `must be larger than the unit's throat (${m.throatDiameter_m} m): the upstream tap sits where the bore is wider`)
  }
  const beta = D !== null && D > 0 ? m.throatDiameter_m / D : 0
  // flowFromDifferential takes β from the two diameters; a tap in the head pool is an infinite bore.
  const flow = flowFromDifferential(m.dischargeCoefficient, m.throatDiameter_m, D ?? Number.POSITIVE_INFINITY, dp, rho)
  return { differential_Pa: dp, flow_m3s: flow, beta, warnings }
}

/** Measured oxygen either side of the unit, and where the site is. */
export interface OxygenTransferInput {
  upstreamOxygen_mgL: number
  downstreamOxygen_mgL: number
  waterTemp_C: number
  altitude_m: number
  salinity_gkg: number
}

/** The share of the oxygen deficit the water lost, measured. */
export interface OxygenTransfer {
  /** C_s at the measured temperature and the site's pressure, mg/L. */
  saturation_mgL: number
  /** Fraction of the upstream deficit closed, E = (C_d − C_u)/(C_s − C_u). */
  deficitClosed: number
  /** Deficit ratio r = (C_s − C_u)/(C_s − C_d) = 1/(1 − E); null when the water reached or passed saturation. */
  deficitRatio: number | null
  warnings: string[]
}

/**
 * The fraction of the oxygen deficit closed between two measurements, E = (C_d − C_u)/(C_s − C_u),
 * and the deficit ratio r = 1/(1 − E) (the weir-aeration literature's r, e.g. Butts & Evans 1983),
 * with C_s by Benson & Krause (1984) at the measured temperature and the site's ISA pressure.
 * Refuses an upstream at or above saturation: there is no deficit to close, so E means nothing.
 */
export function oxygenTransfer(m: OxygenTransferInput): OxygenTransfer {
  const cs = oxygenSaturation(m.waterTemp_C, isaPressure(m.altitude_m), m.salinity_gkg)
  const deficit = cs - m.upstreamOxygen_mgL
  if (!(deficit > 0.05)) {
    throw new EngineInputError('upstreamOxygen_mgL', `is at or above saturation (${cs.toFixed(2)} mg/L at ${m.waterTemp_C} °C and the site's pressure): there is no oxygen deficit for the unit to close, so the transfer cannot be measured this way`)
  }
  const E = (m.downstreamOxygen_mgL - m.upstreamOxygen_mgL) / deficit
  const warnings: string[] = []
  if (m.downstreamOxygen_mgL > cs) warnings.push(`The downstream oxygen is above saturation (${cs.toFixed(2)} mg/L): the water is supersaturated, so dissolved gas may harm fish; check the probe too.`)
  if (E < 0) warnings.push('The downstream oxygen is below the upstream: the water lost oxygen on its way through.')
  return { saturation_mgL: cs, deficitClosed: E, deficitRatio: E < 1 ? 1 / (1 - E) : null, warnings }
}

/** A measured figure against the assessed one. */
export type Verdict =
  | { kind: 'as-assessed'; difference: number }
  | { kind: 'below' | 'above'; difference: number }
  | { kind: 'not-comparable'; reason: string }

/** Measured against assessed: within the tolerance "performs as assessed", else below or above by the relative difference. */
export function verdictOf(measured: number, assessed: number, tolerance = AS_ASSESSED_TOLERANCE.value): Verdict {
  if (!(assessed > 1e-9)) return { kind: 'not-comparable', reason: 'the assessment expects nothing here to compare with' }
  const difference = measured / assessed - 1
  if (Math.abs(difference) <= tolerance + 1e-12) return { kind: 'as-assessed', difference }
  return { kind: difference < 0 ? 'below' : 'above', difference }
}

/** The measurement as a commissioning record holds it. */
export interface CommissioningMeasurement {
  /** When it was measured (ISO date-time): its calendar month decides closed months. */
  measuredAt: string
  riverFlow_m3s: number
  waterTemp_C: number
  manometerFluid: ManometerFluid
  manometerDensity_kgm3: number
  reading_m: number
  readingUnit: ReadingUnit
  upstreamTapDiameter_m: number | null
  /** C of the unit; null for the option's own flow coefficient (the one its assessment used). */
  dischargeCoefficient: number | null
  upstreamOxygen_mgL: number
  downstreamOxygen_mgL: number
  oxygenMeasuredAt: OxygenPoint
}

/** What the assessment said at the measured conditions. */
export interface AssessedAtMeasurement {
  unitsRunning: number
  unitFlow_m3s: number
  /** Downstream oxygen at the point measured (unit outlet, or mixed below the weir), mg/L. */
  downstreamOxygen_mgL: number
  deficitClosed: number | null
  saturation_mgL: number
}

/** A whole commissioning check: the measured figures, the assessed ones and the verdicts. */
export interface CommissioningResult {
  measured: { flow: ManometerFlow; dischargeCoefficient: number; oxygen: OxygenTransfer }
  assessed: AssessedAtMeasurement
  flowVerdict: Verdict
  oxygenVerdict: Verdict
  tolerance: number
  warnings: string[]
}

/** The option's discharge coefficient: its flow coefficient, or its constriction type's default (what the assessment used). */
export function optionDischargeCoefficient(option: AssessInput['option']): number {
  return option.flowCoefficient ?? constrictionDefaults(option.constriction).flowCoefficient
}

/** The measured flow and transfer alone, from the option and site a record is checked against (the browser's preview). */
export function measuredFigures(m: CommissioningMeasurement, at: { throatDiameter_m: number; dischargeCoefficient: number; altitude_m: number; salinity_gkg: number }): CommissioningResult['measured'] {
  const C = m.dischargeCoefficient ?? at.dischargeCoefficient
  const flow = manometerFlow({
    reading_m: m.reading_m, readingUnit: m.readingUnit, manometerDensity_kgm3: m.manometerDensity_kgm3, manometerFluid: m.manometerFluid,
    waterTemp_C: m.waterTemp_C, throatDiameter_m: at.throatDiameter_m, upstreamTapDiameter_m: m.upstreamTapDiameter_m, dischargeCoefficient: C,
  })
  const oxygen = oxygenTransfer({
    upstreamOxygen_mgL: m.upstreamOxygen_mgL, downstreamOxygen_mgL: m.downstreamOxygen_mgL, waterTemp_C: m.waterTemp_C,
    altitude_m: at.altitude_m, salinity_gkg: at.salinity_gkg,
  })
  return { flow, dischargeCoefficient: C, oxygen }
}

/** Calendar month 1–12 of an ISO date-time, as written (the measurement's local date). */
function monthOf(iso: string): number {
  const m = Number(iso.slice(5, 7))
  return m >= 1 && m <= 12 ? m : 0
}

/**
 * The check of one measurement against a stored assessment's input: the measured figures, and the
 * engine's state at the measured river flow with the measured temperature and upstream oxygen in the
 * measured month (flowState, under the option's operating rule), read at the point the oxygen was
 * measured (the units' outlet by the summary's method, or mixed below the weir).
 */
export function commissioningCheck(input: AssessInput, m: CommissioningMeasurement): CommissioningResult {
  const o = input.option
  const measured = measuredFigures(m, {
    throatDiameter_m: o.throatDiameter_m, dischargeCoefficient: optionDischargeCoefficient(o),
    altitude_m: input.site.altitude_m, salinity_gkg: input.site.salinity_gkg,
  })
  const basis = runBasis(input)
  const s = basisScheme(input, basis)
  const fs = flowState(s, m.riverFlow_m3s, { month: monthOf(m.measuredAt), tC: m.waterTemp_C, upstreamO2_mgL: m.upstreamOxygen_mgL })
  const ox = fs.oxygen
  const unitOutlet = input.settings.oxygenMethod === 'field-transfer' ? ox.unitFieldTransfer_mgL : ox.unitBubbleModel_mgL
  const down = m.oxygenMeasuredAt === 'unit-outlet' ? unitOutlet : ox.withScheme_mgL
  const deficit = ox.saturation_mgL - m.upstreamOxygen_mgL
  const assessed: AssessedAtMeasurement = {
    unitsRunning: fs.unitsRunning,
    unitFlow_m3s: fs.unitsRunning > 0 ? fs.unitFlow_m3s : 0,
    downstreamOxygen_mgL: down,
    deficitClosed: deficit > 0 && fs.unitsRunning > 0 ? (down - m.upstreamOxygen_mgL) / deficit : null,
    saturation_mgL: ox.saturation_mgL,
  }
  const warnings = [...measured.flow.warnings, ...measured.oxygen.warnings]
  const shut = fs.unitsRunning === 0
  const shutReason = 'the assessment has every unit shut at this river flow and month, so it expects no flow through a unit to compare with'
  const flowVerdict: Verdict = shut ? { kind: 'not-comparable', reason: shutReason } : verdictOf(measured.flow.flow_m3s, assessed.unitFlow_m3s)
  const oxygenVerdict: Verdict = shut || assessed.deficitClosed === null
    ? { kind: 'not-comparable', reason: shutReason }
    : verdictOf(measured.oxygen.deficitClosed, assessed.deficitClosed)
  if (shut) warnings.push('At the measured river flow and month the assessment keeps every unit shut: check the flow and the date.')
  return { measured, assessed, flowVerdict, oxygenVerdict, tolerance: AS_ASSESSED_TOLERANCE.value, warnings }
}

/** A verdict in words: "performs as assessed", "below the assessment by 12 %". */
export function verdictWords(v: Verdict): string {
  if (v.kind === 'not-comparable') return `not comparable: ${v.reason}`
  if (v.kind === 'as-assessed') return 'performs as assessed'
  return `${v.kind} the assessment by ${Math.round(Math.abs(v.difference) * 100)} %`
}
