// The single entry point: one option at one site → energy, oxygen, safety flags, money. The result's
// shape is in results.ts, the flags and their plain-language reasons in flags.ts.
import type { AssessInput } from '../schemas/assess'
import { defaultsUsed } from './defaultsUsed'
import { annualEnergyFromFdc, annualEnergyFromRecord, DAYS_IN_MONTH, tabulatedPower, type AnnualEnergy, type PowerAt, type PowerSample } from './energy'
import {
  exceedanceGrid, fdcFromPoints, fdcFromRecord, fdcStats, flowAtExceedance, monthOfDay, reservedFlow,
  scaleFdcByAreaRatio, scaleRecordByAreaRatio, type DailyFlow, type Fdc,
} from './hydrology'
import { moneySummary } from './money'
import { buildScheme, flowState, powerSample, powerState, type Conditions, type FlowState, type PowerState, type Scheme } from './scheme'
import { unitTotalDissolvedGas } from './schemeOxygen'
import { buildFlags, NET_LOSS_TOLERANCE_mgL, type Running } from './flags'
import type { AssessResult, FlagId, MethodsComparison, MonthRow, PerFlowRow, SummerLowFlow } from './results'
import { ENGINE_VERSION } from './version'
import { MONTH_SHORT } from '../utils/months'

const PER_FLOW_EXCEEDANCES = [1, 5, 10, 20, 30, 40, 50, 60, 70, 80, 90, 95, 99] as const
const SUMMARY_GRID = 200

const mean = (xs: readonly number[]): number => (xs.length ? xs.reduce((s, x) => s + x, 0) / xs.length : 0)

/** The site's hydrology after gauge scaling: its FDC and, for a record, its days. */
interface SiteHydrology {
  fdc: Fdc
  days: DailyFlow[] | null
}

function siteHydrology(input: AssessInput): SiteHydrology {
  const sc = input.gaugeScaling
  if (input.hydrology.kind === 'record') {
    const days = sc ? scaleRecordByAreaRatio(input.hydrology.days, sc.siteArea_km2, sc.gaugeArea_km2) : input.hydrology.days
    return { fdc: fdcFromRecord(days), days }
  }
  const fdc = fdcFromPoints(input.hydrology.points)
  return { fdc: sc ? scaleFdcByAreaRatio(fdc, sc.siteArea_km2, sc.gaugeArea_km2) : fdc, days: null }
}

function monthFlows(input: AssessInput, h: SiteHydrology): Array<{ flow: number, basis: MonthRow['flowBasis'] }> {
  if (h.days) {
    const sum = new Array<number>(12).fill(0)
    const n = new Array<number>(12).fill(0)
    h.days.forEach((d, i) => {
      if (d.flow === null) return
      const m = monthOfDay(d.date, i, 'hydrology.days') - 1
      sum[m] = (sum[m] ?? 0) + d.flow
      n[m] = (n[m] ?? 0) + 1
    })
    const q50 = flowAtExceedance(h.fdc, 50)
    return sum.map((s, m) => ((n[m] ?? 0) > 0 ? { flow: s / (n[m] ?? 1), basis: 'record-mean' as const } : { flow: q50, basis: 'annual-q50' as const }))
  }
  const q50 = flowAtExceedance(h.fdc, 50)
  const sc = input.gaugeScaling
  const ratio = sc ? sc.siteArea_km2 / sc.gaugeArea_km2 : 1
  return input.site.months.map((m) => (m.flow_m3s !== undefined ? { flow: m.flow_m3s * ratio, basis: 'entered' as const } : { flow: q50, basis: 'annual-q50' as const }))
}

/** Mean annual conditions: the mean of the twelve months' temperature and upstream oxygen. */
function annualConditions(input: AssessInput): Conditions {
  return {
    tC: mean(input.site.months.map((m) => m.temperature_C)),
    upstreamO2_mgL: mean(input.site.months.map((m) => m.upstreamOxygen_mgL)),
  }
}

function monthConditions(input: AssessInput): Conditions[] {
  return input.site.months.map((m) => ({ tC: m.temperature_C, upstreamO2_mgL: m.upstreamOxygen_mgL }))
}

function energyOf(input: AssessInput, h: SiteHydrology, s: Scheme, annual: Conditions, months: Conditions[]): AnnualEnergy {
  const stateAt = (flow: number, month: number): PowerSample => powerSample(s, flow, month === 0 ? annual : (months[month - 1] ?? annual))
  const exact: PowerAt = (flow, month) => stateAt(flow, month).power
  // A long record has a distinct flow almost every day: tabulate power over its range instead.
  // The FDC's flows fall as exceedance rises: the first is the highest, the last positive the lowest.
  const flows = h.fdc.flow
  let last = flows.length - 1
  while (last > 0 && !((flows[last] ?? 0) > 0)) last--
  const opts = { rating_W: s.ratedPerUnit_W * input.option.units, availability: input.settings.availability }
  if (!h.days) return annualEnergyFromFdc(h.fdc, exact, opts)
  return annualEnergyFromRecord(h.days, tabulatedPower(stateAt, flows[last] ?? 0, flows[0] ?? 0), { ...opts, memoise: false })
}

