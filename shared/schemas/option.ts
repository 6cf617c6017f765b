// Stored design options, stored assessments, the design sweep of an option, the portfolio and the
// comparison. Shared by the server routes (server/api/options, server/api/assessments,
// server/api/sites/[id]/options, server/api/orgs/[orgId]/portfolio, server/api/compare) and the forms.
// Keep the exported names stable: the UI imports them.
// Longer than most files: options, assessments, sweep, portfolio and compare share their DTOs here.
import { z } from 'zod'
import type { AssessResult, FlagId } from '../engine/results'
import type { SweepResult } from '../engine/sweep'
import {
  OptionInputSchema as EngineOptionSchema,
  SettingsInputSchema,
  SweepGridSchema,
  type AssessInput,
} from './assess'
import { IdSchema, NameSchema, fromDigits } from './common'
import { REVIEW_STATES, type ReviewState } from './review'

export { EngineOptionSchema }

const NotesSchema = z.string({ error: 'must be text' }).max(10_000, 'is too long (10,000 characters at most)')
const VersionSchema = z
  .number({ error: (iss) => (iss.input === undefined ? 'is required (the version you last read)' : 'must be a number') })
  .int('must be a whole number')
  .min(1, 'must be 1 or more')

// ——— options ———

// The fields without defaults, so the patch schema never fills in a field the caller left out.
const optionFields = {
  name: NameSchema,
  notes: NotesSchema,
  /** The design: the engine's option (units, throat, outlet, submergence, air pipe, turbine, costs). */
  design: EngineOptionSchema,
  /** Engine settings for this option's assessments; every one has a default with its origin. */
  settings: SettingsInputSchema,
}

/** Body of POST /api/sites/[id]/options. Unknown keys are dropped; defaults are filled in and stored. */
export const OptionInputSchema = z.object({
  ...optionFields,
  notes: optionFields.notes.default(''),
  settings: optionFields.settings.prefault({}),
})
export type OptionInput = z.infer<typeof OptionInputSchema>
/** What a form holds before parsing (defaults not yet filled in). */
export type OptionInputDraft = z.input<typeof OptionInputSchema>
/** The engine's option as stored (defaults filled in). */
export type OptionDesign = z.infer<typeof EngineOptionSchema>
/** The engine settings as stored (defaults filled in). */
export type OptionSettings = z.infer<typeof SettingsInputSchema>

/**
 * Body of PATCH /api/options/[id]: any top-level field (each replaces the stored one whole, e.g. the
 * whole design), plus the `version` last read; a stale version answers 409.
 */
export const OptionPatchSchema = z.object(optionFields).partial().extend({ version: VersionSchema })
export type OptionPatch = z.infer<typeof OptionPatchSchema>

export const OptionParamsSchema = z.object({ id: IdSchema })

/** GET /api/options/[id]; one item of GET /api/sites/[id]/options. */
export interface OptionDto {
  id: number
  siteId: number
  orgId: number
  name: string
  notes: string
  design: OptionDesign
  settings: OptionSettings
  /** Send it back with PATCH; it rises by one with every change. */
  version: number
  createdAt: string
  updatedAt: string
  createdBy: { id: number; name: string } | null
  /** The newest stored assessment of this option, or null. */
  latestAssessment: AssessmentDto | null
}

/** GET /api/sites/[id]/options (live options, oldest first). */
export interface OptionListDto {
  siteId: number
  options: OptionDto[]
}

// ——— assessments ———

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
export const ASSESSMENT_TABLES = ['perFlow', 'months', 'summary'] as const
export type AssessmentTable = (typeof ASSESSMENT_TABLES)[number]

const EXPORT_FILES = ASSESSMENT_TABLES.map((t) => `${t}.csv` as const) as [`${AssessmentTable}.csv`, ...`${AssessmentTable}.csv`[]]

/** Route parameters of GET /api/assessments/[id]/export/[table].csv (the last segment is `perFlow.csv`, `months.csv` or `summary.csv`). */
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
  annualEnergyMWh: number
  capacityFactor: number
  ratedPowerKw: number
  /** Null when the units never run. */
  minCavitationMarginM: number | null
  /** Net dissolved-oxygen gain at summer low flow, mg/L. */
  netOxygenGainSlfMgL: number
  /** Levelised cost, money per MWh; null when no energy. */
  lcoe: number | null
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

// ——— sweep ———

/** Body of POST /api/options/[id]/sweep. */
export const OptionSweepSchema = z.object({ grid: SweepGridSchema })
export type OptionSweep = z.infer<typeof OptionSweepSchema>

/** POST /api/options/[id]/sweep: the engine's sweep over the option at its site. */
export interface OptionSweepDto extends SweepResult {
  optionId: number
  engineVersion: string
}

/** Body of POST /api/options/[id]/sweep/save: a grid point saved as a new option at the same site. */
export const SweepSaveSchema = z.object({
  throatDiameter_m: z.number({ error: 'must be a number' }).positive('must be more than 0').max(10, 'must be 10 m or less'),
  units: z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'needs at least 1 unit').max(50, 'must be 50 or less'),
  throatDepth_m: z.number({ error: 'must be a number' }).min(0, 'must be 0 or more').max(30, 'must be 30 m or less'),
  name: NameSchema,
})
export type SweepSave = z.infer<typeof SweepSaveSchema>

// ——— portfolio ———

