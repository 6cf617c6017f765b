// The shape of an assessment's result: the per-flow and month tables, the headline figures, both
// oxygen methods, the flags. Shared by the engine, the API and every page that shows a result.
import type { MoneySummary } from './money'
import type { DefaultUsed } from './defaultsUsed'
import type { FdcStats } from './hydrology'
import type { FlowState } from './scheme'

/** Names of the flags an assessment raises. */
export type FlagId = 'cavitation' | 'gas-supersaturation' | 'oxygen-below-target' | 'net-oxygen-loss' | 'head-limited-never-runs'

/** One flag, raised or clear, with a plain-language reason either way. */
export interface Flag {
  id: FlagId
  raised: boolean
  /** True for flags about harm (to people, plant or fish); the sweep keeps these clear. */
  safety: boolean
  reason: string
}

/** One row of the table across the flow-duration curve. */
export interface PerFlowRow {
  /** % of time the flow is equalled or exceeded. */
  exceedance: number
  riverFlow_m3s: number
  regime: FlowState['regime']
  unitsRunning: number
  unitFlow_m3s: number
  spill_m3s: number
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
}

/** One row of the month table. */
export interface MonthRow {
  month: number
  name: string
  temperature_C: number
  flow_m3s: number
  flowBasis: 'record-mean' | 'entered' | 'annual-q50'
  upstreamOxygen_mgL: number
  downstreamWithout_mgL: number
  downstreamWith_mgL: number
  downstreamFieldTransfer_mgL: number
  downstreamBubbleContact_mgL: number
  netGain_mgL: number
  target_mgL: number
  unitTotalDissolvedGas: number
  cavitationMargin_m: number | null
  flags: FlagId[]
  energy_MWh: number
  energyBasis: 'record' | 'month-flow'
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
  netOxygenGainSummerLowFlow_mgL: number
  summerLowFlow: SummerLowFlow
  lcoe: number | null
  flags: Flag[]
}

/** Both oxygen methods side by side. */
export interface MethodsComparison {
  summaryUses: 'field-transfer' | 'bubble-contact'
  note: string
  atSummerLowFlow: Record<'fieldTransfer' | 'bubbleContact', { unitOutlet_mgL: number, downstream_mgL: number, netGain_mgL: number }>
}

/** Result of one assessment. */
export interface AssessResult {
  summary: AssessSummary
  perFlow: PerFlowRow[]
  months: MonthRow[]
  methods: MethodsComparison
  hydrology: FdcStats & { reservedFlow_m3s: number, basis: 'fdc' | 'record', daysWithData: number | null }
  money: MoneySummary
  defaultsUsed: DefaultUsed[]
  engineVersion: string
}