function perFlowRow(exceedance: number, f: FlowState): PerFlowRow {
  return {
    exceedance, riverFlow_m3s: f.riverFlow_m3s, regime: f.regime, unitsRunning: f.unitsRunning, unitFlow_m3s: f.unitFlow_m3s,
    spill_m3s: f.spill_m3s, reservedFlow_m3s: f.reserved_m3s, grossHead_m: f.grossHead_m, workingHead_m: f.workingHead_m,
    throatVelocity_ms: f.throatVelocity_ms, suctionHead_m: f.suction_m, cavitationMargin_m: f.cavitationMargin_m,
    cavitationIndex: f.cavitationIndex, airFlow_m3s: f.airFlow_m3s, electricalPower_kW: f.electricalPower_W / 1000,
    waterToWire: f.waterToWire, downstreamOxygenWithout_mgL: f.oxygen.withoutScheme_mgL,
    downstreamOxygenWith_mgL: f.oxygen.withScheme_mgL, netOxygenGain_mgL: f.oxygen.netGain_mgL,
    unitTotalDissolvedGas: f.oxygen.unitTdg,
  }
}

/** The warmest three months; of those, the one with the lowest month flow (summer low flow). */
function pickSummerLowFlow(rows: ReadonlyArray<{ month: number, temperature_C: number, flow_m3s: number }>): SummerLowFlow {
  const warm = [...rows].sort((a, b) => b.temperature_C - a.temperature_C || a.month - b.month).slice(0, 3)
  const low = warm.reduce((best, r) => (r.flow_m3s < best.flow_m3s ? r : best), warm[0] ?? { month: 7, temperature_C: 15, flow_m3s: 0 })
  return {
    month: low.month, flow_m3s: low.flow_m3s, temperature_C: low.temperature_C,
    basis: 'lowest month flow among the three warmest months, at that month\'s temperature and upstream oxygen',
  }
}

