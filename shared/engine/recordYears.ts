// Year by year from a daily record: each complete calendar year's energy and net oxygen change, the
// annual energy exceeded in half and in nine of ten years (P50, P90), and the driest year. It reads
// the record once read (hydrology.ts), its energy year by year (energy.ts) and the states the year
// was judged at (year.ts), so it evaluates nothing new.
import type { RecordYear } from './energy'
import type { RecordSample } from './hydrology'
import type { FlowState } from './scheme'
import type { YearStates } from './year'
import { MONTH_SHORT } from '../utils/months'

/** A calendar year counts when at least this share of its days have a flow (common practice, no source: short gaps are filled by the year's own mean). */
export const COMPLETE_YEAR_SHARE = 0.95

/** Fewest complete years for P90: with n years the Weibull positions run from 100/(n+1) to 100·n/(n+1) %, so 90 % needs n ≥ 9. */
const P90_MIN_YEARS = 9

/** One complete calendar year of the record. */
export interface RecordYearFigures {
  year: number
  daysWithData: number
  /** Mean flow over the year's days with data, m³/s. */
  meanFlow_m3s: number
  /** The year's energy after availability, MWh (its days with data scaled to the whole year). */
  energy_MWh: number
  /** Mean net oxygen change over the year's days, mg/L. */
  meanNetGain_mgL: number
  /** The lowest of the year's month means of the net oxygen change, mg/L, and that month (1–12). */
  worstMonthNetGain_mgL: number
  worstMonth: number
  worstMonthName: string
}

/** What the complete years of a record say about year-to-year spread. */
export interface YearByYear {
  /** Complete years, in calendar order. */
  years: RecordYearFigures[]
  /** Calendar years left out for having too few days with data. */
  incompleteYears: number[]
  /** Annual energy exceeded in half the years, MWh; null without a complete year. */
  p50Energy_MWh: number | null
  /** Annual energy exceeded in nine years of ten, MWh; null with fewer than 9 complete years. */
  p90Energy_MWh: number | null
  /** The year with the lowest mean flow. */
  driest: RecordYearFigures | null
  /** The lowest year's mean net oxygen change, mg/L (null without a complete year). */
  worstYearNetGain_mgL: number | null
  /** How the figures were found, in words. */
  basis: string
}

/**
 * The record's complete years: energy from its days at the tabulated power (as the annual figure),
 * and each day's net oxygen change read off its month's judged states at that day's flow (linear
 * between the two judged flows either side, held at the ends). P50 and P90 by exceedance over the
 * years with the Weibull plotting position m/(n+1) (Weibull 1939), linear between ranks, never
 * extrapolated.
 */
