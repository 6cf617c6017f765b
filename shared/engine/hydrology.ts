// Hydrology: flow-duration curves (FDC) from entered points or a daily record, their statistics,
// monthly curves, gauge scaling and the reserved (hands-off) flow. Flows in m³/s, exceedance in %.
// Longer than most files: every curve here shares the same sorted-array and interpolation helpers.

import type { SourcedValue } from './defaults'
import { EngineInputError, checkNumber } from './errors'

/** One entered FDC point: the flow equalled or exceeded `exceedance` % of the time. */
export interface FdcPoint {
  /** Exceedance, % of time (0–100). */
  exceedance: number
  /** Flow, m³/s (≥ 0). */
  flow: number
}

/** One day of a gauged record; `flow` null marks a gap. */
export interface DailyFlow {
  /** Calendar date, YYYY-MM-DD. */
  date: string
  /** Daily mean flow, m³/s, or null where the record has no data. */
  flow: number | null
}

/** How flow is interpolated between FDC nodes. */
export type FdcInterpolation = 'log-linear' | 'linear'

/**
 * A flow-duration curve: nodes sorted by exceedance; flow is non-increasing.
 * Outside the first and last node the flow is held at the end value (no extrapolation).
 * A record's curve holds its nodes in typed arrays (one node a day: a century is 36,525 of them).
 */
export interface Fdc {
  /** Where the curve came from. */
  readonly kind: 'points' | 'record'
  /** Exceedance of each node, %, strictly increasing within 0–100. */
  readonly exceedance: ArrayLike<number>
  /** Flow at each node, m³/s, non-increasing. */
  readonly flow: ArrayLike<number>
  /** 'log-linear' for entered points, 'linear' (Hyndman & Fan type 6) for a record. */
  readonly interpolation: FdcInterpolation
  /** Mean flow, m³/s: the record's arithmetic mean, or the exact integral of the entered curve. */
  readonly meanFlow: number
  /** Days with data (record) or number of entered points. */
  readonly count: number
}

/** Headline statistics of an FDC, m³/s. */
export interface FdcStats {
  /** Flow equalled or exceeded 95 % of the time (low-flow index). */
  q95: number
  /** Median flow. */
  q50: number
  /** Flow equalled or exceeded 10 % of the time. */
  q10: number
  /** Mean flow. */
  mean: number
}

/** Reserved flow: a fixed value, or the flow at a named exceedance (e.g. 95 for Q95). */
export type ReservedFlowSetting =
  | { kind: 'fixed'; /** m³/s */ flow: number }
  | { kind: 'percentile'; /** % of time, 0–100 */ exceedance: number }

/** Hydrology defaults, each with its origin. */
export const HYDROLOGY_DEFAULTS = {
  reservedFlowExceedance: {
    value: 95,
    unit: '%',
    source: 'common practice (hands-off flow often set at Q95)',
  },
} as const satisfies Record<string, SourcedValue>

const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/

/** Month 1–12 of a well-formed `YYYY-MM-DD` date, read digit by digit; 0 when it is not one. */
function quickMonth(date: unknown): number {
  if (typeof date !== 'string' || date.length !== 10 || date.charCodeAt(4) !== 45 || date.charCodeAt(7) !== 45) return 0
  const month = digit(date, 5) * 10 + digit(date, 6)
  const day = digit(date, 8) * 10 + digit(date, 9)
  const year = digit(date, 0) + digit(date, 1) + digit(date, 2) + digit(date, 3)
  return year >= 0 && month >= 1 && month <= 12 && day >= 1 && day <= 31 ? month : 0
}

/** Calendar month 1–12 of a `YYYY-MM-DD` date; throws an EngineInputError on `field` otherwise. */
export function monthOf(date: unknown, field = 'date'): number {
  const quick = quickMonth(date)
  if (quick) return quick
  const m = typeof date === 'string' ? DATE_RE.exec(date) : null
  if (!m) throw new EngineInputError(field, 'must be a date written YYYY-MM-DD')
  throw new EngineInputError(field, 'is not a calendar date')
}

/** Month of `list[index].date`, naming that path only when the date is bad (no string built per day). */
export function monthOfDay(date: unknown, index: number, list = 'days'): number {
  return quickMonth(date) || monthOf(date, `${list}[${index}].date`)
}

