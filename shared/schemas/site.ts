// Sites: their reach, weir, months and hydrology inputs, the bodies that create and change them, and
// the site as the routes return it. The list and map queries are in siteList.ts, the flow record in
// flowRecord.ts, attachments in attachment.ts.
// Shared by the server routes (server/api/orgs/[orgId]/sites, server/api/sites, server/api/attachments)
// and the site forms. Keep the exported names stable: the UI imports them.
import { z } from 'zod'
import { WATER_QUALITY_A, WEIR_SHAPE_B, type WaterQualityClass, type WeirShapeClass } from '../engine/oxygen'
import type { WeirAerationModel } from '../engine/weirAeration'
import { MAX_FLOW_M3S, WeirHydraulicsInputSchema, areaRatioProblem } from './assess'
import { FlowRulesSchema, NO_FLOW_RULES, type FlowRulesSetting } from './flowRules'
import { IdSchema, NameSchema } from './common'
import type { FlowRecordSummary } from './flowRecord'
import type { Currency } from './organisation'

const num = z.number({ error: 'must be a number' })
const nonNegative = num.min(0, 'must be 0 or more')
const positive = num.positive('must be more than 0')
/** A river flow, m³/s, at most MAX_FLOW_M3S (the engine's limit, and the flow-record upload's). */
const flow = nonNegative.max(MAX_FLOW_M3S, `must be ${MAX_FLOW_M3S.toLocaleString('en-GB')} m³/s or less`)

// ——— classes and limits ———

/** Butts & Evans (1983) weir-shape classes, as named in shared/engine/oxygen.ts. */
export const WEIR_SHAPES = Object.keys(WEIR_SHAPE_B) as [WeirShapeClass, ...WeirShapeClass[]]
/** Butts & Evans (1983) water-quality classes, as named in shared/engine/oxygen.ts. */
export const WATER_QUALITIES = Object.keys(WATER_QUALITY_A) as [WaterQualityClass, ...WaterQualityClass[]]
/** Plain labels for the select boxes. */
export const WEIR_SHAPE_LABELS: Record<WeirShapeClass, string> = Object.fromEntries(
  WEIR_SHAPES.map((k) => [k, WEIR_SHAPE_B[k].label]),
) as Record<WeirShapeClass, string>
export const WATER_QUALITY_LABELS: Record<WaterQualityClass, string> = Object.fromEntries(
  WATER_QUALITIES.map((k) => [k, WATER_QUALITY_A[k].label]),
) as Record<WaterQualityClass, string>

/** The weir aeration models the engine offers (shared/engine/weirAeration.ts). */
export const WEIR_AERATION_MODELS = ['butts-evans', 'avery-novak', 'measured'] as const satisfies readonly WeirAerationModel[]
/** Plain labels for the select box and the results. */
export const WEIR_AERATION_MODEL_LABELS: Record<WeirAerationModel, string> = {
  'butts-evans': 'Butts & Evans (1983)',
  'avery-novak': 'Avery & Novak (1978)',
  'measured': 'Measured deficit ratio',
}

export const OXYGEN_UNITS = ['mg/L', '%sat'] as const
export type OxygenUnit = (typeof OXYGEN_UNITS)[number]

/** Largest gross head a site may have, m. */
export const MAX_GROSS_HEAD_M = 20

// ——— parts of a site ———

/** A point on the map, WGS 84 degrees. */
export const LocationSchema = z.object({
  lat: num.min(-90, 'must be between -90 and 90').max(90, 'must be between -90 and 90'),
  lng: num.min(-180, 'must be between -180 and 180').max(180, 'must be between -180 and 180'),
})

/** One GeoJSON position, [lng, lat] (RFC 7946 order: longitude first). */
export const PositionSchema = z.tuple([
  num.min(-180, 'longitude must be between -180 and 180').max(180, 'longitude must be between -180 and 180'),
  num.min(-90, 'latitude must be between -90 and 90').max(90, 'latitude must be between -90 and 90'),
])