/** Columns the portfolio may be sorted by (allow-list). Figures sort with sites never assessed last. */
export const PORTFOLIO_SORTS = [
  'name', 'riverName', 'grossHeadM', 'assessedAt',
  'annualEnergyMWh', 'capacityFactor', 'ratedPowerKw', 'minCavitationMarginM', 'netOxygenGainSlfMgL', 'lcoe', 'flagsRaised',
  'reviewState',
] as const
export type PortfolioSort = (typeof PORTFOLIO_SORTS)[number]

/** Query of GET /api/orgs/[orgId]/portfolio. `format=csv` answers the same rows (all pages) as CSV. */
export const PortfolioQuerySchema = z.object({
  page: fromDigits(z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').max(200, 'must be 200 or less')).default(50),
  sort: z.enum(PORTFOLIO_SORTS, { error: `must be one of ${PORTFOLIO_SORTS.join(', ')}` }).default('name'),
  dir: z.enum(['asc', 'desc'], { error: "must be 'asc' or 'desc'" }).default('asc'),
  /** Text to find in the site or river name (case-insensitive). */
  q: z.string().trim().max(120, 'is too long').optional(),
  /** Exact river name (case-insensitive). */
  river: z.string().trim().max(120, 'is too long').optional(),
  /** `yes`: only sites with an assessment; `no`: only sites without one. */
  assessed: z.enum(['yes', 'no'], { error: "must be 'yes' or 'no'" }).optional(),
  /** Only sites whose review is in this state (a site never submitted is `draft`). */
  reviewState: z.enum(REVIEW_STATES, { error: `must be one of ${REVIEW_STATES.join(', ')}` }).optional(),
  /** `csv`: every matching row as CSV; `map`: every matching row (up to PORTFOLIO_MAP_MAX) as JSON, unpaged. */
  format: z.enum(['json', 'csv', 'map'], { error: "must be 'json', 'csv' or 'map'" }).default('json'),
})

/** Most rows `format=map` answers (the map shows every site; this bounds the answer). */
export const PORTFOLIO_MAP_MAX = 2000
export type PortfolioQuery = z.infer<typeof PortfolioQuerySchema>

/** The headline figures of a site's latest assessment (of any of its live options). */
export interface PortfolioLatest {
  assessmentId: number
  optionId: number
  optionName: string
  assessedAt: string
  engineVersion: string
  stale: boolean
  annualEnergyMWh: number
  capacityFactor: number
  ratedPowerKw: number
  minCavitationMarginM: number | null
  netOxygenGainSlfMgL: number
  lcoe: number | null
  flagsRaised: FlagId[]
}

/** One row of the portfolio. */
export interface PortfolioRow {
  siteId: number
  name: string
  riverName: string
  location: { lat: number; lng: number }
  grossHeadM: number
  /** The site's review state; `draft` when nobody has submitted it. */
  reviewState: ReviewState
  /** Null when no live option of the site has an assessment yet. */
  latest: PortfolioLatest | null
}

/** GET /api/orgs/[orgId]/portfolio. */
export interface PortfolioDto {
  page: number
  pageSize: number
  total: number
  sort: PortfolioSort
  dir: 'asc' | 'desc'
  rows: PortfolioRow[]
}

// ——— comparison ———

/** Most options one comparison may hold. */
export const MAX_COMPARE = 6

/** Query of GET /api/compare: `options=1,2,3` (2 to 6 ids, any sites of the user's organisations). */
export const CompareQuerySchema = z.object({
  options: z
    .string({ error: 'is required (2 to 6 option ids, e.g. options=1,2)' })
    .transform((s) => s.split(',').map((p) => p.trim()).filter((p) => p !== '').map(Number))
    .pipe(
      z
        .array(z.number({ error: 'must be option ids' }).int('must be whole-number ids').positive('must be positive ids'), { error: 'must be option ids' })
        .min(2, 'needs at least 2 option ids')
        .max(MAX_COMPARE, `may hold ${MAX_COMPARE} option ids at most`)
        .refine((ids) => new Set(ids).size === ids.length, 'must not repeat an option'),
    ),
})
export type CompareQuery = z.infer<typeof CompareQuerySchema>

/** One column of the comparison. */
export interface CompareItem {
  option: { id: number; name: string; design: OptionDesign; settings: OptionSettings; version: number }
  site: { id: number; orgId: number; name: string; riverName: string; grossHeadM: number }
  latestAssessment: AssessmentDto | null
}

/** GET /api/compare: in the order asked. */
export interface CompareDto {
  items: CompareItem[]
}

// ——— an organisation's options, grouped by site (the comparison's picker) ———

/** Most sites one page of GET /api/orgs/[orgId]/options holds. */
export const ORG_OPTIONS_MAX_SITES = 200

/** Query of GET /api/orgs/[orgId]/options: pages of live sites, by name. */
export const OrgOptionsQuerySchema = z.object({
  page: fromDigits(z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(
    z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').max(ORG_OPTIONS_MAX_SITES, `must be ${ORG_OPTIONS_MAX_SITES} or less`),
  ).default(ORG_OPTIONS_MAX_SITES),
})
export type OrgOptionsQuery = z.infer<typeof OrgOptionsQuerySchema>

/** One live site of the organisation with its live options (oldest first). */
export interface SiteOptions {
  siteId: number
  siteName: string
  riverName: string
  options: OptionDto[]
}

/** GET /api/orgs/[orgId]/options: one page of live sites by name, each with its live options. */
export interface OrgOptionsDto {
  page: number
  pageSize: number
  /** Live sites of the organisation in all. */
  total: number
  sites: SiteOptions[]
}
