// Comparing options side by side (server/api/compare), and an organisation's options grouped by
// site for the comparison's picker (server/api/orgs/[orgId]/options).
import { z } from 'zod'
import type { BaselineResult } from '../engine/results'
import { fromDigits } from './common'
import type { AssessmentDto } from './assessment'
import type { OptionDesign, OptionDto, OptionSettings } from './option'
import type { Currency } from './organisation'

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
  /** `currency`: the site's organisation's; the option's amounts are in it. */
  site: { id: number; orgId: number; name: string; riverName: string; grossHead_m: number; currency: Currency }
  latestAssessment: AssessmentDto | null
  /** The conventional turbine of the latest assessment; null when none is stored (not assessed, or a run stored before it). */
  baseline: Pick<BaselineResult, 'kindLabel' | 'annualEnergy_MWh' | 'energyGivenUp_MWh' | 'oxygenGainedOverBaseline_mgL' | 'oxygenPerMWhGivenUp' | 'lcoe'> | null
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
