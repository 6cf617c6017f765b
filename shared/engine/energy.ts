// Annual energy from a daily record or an FDC, with availability, capacity factor, full-load hours
// and energy by month. Power in W inside; energy out in MWh/yr.
// Longer than most files: the record and FDC integrals share the tabulated power curve and its checks.

import { HOURS_PER_YEAR } from './constants'
import type { SourcedValue } from './defaults'
import { EngineInputError, checkNumber } from './errors'
import { exceedanceGrid, flowAtExceedance, readRecord } from './hydrology'
import type { DailyFlow, Fdc, RecordSample } from './hydrology'

/**
 * Electrical power P_e in W at river flow `flow` (m³/s) in calendar month `month` (1–12), or
 * `MONTH_ANNUAL` (0) when integrating an annual FDC. Must be pure, finite and ≥ 0: it is called
 * once per distinct (flow, month) pair (along an FDC's grid, once per run of equal flows) and its
 * results are reused.
 */
export type PowerAt = (flow: number, month: number) => number

/** Month argument passed to `PowerAt` for an annual FDC, where no month is known. */
export const MONTH_ANNUAL = 0

/** Days in each month of a 365-day year, January first. */
export const DAYS_IN_MONTH: readonly number[] = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31]

/** Mean days per year of a record (Julian year), used to turn record days into years. */
export const DAYS_PER_YEAR = 365.25

/** Energy defaults, each with its origin. */
export const ENERGY_DEFAULTS = {
  availability: { value: 0.95, unit: '-', source: 'illustrative' },
  hoursPerYear: { value: HOURS_PER_YEAR, unit: 'h', source: 'common practice (365-day year)' },
  gridPoints: { value: 2000, unit: '-', source: 'illustrative (midpoint grid; about 0.1 % or better on smooth curves)' },
  tablePoints: { value: 64, unit: '-', source: 'illustrative (flows per month at which power is tabulated; jumps are placed by bisection, and the tests hold the table within 0.5 % of exact)' },
} as const satisfies Record<string, SourcedValue>

/** Options shared by both annual-energy methods. */
export interface EnergyOptions {
  /** Installed electrical rating, W; 0 gives capacity factor and full-load hours of 0. */
  rating_W: number
  /** Fraction of the year the plant can run, 0–1 (default 0.95, illustrative). */
  availability?: number
  /**
   * Cache `powerAt` per distinct (flow, month) (default true). Pass false when `powerAt` is
   * already cheap, e.g. from `tabulatedPower`; its answers are still checked.
   */
  memoise?: boolean
}

/** Options for `annualEnergyFromFdc`. */
export interface FdcEnergyOptions extends EnergyOptions {
  /** Cells of the midpoint grid over 0–100 % exceedance (default 2000). */
  gridPoints?: number
  /** Hours in the year the curve stands for (default 8760). */
  hoursPerYear?: number
  /** Twelve monthly FDCs, January first (null for a month without data), for energy by month. */
  monthlyFdcs?: readonly (Fdc | null)[]
}

/** Annual energy and its breakdown. */
export interface AnnualEnergy {
  /** Mean annual electrical energy after availability, MWh/yr. */
  annualEnergy_MWh: number
  /**
   * Twelve values, January first, MWh/yr, after availability; null where the month has no data.
   * From a record they sum exactly to `annualEnergy_MWh`; from monthly FDCs they sum only roughly
   * to it (the annual figure comes from the annual curve).
   */
  energyByMonth_MWh: (number | null)[]
  /** Annual energy / (rating × hours per year), 0–1; 0 when the rating is 0. */
  capacityFactor: number
  /** Annual energy / rating, h/yr; 0 when the rating is 0. */
  annualFullLoad_h: number
  /** Hours per year behind the figures (24 × 365.25 for a record, 8760 by default for an FDC). */
  hoursPerYear: number
}

/** One calendar year of a record: its energy before availability and its days with data. */
export interface RecordYear {
  year: number
  /** Σ P_e·24 h over the year's days with data, Wh (before availability). */
  wh: number
  daysWithData: number
}

