// The single entry point: one option at one site → energy, oxygen, safety flags, money. The result's
// shape is in results.ts, the flags and their plain-language reasons in flags.ts.
import type { AssessInput } from '../schemas/assess'
import { assessBaseline } from './baseline'
import { defaultsUsed } from './defaultsUsed'
import type { AnnualEnergy } from './energy'
import {
  exceedanceGrid, fdcFromPoints, fdcFromRecord, fdcStats, flowAtExceedance, reservedFlow,
  scaleFdcByAreaRatio, scaleRecordByAreaRatio,
} from './hydrology'
import { moneySummary } from './money'
import { buildScheme, flowState, powerState, type Conditions, type FlowState, type Scheme } from './scheme'
import { buildFlags } from './flags'
import type { AssessResult, MethodsComparison, ModeFigures, MonthRow, PerFlowRow, SummerLowFlow } from './results'
import { recoveredFraction, throatAreaRatio } from './venturi'
import { judgeYear, monthCurves, yearEnergy, type MonthCurve, type SiteHydrology, type YearJudgement } from './year'
import { ENGINE_VERSION } from './version'
import { MONTH_SHORT } from '../utils/months'

const PER_FLOW_EXCEEDANCES = [1, 5, 10, 20, 30, 40, 50, 60, 70, 80, 90, 95, 99] as const
const SUMMARY_GRID = 200

const mean = (xs: readonly number[]): number => (xs.length ? xs.reduce((s, x) => s + x, 0) / xs.length : 0)

function siteHydrology(input: AssessInput): SiteHydrology {
  const sc = input.gaugeScaling
  if (input.hydrology.kind === 'record') {
    const days = sc ? scaleRecordByAreaRatio(input.hydrology.days, sc.siteArea_km2, sc.gaugeArea_km2) : input.hydrology.days
    return { fdc: fdcFromRecord(days), days }
  }
  const fdc = fdcFromPoints(input.hydrology.points)
  return { fdc: sc ? scaleFdcByAreaRatio(fdc, sc.siteArea_km2, sc.gaugeArea_km2) : fdc, days: null }
}

/**
 * The month table's flow for each month: a record's mean for the month (the mean of the month's own
 * curve, which holds exactly that month's days), else the median of the month's curve, else the annual median.
 */
function monthFlows(h: SiteHydrology, curves: readonly MonthCurve[]): Array<{ flow: number, basis: MonthRow['flowBasis'] }> {
  const q50 = flowAtExceedance(h.fdc, 50)
  return curves.map((c) => {
    if (c.basis === 'record') return { flow: c.curve.meanFlow, basis: 'record-mean' as const }
    if (c.basis === 'seasonal-profile') return { flow: flowAtExceedance(c.curve, 50), basis: 'profile-median' as const }
    return { flow: q50, basis: 'annual-q50' as const }
  })
}

/** Mean annual conditions: the mean of the twelve months' temperature and upstream oxygen (month 0: never a closed month). */
function annualConditions(input: AssessInput): Conditions {
  return {
    month: 0,
    tC: mean(input.site.months.map((m) => m.temperature_C)),
    upstreamO2_mgL: mean(input.site.months.map((m) => m.upstreamOxygen_mgL)),
  }
}

function monthConditions(input: AssessInput): Conditions[] {
  return input.site.months.map((m, k) => ({ month: k + 1, tC: m.temperature_C, upstreamO2_mgL: m.upstreamOxygen_mgL }))
}

function perFlowRow(exceedance: number, f: FlowState): PerFlowRow {
  return {
    exceedance, riverFlow_m3s: f.riverFlow_m3s, regime: f.regime, shutReason: f.shutReason, unitsRunning: f.unitsRunning, unitFlow_m3s: f.unitFlow_m3s,
    spill_m3s: f.spill_m3s, reservedFlow_m3s: f.reserved_m3s, grossHead_m: f.grossHead_m, workingHead_m: f.workingHead_m,
    throatVelocity_ms: f.throatVelocity_ms, suctionHead_m: f.suction_m, cavitationMargin_m: f.cavitationMargin_m,
    cavitationIndex: f.cavitationIndex, airFlow_m3s: f.airFlow_m3s, electricalPower_kW: f.electricalPower_W / 1000,
    waterToWire: f.waterToWire, downstreamOxygenWithout_mgL: f.oxygen.withoutScheme_mgL,
    downstreamOxygenWith_mgL: f.oxygen.withScheme_mgL, netOxygenGain_mgL: f.oxygen.netGain_mgL,
    unitTotalDissolvedGas: f.oxygen.unitTdg, unitGasExcess_mmHg: f.oxygen.unitGasExcess_mmHg, mixedTotalDissolvedGas: f.oxygen.mixedTdg,
  }
}

/** One operating mode run over the year: its scheme, energy, whole-year judgement and the month table's states. */
interface YearRun {
  s: Scheme
  energy: AnnualEnergy
  year: YearJudgement
  monthStates: FlowState[]
}

