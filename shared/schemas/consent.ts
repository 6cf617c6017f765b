// The consents and constraints list of a site: the body that changes one permission, the body that
// changes the site's constraints (nearest dwelling, noise limit, gauging station), and what
// GET /api/sites/[id]/consents answers. Shared by server/api/sites/[id]/consents/** and
// server/api/sites/[id]/constraints.patch.ts and the consents section of the site page.
import { z } from 'zod'
import { MAX_NOISE_DISTANCE_M, MIN_NOISE_DISTANCE_M, type NoiseCheck } from '../engine/noise'
import { CONSENT_KINDS, CONSENT_STATUSES, type ConsentCounts, type ConsentKind, type ConsentStatus, type EelScreeningCheck } from '../utils/consents'
import { IdSchema } from './common'

export const CONSENT_REFERENCE_MAX = 120
export const CONSENT_TEXT_MAX = 4000

const text = (max: number) => z.string({ error: 'must be text' }).trim().max(max, `is too long (${max.toLocaleString('en-GB')} characters at most)`)
const num = z.number({ error: 'must be a number' })

/** A calendar day, YYYY-MM-DD, that exists; null for none. */
const DaySchema = z
  .string({ error: 'must be a date, YYYY-MM-DD' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date, YYYY-MM-DD')
  .refine((d) => {
    const t = new Date(`${d}T00:00:00Z`)
    return !Number.isNaN(t.getTime()) && t.toISOString().startsWith(d)
  }, 'is not a real date')
  .nullable()

/** Route parameters of /api/sites/[id]/consents and /constraints. */
export const ConsentListParamsSchema = z.object({ id: IdSchema })

/** Route parameters of PATCH /api/sites/[id]/consents/[kind]. */
export const ConsentParamsSchema = z.object({
  id: IdSchema,
  kind: z.enum(CONSENT_KINDS, { error: `must be one of ${CONSENT_KINDS.join(', ')}` }),
})

/**
 * Body of PATCH /api/sites/[id]/consents/[kind]: the version last read (0 for a permission never
 * saved) and the fields to replace. A decision date may not come before the application date.
 */
export const ConsentPatchSchema = z
  .object({
    version: num.int('must be a whole number').min(0, 'must be 0 or more'),
    status: z.enum(CONSENT_STATUSES, { error: `must be one of ${CONSENT_STATUSES.join(', ')}` }).optional(),
    reference: text(CONSENT_REFERENCE_MAX).optional(),
    appliedOn: DaySchema.optional(),
    decidedOn: DaySchema.optional(),
    conditions: text(CONSENT_TEXT_MAX).optional(),
    notes: text(CONSENT_TEXT_MAX).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.appliedOn && v.decidedOn && v.decidedOn < v.appliedOn) {
      ctx.addIssue({ code: 'custom', path: ['decidedOn'], message: `must not be before the application date (${v.appliedOn})` })
    }
  })
export type ConsentPatch = z.infer<typeof ConsentPatchSchema>

/**
 * Body of PATCH /api/sites/[id]/constraints: the version last read (0 when never saved), the nearest
 * dwelling's distance from the air turbines, the noise limit there (null takes the default), and
 * whether the weir is a gauging station.
 */
export const ConstraintsPatchSchema = z.object({
  version: num.int('must be a whole number').min(0, 'must be 0 or more'),
  nearestDwelling_m: num
    .min(MIN_NOISE_DISTANCE_M, `must be at least ${MIN_NOISE_DISTANCE_M} m`)
    .max(MAX_NOISE_DISTANCE_M, `must be ${MAX_NOISE_DISTANCE_M.toLocaleString('en-GB')} m or less`)
    .nullable()
    .optional(),
  noiseLimit_dBA: num.min(20, 'must be 20 dB(A) or more').max(90, 'must be 90 dB(A) or less').nullable().optional(),
  isGaugingStation: z.boolean({ error: 'must be true or false' }).optional(),
})
export type ConstraintsPatch = z.infer<typeof ConstraintsPatchSchema>

/** One permission as the list shows it; a kind never saved has version 0 and status `not-started`. */
export interface ConsentDto {
  kind: ConsentKind
  label: string
  why: string
  source: string
  status: ConsentStatus
  statusLabel: string
  reference: string
  appliedOn: string | null
  decidedOn: string | null
  conditions: string
  notes: string
  version: number
  updatedAt: string | null
  updatedBy: { id: number; name: string } | null
}

/** A site's constraints (one row per site, version 0 until first saved). */
export interface ConstraintsDto {
  nearestDwelling_m: number | null
  /** The limit set for the site, or null when the default applies. */
  noiseLimit_dBA: number | null
  isGaugingStation: boolean
  version: number
}

/** The scheme the checks are about: the option of the assessment under review, else of the newest assessment, else the newest option. */
export interface ConsentSchemeRef {
  optionId: number
  optionName: string
  units: number
  /** The air turbine's sound power level per unit, dB(A); null when the option gives none. */
  soundPower_dBA: number | null
  /** The assessment the diverted flow is read from; null when the option has none. */
  assessmentId: number | null
}

/** The noise check at the nearest dwelling. */
export interface ConsentNoiseDto {
  limit_dBA: number
  limitIsDefault: boolean
  limitSource: string
  /** Null with `missing` saying what is needed when a figure is missing. */
  check: NoiseCheck | null
  missing: string | null
  source: string
}

/** GET /api/sites/[id]/consents. */
export interface ConsentListDto {
  siteId: number
  /** Every kind, in CONSENT_KINDS order. */
  consents: ConsentDto[]
  counts: ConsentCounts
  constraints: ConstraintsDto
  scheme: ConsentSchemeRef | null
  noise: ConsentNoiseDto
  eelScreening: EelScreeningCheck
  /** The gauging-station warning, or null when the weir is not one. */
  gaugingWarning: string | null
  /** Whether the caller may change the list (the server checks again). */
  canEdit: boolean
}

/** The consents block of the reviewer's brief and the landowner summary. */
export interface ConsentSummaryDto {
  counts: ConsentCounts
  total: number
  /** Refused permissions, by label. */
  refused: string[]
  /** Permissions still to get (not started or applied for), by label. */
  outstanding: string[]
  /** "Permissions: 3 of 10 granted, 2 applied for, 1 refused (flood-risk permit)". */
  line: string
  gaugingWarning: string | null
  eelScreening: string | null
}