/** Calendar year of a date `monthOfDay` has accepted. */
function yearOf(date: string): number {
  return digit(date, 0) * 1000 + digit(date, 1) * 100 + digit(date, 2) * 10 + digit(date, 3)
}

/** The decimal digit at `i`, or NaN when that character is not a digit. */
function digit(s: string, i: number): number {
  const c = s.charCodeAt(i) - 48
  return c >= 0 && c <= 9 ? c : Number.NaN
}

/** FDC from entered points, flow interpolated log-linearly against exceedance, linearly where a node flow is 0 (common practice). */
export function fdcFromPoints(points: readonly FdcPoint[]): Fdc {
  if (!Array.isArray(points) || points.length < 3) {
    throw new EngineInputError('points', 'an FDC needs at least 3 points')
  }
  const exceedance: number[] = []
  const flow: number[] = []
  points.forEach((pt, i) => {
    const p = checkNumber(pt?.exceedance, `points[${i}].exceedance`, { min: 0, max: 100 })
    const q = checkNumber(pt?.flow, `points[${i}].flow`, { min: 0 })
    const prevP = exceedance[i - 1]
    const prevQ = flow[i - 1]
    if (prevP !== undefined && p <= prevP) {
      throw new EngineInputError(`points[${i}].exceedance`, 'points must be sorted by rising exceedance, without repeats')
    }
    if (prevQ !== undefined && q > prevQ) {
      throw new EngineInputError(`points[${i}].flow`, 'flow must not rise as exceedance rises')
    }
    exceedance.push(p)
    flow.push(q)
  })
  const shape = { exceedance, flow, interpolation: 'log-linear' as const }
  return { kind: 'points', ...shape, meanFlow: curveMean(shape), count: points.length }
}

/** FDC from a daily record with the Weibull plotting position P = m/(n+1), flows ranked descending, n = days with data (Weibull 1939). */
export function fdcFromRecord(days: readonly DailyFlow[]): Fdc {
  return fdcFromSample(recordFlows(days, 'days'), 'days')
}

/** Flow Q(p) at exceedance p %, interpolated between nodes and held at the end values outside them (FDC definition). */
export function flowAtExceedance(fdc: Fdc, exceedance: number): number {
  const p = checkNumber(exceedance, 'exceedance', { min: 0, max: 100 })
  const ex = fdc.exceedance
  const fl = fdc.flow
  const last = ex.length - 1
  if (p <= at(ex, 0)) return at(fl, 0)
  if (p >= at(ex, last)) return at(fl, last)
  let lo = 0
  let hi = last
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (at(ex, mid) <= p) lo = mid
    else hi = mid
  }
  const t = (p - at(ex, lo)) / (at(ex, hi) - at(ex, lo))
  return interpolate(at(fl, lo), at(fl, hi), t, fdc.interpolation)
}

/** Exceedance % of flow q: the largest p with Q(p) ≥ q, the inverse of `flowAtExceedance` (FDC definition). */
export function exceedanceOfFlow(fdc: Fdc, flow: number): number {
  const q = checkNumber(flow, 'flow', { min: 0 })
  const ex = fdc.exceedance
  const fl = fdc.flow
  const last = fl.length - 1
  if (q <= at(fl, last)) return 100
  if (q > at(fl, 0)) return 0
  // Last node with flow ≥ q; fl[0] ≥ q > fl[last] so 0 ≤ lo < last.
  let lo = 0
  let hi = last
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (at(fl, mid) >= q) lo = mid
    else hi = mid
  }
  const a = at(fl, lo)
  const b = at(fl, hi)
  const t =
    fdc.interpolation === 'log-linear' && b > 0 ? Math.log(q / a) / Math.log(b / a) : (q - a) / (b - a)
  return at(ex, lo) + t * (at(ex, hi) - at(ex, lo))
}

/** Q95, Q50, Q10 and mean flow of an FDC, m³/s (FDC definition; Q_p equalled or exceeded p % of the time). */
export function fdcStats(fdc: Fdc): FdcStats {
  return {
    q95: flowAtExceedance(fdc, 95),
    q50: flowAtExceedance(fdc, 50),
    q10: flowAtExceedance(fdc, 10),
    mean: fdc.meanFlow,
  }
}

