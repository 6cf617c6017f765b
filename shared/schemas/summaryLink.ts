// Summary links: revocable, expiring, unguessable links to a read-only landowner summary of one site.
// Shared by server/api/sites/[id]/summary-links*, server/api/summary-links/**,
// server/api/orgs/[orgId]/summary-links*, server/api/public/summary/[token], the sharing form and /s/[token].
// Keep the exported names stable: the UI imports them.
import { z } from 'zod'
import type { MoneySummary, StoredMoney } from '../engine/money'
import { IdSchema, fromDigits } from './common'
import type { Currency } from './organisation'
import type { ReviewState } from './review'
import type { Reach } from './site'
import type { BaselineLine } from '../engine/results'

export const SUMMARY_LINK_DAYS_DEFAULT = 30
export const SUMMARY_LINK_DAYS_MAX = 365
export const SUMMARY_LINK_NOTE_MAX = 500

/**
 * Energy use of one home a year, kWh, for the homes-equivalent figure. Illustrative: a round figure
 * of the order of an average household's electricity use, not a measured value for any place.
 */
export const HOME_KWH_PER_YEAR = 2700

/** The landowner page a summary link opens. */
export const summaryPath = (token: string) => `/s/${encodeURIComponent(token)}`

/** Body of POST /api/sites/[id]/summary-links. */
export const SummaryLinkInputSchema = z.object({
  expiresIn_d: z.coerce
    .number({ error: 'must be a number' })
    .int('must be a whole number of days')
    .min(1, 'must be 1 day or more')
    .max(SUMMARY_LINK_DAYS_MAX, `must be ${SUMMARY_LINK_DAYS_MAX} days or fewer`)
    .default(SUMMARY_LINK_DAYS_DEFAULT),
  note: z.string({ error: 'must be text' }).trim().max(SUMMARY_LINK_NOTE_MAX, `is too long (${SUMMARY_LINK_NOTE_MAX} characters at most)`).optional(),
})
export type SummaryLinkInput = z.infer<typeof SummaryLinkInputSchema>
/** What the form holds before parsing. */
export type SummaryLinkDraft = z.input<typeof SummaryLinkInputSchema>

/** Route parameters of /api/sites/[id]/summary-links and DELETE /api/summary-links/[id]. */
export const SummaryLinkParamsSchema = z.object({ id: IdSchema })

/** Query of GET /api/orgs/[orgId]/summary-links. */
export const SummaryLinkListQuerySchema = z.object({
  state: z.enum(['active', 'expired', 'revoked'], { error: 'must be one of active, expired, revoked' }).optional(),
  page: fromDigits(z.number().int().min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(z.number().int().min(1, 'must be 1 or more').max(200, 'must be 200 or less')).default(50),
})

export type SummaryLinkState = 'active' | 'expired' | 'revoked'

/** One summary link as its site's engineers and the organisation's admins see it (never its token). */
export interface SummaryLinkDto {
  id: number
  siteId: number
  siteName: string
  note: string | null
  state: SummaryLinkState
  createdAt: string
  expiresAt: string
  revokedAt: string | null
  viewCount: number
  lastViewedAt: string | null
  createdBy: { id: number; name: string } | null
}

/** Response of POST /api/sites/[id]/summary-links: the only time the token is shown. */
export interface SummaryLinkCreatedDto extends SummaryLinkDto {
  token: string
  /** `/s/<token>`. */
  path: string
  /** The whole link, from NUXT_PUBLIC_APP_URL. */
  url: string
}

/** GET /api/sites/[id]/summary-links and GET /api/orgs/[orgId]/summary-links. */
export interface SummaryLinkListDto {
  page: number
  pageSize: number
  total: number
  links: SummaryLinkDto[]
}

/** GET /api/public/summary/[token]: the landowner summary, and nothing else (no ids, no e-mail addresses). */
export interface PublicSummaryDto {
  site: {
    name: string
    riverName: string
    location: { lat: number; lng: number }
    reach: Reach | null
    grossHead_m: number
  }
  /** What would be built, from the assessment shown; null when the site has no assessment yet. */
  scheme: {
    optionName: string
    units: number
    throatDiameter_m: number
    outletDiameter_m: number
    /** One or two sentences in plain words. */
    description: string
  } | null
  /** Which assessment the figures come from. */
  basis: { kind: 'under-review' | 'latest'; assessedAt: string; engineVersion: string } | null
  energy: {
    annualEnergy_MWh: number
    homesEquivalent: number
    annualUsePerHome_kWh: number
    /** Plain-language assumption behind the homes figure. */
    assumption: string
    source: 'illustrative'
    /** A conventional turbine at the same weir, for the one plain line beside the scheme's energy; null for a run stored before it. */
    baseline: BaselineLine | null
  } | null
  /** What it would cost and whether it pays at the export price, in the organisation's currency. */
  money: (StoredMoney & Pick<MoneySummary, 'pays' | 'shortfalls' | 'breakEvenPrice'> & { currency: Currency }) | null
  /** Oxygen in the river below the weir by month, mg/L. */
  river: {
    target_mgL: number
    months: { month: number; name: string; without_mgL: number; with_mgL: number; target_mgL: number }[]
    /** Plain words: the summer low-flow gain. */
    summary: string
    /** Plain words on how the fall at the weir changes with the river, when heads come from the weir's hydraulics (absent before it). */
    weirHeads?: string | null
    /** Plain words: what always stays in the river under the flow rules; absent for a run stored before them. */
    whatStays?: string
  } | null
  /** How sure the energy and oxygen figures are, in plain sentences made from the numbers beside them; null when the site has no assessment yet. */
  howSure: {
    /** Annual energy made at least in 9 years of 10 of the daily flow record, MWh; null without 9 complete years. */
    recordP90Energy_MWh: number | null
    /** Annual energy made at least in 9 of 10 draws of the uncertain inputs (an average year), MWh; null when no draws ran. */
    energyP90_MWh: number | null
    /** Share of the draws (0–1) whose worst month loses more oxygen than the acceptable loss; null when no draws ran. */
    netLossProbability: number | null
    /** The plain sentences; empty when there is nothing to say. */
    sentences: string[]
  } | null
  review: {
    state: ReviewState
    stateLabel: string
    /** The reviewer's reason, once decided. */
    decisionText: string | null
    conditions: string | null
    decidedAt: string | null
  }
  /** Safety and screening cautions, plus any raised safety flag in plain words. */
  cautions: { title: string; text: string }[]
  contact: { organisationName: string; preparedBy: string | null }
  expiresAt: string
  /** The site's consents list in one plain line ("Permissions: 3 of 10 granted, 2 applied for, 1 refused (flood-risk permit)"), and the gauging-station warning; null when the sources gave none. */
  permissions: { line: string; gaugingWarning: string | null } | null
  /** The latest commissioning record in one plain line ("Measured on 12 May 2027: performs as assessed"); null before the scheme is measured. */
  commissioning: string | null
}