/** The reach, intake to outfall, as a GeoJSON LineString. */
export const ReachSchema = z.object({
  type: z.literal('LineString', { error: "must be 'LineString'" }),
  coordinates: z.array(PositionSchema).min(2, 'a reach needs at least 2 points').max(1000, 'a reach may have 1000 points at most'),
})

/** The weir or drop the installation would sit in. */
export const WeirSchema = z.object({
  /** Head pool to tail pool at ordinary flows, m. */
  grossHead_m: positive.max(MAX_GROSS_HEAD_M, `must be ${MAX_GROSS_HEAD_M} m or less`),
  /** Crest width, m. */
  crestWidth_m: positive.max(1000, 'must be 1000 m or less'),
  shape: z.enum(WEIR_SHAPES, { error: `must be one of ${WEIR_SHAPES.join(', ')}` }),
  waterQuality: z.enum(WATER_QUALITIES, { error: `must be one of ${WATER_QUALITIES.join(', ')}` }),
  /** Which weir aeration model the figures use (the others are shown as a range beside it); left out: Butts & Evans. */
  aerationModel: z.enum(WEIR_AERATION_MODELS, { error: `must be one of ${WEIR_AERATION_MODELS.join(', ')}` }).optional(),
  /** A deficit ratio measured below this weir, with the water temperature and whether the weir was drowned then. */
  measuredDeficitRatio: z.object({
    r: z.number({ error: 'must be a number' }).min(1, 'must be 1 or more (1 means no aeration)').max(100, 'must be 100 or less'),
    temperature_C: z.number({ error: 'must be a number' }).min(0, 'must be 0 °C or more').max(40, 'must be 40 °C or less'),
    drowned: z.boolean({ error: 'must be true or false' }).default(false),
    /** When and how it was measured, in the user's words. */
    note: z.string({ error: 'must be text' }).max(500, 'is too long (500 characters at most)').default(''),
  }).nullable().optional(),

  /** Heads from the weir's hydraulics (crest height, weir coefficient, tail rating) instead of the head table; null or left out: the head table. */
  hydraulics: WeirHydraulicsInputSchema.nullable().optional(),
}).refine((w) => w.aerationModel !== 'measured' || !!w.measuredDeficitRatio, { path: ['measuredDeficitRatio'], message: 'is needed when the aeration model is "measured"' })

/** One row of the gross head against river flow (tailwater rises in floods). */
export const HeadRowSchema = z.object({
  /** River flow, m³/s. */
  flow,
  /** Gross head at that flow, m. */
  head: nonNegative.max(MAX_GROSS_HEAD_M, `must be ${MAX_GROSS_HEAD_M} m or less`),
})

/** Head-vs-flow table: may be empty; rows sorted by rising flow, no repeats. */
export const HeadTableSchema = z
  .array(HeadRowSchema)
  .max(50, 'may have 50 rows at most')
  .superRefine((rows, ctx) => {
    rows.forEach((r, i) => {
      const prev = rows[i - 1]
      if (prev && r.flow <= prev.flow) ctx.addIssue({ code: 'custom', path: [i, 'flow'], message: 'rows must be sorted by rising flow, without repeats' })
    })
  })

/** Reserved (hands-off) flow: a fixed value, or the flow at a named exceedance (95 for Q95). */
export const ReservedFlowSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('fixed'), flow }),
    z.object({ kind: z.literal('percentile'), exceedance: num.min(0, 'must be between 0 and 100').max(100, 'must be between 0 and 100') }),
  ],
  { error: "must be 'fixed' or 'percentile'" },
)

