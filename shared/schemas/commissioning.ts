// Commissioning records: measurements on a built scheme set against the stored assessment they
// check. Shared by server/api/sites/[id]/commissioning*, server/api/commissioning/[id], the
// commissioning form and its preview. Keep the exported names stable: the UI imports them.
import { z } from 'zod'
import { MANOMETER_FLUIDS, type CommissioningMeasurement, type CommissioningResult, type ManometerFluid, type OxygenPoint, type Verdict } from '../engine/commissioning'
import type { ReadingUnit } from '../engine/metering'
import { IdSchema } from './common'

export const MANOMETER_FLUID_IDS = ['mercury', 'gauge-oil', 'water', 'custom'] as const satisfies readonly ManometerFluid[]
export const READING_UNITS = ['m-of-manometer-fluid', 'm-of-water'] as const satisfies readonly ReadingUnit[]
export const OXYGEN_POINTS = ['unit-outlet', 'below-weir'] as const satisfies readonly OxygenPoint[]
export const COMMISSIONING_NOTES_MAX = 4000
/** Densities within this band of water's cannot read a differential of water: the columns would not move. */
const NEAR_WATER_KGM3 = { min: 950, max: 1050 }

const num = z.number({ error: 'must be a number' })
const oxygen = num.min(0, 'must be 0 or more').max(30, 'must be 30 mg/L or less')

/** A date-time as a person writes it (`2027-05-12T10:30`, seconds and an offset optional), between 1900 and a day from now. */
const MeasuredAtSchema = z
  .string({ error: 'is required' })
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?(Z|[+-]\d{2}:\d{2})?$/, 'must be a date and time such as 2027-05-12T10:30')
  .refine((s) => {
    const t = Date.parse(/Z|[+-]\d{2}:\d{2}$/.test(s) ? s : `${s}Z`)
    return Number.isFinite(t) && t >= Date.UTC(1900, 0, 1) && t <= Date.now() + 36 * 3600 * 1000
  }, 'must be a real date and time, not in the future')

/** Body of POST /api/sites/[id]/commissioning. The option is the assessment's own. */
export const CommissioningInputSchema = z
  .object({
    assessmentId: IdSchema,
    measuredAt: MeasuredAtSchema,
    measuredBy: z.string({ error: 'is required' }).trim().min(1, 'is required: who took the readings').max(120, 'is too long (120 characters at most)'),
    riverFlow_m3s: num.positive('must be more than 0').max(1_000_000, 'must be 1,000,000 m³/s or less'),
    waterTemp_C: num.min(0, 'must be 0 °C or more').max(40, 'must be 40 °C or less'),
    manometerFluid: z.enum(MANOMETER_FLUID_IDS, { error: `must be one of ${MANOMETER_FLUID_IDS.join(', ')}` }),
    /** Only read for a custom fluid; a named fluid takes its table density. */
    manometerDensity_kgm3: num.positive('must be more than 0').max(25_000, 'must be 25,000 kg/m³ or less').nullable().optional(),
    reading_m: num.positive('must be more than 0').max(20, 'must be 20 m or less'),
    readingUnit: z.enum(READING_UNITS, { error: `must be one of ${READING_UNITS.join(', ')}` }).default('m-of-manometer-fluid'),
    upstreamTapDiameter_m: num.positive('must be more than 0').max(20, 'must be 20 m or less').nullable().default(null),
    dischargeCoefficient: num.positive('must be more than 0').max(1, 'must be 1 or less').nullable().default(null),
    upstreamOxygen_mgL: oxygen,
    downstreamOxygen_mgL: oxygen,
    oxygenMeasuredAt: z.enum(OXYGEN_POINTS, { error: `must be one of ${OXYGEN_POINTS.join(', ')}` }),
    notes: z.string({ error: 'must be text' }).trim().max(COMMISSIONING_NOTES_MAX, `is too long (${COMMISSIONING_NOTES_MAX.toLocaleString('en-GB')} characters at most)`).default(''),
  })
  .superRefine((v, ctx) => {
    if (v.manometerFluid !== 'custom') return
    const rho = v.manometerDensity_kgm3
    if (rho === null || rho === undefined) {
      ctx.addIssue({ code: 'custom', path: ['manometerDensity_kgm3'], message: 'is required for a custom manometer fluid' })
    } else if (rho > NEAR_WATER_KGM3.min && rho < NEAR_WATER_KGM3.max) {
      ctx.addIssue({ code: 'custom', path: ['manometerDensity_kgm3'], message: `must be below ${NEAR_WATER_KGM3.min} or above ${NEAR_WATER_KGM3.max} kg/m³: a fluid as dense as water shows no differential` })
    }
  })
  .transform((v) => ({
    ...v,
    manometerDensity_kgm3: v.manometerFluid === 'custom' ? v.manometerDensity_kgm3! : MANOMETER_FLUIDS[v.manometerFluid].value,
  }))
export type CommissioningInput = z.infer<typeof CommissioningInputSchema>
/** What the form holds before parsing. */
export type CommissioningDraft = z.input<typeof CommissioningInputSchema>

/** Route parameters of DELETE /api/commissioning/[id]. */
export const CommissioningParamsSchema = z.object({ id: IdSchema })

/** One stored commissioning record: the measurement as the engine takes it, and who, which assessment and what came of it. */
export interface CommissioningRecordDto extends CommissioningMeasurement {
  id: number
  siteId: number
  optionId: number | null
  optionName: string | null
  assessmentId: number | null
  measuredBy: string
  enteredBy: { id: number; name: string } | null
  notes: string
  /** The figures and verdicts as computed when it was stored, with that engine's version. */
  result: CommissioningResult
  engineVersion: string
  createdAt: string
}

/** An assessment a record may be checked against, with what the form's preview needs of it. */
export interface CommissioningBasisDto {
  assessmentId: number
  optionId: number
  optionName: string
  createdAt: string
  engineVersion: string
  units: number
  throatDiameter_m: number
  /** The option's discharge (flow) coefficient, as its assessment used it. */
  dischargeCoefficient: number
  altitude_m: number
  salinity_gkg: number
}

/** GET /api/sites/[id]/commissioning: the site's records (newest measurement first) and the assessments to check against. */
export interface CommissioningListDto {
  records: CommissioningRecordDto[]
  assessments: CommissioningBasisDto[]
}

/** The latest record in a line, for the reviewer's brief and the landowner summary. */
export interface CommissioningLine {
  measuredAt: string
  measuredBy: string
  flow: Verdict
  oxygen: Verdict
  /** Plain words: "Measured on 12 May 2027: performs as assessed". */
  sentence: string
}
