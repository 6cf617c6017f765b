// The review of a site by environmental officers: its states, the submit and decision bodies, the
// comment thread and what GET /api/sites/[id]/review and /review/brief answer. Shared by the server
// routes (server/api/sites/[id]/review/**, server/api/sites/[id]/comments*) and the review forms.
// Keep the exported names stable: the UI imports them.
import type { WeirHeadsLine } from '../utils/weirHeads'
import { z } from 'zod'
import type { MoneySummary, StoredMoney } from '../engine/money'
import type { BaselineLine, FlagId, FlagLevel } from '../engine/results'
import { IdSchema, fromDigits } from './common'
import type { Currency } from './organisation'
import type { ReservedFlow } from './site'
import type { HowSure } from '../utils/howSure'
import { CONSENT_KINDS, type ConsentKind } from '../utils/consents'
import type { ConsentSummaryDto } from './consent'
import type { CommissioningLine } from './commissioning'
import type { Role } from '../utils/roles'

/** Every state a site's review can be in; a site nobody has submitted is `draft`. */
export const REVIEW_STATES = ['draft', 'submitted', 'accepted', 'accepted-with-conditions', 'returned'] as const
export type ReviewState = (typeof REVIEW_STATES)[number]

/** The decisions a reviewer can record on a submitted site. */
export const REVIEW_DECISIONS = ['accepted', 'accepted-with-conditions', 'returned'] as const
export type ReviewDecision = (typeof REVIEW_DECISIONS)[number]

/** Plain-language label of each state, as the UI and the e-mails show it. */
export const REVIEW_STATE_LABELS: Record<ReviewState, string> = {
  draft: 'Not yet submitted',
  submitted: 'Submitted for review',
  accepted: 'Accepted',
  'accepted-with-conditions': 'Accepted with conditions',
  returned: 'Returned for changes',
}

/** Roles that may submit a site for review (and re-submit it after it is returned). */
export const REVIEW_SUBMIT_ROLES = ['admin', 'engineer'] as const satisfies readonly Role[]
/** Roles that may record a decision (a single-site reviewer counts as reviewer on that site). */
export const REVIEW_DECIDE_ROLES = ['admin', 'reviewer'] as const satisfies readonly Role[]
/** Roles that may add to a site's comment thread (viewers read it). */
export const COMMENT_ROLES = ['admin', 'engineer', 'reviewer'] as const satisfies readonly Role[]

/** The page of a site's review, where e-mails link to. */
export const siteReviewPath = (siteId: number) => `/sites/${siteId}?tab=review`

/** The flag ids a comment may point at (the engine's flags). */
export const FLAG_IDS = ['cavitation', 'gas-supersaturation', 'scheme-below-target', 'net-oxygen-loss', 'oxygen-below-target', 'never-runs', 'does-not-pay'] as const satisfies readonly FlagId[]

export const REVIEW_NOTE_MAX = 4000
export const REVIEW_REASON_MAX = 4000
export const REVIEW_CONDITIONS_MAX = 10_000
export const COMMENT_MAX = 5000

const text = (max: number) => z.string({ error: 'must be text' }).trim().max(max, `is too long (${max.toLocaleString('en-GB')} characters at most)`)

/** Route parameters of every /api/sites/[id]/review… and /comments route. */
export const ReviewParamsSchema = z.object({ id: IdSchema })

/** Body of POST /api/sites/[id]/review/submit: the assessment (of this site) to review, and a note. */
export const ReviewSubmitSchema = z.object({
  assessmentId: IdSchema,
  note: text(REVIEW_NOTE_MAX).optional(),
})
export type ReviewSubmitInput = z.infer<typeof ReviewSubmitSchema>

/**
 * Body of POST /api/sites/[id]/review/decision. `reason` is always required; `conditions` is required
 * for `accepted-with-conditions` and refused with any other decision (an empty string counts as none).
 */
export const ReviewDecisionSchema = z
  .object({
    decision: z.enum(REVIEW_DECISIONS, { error: `must be one of ${REVIEW_DECISIONS.join(', ')}` }),
    reason: text(REVIEW_REASON_MAX).min(1, 'is required: say why'),
    conditions: text(REVIEW_CONDITIONS_MAX).optional(),
    /** Permissions of the site's consents list the decision requires granted. */
    requiredConsents: z
      .array(z.enum(CONSENT_KINDS, { error: `must be one of ${CONSENT_KINDS.join(', ')}` }), { error: 'must be a list of consent kinds' })
      .max(CONSENT_KINDS.length, `lists at most ${CONSENT_KINDS.length} kinds`)
      .refine((ks) => new Set(ks).size === ks.length, 'lists a kind twice')
      .default([]),
  })
  .superRefine((v, ctx) => {
    const has = !!v.conditions
    if (v.decision === 'accepted-with-conditions' && !has) {
      ctx.addIssue({ code: 'custom', path: ['conditions'], message: 'is required when accepting with conditions' })
    }
    if (v.decision !== 'accepted-with-conditions' && has) {
      ctx.addIssue({ code: 'custom', path: ['conditions'], message: 'only goes with accepted-with-conditions' })
    }
    if (v.decision === 'returned' && v.requiredConsents.length) {
      ctx.addIssue({ code: 'custom', path: ['requiredConsents'], message: 'only goes with an acceptance' })
    }
  })
  .transform((v) => ({ ...v, conditions: v.conditions || undefined }))
export type ReviewDecisionInput = z.infer<typeof ReviewDecisionSchema>