function runYear(input: AssessInput, reserved: number, annual: Conditions, monthCond: Conditions[], h: SiteHydrology, curves: MonthCurve[], flows: Array<{ flow: number }>): YearRun {
  const s = buildScheme(input, reserved, annual)
  const energy = yearEnergy(input, h, s, monthCond, curves)
  const year = judgeYear(s, monthCond, curves)
  const monthStates = flows.map((f, m) => flowState(s, f.flow, monthCond[m] ?? annual))
  return { s, energy, year, monthStates }
}

function modeFigures(r: YearRun): ModeFigures {
  return {
    annualEnergy_MWh: r.energy.annualEnergy_MWh,
    worstMonthNetGain_mgL: Math.min(...r.monthStates.map((f) => f.oxygen.netGain_mgL)),
    worstNetGain_mgL: r.year.tallies['net-oxygen-loss'].worst?.value ?? 0,
    meanNetGain_mgL: r.year.meanNetGain_mgL,
  }
}

/** The same input run the other way (energy first ↔ river first). */
function otherMode(input: AssessInput): AssessInput {
  const mode = input.option.operation.mode === 'energy-first' ? 'river-first' : 'energy-first'
  return { ...input, option: { ...input.option, operation: { ...input.option.operation, mode } } }
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

/** What an assessment works out beyond the option's own figures. */
export interface AssessOptions {
  /**
   * Also run the other operating mode for the side-by-side comparison (default true). A sweep or a
   * sensitivity run, which read only the option's own figures, pass false and get the option's
   * own mode in both columns.
   */
  compareModes?: boolean
}

/** Assess one option at one site under its operating rule: per-flow table, month table, the year judged flow by flow, energy, both oxygen methods, both operating modes, flags, money. */
export function assess(input: AssessInput, options: AssessOptions = {}): AssessResult {
  const st = input.settings
  const o = input.option
  const h = siteHydrology(input)
  const reserved = reservedFlow(input.reservedFlow, h.fdc)
  const annual = annualConditions(input)
  const monthCond = monthConditions(input)
  const curves = monthCurves(input, h)
  const flows = monthFlows(h, curves)
  const main = runYear(input, reserved, annual, monthCond, h, curves, flows)
  const other = options.compareModes === false ? main : runYear(otherMode(input), reserved, annual, monthCond, h, curves, flows)
  const { s, energy, year, monthStates } = main
  const rating_W = s.ratedPerUnit_W * o.units
  const closed = new Set(o.operation.closedMonths)

  const perFlow = PER_FLOW_EXCEEDANCES.map((p) => perFlowRow(p, flowState(s, flowAtExceedance(h.fdc, p), annual)))
  // The states across the annual curve explain why units never run; only worked out when they do not.
  const grid = () => exceedanceGrid(SUMMARY_GRID).map((p) => powerState(s, flowAtExceedance(h.fdc, p), annual))

  const months: MonthRow[] = monthStates.map((fs, m) => {
    const c = monthCond[m] ?? annual
    const flowInfo = flows[m] ?? { flow: 0, basis: 'annual-q50' as const }
    const ym = year.months[m] ?? { runningShare: 0, lossShare: 0, worstNetGain_mgL: 0, flags: [] }
    const curveBasis = curves[m]?.basis ?? 'annual-curve'
    return {
      month: m + 1, name: MONTH_SHORT[m] ?? String(m + 1), temperature_C: c.tC, flow_m3s: flowInfo.flow, flowBasis: flowInfo.basis,
      curveBasis, closed: closed.has(m + 1),
      upstreamOxygen_mgL: c.upstreamO2_mgL, upstreamMeasured: input.site.months[m]?.upstreamMeasured ?? true, downstreamWithout_mgL: fs.oxygen.withoutScheme_mgL, downstreamWith_mgL: fs.oxygen.withScheme_mgL,
      downstreamWithoutRange_mgL: fs.oxygen.withoutSchemeRange_mgL,
      downstreamFieldTransfer_mgL: fs.oxygen.withSchemeFieldTransfer_mgL, downstreamBubbleModel_mgL: fs.oxygen.withSchemeBubbleModel_mgL,
      upstreamSupersaturated: c.upstreamO2_mgL > fs.oxygen.saturation_mgL,
      netGain_mgL: fs.oxygen.netGain_mgL, target_mgL: st.oxygenTarget_mgL, unitTotalDissolvedGas: fs.oxygen.unitTdg,
      unitGasExcess_mmHg: fs.unitsRunning > 0 ? fs.oxygen.unitGasExcess_mmHg : 0,
      cavitationMargin_m: fs.unitsRunning > 0 ? fs.cavitationMargin_m : null, flags: ym.flags,
      runningShare: ym.runningShare, lossShare: ym.lossShare, worstNetGain_mgL: ym.worstNetGain_mgL,
      energy_MWh: energy.energyByMonth_MWh[m] ?? 0,
      energyBasis: h.days ? 'record' : curveBasis === 'seasonal-profile' ? 'month-curve' : 'annual-curve',
    }
  })

  const slf = pickSummerLowFlow(months)
  // The summer low flow is one of the month rows (its flow and conditions), so its state is that row's.
  const slfState = monthStates[slf.month - 1] ?? flowState(s, slf.flow_m3s, monthCond[slf.month - 1] ?? annual)

  const money = moneySummary({
    ...o.costs, rating_W, units: o.units, annualEnergy_MWh: energy.annualEnergy_MWh,
    opexFraction: st.opexFraction, discountRate: st.discountRate, life_yr: st.life_yr, exportPrice: st.exportPrice, gridFactor: st.gridFactor,
  })

  const flags = buildFlags({ s, year, energy, grid })
  const worstCav = year.worstCavitation
  const worstTdg = year.worstTdg

  const slfOxygen = slfState.oxygen
  const methods: MethodsComparison = {
    summaryUses: st.oxygenMethod,
    note: 'The bubble model follows bubbles from the throat through the diffuser and up through the tail pool, exchanging oxygen and nitrogen with the unit\'s water at the local pressure (McGinnis & Little 2002; Wüest, Brooks & Imboden 1992): it gives the oxygen and the dissolved gas together. The field transfer is a per-metre-of-submergence efficiency in the ASCE/EWRI 2-06 form, made for diffusers on a tank floor, kept as a cross-check. Neither can pass what the air carries.',
    atSummerLowFlow: {
      fieldTransfer: { unitOutlet_mgL: slfOxygen.unitFieldTransfer_mgL, downstream_mgL: slfOxygen.withSchemeFieldTransfer_mgL, netGain_mgL: slfState.riverFlow_m3s > 0 ? slfOxygen.withSchemeFieldTransfer_mgL - slfOxygen.withoutScheme_mgL : 0 },
      bubbleModel: { unitOutlet_mgL: slfOxygen.unitBubbleModel_mgL, downstream_mgL: slfOxygen.withSchemeBubbleModel_mgL, netGain_mgL: slfState.riverFlow_m3s > 0 ? slfOxygen.withSchemeBubbleModel_mgL - slfOxygen.withoutScheme_mgL : 0 },
    },
    weir: { model: slfOxygen.weirModel, note: slfOxygen.weirModelNote, withoutRange_mgL: slfOxygen.withoutSchemeRange_mgL },
  }

  const energyFirst = o.operation.mode === 'energy-first' ? main : other
  const riverFirst = o.operation.mode === 'energy-first' ? other : main
  const g = s.geometry
  return {
    summary: {
      annualEnergy_MWh: energy.annualEnergy_MWh,
      capacityFactor: energy.capacityFactor,
      annualFullLoad_h: energy.annualFullLoad_h,
      ratedPower_kW: rating_W / 1000,
      ratingSizedToDesign: s.ratingSizedToDesign,
      meanAirFlow_m3s: year.meanAirFlow_m3s,
      peakAirFlow_m3s: year.peakAirFlow_m3s,
      minCavitationMargin_m: worstCav ? worstCav.cavitationMargin_m : null,
      minCavitationIndex: year.minCavitationIndex,
      maxUnitTotalDissolvedGas: worstTdg ? worstTdg.oxygen.unitTdg : 0,
      maxUnitGasExcess_mmHg: year.maxGasExcess_mmHg,
      netOxygenGainSummerLowFlow_mgL: slfState.oxygen.netGain_mgL,
      meanNetOxygenGain_mgL: year.meanNetGain_mgL,
      worstNetOxygenGain_mgL: year.tallies['net-oxygen-loss'].worst?.value ?? 0,
      recoveredFraction: recoveredFraction(g.inletLoss, g.diffuserEfficiency, throatAreaRatio(g)),
      summerLowFlow: slf,
      lcoe: money.lcoe,
      flags,
    },
    perFlow,
    months,
    methods,
    operation: {
      mode: o.operation.mode, allowedDrawdown_m: o.operation.allowedDrawdown_m, closedMonths: [...o.operation.closedMonths].sort((a, b) => a - b),
      runningShare: year.runningShare, modesCompared: other !== main, energyFirst: modeFigures(energyFirst), riverFirst: modeFigures(riverFirst),
      energyGivenUpForRiver_MWh: energyFirst.energy.annualEnergy_MWh - riverFirst.energy.annualEnergy_MWh,
      basis: year.basis,
    },
    hydrology: {
      ...fdcStats(h.fdc), reservedFlow_m3s: reserved, basis: h.days ? 'record' : 'fdc',
      daysWithData: h.days ? h.fdc.count : null,
    },
    money,
    baseline: assessBaseline({ input, h, reserved_m3s: reserved, curves, months: monthCond, annual, monthFlows_m3s: flows.map((f) => f.flow), venturi: { annualEnergy_MWh: energy.annualEnergy_MWh, meanNetGain_mgL: year.meanNetGain_mgL } }),
    defaultsUsed: defaultsUsed(input),
    engineVersion: ENGINE_VERSION,
  }
}
