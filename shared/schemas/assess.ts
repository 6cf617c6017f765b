// The input of one assessment and of a design sweep; shared by the API routes, the forms and the engine.
import { z } from 'zod'
import { DEFAULTS, MAX_MONTE_CARLO_DRAWS } from '../engine/defaults'
import { MONEY_DEFAULTS } from '../engine/money'
import { BASELINE_DEFAULTS, BASELINE_KINDS } from '../engine/baselineUnits'
import { WATER_QUALITY_A, WEIR_SHAPE_B, type WaterQualityClass, type WeirShapeClass } from '../engine/oxygen'
import { FlowRulesSchema } from './flowRules'

const num = z.number({ error: 'must be a number' })
const nonNegative = num.min(0, 'must be 0 or more')
const positive = num.positive('must be more than 0')
const fraction = num.min(0, 'must be between 0 and 1').max(1, 'must be between 0 and 1')
/** Largest river flow accepted, m³/s: far above any river's (as the flow-record upload, server/utils/flowCsv.ts). */
export const MAX_FLOW_M3S = 1_000_000
const flow = nonNegative.max(MAX_FLOW_M3S, `must be ${MAX_FLOW_M3S.toLocaleString('en-GB')} m³/s or less`)
/** Largest amount of money accepted for a cost, in the option's currency. */
export const MAX_AMOUNT = 1e12
const amount = nonNegative.max(MAX_AMOUNT, `must be ${MAX_AMOUNT.toLocaleString('en-GB')} or less`)
/** Largest catchment area accepted, km². */
const MAX_AREA_KM2 = 1_000_000
/** Largest ratio of site to gauge catchment area, either way, for the area-ratio method (far past any sensible use). */
export const MAX_AREA_RATIO = 1000

/**
 * Why a site and gauge catchment pair cannot scale flows by their ratio, naming the smaller area
 * (the one too small next to the other), or null when it can.
 */
export function areaRatioProblem(siteArea: number, gaugeArea: number): { area: 'site' | 'gauge'; message: string } | null {
  if (siteArea / gaugeArea > MAX_AREA_RATIO) return { area: 'gauge', message: `must be at least 1/${MAX_AREA_RATIO} of the site area for the area-ratio method` }
  if (gaugeArea / siteArea > MAX_AREA_RATIO) return { area: 'site', message: `must be at least 1/${MAX_AREA_RATIO} of the gauge area for the area-ratio method` }
  return null
}
const d = <K extends keyof typeof DEFAULTS>(k: K): number => DEFAULTS[k].value

const WATER_QUALITY = Object.keys(WATER_QUALITY_A) as [WaterQualityClass, ...WaterQualityClass[]]
const WEIR_SHAPE = Object.keys(WEIR_SHAPE_B) as [WeirShapeClass, ...WeirShapeClass[]]

/** One month of site conditions, January first. */
export const MonthInputSchema = z.object({
  temperature_C: num.min(0, 'must be 0 °C or more').max(40, 'must be 40 °C or less'),
  upstreamOxygen_mgL: num.min(0, 'must be 0 or more').max(30, 'must be 30 mg/L or less'),
  /** Month's flow, used with an entered FDC (a record gives its own). */
  flow_m3s: flow.optional(),
  /** False when the upstream oxygen was not measured this month (the value given stands in). */
  upstreamMeasured: z.boolean().default(true),
})

/** One entered FDC point, exceedance in % of time. */
export const EngineFdcPointSchema = z.object({
  exceedance: num.min(0).max(100, 'must be 100 % or less'),
  flow,
})

/** One day of a gauged record; null flow marks a gap. */
export const DailyFlowSchema = z.object({
  date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date written YYYY-MM-DD'),
  flow: flow.nullable(),
})