/** Assess one option at one site: per-flow table across the FDC, month table, annual energy, oxygen by both methods, flags, money. */
export function assess(input: AssessInput): AssessResult {
  const st = input.settings
  const h = siteHydrology(input)
  const reserved = reservedFlow(input.reservedFlow, h.fdc)
  const annual = annualConditions(input)
  const monthCond = monthConditions(input)
  const s = buildScheme(input, reserved, annual)
  const energy = energyOf(input, h, s, annual, monthCond)
  const rating_W = s.ratedPerUnit_W * input.option.units

  const perFlow = PER_FLOW_EXCEEDANCES.map((p) => perFlowRow(p, flowState(s, flowAtExceedance(h.fdc, p), annual)))
  const gridFlows = exceedanceGrid(SUMMARY_GRID).map((p) => flowAtExceedance(h.fdc, p))
  // The summary grids need the power side everywhere but, of the oxygen side, only the total
  // dissolved gas where units run (see unitTotalDissolvedGas).
  const grid = gridFlows.map((q) => powerState(s, q, annual))
  const warmest = monthCond.reduce((a, b) => (b.tC > a.tC ? b : a), monthCond[0] ?? annual)
  const warmGrid = gridFlows.map((q) => powerState(s, q, warmest))

  const flows = monthFlows(input, h)
  const monthStates = flows.map((f, m) => flowState(s, f.flow, monthCond[m] ?? annual))
  const months: MonthRow[] = monthStates.map((fs, m) => {
    const c = monthCond[m] ?? annual
    const flowInfo = flows[m] ?? { flow: 0, basis: 'annual-q50' as const }
    const recorded = energy.energyByMonth_MWh[m]
    const e = recorded ?? (fs.electricalPower_W * (DAYS_IN_MONTH[m] ?? 30) * 24 * st.availability) / 1e6
    const flags: FlagId[] = []
    if (fs.oxygen.withScheme_mgL < st.oxygenTarget_mgL) flags.push('oxygen-below-target')
    if (fs.oxygen.netGain_mgL < -NET_LOSS_TOLERANCE_mgL) flags.push('net-oxygen-loss')
    if (fs.unitsRunning > 0 && fs.oxygen.unitTdg > st.tdgLimit) flags.push('gas-supersaturation')
    if (fs.unitsRunning > 0 && fs.cavitationMargin_m < st.minCavitationMargin_m) flags.push('cavitation')
    return {
      month: m + 1, name: MONTH_SHORT[m] ?? String(m + 1), temperature_C: c.tC, flow_m3s: flowInfo.flow, flowBasis: flowInfo.basis,
      upstreamOxygen_mgL: c.upstreamO2_mgL, downstreamWithout_mgL: fs.oxygen.withoutScheme_mgL, downstreamWith_mgL: fs.oxygen.withScheme_mgL,
      downstreamFieldTransfer_mgL: fs.oxygen.withSchemeFieldTransfer_mgL, downstreamBubbleContact_mgL: fs.oxygen.withSchemeBubbleContact_mgL,
      netGain_mgL: fs.oxygen.netGain_mgL, target_mgL: st.oxygenTarget_mgL, unitTotalDissolvedGas: fs.oxygen.unitTdg,
      cavitationMargin_m: fs.unitsRunning > 0 ? fs.cavitationMargin_m : null, flags, energy_MWh: e,
      energyBasis: recorded === null || recorded === undefined ? 'month-flow' : 'record',
    }
  })

  const slf = pickSummerLowFlow(months)
  // The summer low flow is one of the month rows (its flow and conditions), so its state is that row's.
  const slfState = monthStates[slf.month - 1] ?? flowState(s, slf.flow_m3s, monthCond[slf.month - 1] ?? annual)

  const runningStates: Running[] = [
    ...warmGrid.filter((g) => g.unitsRunning > 0).map((g) => ({ state: g, tdg: unitTotalDissolvedGas(s, g, warmest) })),
    ...grid.filter((g) => g.unitsRunning > 0).map((g) => ({ state: g, tdg: unitTotalDissolvedGas(s, g, annual) })),
    ...monthStates.filter((g) => g.unitsRunning > 0).map((g) => ({ state: g, tdg: g.oxygen.unitTdg })),
  ]
  const worst = runningStates.reduce<PowerState | null>((w, g) => (w === null || g.state.cavitationMargin_m < w.cavitationMargin_m ? g.state : w), null)
  const tdgWorst = runningStates.reduce<Running | null>((w, g) => (w === null || g.tdg > w.tdg ? g : w), null)
  const maxTdg = tdgWorst ? tdgWorst.tdg : 0
  const sigmas = runningStates.map((g) => g.state.cavitationIndex).filter((x): x is number => x !== null)

  const money = moneySummary({
    ...input.option.costs, rating_W, units: input.option.units, annualEnergy_MWh: energy.annualEnergy_MWh,
    opexFraction: st.opexFraction, discountRate: st.discountRate, life_yr: st.life_yr, exportPrice: st.exportPrice, gridFactor: st.gridFactor,
  })

  const flags = buildFlags({ s, worst, tdgWorst, maxTdg, months, slfGain: slfState.oxygen.netGain_mgL, slf, energy, grid })

  // Both oxygen methods at summer low flow, whichever one the summary uses.
  const slfOxygen = slfState.oxygen
  const methods: MethodsComparison = {
    summaryUses: st.oxygenMethod,
    note: 'Field transfer applies the ASCE/EWRI 2-06 correction, made for diffusers on a tank floor; bubble contact uses Higbie penetration theory for air drawn into a turbulent throat and diffuser. Both approach saturation exponentially and neither can pass it.',
    atSummerLowFlow: {
      fieldTransfer: { unitOutlet_mgL: slfOxygen.unitFieldTransfer_mgL, downstream_mgL: slfOxygen.withSchemeFieldTransfer_mgL, netGain_mgL: slfState.riverFlow_m3s > 0 ? slfOxygen.withSchemeFieldTransfer_mgL - slfOxygen.withoutScheme_mgL : 0 },
      bubbleContact: { unitOutlet_mgL: slfOxygen.unitBubbleContact_mgL, downstream_mgL: slfOxygen.withSchemeBubbleContact_mgL, netGain_mgL: slfState.riverFlow_m3s > 0 ? slfOxygen.withSchemeBubbleContact_mgL - slfOxygen.withoutScheme_mgL : 0 },
    },
  }

  return {
    summary: {
      annualEnergy_MWh: energy.annualEnergy_MWh,
      capacityFactor: energy.capacityFactor,
      annualFullLoad_h: energy.annualFullLoad_h,
      ratedPower_kW: rating_W / 1000,
      ratingSizedToDesign: s.ratingSizedToDesign,
      meanAirFlow_m3s: mean(grid.map((g) => g.airFlow_m3s)),
      peakAirFlow_m3s: Math.max(0, ...grid.map((g) => g.airFlow_m3s)),
      minCavitationMargin_m: worst ? worst.cavitationMargin_m : null,
      minCavitationIndex: sigmas.length ? Math.min(...sigmas) : null,
      maxUnitTotalDissolvedGas: maxTdg,
      netOxygenGainSummerLowFlow_mgL: slfState.oxygen.netGain_mgL,
      summerLowFlow: slf,
      lcoe: money.lcoe,
      flags,
    },
    perFlow,
    months,
    methods,
    hydrology: {
      ...fdcStats(h.fdc), reservedFlow_m3s: reserved, basis: h.days ? 'record' : 'fdc',
      daysWithData: h.days ? h.fdc.count : null,
    },
    money,
    defaultsUsed: defaultsUsed(input),
    engineVersion: ENGINE_VERSION,
  }
}
