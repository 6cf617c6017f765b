// Stored design options and the design sweep of an option: their bodies and how the routes show
// them (server/api/sites/[id]/options, server/api/options) and the option forms. Stored assessments
// are in assessment.ts, the portfolio in portfolio.ts, the comparison in compare.ts.
import { z } from 'zod'
import type { SweepResult } from '../engine/sweep'
import {
  EngineOptionSchema,
  SettingsInputSchema,
  SweepGridSchema,
} from './assess'
import { IdSchema, NameSchema } from './common'
import type { AssessmentDto } from './assessment'

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
