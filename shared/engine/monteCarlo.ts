// How sure the figures are: a seeded Monte Carlo over the inputs nobody knows exactly before a unit
// is built (bubble size, the throat's air pumping, transfer, turbine and generator efficiency,
// availability, capital cost, export price). Each draw re-runs the year (energy month by month and the
// month table's oxygen) from the same hydrology (runBasis.ts), so a draw costs a year's energy, not a
// whole assessment. The same seed always gives the same draws.
import type { AssessInput } from '../schemas/assess'
import { atExceedance } from './recordYears'
import { LEVERS, type LeverKey } from './levers'
import { drawFrom, seededRandom, type Spread } from './random'
import { basisScheme, runBasis, type RunBasis } from './runBasis'
import { flowState, schemeMoney } from './scheme'
import { yearEnergy } from './year'

/** The inputs the Monte Carlo draws. */
export type UncertainKey = Extract<LeverKey,
  | 'bubbleDiameter' | 'jetPumpEfficiency' | 'sotePerMetre' | 'turbineEfficiency' | 'generatorEfficiency'
  | 'availability' | 'capex' | 'exportPrice'>

/** One uncertain input: its spread about the value in use (read and set by its lever, levers.ts), and where the spread comes from. */
interface UncertainInput {
  key: UncertainKey
  spread: (v: number) => Spread
  source: string
}

/** A triangular spread of factors about `v`, its mode at `v`, clipped to [min, max]. */
const factors = (lo: number, hi: number, min = 0, max = Infinity) => (v: number): Spread => ({
  kind: 'triangular', low: Math.max(min, v * lo), mode: v, high: Math.min(max, v * hi),
})

const INPUTS: readonly UncertainInput[] = [
  {
    key: 'bubbleDiameter',
    // the bubble model's own range, 1–6 mm, with the value in use as the mode
    spread: (v) => ({ kind: 'triangular', low: Math.min(v, 0.001), mode: v, high: Math.max(v, 0.005) }),
    source: 'judgement: 1–5 mm at 5–7 m/s throat velocity with a high gas fraction (the bubble model\'s default), triangular with the value in use as its mode',
  },
  {
    key: 'jetPumpEfficiency', spread: factors(0.6, 1.6, 0, 1),
    source: 'optimised liquid-jet gas pumps reach 0.4–0.5 (Cunningham 1974, 1995); a river venturi is far from optimised: 0.6–1.6 × the value in use (0.15–0.40 at the default 0.25), triangular; the low end is illustrative',
  },
  {
    key: 'sotePerMetre', spread: factors(0.5, 2, 0, 0.3),
    source: 'from memory: jet aerators 3.3–5.3 %/m in clean water (US EPA/625/1-89/023), range 2–8 %/m: 0.5–2 × the value in use, triangular',
  },
  {
    key: 'turbineEfficiency', spread: factors(0.75, 1.25, 0, 1),
    source: 'Wells-type air turbines peak at about 0.75 (Curran & Gato 1997); impulse turbines about 0.45–0.55 (from memory): 0.75–1.25 × the value in use, triangular',
  },
  {
    key: 'generatorEfficiency',
    spread: (v) => ({ kind: 'uniform', low: Math.min(v, 0.9), high: Math.min(1, Math.max(v, 0.97)) }),
    source: 'from memory: small generators 0.90–0.97, uniform (widened to hold the value in use)',
  },
  {
    key: 'availability', spread: factors(0.85 / 0.95, 0.98 / 0.95, 0, 1),
    source: 'illustrative: 0.85–0.98 at the default 0.95 (the same factors about the value in use), triangular',
  },
  {
    key: 'capex', spread: factors(0.7, 1.5),
    source: 'from memory: a screening estimate may come out 20–50 % low or 30–100 % high (AACE International 18R-97, class 5); taken −30 % / +50 % on every cost line, triangular',
  },
  {
    key: 'exportPrice', spread: factors(0.7, 1.3),
    source: 'illustrative: ±30 % about the price in use, triangular',
  },
]

/** One uncertain input as the result reports it. */
export interface UncertainInputUsed {
  key: UncertainKey
  label: string
  unit: string
  value: number
  spread: Spread
  source: string
}

/** A figure's spread over the draws: the values exceeded in 90 %, 50 % and 10 % of draws. */
export interface DrawSpread {
  p90: number | null
  p50: number | null
  p10: number | null
}

/** One bar of a histogram over the draws. */
export interface HistogramBin {
  from: number
  to: number
  count: number
}

/** What the Monte Carlo found. */
export interface UncertaintyResult {
  seed: number
  draws: number
  inputs: UncertainInputUsed[]
  /** Annual energy, MWh/yr. */
  energy_MWh: DrawSpread
  /** Levelised cost, currency/MWh, over the draws that make energy (null where fewer than half do). */
  lcoe: DrawSpread
  npv: DrawSpread
  /** The worst month-table month's net oxygen change, mg/L. */
  worstMonthNetGain_mgL: DrawSpread
  /** Share of draws whose worst month loses more oxygen than the acceptable loss. */
  netLossProbability: number
  /** Share of draws with a negative NPV. */
  lossMakingProbability: number
  energyHistogram: HistogramBin[]
  oxygenHistogram: HistogramBin[]
  basis: string
}

