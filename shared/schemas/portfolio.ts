// The portfolio: an organisation's sites with their latest assessment's headline figures and review
// state, sorted, filtered and paged (server/api/orgs/[orgId]/portfolio).
import { z } from 'zod'
import type { FlagId } from '../engine/results'
import { fromDigits } from './common'
import type { Currency } from './organisation'
import { REVIEW_STATES, type ReviewState } from './review'

/** Columns the portfolio may be sorted by (allow-list). Figures sort with sites never assessed last. */
export const PORTFOLIO_SORTS = [
  'name', 'riverName', 'grossHead_m', 'assessedAt',
  'annualEnergy_MWh', 'capacityFactor', 'ratedPower_kW', 'minCavitationMargin_m', 'netOxygenGainSummerLowFlow_mgL', 'lcoe', 'npv', 'capex', 'energyP90_MWh', 'baselineEnergy_MWh', 'flagsRaised',
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
  annualEnergy_MWh: number
  capacityFactor: number
  ratedPower_kW: number
  minCavitationMargin_m: number | null
  netOxygenGainSummerLowFlow_mgL: number
  lcoe: number | null
  /** In the organisation's currency (the answer's `currency`). */
  npv: number | null
  capex: number | null
  /** The Monte Carlo's P50 and P90 annual energy, MWh/yr, and its chance (0–1) of a net oxygen loss in the worst month; null when it did not run. */
  energyP50_MWh: number | null
  energyP90_MWh: number | null
  netLossProbability: number | null
  /** The daily record's P90 year, MWh/yr; null for an entered curve or under 9 complete years. */
  recordP90_MWh: number | null
  /** Annual energy of a conventional turbine at the same weir, MWh/yr; null for a run stored before the baseline. */
  baselineEnergy_MWh: number | null
  flagsRaised: FlagId[]
}

/** One row of the portfolio. */
export interface PortfolioRow {
  siteId: number
  name: string
  riverName: string
  location: { lat: number; lng: number }
  grossHead_m: number
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
  /** The organisation's currency: every amount in the rows is in it. */
  currency: Currency
  rows: PortfolioRow[]
}
