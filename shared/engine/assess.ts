// The single entry point: one option at one site → energy, oxygen, safety flags, money. The result's
// shape is in results.ts, the flags and their plain-language reasons in flags.ts.
import type { AssessInput } from '../schemas/assess'
import { assessBaseline } from './baseline'
import { defaultsUsed } from './defaultsUsed'
import { depletedReach } from './depletedReach'
import { exceedanceGrid, fdcStats, flowAtExceedance } from './hydrology'
import { yearByYear } from './recordYears'
import { basisScheme, runBasis, type RunBasis } from './runBasis'
import { monteCarlo } from './monteCarlo'
import { flowState, powerState, riverFirstState, schemeMoney, type FlowState, type Scheme } from './scheme'
import { buildFlags, moneyFlag, withMoneyAtP50 } from './flags'
import type { AssessResult, MethodsComparison, ModeFigures, MonthRow, PerFlowRow, SummerLowFlow } from './results'
import { recoveredFraction, throatAreaRatio } from './venturi'
import { judgeYear, yearEnergy, yearStates, type YearEnergy, type YearJudgement, type YearStates } from './year'
import { ENGINE_VERSION } from './version'
import { MONTH_SHORT } from '../utils/months'

const PER_FLOW_EXCEEDANCES = [1, 5, 10, 20, 30, 40, 50, 60, 70, 80, 90, 95, 99] as const
const SUMMARY_GRID = 200

function perFlowRow(exceedance: number, f: FlowState): PerFlowRow {
  return {
    exceedance, riverFlow_m3s: f.riverFlow_m3s, regime: f.regime, shutReason: f.shutReason, unitsRunning: f.unitsRunning, unitFlow_m3s: f.unitFlow_m3s,
    spill_m3s: f.spill_m3s, reservedFlow_m3s: f.reserved_m3s, grossHead_m: f.grossHead_m, workingHead_m: f.workingHead_m,
    throatVelocity_ms: f.throatVelocity_ms, suctionHead_m: f.suction_m, cavitationMargin_m: f.cavitationMargin_m,
    cavitationIndex: f.cavitationIndex, airFlow_m3s: f.airFlow_m3s, electricalPower_kW: f.electricalPower_W / 1000,
    waterToWire: f.waterToWire, downstreamOxygenWithout_mgL: f.oxygen.withoutScheme_mgL,
    downstreamOxygenWith_mgL: f.oxygen.withScheme_mgL, netOxygenGain_mgL: f.oxygen.netGain_mgL,
    unitTotalDissolvedGas: f.oxygen.unitTdg, unitGasExcess_mmHg: f.oxygen.unitGasExcess_mmHg, mixedTotalDissolvedGas: f.oxygen.mixedTdg,
    throatDepth_m: f.throatDepth_m, tailDepth_m: f.tailDepth_m, weirDrowned: f.oxygen.weirDrowned,
  }
}

/** One operating mode run over the year: its scheme, energy, the states the year is judged at, the judgement and the month table's states. */
interface YearRun {
  s: Scheme
  energy: YearEnergy
  states: YearStates
  year: YearJudgement
  monthStates: FlowState[]
}

/**
 * Run `input` over the year. A river-first run given the same option's energy-first run reuses every
 * state the river test lets stand (riverFirstState): the two modes differ only where energy first
 * would cost the river.
 */
function runYear(input: AssessInput, b: RunBasis, energyFirst?: YearRun): YearRun {
  const s = basisScheme(input, b)
  const energy = yearEnergy(input, b.h, s, b.monthCond, b.curves)
  const states = yearStates(s, b.monthCond, b.curves, energyFirst?.states)
  const year = judgeYear(s, b.curves, states)
  const monthStates = b.flows.map((f, m) => {
    const c = b.monthCond[m] ?? b.annual
    const e = energyFirst?.monthStates[m]
    return e ? riverFirstState(s, e, c) : flowState(s, f.flow, c)
  })
  return { s, energy, states, year, monthStates }
}

/** The option's own run and the other mode's: the energy-first run first, so the river-first run can reuse its states. */
function runBothModes(input: AssessInput, b: RunBasis, compareModes: boolean): { main: YearRun, other: YearRun } {
  const riverFirst = input.option.operation.mode === 'river-first'
  if (!compareModes) {
    const main = runYear(input, b)
    return { main, other: main }
  }
  const energyInput = riverFirst ? otherMode(input) : input
  const e = runYear(energyInput, b)
  const r = runYear(riverFirst ? input : otherMode(input), b, e)
  return riverFirst ? { main: r, other: e } : { main: e, other: r }
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
  const basis = runBasis(input)
  const { h, reserved, annual, monthCond, curves, flows } = basis
  const { main, other } = runBothModes(input, basis, options.compareModes !== false)
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
      energyBasis: h.record ? 'record' : curveBasis === 'seasonal-profile' ? 'month-curve' : 'annual-curve',
    }
  })

  const slf = pickSummerLowFlow(months)
  // The summer low flow is one of the month rows (its flow and conditions), so its state is that row's.
  const slfState = monthStates[slf.month - 1] ?? flowState(s, slf.flow_m3s, monthCond[slf.month - 1] ?? annual)

  // Civils are priced on the design flow: every unit running full at the gross head.
  const money = schemeMoney(s, energy.annualEnergy_MWh)

  const flags = [...buildFlags({ s, year, energy, grid }), moneyFlag(money, st.exportPrice)]
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
      ...fdcStats(h.fdc), reservedFlow_m3s: reserved, basis: h.record ? 'record' : 'fdc',
      daysWithData: h.record ? h.fdc.count : null,
    },
    years: h.record && energy.byYear ? yearByYear(h.record.sample, energy.byYear, st.availability, main.states) : null,
    uncertainty: null,
    money,
    baseline: assessBaseline({ input, h, reserved_m3s: reserved, rules: basis.rules, curves, months: monthCond, annual, monthFlows_m3s: flows.map((f) => f.flow), venturi: { annualEnergy_MWh: energy.annualEnergy_MWh, meanNetGain_mgL: year.meanNetGain_mgL }, states: main.states }),
    depletedReach: depletedReach(input.flowRules, basis.rules, main.states),
    defaultsUsed: defaultsUsed(input),
    engineVersion: ENGINE_VERSION,
  }
}

/**
 * An assessment with its Monte Carlo, as a stored assessment is run: the draws and seed are the
 * input's (settings.monteCarloDraws, settings.monteCarloSeed), so the stored input re-runs to the
 * same figures.
 */
export function assessWithUncertainty(input: AssessInput): AssessResult {
  const r = assess(input)
  const uncertainty = monteCarlo(input)
  return { ...r, uncertainty, summary: { ...r.summary, flags: withMoneyAtP50(r.summary.flags, uncertainty) } }
}