const HISTOGRAM_BINS = 20

/** The figures of one draw. */
interface DrawFigures {
  energy_MWh: number
  lcoe: number | null
  npv: number
  worstMonthNetGain_mgL: number
}

/** One draw: the year's energy and the month table's oxygen of `input` on the shared hydrology, and its money. */
function runDraw(input: AssessInput, b: RunBasis): DrawFigures {
  const s = basisScheme(input, b)
  const e = yearEnergy(input, b.h, s, b.monthCond, b.curves).annualEnergy_MWh
  let worst = Infinity
  for (let m = 0; m < b.flows.length; m++) {
    const g = flowState(s, (b.flows[m] as { flow: number }).flow, b.monthCond[m] ?? b.annual).oxygen.netGain_mgL
    if (g < worst) worst = g
  }
  const money = schemeMoney(s, e)
  return {
    energy_MWh: e,
    lcoe: money.lcoe,
    npv: money.npv,
    worstMonthNetGain_mgL: Number.isFinite(worst) ? worst : 0,
  }
}

/**
 * Seeded Monte Carlo over the uncertain inputs (ENGINE.md §12): each draw takes every input from its
 * spread (uniform or triangular, by inverting its distribution) with one seeded stream, in a fixed
 * order, and re-runs the year under the option's operating rule. Percentiles by exceedance over the
 * draws with the Weibull plotting position m/(n+1).
 */
export function monteCarlo(input: AssessInput, draws = input.settings.monteCarloDraws, seed = input.settings.monteCarloSeed): UncertaintyResult | null {
  if (!(draws > 0)) return null
  const b = runBasis(input)
  const used = INPUTS.map((u) => {
    const lever = LEVERS[u.key]
    const value = lever.get(input)
    return { u, lever, value, spread: u.spread(value) }
  })
  const random = seededRandom(seed)
  const out: DrawFigures[] = []
  for (let d = 0; d < draws; d++) {
    let drawn = input
    for (const { lever, spread } of used) drawn = lever.set(drawn, drawFrom(spread, random()))
    out.push(runDraw(drawn, b))
  }
  const energies = out.map((f) => f.energy_MWh)
  const gains = out.map((f) => f.worstMonthNetGain_mgL)
  const costs = out.map((f) => f.lcoe).filter((x): x is number => x !== null)
  return {
    seed, draws,
    inputs: used.map(({ u, lever, value, spread }) => ({ key: u.key, label: lever.label, unit: lever.unit, value, spread, source: u.source })),
    energy_MWh: spreadOf(energies),
    lcoe: costs.length * 2 >= draws ? spreadOf(costs) : { p90: null, p50: null, p10: null },
    npv: spreadOf(out.map((f) => f.npv)),
    worstMonthNetGain_mgL: spreadOf(gains),
    netLossProbability: gains.filter((g) => g < -input.settings.acceptableOxygenLoss_mgL).length / draws,
    lossMakingProbability: out.filter((f) => f.npv < 0).length / draws,
    energyHistogram: histogram(energies),
    oxygenHistogram: histogram(gains),
    basis: `${draws} draws from seed ${seed}, each input drawn from its spread (below) and the year re-run under the option's operating rule on the same flows: energy month by month and the month table's oxygen. P90 is the figure exceeded in 90 % of draws (Weibull plotting position m/(n+1)). The flows themselves are not drawn: the year-by-year figures show their spread.`,
  }
}

/** P90, P50 and P10 by exceedance over the draws. */
function spreadOf(values: readonly number[]): DrawSpread {
  const sorted = [...values].sort((a, b) => b - a)
  return { p90: atExceedance(sorted, 90), p50: atExceedance(sorted, 50), p10: atExceedance(sorted, 10) }
}

/** Equal-width bins from the least to the greatest value; one bin when all are equal. */
function histogram(values: readonly number[]): HistogramBin[] {
  if (!values.length) return []
  let lo = Infinity
  let hi = -Infinity
  for (const v of values) {
    if (v < lo) lo = v
    if (v > hi) hi = v
  }
  if (!(hi > lo)) return [{ from: lo, to: hi, count: values.length }]
  const width = (hi - lo) / HISTOGRAM_BINS
  const bins = Array.from({ length: HISTOGRAM_BINS }, (_, k) => ({ from: lo + k * width, to: k === HISTOGRAM_BINS - 1 ? hi : lo + (k + 1) * width, count: 0 }))
  for (const v of values) bins[Math.min(HISTOGRAM_BINS - 1, Math.floor((v - lo) / width))]!.count++
  return bins
}