/** Hydrology: entered FDC points or a daily record, optionally scaled from a gauge by catchment area. */
export const HydrologyInputSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('fdc'),
    points: z.array(EngineFdcPointSchema).min(3, 'an FDC needs at least 3 points').max(500),
  }).superRefine((h, ctx) => {
    h.points.forEach((p, i) => {
      const prev = h.points[i - 1]
      if (prev && p.exceedance <= prev.exceedance) ctx.addIssue({ code: 'custom', path: ['points', i, 'exceedance'], message: 'points must be sorted by rising exceedance, without repeats' })
      if (prev && p.flow > prev.flow) ctx.addIssue({ code: 'custom', path: ['points', i, 'flow'], message: 'flow must not rise as exceedance rises' })
    })
  }),
  z.object({
    kind: z.literal('record'),
    days: z.array(DailyFlowSchema).min(1, 'the record needs at least one day').max(80000, 'the record is too long'),
  }),
])

/** Catchment areas for the area-ratio method. */
export const GaugeScalingSchema = z.object({
  siteArea_km2: positive.max(MAX_AREA_KM2, 'is too large'),
  gaugeArea_km2: positive.max(MAX_AREA_KM2, 'is too large'),
}).superRefine((a, ctx) => {
  const problem = areaRatioProblem(a.siteArea_km2, a.gaugeArea_km2)
  if (problem) ctx.addIssue({ code: 'custom', path: [problem.area === 'site' ? 'siteArea_km2' : 'gaugeArea_km2'], message: problem.message })
})

/** Reserved (hands-off) flow: fixed, or the flow at a named exceedance. */
export const ReservedFlowInputSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('fixed'), flow }),
  z.object({ kind: z.literal('percentile'), exceedance: num.min(0).max(100) }),
])

/** How the existing weir aerates what falls over it: the model the figures use, and a measured deficit ratio if there is one. */
export const WeirAerationInputSchema = z.object({
  model: z.enum(['butts-evans', 'avery-novak', 'measured']).default('butts-evans'),
  measured: z.object({
    /** Deficit ratio r = (C_s − C_u)/(C_s − C_d) measured below the weir. */
    r: num.min(1, 'must be 1 or more (1 means no aeration)').max(100, 'must be 100 or less'),
    /** Water temperature when it was measured, °C. */
    tC: num.min(0, 'must be 0 °C or more').max(40, 'must be 40 °C or less'),
    /** True when it was measured with the weir drowned. */
    drowned: z.boolean().default(false),
  }).nullable().default(null),
}).refine((w) => w.model !== 'measured' || w.measured !== null, { path: ['measured'], message: 'is needed when the weir model is "measured"' })

/** Largest crest height, channel width and tail depth accepted for the weir hydraulics, m. */
const MAX_HYDRAULIC_LEVEL_M = 30

/** One row of the tail pool's stage–discharge table: river flow and depth over the tail-pool bed. */
export const TailRowSchema = z.object({
  flow_m3s: flow,
  depth_m: nonNegative.max(MAX_HYDRAULIC_LEVEL_M, `must be ${MAX_HYDRAULIC_LEVEL_M} m or less`),
})

/**
 * How the tail level follows the river: Manning's equation for a rectangular channel, or a stage–discharge
 * table (at least 2 rows, by rising flow without repeats, depth never falling).
 */
export const TailRatingSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('manning'),
    channelWidth_m: positive.max(1000, 'must be 1000 m or less'),
    bedSlope: num.min(0.00001, 'must be between 0.00001 and 0.1').max(0.1, 'must be between 0.00001 and 0.1'),
    roughnessN: num.min(0.01, 'must be between 0.01 and 0.2').max(0.2, 'must be between 0.01 and 0.2'),
  }),
  z.object({
    kind: z.literal('table'),
    rows: z.array(TailRowSchema).min(2, 'needs at least 2 rows').max(50, 'may have 50 rows at most').superRefine((rows, ctx) => {
      rows.forEach((r, i) => {
        const prev = rows[i - 1]
        if (prev && r.flow_m3s <= prev.flow_m3s) ctx.addIssue({ code: 'custom', path: [i, 'flow_m3s'], message: 'rows must be sorted by rising flow, without repeats' })
        if (prev && r.depth_m < prev.depth_m) ctx.addIssue({ code: 'custom', path: [i, 'depth_m'], message: 'depth must not fall as flow rises' })
      })
    }),
  }),
], { error: "must be 'manning' or 'table'" })

