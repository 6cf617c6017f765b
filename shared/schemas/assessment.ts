// Stored assessments: creating one, listing an option's, exporting their tables, and how the routes
// show them (server/api/options/[id]/assessments, server/api/assessments).
import { z } from 'zod'
import type { AssessResult, FlagId } from '../engine/results'
import type { AssessInput } from './assess'
import { IdSchema, fromDigits } from './common'

/**
 * Body of POST /api/options/[id]/assessments (may be empty).
 * `rerunOf` links the new assessment to an older one of the same option (which is kept);
 * `use: 'stored'` re-runs the older one's stored input exactly (on this engine version), `use: 'current'`
 * (the default) builds the input afresh from the site and option as they are now.
 */
export const AssessmentCreateSchema = z
  .object({
    rerunOf: IdSchema.optional(),
    use: z.enum(['current', 'stored'], { error: "must be 'current' or 'stored'" }).default('current'),
  })
  .refine((b) => b.use === 'current' || b.rerunOf !== undefined, { path: ['rerunOf'], message: "is required when use is 'stored'" })
export type AssessmentCreate = z.infer<typeof AssessmentCreateSchema>

export const AssessmentParamsSchema = z.object({ id: IdSchema })

/** Tables of a stored assessment that export as CSV. */
export const ASSESSMENT_TABLES = ['perFlow', 'months', 'summary', 'depletedReach'] as const
export type AssessmentTable = (typeof ASSESSMENT_TABLES)[number]

const EXPORT_FILES = ASSESSMENT_TABLES.map((t) => `${t}.csv` as const) as [`${AssessmentTable}.csv`, ...`${AssessmentTable}.csv`[]]

/** Route parameters of GET /api/assessments/[id]/export/[table].csv (the last segment is `perFlow.csv`, `months.csv`, `summary.csv` or `depletedReach.csv`). */
export const AssessmentExportParamsSchema = z
  .object({
    id: IdSchema,
    file: z.enum(EXPORT_FILES, { error: `must be one of ${EXPORT_FILES.join(', ')}` }),
  })
  .transform(({ id, file }) => ({ id, table: file.slice(0, -'.csv'.length) as AssessmentTable }))

/** Query of GET /api/options/[id]/assessments (newest first). */
export const AssessmentListQuerySchema = z.object({
  page: fromDigits(z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').max(200, 'must be 200 or less')).default(50),
})
export type AssessmentListQuery = z.infer<typeof AssessmentListQuerySchema>

/** One stored assessment without its tables (lists, the option's latest, the portfolio). */
export interface AssessmentDto {
  id: number
  siteId: number
  optionId: number
  /** Engine version the figures were computed with. */
  engineVersion: string
  /** True when engineVersion is not the engine this server runs: re-run it to refresh the figures. */
  stale: boolean
  createdAt: string
  createdBy: { id: number; name: string } | null
  /** Id of the older assessment this one re-ran (kept), or null. */
  supersedes: number | null
  /** Id of the newer assessment that re-ran this one, or null. */
  supersededBy: number | null
  annualEnergy_MWh: number
  capacityFactor: number
  ratedPower_kW: number
  /** Null when the units never run. */
  minCavitationMargin_m: number | null
  /** Net dissolved-oxygen gain at summer low flow, mg/L. */
  netOxygenGainSummerLowFlow_mgL: number
  /** Levelised cost, money per MWh; null when no energy. */
  lcoe: number | null
  /** Capital cost, in the organisation's currency; null only for a stored result that lacked it. */
  capex: number | null
  /** NPV at the export price over the life, in the organisation's currency; null only for a stored result that lacked it. */
  npv: number | null
  /** The Monte Carlo's annual energy exceeded in half and in nine of ten draws, MWh/yr; null when no draws ran or stored before engine 0.3.0. */
  energyP50_MWh: number | null
  energyP90_MWh: number | null
  /** The Monte Carlo's share of draws whose worst month loses more oxygen than the acceptable loss (0–1); null as above. */
  netLossProbability: number | null
  /** The daily record's annual energy exceeded in nine years of ten, MWh/yr; null for an entered curve or under 9 complete years. */
  recordP90_MWh: number | null
  /** Annual energy of a conventional turbine at the same weir, MWh/yr; null for a run stored before the baseline. */
  baselineEnergy_MWh: number | null
  /** Flags raised. */
  flagsRaised: FlagId[]
}

/** GET /api/assessments/[id] and the 201 of POST /api/options/[id]/assessments: as stored, never recomputed. */
export interface AssessmentDetailDto extends AssessmentDto {
  /** The exact engine input used, defaults filled in. */
  input: AssessInput
  result: AssessResult
}

/** GET /api/options/[id]/assessments. */
export interface AssessmentListDto {
  optionId: number
  page: number
  pageSize: number
  total: number
  assessments: AssessmentDto[]
}