/** Annual energy from a daily record. */
export interface RecordEnergy extends AnnualEnergy {
  /** Each calendar year the record touches, in order (the year-by-year figures start here). */
  byYear: RecordYear[]
  /** Days with data. */
  daysWithData: number
  /** Days with data in each calendar month, January first. */
  daysWithDataByMonth: number[]
  /** Years of record = days with data / 365.25. */
  years: number
}

/** E = A · Σ P_e(Q_day)·24 h / years, years = days with data / 365.25; by month the same sum over that month's days (energy = power × time, common practice). */
export function annualEnergyFromRecord(
  days: readonly DailyFlow[],
  powerAt: PowerAt,
  options: EnergyOptions,
): RecordEnergy {
  return annualEnergyFromSample(readRecord(days), powerAt, options)
}

/** `annualEnergyFromRecord` over a record already read (its days with data, months and years). */
export function annualEnergyFromSample(sample: RecordSample, powerAt: PowerAt, options: EnergyOptions): RecordEnergy {
  const { availability, rating_W } = readOptions(options)
  const power = options.memoise === false ? checked(powerAt) : memoised(powerAt)
  const whByMonth = new Array<number>(12).fill(0)
  const daysByMonth = new Array<number>(12).fill(0)
  const { flows, months, years: yearOfDay } = sample
  const n = flows.length
  if (n === 0) throw new EngineInputError('days', 'the record has no days with flow data')
  let first = yearOfDay[0] as number
  let last = first
  for (let i = 1; i < n; i++) {
    const y = yearOfDay[i] as number
    if (y < first) first = y
    else if (y > last) last = y
  }
  const whByYear = new Float64Array(last - first + 1)
  const daysByYear = new Uint16Array(last - first + 1)
  for (let i = 0; i < n; i++) {
    const m = months[i] as number
    const wh = power(flows[i] as number, m) * 24
    whByMonth[m - 1] = (whByMonth[m - 1] as number) + wh
    daysByMonth[m - 1] = (daysByMonth[m - 1] as number) + 1
    const y = (yearOfDay[i] as number) - first
    whByYear[y] = (whByYear[y] as number) + wh
    daysByYear[y] = (daysByYear[y] as number) + 1
  }
  const byYear: RecordYear[] = []
  for (let y = 0; y < whByYear.length; y++) if ((daysByYear[y] as number) > 0) byYear.push({ year: first + y, wh: whByYear[y] as number, daysWithData: daysByYear[y] as number })
  const years = n / DAYS_PER_YEAR
  const toMWhPerYear = availability / years / 1e6
  const energyByMonth_MWh = whByMonth.map((wh, k) => ((daysByMonth[k] as number) > 0 ? wh * toMWhPerYear : null))
  const annualEnergy_MWh = whByMonth.reduce((s, wh) => s + wh, 0) * toMWhPerYear
  const hoursPerYear = 24 * DAYS_PER_YEAR
  return {
    annualEnergy_MWh,
    energyByMonth_MWh,
    ...loadFigures(annualEnergy_MWh, rating_W, hoursPerYear),
    hoursPerYear,
    daysWithData: n,
    daysWithDataByMonth: daysByMonth,
    years,
    byYear,
  }
}

