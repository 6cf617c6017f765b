// The commissioning form's draft, its wording and the choices it offers (components/commissioning/*).
import { MANOMETER_FLUIDS, type CommissioningMeasurement, type ManometerFluid, type OxygenPoint, type Verdict } from '#shared/engine/commissioning'
import type { ReadingUnit } from '#shared/engine/metering'
import type { CommissioningDraft } from '#shared/schemas/commissioning'

/** What the form holds: numbers may be blank (null) or half-typed (NaN) until checked. */
export interface CommissioningFormDraft {
  assessmentId: number | null
  measuredAt: string
  measuredBy: string
  riverFlow_m3s: number | null
  waterTemp_C: number | null
  manometerFluid: ManometerFluid
  manometerDensity_kgm3: number | null
  reading_m: number | null
  readingUnit: ReadingUnit
  upstreamTapDiameter_m: number | null
  dischargeCoefficient: number | null
  upstreamOxygen_mgL: number | null
  downstreamOxygen_mgL: number | null
  oxygenMeasuredAt: OxygenPoint
  notes: string
}

/** A fresh draft against `assessmentId`: mercury read as a column, oxygen at the unit outlet. */
export function emptyCommissioningDraft(assessmentId: number | null): CommissioningFormDraft {
  return {
    assessmentId, measuredAt: '', measuredBy: '', riverFlow_m3s: null, waterTemp_C: null,
    manometerFluid: 'mercury', manometerDensity_kgm3: null, reading_m: null, readingUnit: 'm-of-manometer-fluid',
    upstreamTapDiameter_m: null, dischargeCoefficient: null, upstreamOxygen_mgL: null, downstreamOxygen_mgL: null,
    oxygenMeasuredAt: 'unit-outlet', notes: '',
  }
}

/** The draft as the schema's input (blank numbers stay blank: the schema names them). */
export const asSchemaDraft = (d: CommissioningFormDraft) => d as unknown as CommissioningDraft

/** The measurement the preview computes from, or null while a figure it needs is blank or not a number. */
export function previewMeasurement(d: CommissioningFormDraft): CommissioningMeasurement | null {
  const n = (x: number | null) => (x !== null && Number.isFinite(x) ? x : null)
  const flow = n(d.riverFlow_m3s) ?? 0
  const t = n(d.waterTemp_C)
  const h = n(d.reading_m)
  const cu = n(d.upstreamOxygen_mgL)
  const cd = n(d.downstreamOxygen_mgL)
  const rho = d.manometerFluid === 'custom' ? n(d.manometerDensity_kgm3) : MANOMETER_FLUIDS[d.manometerFluid].value
  if (t === null || h === null || cu === null || cd === null || rho === null) return null
  return {
    measuredAt: d.measuredAt, riverFlow_m3s: flow, waterTemp_C: t, manometerFluid: d.manometerFluid, manometerDensity_kgm3: rho,
    reading_m: h, readingUnit: d.readingUnit, upstreamTapDiameter_m: n(d.upstreamTapDiameter_m), dischargeCoefficient: n(d.dischargeCoefficient),
    upstreamOxygen_mgL: cu, downstreamOxygen_mgL: cd, oxygenMeasuredAt: d.oxygenMeasuredAt,
  }
}

/** The manometer fluids offered, with their densities and origins. */
export const FLUID_CHOICES: { value: ManometerFluid; label: string }[] = [
  ...(Object.entries(MANOMETER_FLUIDS) as [Exclude<ManometerFluid, 'custom'>, (typeof MANOMETER_FLUIDS)['mercury']][])
    .map(([value, f]) => ({ value, label: `${f.label}: ${f.value.toLocaleString('en-GB')} kg/m³` })),
  { value: 'custom', label: 'Another fluid: enter its density' },
]

export const READING_UNIT_CHOICES: { value: ReadingUnit; label: string }[] = [
  { value: 'm-of-manometer-fluid', label: 'm of manometer fluid (the column difference as read)' },
  { value: 'm-of-water', label: 'm of water (a head already converted)' },
]

export const OXYGEN_POINT_CHOICES: { value: OxygenPoint; label: string }[] = [
  { value: 'unit-outlet', label: 'At the unit outlet (before mixing)' },
  { value: 'below-weir', label: 'Below the weir, after mixing with the spill' },
]

/** Cautions beside the fields where a person takes the reading (PRODUCT.md, "Cautions the product shows"). */
export const COMMISSIONING_CAUTIONS = {
  manometer: 'The throat tappings and the air shaft are confined spaces: suction can trap a person. Read the manometer from outside the shaft with the units shut or the tappings valved off, never alone, and never enter the shaft without a confined-space permit and gas test.',
  mercury: 'Mercury is toxic: keep the manometer in a tray, and never let it spill into the river.',
  oxygen: 'Sampling below the weir means working beside the river: the recirculating jump below a low weir drowns people. Sample from the bank or a platform with a throw line to hand, wear a life jacket, and watch for sudden rises in flow.',
}

/** "performs as assessed", "12 % below the assessment", "not comparable". */
export function verdictLabel(v: Verdict): string {
  if (v.kind === 'as-assessed') return 'performs as assessed'
  if (v.kind === 'not-comparable') return 'not comparable'
  return `${v.kind} by ${Math.round(Math.abs(v.difference) * 100)} %`
}
