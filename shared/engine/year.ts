// The year stage: each month's flow-duration curve, energy month by month, and the whole year judged
// flow by flow (every flag's share of time and its worst value, with when). It takes the scheme under
// its operating rule (scheme.ts) and the site's hydrology (hydrology.ts); assess.ts wires it.
import type { AssessInput } from '../schemas/assess'
import { MONTH_SHORT } from '../utils/months'
import { annualEnergyFromSample, DAYS_IN_MONTH, loadFigures, tabulatedPower, type AnnualEnergy, type PowerAt, type PowerSample, type RecordYear } from './energy'
import { exceedanceGrid, flowAtExceedance, scaleCurve, type Fdc, type RecordSample } from './hydrology'
import { NET_LOSS_TOLERANCE_mgL } from './flags'
import { flowState, powerSample, riverFirstState, type Conditions, type FlowState, type Scheme } from './scheme'
import type { FlagId, FlagWorst } from './results'

/** Cells of each month's exceedance grid when the year is judged (ENGINE.md §8: at least 100 flows a month). */
export const YEAR_GRID_CELLS = 100
/** Cells of each month's grid for energy from a curve (midpoint rule, tabulated power). */
const ENERGY_GRID_CELLS = 2000

/** Where a month's flows come from. */
export type MonthCurveBasis = 'record' | 'seasonal-profile' | 'annual-curve'

/** One month's flow-duration curve and where it comes from. */
export interface MonthCurve {
  curve: Fdc
  basis: MonthCurveBasis
  /** The factor the annual curve was scaled by (1 for a record's own month or the annual curve). */
  factor: number
}

/** The site's hydrology after gauge scaling: its FDC and, for a record, its days with data and their month curves. */
export interface SiteHydrology {
  fdc: Fdc
  record: { sample: RecordSample, monthCurves: (Fdc | null)[] } | null
}

const gridFlowsCache = new WeakMap<Fdc, Map<number, Float64Array>>()

/** The flows of a curve at the midpoints of `cells` equal shares of time, worked out once per curve (both operating modes read them). */
function gridFlows(curve: Fdc, cells: number): Float64Array {
  let byCells = gridFlowsCache.get(curve)
  if (!byCells) {
    byCells = new Map()
    gridFlowsCache.set(curve, byCells)
  }
  let flows = byCells.get(cells)
  if (!flows) {
    flows = Float64Array.from(exceedanceGrid(cells), (p) => flowAtExceedance(curve, p))
    byCells.set(cells, flows)
  }
  return flows
}

/**
 * Twelve month curves, January first. A record gives each month its own curve (Weibull over that
 * month's days; a month with no data falls back to the annual curve). An entered FDC is scaled month
 * by month by the seasonal profile, the twelve month flows entered on the months tab, used as a shape:
 * each month's factor is its flow over the day-weighted mean of the twelve, so the year's mean flow
 * stays the curve's (a seasonal scaling of an annual curve, common practice, no source). Without a
 * complete profile every month uses the annual curve.
 */
export function monthCurves(input: AssessInput, h: SiteHydrology): MonthCurve[] {
  if (h.record) {
    return h.record.monthCurves.map((c) => (c ? { curve: c, basis: 'record' as const, factor: 1 } : { curve: h.fdc, basis: 'annual-curve' as const, factor: 1 }))
  }
  const profile = input.site.months.map((m) => m.flow_m3s)
  const complete = profile.every((q): q is number => q !== undefined && q >= 0)
  const weightedMean = complete ? profile.reduce((s, q, m) => s + q * (DAYS_IN_MONTH[m] ?? 30), 0) / 365 : 0
  if (!complete || !(weightedMean > 0)) return profile.map(() => ({ curve: h.fdc, basis: 'annual-curve' as const, factor: 1 }))
  return profile.map((q) => {
    const f = q / weightedMean
    return { curve: scaleCurve(h.fdc, f), basis: 'seasonal-profile' as const, factor: f }
  })
}

/** The lowest positive and the highest flow of a set of curves (a power table's range): a curve's flows fall as exceedance rises. */
function flowRange(curves: readonly Fdc[]): { min: number, max: number } {
  let min = Infinity
  let max = 0
  for (const c of curves) {
    const f = c.flow
    let last = f.length - 1
    while (last > 0 && !((f[last] ?? 0) > 0)) last--
    const lo = f[last] ?? 0
    if (lo > 0 && lo < min) min = lo
    max = Math.max(max, f[0] ?? 0)
  }
  return { min: Number.isFinite(min) ? min : 0, max }
}

/**
 * Annual energy month by month under the operating rule. A record sums its days, each at its month's
 * conditions; a curve site integrates each month's curve (midpoint rule) over the month's hours, so
 * the months always sum to the year. Power is tabulated over the flow range, jumps kept sharp (energy.ts).
 */