/** E = A · 8760 h · ∫₀¹ P_e(Q(p)) dp by the midpoint rule; by month from monthly FDCs × hours in the month (FDC method, common practice). */
export function annualEnergyFromFdc(fdc: Fdc, powerAt: PowerAt, options: FdcEnergyOptions): AnnualEnergy {
  const { availability, rating_W } = readOptions(options)
  const gridPoints = checkNumber(options.gridPoints ?? ENERGY_DEFAULTS.gridPoints.value, 'gridPoints', {
    min: 1,
    integer: true,
  })
  const hoursPerYear = checkNumber(options.hoursPerYear ?? ENERGY_DEFAULTS.hoursPerYear.value, 'hoursPerYear', {
    min: 0,
    minExclusive: true,
  })
  const monthly = options.monthlyFdcs
  if (monthly !== undefined && (!Array.isArray(monthly) || monthly.length !== 12)) {
    throw new EngineInputError('monthlyFdcs', 'must hold 12 months, January first')
  }
  const grid = exceedanceGrid(gridPoints)
  const power = memoisedAlongCurve(powerAt)
  const meanPower_W = (curve: Fdc, month: number): number =>
    grid.reduce((s, p) => s + power(flowAtExceedance(curve, p), month), 0) / gridPoints

  const annualEnergy_MWh = (meanPower_W(fdc, MONTH_ANNUAL) * hoursPerYear * availability) / 1e6
  const energyByMonth_MWh = DAYS_IN_MONTH.map((days, k) => {
    const curve = monthly?.[k]
    if (!curve) return null
    const hours = (days * 24 * hoursPerYear) / HOURS_PER_YEAR
    return (meanPower_W(curve, k + 1) * hours * availability) / 1e6
  })
  return {
    annualEnergy_MWh,
    energyByMonth_MWh,
    ...loadFigures(annualEnergy_MWh, rating_W, hoursPerYear),
    hoursPerYear,
  }
}

/** Power at one flow, with a whole-number code of the operating state (units running, turbine state) where power may jump. */
export interface PowerSample {
  power: number
  state: number
}

/** Bisection steps that place a jump inside a table cell (cell width / 2^12: a few millionths of the flow, far below what the data can resolve). */
const JUMP_STEPS = 12

/** One month's table: nodes in log flow, power there, and where a cell holds a jump, its place and the power either side. */
interface PowerTable {
  power: Float64Array
  jumpAt: Float64Array
  belowJump: Float64Array
  aboveJump: Float64Array
}

/**
 * Power tabulated on `points` log-spaced flows between `minFlow` and `maxFlow`, one table per month
 * (built on first use), read back by linear interpolation in log flow. Where the operating state
 * changes inside a cell (a unit starts, the turbine cuts in) the jump is found by bisection and each
 * side is interpolated on its own, so steps in the power curve stay sharp. Flows at or beyond the
 * ends, and zero, are evaluated exactly. Piecewise-linear tabulation (numerical practice) turns a
 * long record's tens of thousands of distinct flows into a few hundred evaluations a month; its
 * error on annual energy is checked in the tests.
 */
export function tabulatedPower(
  sampleAt: (flow: number, month: number) => PowerSample,
  minFlow: number,
  maxFlow: number,
  points: number = ENERGY_DEFAULTS.tablePoints.value,
): PowerAt {
  const exact: PowerAt = (flow, month) => sampleAt(flow, month).power
  if (!(minFlow > 0) || !(maxFlow > minFlow) || points < 2) return exact
  const lo = Math.log(minFlow)
  const step = (Math.log(maxFlow) - lo) / (points - 1)
  // Indexed by month (a small whole number): a plain array look-up per day instead of a map's.
  const tables: (PowerTable | undefined)[] = []

  const build = (month: number): PowerTable => {
    const nodes = Array.from({ length: points }, (_, i) => sampleAt(Math.exp(lo + i * step), month))
    const table: PowerTable = {
      power: Float64Array.from(nodes, (n) => n.power),
      jumpAt: new Float64Array(points - 1).fill(Number.NaN),
      belowJump: new Float64Array(points - 1),
      aboveJump: new Float64Array(points - 1),
    }
    for (let i = 0; i < points - 1; i++) {
      const left = nodes[i] as PowerSample
      if (left.state === (nodes[i + 1] as PowerSample).state) continue
      let a = 0
      let b = 1
      let below = left.power
      let above = (nodes[i + 1] as PowerSample).power
      for (let k = 0; k < JUMP_STEPS; k++) {
        const mid = (a + b) / 2
        const sample = sampleAt(Math.exp(lo + (i + mid) * step), month)
        if (sample.state === left.state) {
          a = mid
          below = sample.power
        } else {
          b = mid
          above = sample.power
        }
      }
      table.jumpAt[i] = (a + b) / 2
      table.belowJump[i] = below
      table.aboveJump[i] = above
    }
    return table
  }

  // A curve held flat at its ends asks its end flows again and again: each is evaluated exactly once a month.
  const atMin: (number | undefined)[] = []
  const atMax: (number | undefined)[] = []
  return (flow, month) => {
    if (!(flow > minFlow && flow < maxFlow)) {
      if (flow === minFlow) return (atMin[month] ??= exact(flow, month))
      if (flow === maxFlow) return (atMax[month] ??= exact(flow, month))
      return exact(flow, month)
    }
    let table = tables[month]
    if (!table) {
      table = build(month)
      tables[month] = table
    }
    const x = (Math.log(flow) - lo) / step
    const i = Math.min(points - 2, Math.floor(x))
    const f = x - i
    const p0 = table.power[i] as number
    const p1 = table.power[i + 1] as number
    const jump = table.jumpAt[i] as number
    if (!(jump === jump)) return p0 * (1 - f) + p1 * f // NaN: no jump in this cell
    if (f < jump) return p0 + ((table.belowJump[i] as number) - p0) * (f / jump)
    return (table.aboveJump[i] as number) + (p1 - (table.aboveJump[i] as number)) * ((f - jump) / (1 - jump))
  }
}