/**
 * Heads from the weir's hydraulics (ENGINE.md §13), in place of the head table: crest height above the tail-pool
 * bed, the weir equation's coefficient (null: the default for the crest form), and the tail rating.
 */
export const WeirHydraulicsInputSchema = z.object({
  crestHeight_m: positive.max(MAX_HYDRAULIC_LEVEL_M, `must be ${MAX_HYDRAULIC_LEVEL_M} m or less`),
  dischargeCoefficient: num.min(0.1, 'must be between 0.1 and 1').max(1, 'must be between 0.1 and 1').nullable().default(null),
  tail: TailRatingSchema,
})
export type WeirHydraulicsInput = z.infer<typeof WeirHydraulicsInputSchema>

/** The site: head, altitude, water and its months. */
export const EngineSiteSchema = z.object({
  altitude_m: num.min(-100).max(5000, 'must be 5000 m or less').default(0),
  /** Gross head at the weir (head pool to tail pool) at ordinary flows, m. */
  grossHead_m: nonNegative.max(30, 'must be 30 m or less'),
  /** Gross head against river flow where the tailwater rises in floods. */
  headTable: z.array(z.object({ flow_m3s: flow, head_m: nonNegative.max(30) })).max(50).default([]),
  salinity_gkg: nonNegative.max(40).default(d('salinity')),
  months: z.array(MonthInputSchema).length(12, 'needs 12 months, January first'),
  waterQuality: z.enum(WATER_QUALITY).default('clean'),
  weirShape: z.enum(WEIR_SHAPE).default('sharp-crested-vertical-face'),
  /** Crest length of the weir, m: the discharge per metre for Avery & Novak and whether the weir drowns. */
  crestLength_m: positive.max(1000, 'must be 1000 m or less').optional(),
  weirAeration: WeirAerationInputSchema.prefault({}),
  /** Heads from the weir's hydraulics; null (the default) takes them from grossHead_m and the head table. */
  hydraulics: WeirHydraulicsInputSchema.nullable().default(null),
})

/** The air pipe of each unit. */
export const AirInputSchema = z.object({
  pipeDiameter_m: positive.max(5),
  pipeLength_m: nonNegative.max(500),
  pipeLossK: nonNegative.max(50).default(d('airPipeLossK')),
  frictionFactor: nonNegative.max(0.2).default(d('airPipeFrictionFactor')),
  jetPumpEfficiency: fraction.default(d('jetPumpEfficiency')),
  maxGasLiquidRatio: positive.max(10).default(d('maxGasLiquidRatio')),
})

/** The air turbine and generator of each unit. */
export const TurbineInputSchema = z.object({
  efficiency: fraction.default(d('turbineEfficiency')),
  generatorEfficiency: fraction.default(d('generatorEfficiency')),
  /** Electrical rating per unit, kW; null sizes it to the design point. */
  ratedPower_kW: positive.max(100000).nullable().default(null),
  cutInFraction: fraction.default(d('turbineCutInFraction')),
  /** The maker's A-weighted sound power level of one air turbine, dB(A), for the noise check at the nearest dwelling; null when not known (no figure changes). */
  soundPower_dBA: num.min(40, 'must be 40 dB(A) or more').max(140, 'must be 140 dB(A) or less').nullable().default(null),
})

/** Costs of an option (defaults and their origins in MONEY_DEFAULTS). */
export const CostInputSchema = z.object({
  fixedCost: amount.default(MONEY_DEFAULTS.fixedCost.value),
  ratedPowerPrice: amount.default(MONEY_DEFAULTS.ratedPowerPrice.value),
  civilsPerDesignFlow: amount.default(MONEY_DEFAULTS.civilsPerDesignFlow.value),
})