export function yearByYear(sample: RecordSample, energyByYear: readonly RecordYear[], availability: number, states: YearStates): YearByYear {
  const first = energyByYear[0]?.year ?? 0
  const span = energyByYear.length ? (energyByYear[energyByYear.length - 1] as RecordYear).year - first + 1 : 0
  const flowSum = new Float64Array(span)
  const gainSum = new Float64Array(span)
  const monthGain = new Float64Array(span * 12)
  const monthDays = new Uint16Array(span * 12)
  const { flows, months, years } = sample
  const tables = states.map(gainTable)
  for (let i = 0; i < flows.length; i++) {
    const y = (years[i] as number) - first
    const m = (months[i] as number) - 1
    const q = flows[i] as number
    const g = gainAt(tables[m] ?? EMPTY, q)
    flowSum[y] = (flowSum[y] as number) + q
    gainSum[y] = (gainSum[y] as number) + g
    monthGain[y * 12 + m] = (monthGain[y * 12 + m] as number) + g
    monthDays[y * 12 + m] = (monthDays[y * 12 + m] as number) + 1
  }
  const out: RecordYearFigures[] = []
  const incomplete: number[] = []
  for (const ry of energyByYear) {
    const days = daysIn(ry.year)
    if (ry.daysWithData < COMPLETE_YEAR_SHARE * days) {
      incomplete.push(ry.year)
      continue
    }
    const y = ry.year - first
    let worst = Infinity
    let worstMonth = 0
    for (let m = 0; m < 12; m++) {
      const n = monthDays[y * 12 + m] as number
      if (n === 0) continue
      const mean = (monthGain[y * 12 + m] as number) / n
      if (mean < worst) {
        worst = mean
        worstMonth = m + 1
      }
    }
    out.push({
      year: ry.year, daysWithData: ry.daysWithData,
      meanFlow_m3s: (flowSum[y] as number) / ry.daysWithData,
      energy_MWh: ((ry.wh / ry.daysWithData) * days * availability) / 1e6,
      meanNetGain_mgL: (gainSum[y] as number) / ry.daysWithData,
      worstMonthNetGain_mgL: worst, worstMonth, worstMonthName: MONTH_SHORT[worstMonth - 1] ?? String(worstMonth),
    })
  }
  const energies = out.map((y) => y.energy_MWh).sort((a, b) => b - a)
  const driest = out.reduce<RecordYearFigures | null>((d, y) => (d === null || y.meanFlow_m3s < d.meanFlow_m3s ? y : d), null)
  return {
    years: out,
    incompleteYears: incomplete,
    p50Energy_MWh: atExceedance(energies, 50),
    p90Energy_MWh: energies.length >= P90_MIN_YEARS ? atExceedance(energies, 90) : null,
    driest,
    worstYearNetGain_mgL: out.length ? Math.min(...out.map((y) => y.meanNetGain_mgL)) : null,
    basis: `${out.length} complete calendar year${out.length === 1 ? '' : 's'} of the record (at least ${Math.round(COMPLETE_YEAR_SHARE * 100)} % of the days with a flow)${
      incomplete.length ? `; ${incomplete.length} left out` : ''
    }. P50 and P90 are the annual energies exceeded in 50 % and 90 % of years, ranked with the Weibull plotting position m/(n+1)${
      out.length < P90_MIN_YEARS ? `; P90 needs at least ${P90_MIN_YEARS} complete years` : ''
    }. Each day's oxygen change is read off its month's judged flows.`,
  }
}

/** Days in a calendar year (Gregorian). */
function daysIn(year: number): number {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 366 : 365
}

/** A month's judged flows (falling along the list) and the net oxygen change at each, in typed arrays read once a day. */
interface GainTable {
  flows: Float64Array
  gains: Float64Array
}

const EMPTY: GainTable = { flows: new Float64Array(0), gains: new Float64Array(0) }

function gainTable(states: readonly FlowState[]): GainTable {
  return { flows: Float64Array.from(states, (f) => f.riverFlow_m3s), gains: Float64Array.from(states, (f) => f.oxygen.netGain_mgL) }
}

/** Net oxygen change at flow q from a month's judged flows: linear between neighbours, held at the ends. */
function gainAt(t: GainTable, q: number): number {
  const { flows, gains } = t
  const n = flows.length
  if (n === 0) return 0
  if (q >= (flows[0] as number)) return gains[0] as number
  if (q <= (flows[n - 1] as number)) return gains[n - 1] as number
  let lo = 0
  let hi = n - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if ((flows[mid] as number) >= q) lo = mid
    else hi = mid
  }
  const a = flows[lo] as number
  const span = a - (flows[hi] as number)
  if (!(span > 0)) return gains[lo] as number
  const t01 = (a - q) / span
  return (gains[lo] as number) + t01 * ((gains[hi] as number) - (gains[lo] as number))
}

/** The value exceeded p % of the time in a list sorted high to low, Weibull positions 100·m/(n+1), linear between ranks; null outside them. */
export function atExceedance(sortedHighToLow: readonly number[], p: number): number | null {
  const n = sortedHighToLow.length
  if (n === 0) return null
  const rank = (p / 100) * (n + 1) // 1-based, fractional
  if (rank < 1 - 1e-9 || rank > n + 1e-9) return null
  const i = Math.min(n - 1, Math.max(0, Math.floor(rank) - 1))
  const t = Math.min(1, Math.max(0, rank - (i + 1)))
  const a = sortedHighToLow[i] as number
  const b = sortedHighToLow[Math.min(n - 1, i + 1)] as number
  return a + t * (b - a)
}