/** Upstream dissolved oxygen, in mg/L or % of saturation. */
export const OxygenReadingSchema = z
  .object({
    value: nonNegative,
    unit: z.enum(OXYGEN_UNITS, { error: "must be 'mg/L' or '%sat'" }),
    /** False when nobody measured it this month: the value stands in (and is used) all the same. Left out: measured. */
    measured: z.boolean({ error: 'must be true or false' }).default(true),
  })
  .superRefine((o, ctx) => {
    const max = o.unit === 'mg/L' ? 30 : 300
    if (o.value > max) ctx.addIssue({ code: 'custom', path: ['value'], message: `must be ${max} ${o.unit} or less` })
  })

/** One month of site conditions. */
export const MonthSchema = z.object({
  waterTemp_C: num.min(0, 'must be 0 °C or more').max(40, 'must be 40 °C or less'),
  upstreamOxygen: OxygenReadingSchema,
  /**
   * The month's mean flow, m³/s: with the other eleven, the seasonal profile that shapes an entered
   * FDC month by month (ignored with a daily record). Null or left out: not entered.
   */
  flow_m3s: flow.nullable().optional(),
})

/** Twelve months, January first. */
export const MonthsSchema = z.array(MonthSchema).length(12, 'needs 12 months, January first')

/** Catchment areas for the area-ratio method, Q_site = Q_gauge · A_site / A_gauge. */
export const CatchmentSchema = z.object({
  siteArea_km2: positive.max(1_000_000, 'is too large'),
  gaugeArea_km2: positive.max(1_000_000, 'is too large'),
}).superRefine((c, ctx) => {
  const problem = areaRatioProblem(c.siteArea_km2, c.gaugeArea_km2)
  if (problem) ctx.addIssue({ code: 'custom', path: [problem.area === 'site' ? 'siteArea_km2' : 'gaugeArea_km2'], message: problem.message })
})

/** One entered FDC point: the flow equalled or exceeded `exceedance` % of the time. */
export const FdcPointSchema = z.object({
  exceedance: num.min(0, 'must be between 0 and 100').max(100, 'must be between 0 and 100'),
  flow,
})

/** Entered FDC: empty, or at least 3 points by rising exceedance with flow never rising. Errors name the row (`fdcPoints.3.flow`). */
export const FdcPointsSchema = z
  .array(FdcPointSchema)
  .max(500, 'may have 500 points at most')
  .superRefine((points, ctx) => {
    if (points.length > 0 && points.length < 3) ctx.addIssue({ code: 'custom', path: [], message: 'an FDC needs at least 3 points (or none)' })
    points.forEach((p, i) => {
      const prev = points[i - 1]
      if (!prev) return
      if (p.exceedance <= prev.exceedance) ctx.addIssue({ code: 'custom', path: [i, 'exceedance'], message: 'points must be sorted by rising exceedance, without repeats' })
      if (p.flow > prev.flow) ctx.addIssue({ code: 'custom', path: [i, 'flow'], message: 'flow must not rise as exceedance rises' })
    })
  })

const RiverNameSchema = z.string({ error: 'is required' }).trim().min(1, 'is required').max(120, 'is too long (120 characters at most)')
const NotesSchema = z.string({ error: 'must be text' }).max(10_000, 'is too long (10,000 characters at most)')
const TargetOxygenSchema = num.min(0, 'must be 0 mg/L or more').max(20, 'must be 20 mg/L or less')
const AltitudeSchema = num.min(-100, 'must be -100 m or more').max(5000, 'must be 5000 m or less')

// The fields without defaults, so the patch schema never fills in a field the caller left out.
const siteFields = {
  name: NameSchema,
  riverName: RiverNameSchema,
  location: LocationSchema,
  reach: ReachSchema.nullable(),
  /** Altitude of the weir above sea level, m (sets the air pressure). */
  altitude_m: AltitudeSchema,
  weir: WeirSchema,
  headTable: HeadTableSchema,
  reservedFlow: ReservedFlowSchema,
  /** Flow rules beyond the hands-off flow (reservedFlow): maximum take, share kept, pass flow. */
  flowRules: FlowRulesSchema,
  months: MonthsSchema,
  catchment: CatchmentSchema.nullable(),
  fdcPoints: FdcPointsSchema,
  /** Downstream oxygen target, mg/L (common practice: 6; the regulator's figure replaces it). */
  targetOxygen_mgL: TargetOxygenSchema,
  notes: NotesSchema,
}

