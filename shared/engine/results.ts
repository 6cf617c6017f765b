// The shape of an assessment's result: the per-flow and month tables, the headline figures, both
// oxygen methods, the flags. Shared by the engine, the API and every page that shows a result.
import type { MoneySummary } from './money'
import type { DefaultUsed } from './defaultsUsed'
import type { FdcStats } from './hydrology'
import type { UncertaintyResult } from './monteCarlo'
import type { YearByYear } from './recordYears'
import type { FlowState } from './scheme'

/** Names of the flags an assessment raises. */
export type FlagId = 'cavitation' | 'gas-supersaturation' | 'scheme-below-target' | 'net-oxygen-loss' | 'oxygen-below-target' | 'never-runs' | 'does-not-pay'

/**
 * How serious a raised flag is: `safety` is harm to people, plant or fish (red); `river` is a cost to
 * the river's oxygen the regulator will weigh (amber); `money` is a scheme that does not pay its way
 * (it harms no one, but a developer stops there); `note` is for information.
 */
export type FlagLevel = 'safety' | 'river' | 'money' | 'note'

/** The worst value a flag met over the year, and when. */
export interface FlagWorst {
  value: number
  unit: string
  /** Calendar month 1–12. */
  month: number
  monthName: string
  flow_m3s: number
  /** % of the month's time that flow is equalled or exceeded. */
  exceedance: number
}

/** One flag, raised or clear, with a plain-language reason either way. */
export interface Flag {
  id: FlagId
  raised: boolean
  level: FlagLevel
  /** True for `safety` flags; the sweep keeps these clear. */
  safety: boolean
  /** Share of the year (0–1) the flag is raised; null for a flag about the whole scheme. */
  shareOfTime: number | null
  /** Worst value over the year and when; null where it does not apply (units never run). */
  worst: FlagWorst | null
  reason: string
}

/** One row of the table across the flow-duration curve. */
export interface PerFlowRow {
  /** % of time the flow is equalled or exceeded. */
  exceedance: number
  riverFlow_m3s: number
  regime: FlowState['regime']
  /** Why units the water could feed stay shut here (null when all it can feed run). */
  shutReason: FlowState['shutReason']
  unitsRunning: number
  unitFlow_m3s: number
  spill_m3s: number
  /** What the flow rules leave in the river at this flow (the hands-off flow with only that rule), m³/s; the spill comes on top. */
  reservedFlow_m3s: number
  grossHead_m: number
  workingHead_m: number
  throatVelocity_ms: number
  suctionHead_m: number
  cavitationMargin_m: number
  cavitationIndex: number | null
  airFlow_m3s: number
  electricalPower_kW: number
  waterToWire: number
  downstreamOxygenWithout_mgL: number
  downstreamOxygenWith_mgL: number
  netOxygenGain_mgL: number
  unitTotalDissolvedGas: number
  unitGasExcess_mmHg: number
  /** Total dissolved gas below the weir after full mixing, fraction. */
  mixedTotalDissolvedGas: number
  /** Throat depth below the tail surface at this flow, m (moves with the tail when heads come from the weir's hydraulics); absent from results stored before it. */
  throatDepth_m?: number
  /** Tail depth over the tail-pool bed by the weir's hydraulics, m; null with the head table; absent from results stored before it. */
  tailDepth_m?: number | null
  /** The weir is drowned at this flow (its aeration is a submerged sluice's); absent from results stored before it. */
  weirDrowned?: boolean
}