/** How the units are run (ENGINE.md §8): the mode, the head pool's allowed drawdown, closed months. */
export const OperationInputSchema = z.object({
  mode: z.enum(['energy-first', 'river-first']).default('energy-first'),
  allowedDrawdown_m: nonNegative.max(5, 'must be 5 m or less').default(d('allowedDrawdown')),
  closedMonths: z.array(num.int('must be a whole month number').min(1, 'must be a month 1–12').max(12, 'must be a month 1–12'))
    .max(12, 'lists at most 12 months')
    .refine((ms) => new Set(ms).size === ms.length, 'lists a month twice')
    .default([]),
})

/** The conventional low-head unit the option is set against (ENGINE.md §11); every field has a default. */
export const BaselineInputSchema = z.object({
  kind: z.enum(BASELINE_KINDS, { error: `must be one of ${BASELINE_KINDS.join(', ')}` }).default('screw'),
  /** Flow through the unit at full load, m³/s; null takes what the flow rules allow at the flow exceeded 30 % of the time. */
  designFlow_m3s: positive.max(MAX_FLOW_M3S, `must be ${MAX_FLOW_M3S.toLocaleString('en-GB')} m³/s or less`).nullable().default(null),
  /** Share of the gross head lost before the runner (screen, channel, draft tube). */
  headLossFraction: num.min(0, 'must be between 0 and 0.5').max(0.5, 'must be between 0 and 0.5').default(BASELINE_DEFAULTS.headLossFraction.value),
  generatorEfficiency: fraction.default(BASELINE_DEFAULTS.generatorEfficiency.value),
  costs: z.object({
    /** Installed cost per kW of rating; null takes the kind's default. */
    ratedPowerPrice: amount.nullable().default(null),
    fixedCost: amount.default(BASELINE_DEFAULTS.fixedCost.value),
  }).prefault({}),
})

/** One design option. */
export const EngineOptionSchema = z.object({
  units: num.int('must be a whole number').min(1, 'needs at least 1 unit').max(50),
  constriction: z.enum(['venturi', 'short-nozzle', 'sharp-plate']).default('venturi'),
  throatDiameter_m: positive.max(10),
  outletDiameter_m: positive.max(20),
  /** Depth of the throat centreline below the tail-pool surface, m. */
  throatDepth_m: nonNegative.max(30),
  inletLoss: nonNegative.max(5).default(d('inletLoss')),
  /** Defaults by constriction type when left out. */
  diffuserEfficiency: fraction.optional(),
  /** Defaults by constriction type when left out. */
  flowCoefficient: num.positive().max(1, 'must be 1 or less').optional(),
  /** Defaults to a cone of the default half-angle when left out. */
  diffuserLength_m: positive.max(200).optional(),
  operation: OperationInputSchema.prefault({}),
  air: AirInputSchema,
  turbine: TurbineInputSchema.prefault({}),
  costs: CostInputSchema.prefault({}),
  baseline: BaselineInputSchema.prefault({}),
}).refine((o) => o.outletDiameter_m >= o.throatDiameter_m, { path: ['outletDiameter_m'], message: 'must be at least the throat diameter' })