export function yearEnergy(input: AssessInput, h: SiteHydrology, s: Scheme, months: readonly Conditions[], curves: readonly MonthCurve[]): YearEnergy {
  const stateAt = (flow: number, month: number): PowerSample => powerSample(s, flow, months[month - 1] as Conditions)
  const range = flowRange(h.record ? [h.fdc] : curves.map((c) => c.curve))
  const power: PowerAt = tabulatedPower(stateAt, range.min, range.max)
  const rating_W = s.ratedPerUnit_W * input.option.units
  const availability = input.settings.availability
  if (h.record) return annualEnergyFromSample(h.record.sample, power, { rating_W, availability, memoise: false })
  const energyByMonth_MWh = curves.map((c, k) => {
    const flows = gridFlows(c.curve, ENERGY_GRID_CELLS)
    let sum = 0
    for (const q of flows) sum += power(q, k + 1)
    return ((sum / flows.length) * (DAYS_IN_MONTH[k] ?? 30) * 24 * availability) / 1e6
  })
  const annualEnergy_MWh = energyByMonth_MWh.reduce((a, b) => a + b, 0)
  return { annualEnergy_MWh, energyByMonth_MWh, ...loadFigures(annualEnergy_MWh, rating_W, 8760), hoursPerYear: 8760, byYear: null }
}

/** A year's energy under the operating rule; a record's also calendar year by calendar year. */
export type YearEnergy = AnnualEnergy & { byYear: RecordYear[] | null }

/** One flag's tally over the year. */
interface Tally {
  share: number
  worst: FlagWorst | null
}

/** What the whole-year judgement found. */
export interface YearJudgement {
  /** Share of the year each flag is raised, and its worst value with when. */
  tallies: Record<Exclude<FlagId, 'never-runs' | 'does-not-pay'>, Tally>
  /** Share of the year at least one unit runs. */
  runningShare: number
  /** Time-weighted mean net oxygen change over the year, mg/L. */
  meanNetGain_mgL: number
  /** Per month: share of the month units run, share with a net loss beyond the acceptable one, worst net change, flags raised in the month. */
  months: Array<{ runningShare: number, lossShare: number, worstNetGain_mgL: number, flags: FlagId[] }>
  /** Smallest cavitation margin where units run, and its state (null if they never run). */
  worstCavitation: FlowState | null
  /** Largest unit total dissolved gas where units run, and its state. */
  worstTdg: FlowState | null
  /** Largest excess gas pressure of the unit discharge where units run, mmHg. */
  maxGasExcess_mmHg: number
  /** Throat cavitation indices where units run (for the smallest). */
  minCavitationIndex: number | null
  /** Mean and peak air flow over the year, m³/s. */
  meanAirFlow_m3s: number
  peakAirFlow_m3s: number
  /** How the year was judged, in words. */
  basis: string
}

/** Count a raised flag: its share of the year grows by the cell's weight, and the month lists it. */
function raise(tallies: YearJudgement['tallies'], monthFlags: Set<FlagId>, id: keyof YearJudgement['tallies'], weight: number): void {
  tallies[id].share += weight
  monthFlags.add(id)
}

/** Keep the lower (or higher) value with when it happened. */
function track(t: Tally, value: number, unit: string, lower: boolean, month: number, f: FlowState, exceedance: number): void {
  if (t.worst === null || (lower ? value < t.worst.value : value > t.worst.value)) {
    t.worst = { value, unit, month, monthName: MONTH_SHORT[month - 1] ?? String(month), flow_m3s: f.riverFlow_m3s, exceedance }
  }
}

/** The state at each cell the year is judged at: twelve months, January first, YEAR_GRID_CELLS flows each. */
export type YearStates = FlowState[][]

/**
 * The states the year is judged at: each month's curve at YEAR_GRID_CELLS flows (each the midpoint of
 * an equal share of the month's time, so a record's days are represented by their month's
 * distribution), each at its month's temperature and upstream oxygen under the operating rule. A
 * river-first scheme given the same option's energy-first states reuses each one the river test lets
 * stand (riverFirstState).
 */
export function yearStates(s: Scheme, months: readonly Conditions[], curves: readonly MonthCurve[], energyFirst?: YearStates): YearStates {
  return curves.map((mc, k) => {
    const c = months[k] as Conditions
    const flows = gridFlows(mc.curve, YEAR_GRID_CELLS)
    const like = energyFirst?.[k]
    const out = new Array<FlowState>(flows.length)
    for (let i = 0; i < flows.length; i++) {
      const e = like?.[i]
      out[i] = e ? riverFirstState(s, e, c) : flowState(s, flows[i] as number, c)
    }
    return out
  })
}