/**
 * A daily record read once: the flows of the days with data, in record order, with each day's
 * calendar month and year. Every later pass (curves, energy, year by year) reads these typed arrays
 * instead of the day objects again.
 */
export interface RecordSample {
  /** Flow of each day with data, m³/s. */
  readonly flows: Float64Array
  /** Its calendar month, 1–12. */
  readonly months: Uint8Array
  /** Its calendar year. */
  readonly years: Uint16Array
}

/** Read a record's days with data: flows checked finite and ≥ 0, dates checked YYYY-MM-DD (gaps skipped unchecked). */
export function readRecord(days: readonly DailyFlow[], path = 'days'): RecordSample {
  if (!Array.isArray(days)) throw new EngineInputError(path, 'must be a list of days')
  const n = days.length
  const flows = new Float64Array(n)
  const months = new Uint8Array(n)
  const years = new Uint16Array(n)
  let k = 0
  for (let i = 0; i < n; i++) {
    const d = days[i] as DailyFlow
    const q = dayFlow(d, i, path)
    if (q === null) continue
    months[k] = monthOfDay(d.date, i, path)
    years[k] = yearOf(d.date)
    flows[k++] = q
  }
  return { flows: flows.subarray(0, k), months: months.subarray(0, k), years: years.subarray(0, k) }
}

/** A record moved to the site by Q_site = Q_gauge · A_site / A_gauge, day by day (area-ratio method, common practice). */
export function scaleSampleByAreaRatio(sample: RecordSample, siteArea: number, gaugeArea: number): RecordSample {
  const r = areaRatio(siteArea, gaugeArea)
  return { ...sample, flows: sample.flows.map((q) => q * r) }
}

/**
 * A record's annual curve and its twelve month curves, January first (null for a month with no
 * data), each by Weibull over its days (Weibull 1939). Each month's flows are sorted once, and the
 * annual curve is the merge of the twelve: the same ranks as sorting the whole record again.
 */
export function recordCurves(sample: RecordSample): { annual: Fdc, months: (Fdc | null)[] } {
  const sorted = sortedMonths(sample)
  // merged in pairs (12 → 6 → 3 → 2 → 1), so each flow is copied about four times, not twelve
  let level: Float64Array[] = sorted
  while (level.length > 1) {
    const next: Float64Array[] = []
    for (let i = 0; i < level.length; i += 2) next.push(i + 1 < level.length ? mergeAscending(level[i] as Float64Array, level[i + 1] as Float64Array) : level[i] as Float64Array)
    level = next
  }
  const all = level[0] ?? new Float64Array(0)
  return {
    annual: fdcFromSorted(all, 'days'),
    months: sorted.map((b, k) => (b.length === 0 ? null : fdcFromSorted(b, `days (month ${k + 1})`))),
  }
}

/** Twelve month curves of a record, January first, each by Weibull over that month's days with data; null for a month with none (Weibull 1939). */
export function recordMonthCurves(sample: RecordSample): (Fdc | null)[] {
  return sortedMonths(sample).map((b, k) => (b.length === 0 ? null : fdcFromSorted(b, `days (month ${k + 1})`)))
}

/** Each calendar month's flows, January first, sorted ascending. */
function sortedMonths(sample: RecordSample): Float64Array[] {
  const n = sample.flows.length
  const counts = new Array<number>(12).fill(0)
  for (let i = 0; i < n; i++) counts[at(sample.months, i) - 1]!++
  const buckets = counts.map((c) => new Float64Array(c))
  const filled = new Array<number>(12).fill(0)
  for (let i = 0; i < n; i++) {
    const k = at(sample.months, i) - 1
    ;(buckets[k] as Float64Array)[filled[k]!++] = at(sample.flows, i)
  }
  return buckets.map((b) => sortFlows(b))
}

/** Two ascending arrays merged into one ascending array. */
function mergeAscending(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length + b.length)
  let i = 0
  let j = 0
  let k = 0
  while (i < a.length && j < b.length) out[k++] = (a[i] as number) <= (b[j] as number) ? (a[i++] as number) : (b[j++] as number)
  while (i < a.length) out[k++] = a[i++] as number
  while (j < b.length) out[k++] = b[j++] as number
  return out
}