/** One row of the month table. */
export interface MonthRow {
  month: number
  name: string
  temperature_C: number
  flow_m3s: number
  /** The month's flow: the record's mean for the month, the median of the curve scaled by the seasonal profile, or the annual median (no profile). */
  flowBasis: 'record-mean' | 'profile-median' | 'annual-q50'
  /** Where the month's curve comes from (its days, the seasonal profile, or the annual curve). */
  curveBasis: 'record' | 'seasonal-profile' | 'annual-curve'
  /** True when the option's operating rule shuts every unit this month. */
  closed: boolean
  upstreamOxygen_mgL: number
  /** False when the site marked this month's upstream oxygen as not measured (the value given was used). */
  upstreamMeasured: boolean
  downstreamWithout_mgL: number
  downstreamWith_mgL: number
  /** Lowest and highest oxygen below the weir without the scheme across the weir aeration models, mg/L. */
  downstreamWithoutRange_mgL: { min_mgL: number, max_mgL: number }
  downstreamFieldTransfer_mgL: number
  downstreamBubbleModel_mgL: number
  /** Upstream water above saturation: the units can only degas it (a net loss here is that, not a failure). */
  upstreamSupersaturated: boolean
  netGain_mgL: number
  target_mgL: number
  unitTotalDissolvedGas: number
  /** Excess gas pressure of the unit discharge over the barometric pressure, mmHg (0 when stopped). */
  unitGasExcess_mmHg: number
  cavitationMargin_m: number | null
  /** Flags raised at any flow of the month's curve. */
  flags: FlagId[]
  /** Share of the month at least one unit runs. */
  runningShare: number
  /** Share of the month with a net oxygen loss beyond the acceptable one. */
  lossShare: number
  /** Worst net oxygen change over the month's curve, mg/L. */
  worstNetGain_mgL: number
  energy_MWh: number
  /** `record`: the month's days; `month-curve`: the month's scaled curve; `annual-curve`: the annual curve at this month's conditions (no seasonal profile). */
  energyBasis: 'record' | 'month-curve' | 'annual-curve'
}

/** Energy and oxygen of one operating mode, for the side-by-side comparison. */
export interface ModeFigures {
  annualEnergy_MWh: number
  /** Lowest month-table net oxygen change, mg/L. */
  worstMonthNetGain_mgL: number
  /** Worst net oxygen change at any flow of the year, mg/L. */
  worstNetGain_mgL: number
  /** Time-weighted mean net oxygen change over the year, mg/L. */
  meanNetGain_mgL: number
}

/** How the units are run, and what each mode gives. */
export interface OperatingSummary {
  mode: 'energy-first' | 'river-first'
  allowedDrawdown_m: number
  closedMonths: number[]
  /** Share of the year at least one unit runs. */
  runningShare: number
  /** False when only the option's own mode was run (a sweep point): both columns then hold its figures. */
  modesCompared: boolean
  energyFirst: ModeFigures
  riverFirst: ModeFigures
  /** Energy first minus river first, MWh/yr: the energy given up for the river (≥ 0 in practice). */
  energyGivenUpForRiver_MWh: number
  /** How the year was judged, in words. */
  basis: string
}

/** The condition the summary's oxygen figure is taken at. */
export interface SummerLowFlow {
  month: number
  flow_m3s: number
  temperature_C: number
  basis: string
}

/** Headline figures. */
export interface AssessSummary {
  annualEnergy_MWh: number
  capacityFactor: number
  annualFullLoad_h: number
  ratedPower_kW: number
  ratingSizedToDesign: boolean
  meanAirFlow_m3s: number
  peakAirFlow_m3s: number
  /** Null when the units never run. */
  minCavitationMargin_m: number | null
  /** Smallest throat cavitation index σ where units run; null when they never run. */
  minCavitationIndex: number | null
  maxUnitTotalDissolvedGas: number
  /** Largest excess gas pressure of the unit discharge over the barometric pressure, mmHg. */
  maxUnitGasExcess_mmHg: number
  netOxygenGainSummerLowFlow_mgL: number
  /** Time-weighted mean net oxygen change over the year, mg/L. */
  meanNetOxygenGain_mgL: number
  /** Worst net oxygen change at any flow of the year, mg/L. */
  worstNetOxygenGain_mgL: number
  /** Fraction of the throat differential the diffuser recovers, η_d(1 − r²)/(1 + k_in − r²). */
  recoveredFraction: number
  summerLowFlow: SummerLowFlow
  lcoe: number | null
  flags: Flag[]
}

/** Both oxygen methods side by side, and the weir model behind the "without" figure. */
export interface MethodsComparison {
  summaryUses: 'bubble-model' | 'field-transfer'
  note: string
  atSummerLowFlow: Record<'fieldTransfer' | 'bubbleModel', { unitOutlet_mgL: number, downstream_mgL: number, netGain_mgL: number }>
  /** The weir aeration model used for the water over the weir, what it stands on, and the range between models at summer low flow. */
  weir: { model: 'butts-evans' | 'avery-novak' | 'measured', note: string, withoutRange_mgL: { min_mgL: number, max_mgL: number } }
}