/** Capacity factor CF = E / (P_rated · hours per year) and full-load hours E / P_rated; zeros for a zero rating (definitions). */
export function loadFigures(
  annualEnergy_MWh: number,
  rating_W: number,
  hoursPerYear: number = HOURS_PER_YEAR,
): { capacityFactor: number; annualFullLoad_h: number } {
  const e = checkNumber(annualEnergy_MWh, 'annualEnergy_MWh', { min: 0 })
  const rating = checkNumber(rating_W, 'rating_W', { min: 0 })
  const hours = checkNumber(hoursPerYear, 'hoursPerYear', { min: 0, minExclusive: true })
  if (rating === 0) return { capacityFactor: 0, annualFullLoad_h: 0 }
  const annualFullLoad_h = (e * 1e6) / rating
  return { capacityFactor: annualFullLoad_h / hours, annualFullLoad_h }
}

// ——— internals ———

function readOptions(options: EnergyOptions): { availability: number; rating_W: number } {
  return {
    availability: checkNumber(options?.availability ?? ENERGY_DEFAULTS.availability.value, 'availability', {
      min: 0,
      max: 1,
    }),
    rating_W: checkNumber(options?.rating_W, 'rating_W', { min: 0 }),
  }
}

/** Wrap `powerAt` to check each answer is finite and ≥ 0. */
function checked(powerAt: PowerAt): PowerAt {
  return (flow, month) => assertPower(powerAt(flow, month), flow, month)
}

function assertPower(p: number, flow: number, month: number): number {
  if (typeof p !== 'number' || !Number.isFinite(p) || p < 0) {
    throw new EngineInputError('powerAt', `gave ${String(p)} W at ${flow} m³/s in month ${month}; power must be finite and ≥ 0`)
  }
  return p
}

/**
 * Wrap `powerAt` to check its answers and reuse the last one while (flow, month) repeats. Walking a
 * curve's grid the flows never rise, so equal flows (a curve held flat at its ends or between equal
 * nodes) come one after another and each distinct flow is asked once, without a map of thousands
 * of entries. `powerAt` is pure, so the figures are those of asking every time.
 */
function memoisedAlongCurve(powerAt: PowerAt): PowerAt {
  let asked = false
  let lastFlow = 0
  let lastMonth = 0
  let last = 0
  return (flow, month) => {
    if (asked && Object.is(flow, lastFlow) && Object.is(month, lastMonth)) return last
    last = assertPower(powerAt(flow, month), flow, month)
    asked = true
    lastFlow = flow
    lastMonth = month
    return last
  }
}

/** Wrap `powerAt` to check its answers and call it once per distinct (flow, month). */
function memoised(powerAt: PowerAt): PowerAt {
  const byMonth = new Map<number, Map<number, number>>()
  return (flow, month) => {
    let cache = byMonth.get(month)
    if (!cache) {
      cache = new Map()
      byMonth.set(month, cache)
    }
    const hit = cache.get(flow)
    if (hit !== undefined) return hit
    const p = assertPower(powerAt(flow, month), flow, month)
    cache.set(flow, p)
    return p
  }
}