/** Twelve FDCs, January first, each by Weibull m/(n+1) over that month's days with data; null for a month with none (Weibull 1939). */
export function monthlyFdcs(days: readonly DailyFlow[]): (Fdc | null)[] {
  return recordMonthCurves(readRecord(days))
}

/** Catchment-area ratio A_site / A_gauge, validated (area-ratio method, common practice). */
export function areaRatio(siteArea: number, gaugeArea: number): number {
  const site = checkNumber(siteArea, 'siteArea', { min: 0, minExclusive: true })
  const gauge = checkNumber(gaugeArea, 'gaugeArea', { min: 0, minExclusive: true })
  return site / gauge
}

/** Q_site = Q_gauge · A_site / A_gauge for each flow, gaps (null) kept (area-ratio method, common practice). */
export function scaleByAreaRatio(flows: readonly number[], siteArea: number, gaugeArea: number): number[]
export function scaleByAreaRatio(
  flows: readonly (number | null)[],
  siteArea: number,
  gaugeArea: number,
): (number | null)[]
export function scaleByAreaRatio(
  flows: readonly (number | null)[],
  siteArea: number,
  gaugeArea: number,
): (number | null)[] {
  const r = areaRatio(siteArea, gaugeArea)
  return flows.map((q) => (q === null ? null : q * r))
}

/** An FDC moved to the site by Q_site = Q_gauge · A_site / A_gauge; exceedances unchanged (area-ratio method, common practice). */
export function scaleFdcByAreaRatio(fdc: Fdc, siteArea: number, gaugeArea: number): Fdc {
  return scaleCurve(fdc, areaRatio(siteArea, gaugeArea))
}

/** A curve with every flow times `factor` (≥ 0), exceedances unchanged. */
export function scaleCurve(fdc: Fdc, factor: number): Fdc {
  return { ...fdc, flow: Float64Array.from(fdc.flow, (q) => q * factor), meanFlow: fdc.meanFlow * factor }
}

/** Reserved flow, m³/s: the fixed value, or Q_p from the FDC for a named exceedance p (hands-off flow, common practice). */
export function reservedFlow(setting: ReservedFlowSetting, fdc: Fdc): number {
  if (setting.kind === 'fixed') return checkNumber(setting.flow, 'reservedFlow.flow', { min: 0 })
  const p = checkNumber(setting.exceedance, 'reservedFlow.exceedance', { min: 0, max: 100 })
  return flowAtExceedance(fdc, p)
}

/** n equal cells over 0–100 % exceedance, returned as their midpoints in %; each carries weight 1/n (midpoint rule). */
export function exceedanceGrid(n: number): number[] {
  const cells = checkNumber(n, 'gridPoints', { min: 1, integer: true })
  const grid = new Array<number>(cells)
  for (let i = 0; i < cells; i++) grid[i] = (100 * (i + 0.5)) / cells
  return grid
}

// ——— internals ———

function at(a: ArrayLike<number>, i: number): number {
  return a[i] as number
}

function interpolate(a: number, b: number, t: number, mode: FdcInterpolation): number {
  if (mode === 'log-linear' && a > 0 && b > 0) return a * Math.pow(b / a, t)
  return a + t * (b - a)
}

/** Exact ∫₀¹⁰⁰ Q(p) dp / 100 of a node curve, with its end values held. */
function curveMean(c: Pick<Fdc, 'exceedance' | 'flow' | 'interpolation'>): number {
  const ex = c.exceedance
  const fl = c.flow
  const last = ex.length - 1
  let area = at(fl, 0) * at(ex, 0) + at(fl, last) * (100 - at(ex, last))
  for (let i = 0; i < last; i++) {
    const a = at(fl, i)
    const b = at(fl, i + 1)
    const w = at(ex, i + 1) - at(ex, i)
    // Log-linear segments average to the logarithmic mean (b − a)/ln(b/a).
    const segMean = c.interpolation === 'log-linear' && a > 0 && b > 0 && a !== b ? (b - a) / Math.log(b / a) : (a + b) / 2
    area += segMean * w
  }
  return area / 100
}