/** Engine settings; every one has a default with its origin in engine/defaults.ts. */
export const SettingsInputSchema = z.object({
  availability: fraction.default(d('availability')),
  minCavitationMargin_m: nonNegative.max(10).default(d('minCavitationMargin')),
  sotePerMetre: nonNegative.max(0.3).default(d('sotePerMetre')),
  inDeviceTransfer: nonNegative.max(0.5, 'must be 0.5 or less').default(d('inDeviceTransfer')),
  alpha: fraction.default(d('alpha')),
  beta: fraction.default(d('beta')),
  theta: num.min(1).max(1.1).default(d('theta')),
  oxygenTarget_mgL: nonNegative.max(20).default(d('oxygenTarget')),
  /** A net oxygen loss beyond this is a river caution, and river-first mode shuts units to avoid it. */
  acceptableOxygenLoss_mgL: nonNegative.max(5, 'must be 5 mg/L or less').default(d('acceptableOxygenLoss')),
  tdgLimit: num.min(1).max(2).default(d('tdgLimit')),
  /** Excess of total gas pressure over the barometric pressure ΔP flagged above, mmHg; the stricter of the two limits applies. */
  tdgExcessLimit_mmHg: nonNegative.max(760, 'must be 760 mmHg or less').default(d('tdgExcessLimit')),
  upstreamNitrogenSaturation: nonNegative.max(2).default(d('upstreamNitrogenSaturation')),
  /** Initial bubble diameter of the bubble model, m (1–6 mm, the range it is meant for). */
  bubbleDiameter_m: num.min(0.001, 'must be 1 mm (0.001 m) or more').max(0.006, 'must be 6 mm (0.006 m) or less').default(d('bubbleDiameter')),
  plumeVelocity_ms: nonNegative.max(2).default(d('plumeVelocity')),
  filmModel: z.enum(['mcginnis-little', 'higbie', 'frossling']).default('mcginnis-little'),
  oxygenDiffusivity20: positive.max(1e-8).default(d('oxygenDiffusivity20')),
  diffuserHalfAngle_deg: num.positive().max(45).default(d('diffuserHalfAngle')),
  airTemperatureOffset_K: num.min(-30).max(30).default(d('airTemperatureOffset')),
  /** The method the summary's oxygen figures use: the bubble model (primary) or the per-metre field transfer (cross-check). */
  oxygenMethod: z.enum(['bubble-model', 'field-transfer']).default('bubble-model'),
  discountRate: num.min(0).max(0.5).default(MONEY_DEFAULTS.discountRate.value),
  life_yr: num.min(1, 'must be 1 year or more').max(100).default(MONEY_DEFAULTS.life_yr.value),
  opexFraction: fraction.default(MONEY_DEFAULTS.opexFraction.value),
  exportPrice: amount.default(MONEY_DEFAULTS.exportPrice.value),
  gridFactor: nonNegative.max(2).default(MONEY_DEFAULTS.gridFactor.value),
  /** Draws of the Monte Carlo a stored assessment runs (0: none). */
  monteCarloDraws: num.int('must be a whole number').min(0).max(MAX_MONTE_CARLO_DRAWS, `must be ${MAX_MONTE_CARLO_DRAWS} or fewer`).default(d('monteCarloDraws')),
  /** Seed of the Monte Carlo's random numbers: the same seed gives the same draws. */
  monteCarloSeed: num.int('must be a whole number').min(0).max(4_294_967_295, 'must fit in 32 bits (4294967295 or less)').default(d('monteCarloSeed')),
})

/** Everything one assessment needs. */
export const AssessInputSchema = z.object({
  site: EngineSiteSchema,
  hydrology: HydrologyInputSchema,
  gaugeScaling: GaugeScalingSchema.nullable().default(null),
  reservedFlow: ReservedFlowInputSchema.default({ kind: 'percentile', exceedance: 95 }),
  /** Flow rules beyond the hands-off flow (reservedFlow); the defaults have no effect. */
  flowRules: FlowRulesSchema.prefault({}),
  option: EngineOptionSchema,
  settings: SettingsInputSchema.prefault({}),
})

/** A parsed assessment input, defaults filled in. */
export type AssessInput = z.infer<typeof AssessInputSchema>
/** An assessment input as a caller may write it, defaults optional. */
export type AssessInputDraft = z.input<typeof AssessInputSchema>

const MAX_SWEEP_POINTS = 400

/** Grid of a design sweep: throat diameter × number of units × submergence. */
export const SweepGridSchema = z.object({
  throatDiameters_m: z.array(positive.max(10)).min(1).max(30),
  units: z.array(num.int().min(1).max(50)).min(1).max(30),
  throatDepths_m: z.array(nonNegative.max(30)).min(1).max(30),
}).refine((g) => g.throatDiameters_m.length * g.units.length * g.throatDepths_m.length <= MAX_SWEEP_POINTS, {
  message: `a sweep may have at most ${MAX_SWEEP_POINTS} points`,
})

/** A parsed sweep grid. */
export type SweepGrid = z.infer<typeof SweepGridSchema>