/** Body of POST /api/sites/[id]/comments. `@name` or `@e-mail` in the body mentions a member. */
export const CommentInputSchema = z.object({
  body: text(COMMENT_MAX).min(1, 'is required'),
  /** An assessment of this site the comment is about. */
  assessmentId: IdSchema.optional(),
  /** A month, 1 = January. */
  month: fromDigits(z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 to 12').max(12, 'must be 1 to 12')).optional(),
  flagId: z.enum(FLAG_IDS, { error: `must be one of ${FLAG_IDS.join(', ')}` }).optional(),
})
export type CommentInput = z.infer<typeof CommentInputSchema>

/** Query of GET /api/sites/[id]/comments: oldest first, paged. */
export const CommentListQuerySchema = z.object({
  page: fromDigits(z.number().int().min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(z.number().int().min(1, 'must be 1 or more').max(200, 'must be 200 or less')).default(100),
})

/** A person as review records show them (never their e-mail). */
export interface PersonRef {
  id: number
  name: string
}

/** The assessment a review is about, with its headline figures. */
export interface ReviewAssessmentRef {
  id: number
  optionId: number
  optionName: string
  engineVersion: string
  createdAt: string
  annualEnergy_MWh: number
  netOxygenGainSummerLowFlow_mgL: number
  flagsRaised: FlagId[]
}

/** One line of a review's history (review_events). */
export interface ReviewEventDto {
  id: number
  /** `submitted` for a (re-)submission, `decided` for a decision. */
  kind: 'submitted' | 'decided'
  from: ReviewState
  to: ReviewState
  by: PersonRef | null
  assessmentId: number | null
  note: string | null
  reason: string | null
  conditions: string | null
  /** Permissions the decision requires granted (empty for none, and for a submission). */
  requiredConsents: ConsentKind[]
  at: string
}

/** GET /api/sites/[id]/review. */
export interface ReviewDto {
  siteId: number
  state: ReviewState
  stateLabel: string
  /** The assessment under review (the last one submitted), or null while draft. */
  assessment: ReviewAssessmentRef | null
  submittedBy: PersonRef | null
  submittedAt: string | null
  /** The latest decision, while the site is in a decided state. */
  decision: { decision: ReviewDecision; reason: string; conditions: string | null; requiredConsents: ConsentKind[]; by: PersonRef | null; at: string } | null
  /** Every change, oldest first. */
  history: ReviewEventDto[]
  /** What the caller may do now (the server checks again). */
  can: { submit: boolean; decide: boolean; comment: boolean }
}

/** Response of POST /review/submit and /review/decision: the new state and the event written. */
export interface ReviewChangeDto {
  state: ReviewState
  event: ReviewEventDto
}

/** One comment of a site's thread. */
export interface CommentDto {
  id: number
  siteId: number
  body: string
  author: PersonRef | null
  assessmentId: number | null
  month: number | null
  flagId: FlagId | null
  /** Members mentioned and notified. */
  mentions: PersonRef[]
  createdAt: string
}

/** GET /api/sites/[id]/comments. */
export interface CommentListDto {
  page: number
  pageSize: number
  total: number
  comments: CommentDto[]
}

/** GET /api/sites/[id]/review/brief: what the reviewer judges, from the stored result. */
export interface ReviewBriefDto {
  siteId: number
  siteName: string
  assessment: ReviewAssessmentRef
  reservedFlow: {
    /** Flow always left in the river, m³/s. */
    flow_m3s: number
    /** The site's setting the assessment ran with. */
    setting: ReservedFlow
    /** Plain words: "Q95 of the gauged daily record" or "fixed at 1.10 m³/s". */
    basis: string
    /** True when, at every flow of the assessment's table, at least the reserved flow stays in the river. */
    keptAtEveryFlow: boolean
  }
  /** Oxygen downstream by month, without and with the scheme, against the target (mg/L). */
  oxygenByMonth: {
    month: number
    name: string
    flow_m3s: number
    temperature_C: number
    without_mgL: number
    with_mgL: number
    target_mgL: number
    netGain_mgL: number
    meetsTargetWithout: boolean
    meetsTargetWith: boolean
    /** False where nobody measured the month's upstream oxygen and a stand-in value was used (absent in a brief stored before: measured). */
    upstreamMeasured?: boolean
  }[]
  netGainSummerLowFlow: { value_mgL: number; month: number; flow_m3s: number; temperature_C: number; basis: string }
  gasSupersaturation: { raised: boolean; reason: string; maxUnitTotalDissolvedGas: number }
  /** Heads from the weir's hydraulics: how the head moves with the flow and when the weir drowns; null with a head table (or absent: a brief before it). */
  weirHeads?: WeirHeadsLine | null
  /** A conventional turbine at the same weir, for the one plain line on what the river gains for the energy given up; null for a run stored before it. */
  baseline: BaselineLine | null
  /** The flow rules the run obeyed and the days a year the river runs at the hands-off flow only, in plain words; null for a run stored before flow rules. */
  flowRules: { rules: string; handsOffOnly_d: number; handsOffDays: string } | null
  /** How sure the energy and oxygen figures are: the Monte Carlo's P90/P50 energy and chance of a net oxygen loss, the record's P90 and driest years (`stored: false` for a run before them). */
  howSure: HowSure
  /** Every flag of the assessment, raised or clear, with its level, the share of the year it is raised and its reason. */
  flags: { id: FlagId; raised: boolean; level: FlagLevel; safety: boolean; shareOfTime: number | null; reason: string }[]
  /** Whether the scheme pays at the export price, amounts in the site's organisation's currency. */
  money: StoredMoney & Pick<MoneySummary, 'pays' | 'shortfalls' | 'breakEvenPrice'> & { currency: Currency }
  /** The site's consents list in brief: counts by status, refused and outstanding permissions, the gauging and eel checks. */
  consents: ConsentSummaryDto
  /** The site's latest commissioning record against its assessment, in a line; null before the scheme is measured. */
  commissioning: CommissioningLine | null
}