/** A day's flow, null for a gap; throws on anything but a finite flow ≥ 0 (hot loop: no allocation on the good path). */
function dayFlow(d: DailyFlow, i: number, path: string): number | null {
  const q = d?.flow
  if (q === null) return null
  if (typeof q === 'number' && q >= 0 && q < Infinity) return q
  return checkNumber(q, `${path}[${i}].flow`, { min: 0 })
}

function recordFlows(days: readonly DailyFlow[], path: string): Float64Array {
  if (!Array.isArray(days)) throw new EngineInputError(path, 'must be a list of days')
  const buf = new Float64Array(days.length)
  let n = 0
  for (let i = 0; i < days.length; i++) {
    const q = dayFlow(days[i] as DailyFlow, i, path)
    if (q !== null) buf[n++] = q
  }
  return buf.subarray(0, n)
}

/** Weibull-ranked FDC of a sample; sorts `values` in place. */
function fdcFromSample(values: Float64Array, path: string): Fdc {
  return fdcFromSorted(sortFlows(values), path)
}

/** Weibull-ranked FDC of a sample already sorted ascending. */
function fdcFromSorted(values: Float64Array, path: string): Fdc {
  const n = values.length
  if (n === 0) throw new EngineInputError(path, 'the record has no days with flow data')
  const exceedance = new Float64Array(n)
  const flow = new Float64Array(n)
  let sum = 0
  for (let m = 1; m <= n; m++) {
    const q = at(values, n - m)
    flow[m - 1] = q
    exceedance[m - 1] = (100 * m) / (n + 1)
    sum += q
  }
  return { kind: 'record', exceedance, flow, interpolation: 'linear', meanFlow: sum / n, count: n }
}

/** Below this many values the built-in sort is as quick as the radix sort. */
const RADIX_MIN = 1024

/** True where a Float64Array's two 32-bit halves come low word first (every platform Node runs on today). */
const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1

/**
 * Sort flows in place, ascending, exactly as `Float64Array.prototype.sort()` would: for doubles with
 * the sign bit clear (+0 and every positive number) the 64-bit pattern read as an unsigned integer
 * rises with the value, so a stable least-significant-digit radix sort over it (11-bit digits, six
 * passes, a pass skipped where every value has the same digit) gives the same order, and equal
 * values have equal bits. A year-long or longer record sorts several times faster than with the
 * comparison sort. Anything else (−0, NaN, a short sample, a big-endian platform) goes to the
 * built-in sort.
 */
export function sortFlows(values: Float64Array): Float64Array {
  const n = values.length
  if (n < RADIX_MIN || !LITTLE_ENDIAN) return values.sort()
  const words = new Uint32Array(values.buffer, values.byteOffset, n * 2)
  for (let i = 1; i < 2 * n; i += 2) if ((words[i] as number) >= 0x80000000 || Number.isNaN(values[(i - 1) >> 1])) return values.sort()
  let src: Float64Array = values
  let srcWords: Uint32Array = words
  let dst: Float64Array = new Float64Array(n)
  let dstWords: Uint32Array = new Uint32Array(dst.buffer)
  const count = new Uint32Array(2048)
  // [word (0 low, 1 high), shift, digit mask]
  const passes: ReadonlyArray<readonly [number, number, number]> = [[0, 0, 2047], [0, 11, 2047], [0, 22, 1023], [1, 0, 2047], [1, 11, 2047], [1, 22, 1023]]
  for (const [word, shift, mask] of passes) {
    count.fill(0)
    for (let i = 0; i < n; i++) count[((srcWords[2 * i + word] as number) >>> shift) & mask]!++
    if (count[((srcWords[word] as number) >>> shift) & mask] === n) continue
    let total = 0
    for (let d = 0; d <= mask; d++) {
      const c = count[d] as number
      count[d] = total
      total += c
    }
    for (let i = 0; i < n; i++) {
      const d = ((srcWords[2 * i + word] as number) >>> shift) & mask
      const at = count[d] as number
      count[d] = at + 1
      dstWords[2 * at] = srcWords[2 * i] as number
      dstWords[2 * at + 1] = srcWords[2 * i + 1] as number
    }
    const t = src
    src = dst
    dst = t
    const tw = srcWords
    srcWords = dstWords
    dstWords = tw
  }
  if (src !== values) values.set(src)
  return values
}

