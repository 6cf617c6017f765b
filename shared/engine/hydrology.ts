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
 * Plain arrays, so a curve survives JSON.
 */
export interface Fdc {
  /** Where the curve came from. */
  readonly kind: 'points' | 'record'
  /** Exceedance of each node, %, strictly increasing within 0–100. */
  readonly exceedance: readonly number[]
  /** Flow at each node, m³/s, non-increasing. */
  readonly flow: readonly number[]
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

/** Twelve FDCs, January first, each by Weibull m/(n+1) over that month's days with data; null for a month with none (Weibull 1939). */
export function monthlyFdcs(days: readonly DailyFlow[]): (Fdc | null)[] {
  if (!Array.isArray(days)) throw new EngineInputError('days', 'must be a list of days')
  const months = new Uint8Array(days.length)
  const counts = new Array<number>(12).fill(0)
  days.forEach((d, i) => {
    const q = dayFlow(d, i, 'days')
    if (q === null) return
    const m = monthOfDay(d.date, i)
    months[i] = m
    counts[m - 1] = at(counts, m - 1) + 1
  })
  const buckets = counts.map((n) => new Float64Array(n))
  const filled = new Array<number>(12).fill(0)
  days.forEach((d, i) => {
    const m = at(months, i)
    if (m === 0) return
    const k = m - 1
    const bucket = buckets[k] as Float64Array
    bucket[at(filled, k)] = d.flow as number
    filled[k] = at(filled, k) + 1
  })
  return buckets.map((b, k) => (b.length === 0 ? null : fdcFromSample(b, `days (month ${k + 1})`)))
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

/** A gauged daily record moved to the site by Q_site = Q_gauge · A_site / A_gauge (area-ratio method, common practice). */
export function scaleRecordByAreaRatio(
  days: readonly DailyFlow[],
  siteArea: number,
  gaugeArea: number,
): DailyFlow[] {
  const r = areaRatio(siteArea, gaugeArea)
  return days.map((d) => ({ date: d.date, flow: d.flow === null ? null : d.flow * r }))
}

/** An FDC moved to the site by Q_site = Q_gauge · A_site / A_gauge; exceedances unchanged (area-ratio method, common practice). */
export function scaleFdcByAreaRatio(fdc: Fdc, siteArea: number, gaugeArea: number): Fdc {
  const r = areaRatio(siteArea, gaugeArea)
  return { ...fdc, flow: fdc.flow.map((q) => q * r), meanFlow: fdc.meanFlow * r }
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
  const n = values.length
  if (n === 0) throw new EngineInputError(path, 'the record has no days with flow data')
  sortFlows(values)
  const exceedance = new Array<number>(n)
  const flow = new Array<number>(n)
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