/** The conventional low-head unit at the same weir (ENGINE.md §11), and what the venturi scheme gives up against it. */
export interface BaselineResult {
  kind: 'screw' | 'propeller' | 'cross-flow'
  /** The kind in plain words. */
  kindLabel: string
  designFlow_m3s: number
  /** Where the design flow comes from: the default rule, or given with the option. */
  designFlowBasis: string
  ratedPower_kW: number
  annualEnergy_MWh: number
  capacityFactor: number
  /** Time-weighted mean net oxygen change below the weir with the baseline, mg/L (never a gain unless the river upstream is above saturation). */
  meanNetOxygenGain_mgL: number
  /** Lowest month-table net oxygen change with the baseline, mg/L. */
  worstMonthNetOxygenGain_mgL: number
  capex: number
  /** Installed cost per kW used, and where it comes from. */
  ratedPowerPrice: number
  ratedPowerPriceSource: string
  /** Installed cost by the ORNL non-powered-dam formula, 2014 US dollars: a cross-check only; null with no rating. */
  capexCrossCheck_usd2014: number | null
  annualOpex: number
  lcoe: number | null
  npv: number
  simplePayback_yr: number | null
  /** Baseline energy less the scheme's, MWh/yr (negative when the scheme makes more). */
  energyGivenUp_MWh: number
  /** The scheme's mean net oxygen change less the baseline's, mg/L. */
  oxygenGainedOverBaseline_mgL: number
  /** mg/L gained over the baseline per MWh/yr given up; null when nothing is given up. */
  oxygenPerMWhGivenUp: number | null
  /** MWh/yr given up per mg/L gained over the baseline; null when nothing is given up or no oxygen is gained. */
  energyGivenUpPerMgL: number | null
  /** The part-load curve used (turbine only) and where it comes from. */
  curve: Array<{ flowFraction: number, efficiency: number }>
  curveSource: string
  /** How the baseline was worked out, in words. */
  basis: string
}

/** The few baseline figures the one-line comparisons need (results card, comparison, reviewer's brief, landowner summary). */
export interface BaselineLine {
  kindLabel: string
  annualEnergy_MWh: number
  /** The venturi scheme's own annual energy, MWh/yr. */
  schemeEnergy_MWh: number
  energyGivenUp_MWh: number
  oxygenGainedOverBaseline_mgL: number
}

/** Result of one assessment. */
export interface AssessResult {
  summary: AssessSummary
  perFlow: PerFlowRow[]
  months: MonthRow[]
  methods: MethodsComparison
  operation: OperatingSummary
  hydrology: FdcStats & { reservedFlow_m3s: number, basis: 'fdc' | 'record', daysWithData: number | null }
  /** Year by year from a daily record (null for an entered curve): energy and oxygen per complete year, P50/P90 energy, the driest year. */
  years: YearByYear | null
  /**
   * The seeded Monte Carlo over the uncertain inputs (monteCarlo.ts); null where it was not run (a
   * sweep's points, a sensitivity's ends, or draws set to 0).
   */
  uncertainty: UncertaintyResult | null
  money: MoneySummary
  /** Absent from results stored before the baseline was added. */
  baseline?: BaselineResult
  /** The depleted reach under the flow rules (depletedReach.ts); absent from results stored before flow rules. */
  depletedReach?: DepletedReach
  defaultsUsed: DefaultUsed[]
  engineVersion: string
}

/** The depleted reach (ENGINE.md §13): what stays over the weir, with and without the scheme. */
export interface DepletedReach {
  /** The site's preset, as stored ('none' when only the hands-off flow applies). */
  preset: 'none' | 'low-sensitivity' | 'high-sensitivity' | 'custom'
  handsOff_m3s: number
  passFlow_m3s: number
  /** Maximum take, m³/s; null when there is none. */
  maxTake_m3s: number | null
  keptShare_pct: number
  /** Flow-duration curves of the river itself and of the flow left over the weir with the scheme. */
  curve: Array<{ exceedance: number, natural_m3s: number, withScheme_m3s: number }>
  /** Days a year the river below the weir runs at the hands-off (and pass) flow only. */
  annualHandsOffOnly_d: number
  basis: string
}