/**
 * Judge the whole year from its states (yearStates): a cell weighs its month's days over 365 divided
 * by the cells.
 */
export function judgeYear(s: Scheme, curves: readonly MonthCurve[], states: YearStates): YearJudgement {
  const st = s.input.settings
  const blank = (): Tally => ({ share: 0, worst: null })
  const tallies: YearJudgement['tallies'] = {
    'cavitation': blank(), 'gas-supersaturation': blank(), 'scheme-below-target': blank(),
    'net-oxygen-loss': blank(), 'oxygen-below-target': blank(),
  }
  const grid = exceedanceGrid(YEAR_GRID_CELLS)
  let runningShare = 0
  let meanGain = 0
  let airSum = 0
  let airPeak = 0
  let worstCavitation: FlowState | null = null
  let worstTdg: FlowState | null = null
  let minSigma: number | null = null
  let maxExcess = 0
  const monthOut: YearJudgement['months'] = []
  states.forEach((monthStates, k) => {
    const month = k + 1
    const w = (DAYS_IN_MONTH[k] ?? 30) / 365 / grid.length
    const m = { runningShare: 0, lossShare: 0, worstNetGain_mgL: Infinity, flags: new Set<FlagId>() }
    for (let i = 0; i < grid.length; i++) {
      const p = grid[i] as number
      const f = monthStates[i] as FlowState
      const o = f.oxygen
      meanGain += o.netGain_mgL * w
      airSum += f.airFlow_m3s * w
      airPeak = Math.max(airPeak, f.airFlow_m3s)
      m.worstNetGain_mgL = Math.min(m.worstNetGain_mgL, o.netGain_mgL)
      if (f.unitsRunning > 0) {
        runningShare += w
        m.runningShare += 1 / grid.length
        if (worstCavitation === null || f.cavitationMargin_m < worstCavitation.cavitationMargin_m) worstCavitation = f
        if (worstTdg === null || o.unitTdg > worstTdg.oxygen.unitTdg) worstTdg = f
        if (f.cavitationIndex !== null) minSigma = minSigma === null ? f.cavitationIndex : Math.min(minSigma, f.cavitationIndex)
        track(tallies['cavitation'], f.cavitationMargin_m, 'm', true, month, f, p)
        if (f.cavitationMargin_m < st.minCavitationMargin_m) raise(tallies, m.flags, 'cavitation', w)
        track(tallies['gas-supersaturation'], o.unitTdg * 100, '%', false, month, f, p)
        maxExcess = Math.max(maxExcess, o.unitGasExcess_mmHg)
        // the stricter of the two limits: % of saturation, or excess pressure ΔP (REFERENCES §13)
        if (o.unitTdg > st.tdgLimit || o.unitGasExcess_mmHg > st.tdgExcessLimit_mmHg) raise(tallies, m.flags, 'gas-supersaturation', w)
      }
      track(tallies['net-oxygen-loss'], o.netGain_mgL, 'mg/L', true, month, f, p)
      if (o.netGain_mgL < -st.acceptableOxygenLoss_mgL) {
        raise(tallies, m.flags, 'net-oxygen-loss', w)
        m.lossShare += 1 / grid.length
      }
      track(tallies['oxygen-below-target'], o.withScheme_mgL, 'mg/L', true, month, f, p)
      if (o.withScheme_mgL < st.oxygenTarget_mgL) {
        raise(tallies, m.flags, 'oxygen-below-target', w)
        if (o.netGain_mgL < -NET_LOSS_TOLERANCE_mgL) {
          raise(tallies, m.flags, 'scheme-below-target', w)
          track(tallies['scheme-below-target'], o.withScheme_mgL, 'mg/L', true, month, f, p)
        }
      }
    }
    monthOut.push({ runningShare: m.runningShare, lossShare: m.lossShare, worstNetGain_mgL: m.worstNetGain_mgL, flags: [...m.flags] })
  })
  return {
    tallies, runningShare, meanNetGain_mgL: meanGain, months: monthOut, worstCavitation, worstTdg,
    minCavitationIndex: minSigma, maxGasExcess_mmHg: maxExcess, meanAirFlow_m3s: airSum, peakAirFlow_m3s: airPeak,
    basis: `Judged at ${YEAR_GRID_CELLS} flows in each month (each the middle of an equal share of the month's time, from ${
      curves.some((c) => c.basis === 'record') ? "the record's days in that month" : curves.some((c) => c.basis === 'seasonal-profile') ? 'the curve scaled by the seasonal profile' : 'the annual curve'
    }), at that month's temperature and upstream oxygen.`,
  }
}