/** Default reserved flow: Q95 (common practice, see HYDROLOGY_DEFAULTS in the engine). */
export const DEFAULT_RESERVED_FLOW = { kind: 'percentile', exceedance: 95 } as const
export const DEFAULT_TARGET_OXYGEN_MGL = 6

/** Body of POST /api/orgs/[orgId]/sites. Unknown keys are dropped. */
export const SiteInputSchema = z.object({
  ...siteFields,
  reach: siteFields.reach.default(null),
  altitude_m: siteFields.altitude_m.default(0),
  headTable: siteFields.headTable.default([]),
  reservedFlow: siteFields.reservedFlow.default({ ...DEFAULT_RESERVED_FLOW }),
  flowRules: siteFields.flowRules.prefault({ ...NO_FLOW_RULES }),
  catchment: siteFields.catchment.default(null),
  fdcPoints: siteFields.fdcPoints.default([]),
  targetOxygen_mgL: siteFields.targetOxygen_mgL.default(DEFAULT_TARGET_OXYGEN_MGL),
  notes: siteFields.notes.default(''),
})
export type SiteInput = z.infer<typeof SiteInputSchema>
/** What a form holds before parsing (defaults not yet filled in). */
export type SiteInputDraft = z.input<typeof SiteInputSchema>

/**
 * Body of PATCH /api/sites/[id]: any top-level field (each replaces the stored one whole, e.g. all
 * 12 months or the whole weir), plus the `version` last read; a stale version answers 409.
 */
export const SitePatchSchema = z.object(siteFields).partial().extend({
  version: z
    .number({ error: (iss) => (iss.input === undefined ? 'is required (the version you last read)' : 'must be a number') })
    .int('must be a whole number')
    .min(1, 'must be 1 or more'),
})
export type SitePatch = z.infer<typeof SitePatchSchema>

export const SiteParamsSchema = z.object({ id: IdSchema })

// ——— what the routes return ———

export type Reach = z.infer<typeof ReachSchema>
export type Weir = z.infer<typeof WeirSchema>
export type HeadRow = z.infer<typeof HeadRowSchema>
export type ReservedFlow = z.infer<typeof ReservedFlowSchema>
/** A stored month: sites stored before a field came lack it (no `measured`: measured; no `flow_m3s`: not entered). */
export type Month = z.input<typeof MonthSchema>
export type Catchment = z.infer<typeof CatchmentSchema>
export type FdcPointInput = z.infer<typeof FdcPointSchema>
export type HydrologySource = 'record' | 'points' | 'none'

/** GET /api/sites/[id]. */
export interface SiteDto {
  id: number
  orgId: number
  name: string
  riverName: string
  location: { lat: number; lng: number }
  reach: Reach | null
  altitude_m: number
  weir: Weir
  headTable: HeadRow[]
  reservedFlow: ReservedFlow
  flowRules: FlowRulesSetting
  months: Month[]
  catchment: Catchment | null
  fdcPoints: FdcPointInput[]
  targetOxygen_mgL: number
  notes: string
  /** Send it back with PATCH; it rises by one with every change. */
  version: number
  createdAt: string
  updatedAt: string
  createdBy: { id: number; name: string } | null
  /** Set only on soft-deleted sites (seen in the admin's deleted list). */
  deletedAt: string | null
  /** Which hydrology the engine will use. */
  hydrologySource: HydrologySource
  flowRecord: FlowRecordSummary | null
  /** The currency of the site's organisation: its options' money figures are in it. */
  currency: Currency
}
