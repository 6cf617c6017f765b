// Heads from the weir's hydraulics (ENGINE.md §13), an alternative to the head-vs-flow table: the head-pool
// level from the weir equation, the tail level from Manning's equation or a stage–discharge table, and from
// them the gross head, whether the weir is drowned, and the throat's depth below the tail at each river flow.
// Levels are heights above the tail-pool bed.
//
// Simplification: the head pool is taken at the level the whole river would hold over the crest. That is the
// ordinary level level control holds the units to (within the allowed drawdown, operation.ts), so the units'
// take does not lower it here; what the units pass still reaches the tail, so the tail level is the whole river's.
import { G } from './constants'
import type { SourcedValue } from './defaults'
import { checkNumber, EngineInputError } from './errors'
import type { WeirShapeClass } from './oxygen'
import { crestFormOf, isDrowned, WEIR_DISCHARGE_COEFFICIENT } from './weirAeration'

/** One row of a stage–discharge table for the tail pool: river flow and the depth of water over the tail-pool bed. */
export interface TailRow {
  flow_m3s: number
  depth_m: number
}

/** How the tail level follows the river flow. */
export type TailRating =
  | { kind: 'manning', channelWidth_m: number, bedSlope: number, roughnessN: number }
  | { kind: 'table', rows: readonly TailRow[] }

/** The weir's hydraulics as entered (the engine input's `site.hydraulics`). */
export interface WeirHydraulicsInput {
  /** Crest above the tail-pool bed, m. */
  crestHeight_m: number
  /** C_d of Q = C_d·L·√(2g)·h^1.5; null takes the default for the weir's crest form. */
  dischargeCoefficient: number | null
  tail: TailRating
}

/** The hydraulics resolved for computation: coefficient chosen, table sorted, constants worked out once. */
export interface WeirHydraulics {
  crestLength_m: number
  crestHeight_m: number
  /** C_d used, and where it comes from. */
  dischargeCoefficient: SourcedValue
  tail: TailRating
  /** C_d·L·√(2g), m^1.5/s: the head over the crest is (Q/k)^(2/3). */
  crestConstant: number
  /** Tail depths already worked out, by river flow (see tailDepth). */
  memo: Map<number, number>
}

/** Manning's equation in SI units for a rectangular section of width B at depth y: Q = (1/n)·A·R^(2/3)·S^(1/2), A = B·y, R = B·y/(B + 2y). */
export function manningFlow(depth_m: number, channelWidth_m: number, bedSlope: number, roughnessN: number): number {
  if (!(depth_m > 0)) return 0
  return conveyance(depth_m, channelWidth_m) * (Math.sqrt(bedSlope) / roughnessN)
}

/** A·R^(2/3) of a rectangular section, m^(8/3): R^(2/3) taken as ∛(R²), the same number and cheaper than a power. */
function conveyance(depth_m: number, width_m: number): number {
  const A = width_m * depth_m
  const R = A / (width_m + 2 * depth_m)
  return A * Math.cbrt(R * R)
}

/** Most steps of the normal-depth solve; Newton from a close start converges in a few, bisection in about sixty. */
const MAX_ITERATIONS = 200

/**
 * Normal depth y of a rectangular channel carrying Q (Manning's equation solved for y). Written as the fixed point
 * y = y_w·((B + 2y)/B)^(2/5), y_w = (nQ/(B√S))^(3/5) the wide-channel depth, whose right side rises with y: started
 * from y_w (never above the root, as R < y) one step stays below the root and lands close to it. From there Newton
 * steps are taken inside a bracket (bisection where a step would leave it; the upper end found by doubling) until
 * the flow matches to 1e-12 relative or the bracket closes. No flow: depth 0.
 */
export function manningDepth(flow_m3s: number, channelWidth_m: number, bedSlope: number, roughnessN: number): number {
  if (!(flow_m3s > 0)) return 0
  const B = channelWidth_m
  const target = flow_m3s
  const yw = ((roughnessN * target) / (B * Math.sqrt(bedSlope))) ** 0.6
  if (!(yw > 0) || !Number.isFinite(yw)) return 0
  const k = Math.sqrt(bedSlope) / roughnessN
  const f = (y: number): number => (y > 0 ? conveyance(y, B) * k : 0) - target
  let lo = yw
  let y = yw * ((B + 2 * yw) / B) ** 0.4
  let hi = Infinity
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    const fy = f(y)
    if (Math.abs(fy) <= 1e-12 * target) return y
    if (fy > 0) hi = y
    else lo = Math.max(lo, y)
    // dQ/dy = Q·(5/(3y) − 4/(3(B + 2y))) for the rectangular section
    const q = fy + target
    const slope = q * (5 / (3 * y) - 4 / (3 * (B + 2 * y)))
    let next = slope > 0 ? y - fy / slope : NaN
    if (!(next > lo && next < hi)) next = Number.isFinite(hi) ? (lo + hi) / 2 : 2 * Math.max(lo, y)
    if (next === y || (Number.isFinite(hi) && hi - lo <= Number.EPSILON * hi)) return next
    y = next
  }
  return y
}

/**
 * Tail depth from a stage–discharge table by linear interpolation between rows (sorted by flow). Below the first
 * row the depth is held at the first row's; above the last row it carries on along the last row pair's slope (a
 * tail keeps rising in a flood: holding it flat would let the head grow without bound as the pool rises), never falling.
 */
export function tableDepth(rows: readonly TailRow[], flow_m3s: number): number {
  const n = rows.length
  if (n === 0) return 0
  const first = rows[0] as TailRow
  if (flow_m3s <= first.flow_m3s || n === 1) return Math.max(0, first.depth_m)
  for (let i = 1; i < n; i++) {
    const b = rows[i] as TailRow
    if (flow_m3s <= b.flow_m3s) {
      const a = rows[i - 1] as TailRow
      const span = b.flow_m3s - a.flow_m3s
      const t = span > 0 ? (flow_m3s - a.flow_m3s) / span : 1
      return Math.max(0, a.depth_m + t * (b.depth_m - a.depth_m))
    }
  }
  const a = rows[n - 2] as TailRow
  const b = rows[n - 1] as TailRow
  const span = b.flow_m3s - a.flow_m3s
  const rise = span > 0 ? Math.max(0, (b.depth_m - a.depth_m) / span) : 0
  return Math.max(0, b.depth_m + rise * (flow_m3s - b.flow_m3s))
}

/**
 * Resolve entered hydraulics for a weir of crest length L and Butts & Evans shape class: C_d given, else the default
 * for the shape's crest form (WEIR_DISCHARGE_COEFFICIENT); the table sorted by flow. Refuses what cannot be used,
 * naming the field under `field` (`site.hydraulics.…`, or `site.crestLength_m`).
 */
export function resolveWeirHydraulics(h: WeirHydraulicsInput, crestLength_m: number | undefined, shape: WeirShapeClass, field = 'site.hydraulics'): WeirHydraulics {
  if (crestLength_m === undefined) throw new EngineInputError('site.crestLength_m', 'is needed for heads from the weir hydraulics')
  const L = checkNumber(crestLength_m, 'site.crestLength_m', { min: 0, minExclusive: true })
  const crestHeight_m = checkNumber(h.crestHeight_m, `${field}.crestHeight_m`, { min: 0 })
  let cd: SourcedValue
  if (h.dischargeCoefficient !== null) {
    cd = { value: checkNumber(h.dischargeCoefficient, `${field}.dischargeCoefficient`, { min: 0, minExclusive: true }), unit: '-', source: 'given with the site' }
  }
  else {
    const form = crestFormOf(shape)
    if (form === null) throw new EngineInputError(`${field}.dischargeCoefficient`, 'is needed: a sluice has no crest form to give a default')
    cd = WEIR_DISCHARGE_COEFFICIENT[form]
  }
  let tail: TailRating
  if (h.tail.kind === 'manning') {
    tail = {
      kind: 'manning',
      channelWidth_m: checkNumber(h.tail.channelWidth_m, `${field}.tail.channelWidth_m`, { min: 0, minExclusive: true }),
      bedSlope: checkNumber(h.tail.bedSlope, `${field}.tail.bedSlope`, { min: 0, minExclusive: true }),
      roughnessN: checkNumber(h.tail.roughnessN, `${field}.tail.roughnessN`, { min: 0, minExclusive: true }),
    }
  }
  else {
    if (h.tail.rows.length < 2) throw new EngineInputError(`${field}.tail.rows`, 'needs at least 2 rows')
    h.tail.rows.forEach((r, i) => {
      checkNumber(r.flow_m3s, `${field}.tail.rows[${i}].flow_m3s`, { min: 0 })
      checkNumber(r.depth_m, `${field}.tail.rows[${i}].depth_m`, { min: 0 })
    })
    tail = { kind: 'table', rows: [...h.tail.rows].sort((a, b) => a.flow_m3s - b.flow_m3s) }
  }
  return { crestLength_m: L, crestHeight_m, dischargeCoefficient: cd, tail, crestConstant: cd.value * L * Math.sqrt(2 * G), memo: new Map() }
}

/** Most tail depths kept per resolved hydraulics: a century of days and the year's grids with room to spare (a few MB). */
const MEMO_LIMIT = 200_000

/**
 * Depth of water over the tail-pool bed at river flow Q, m (Manning's normal depth, or the table). Answers are kept
 * on the resolved hydraulics by flow: an assessment asks each day's flow in each operating mode, and a Monte Carlo
 * asks them again in every draw of the same site, so each distinct flow is solved once (the same figure each time).
 */
export function tailDepth(h: WeirHydraulics, flow_m3s: number): number {
  const known = h.memo.get(flow_m3s)
  if (known !== undefined) return known
  const t = h.tail
  const y = t.kind === 'manning' ? manningDepth(flow_m3s, t.channelWidth_m, t.bedSlope, t.roughnessN) : tableDepth(t.rows, flow_m3s)
  if (h.memo.size >= MEMO_LIMIT) h.memo.clear()
  h.memo.set(flow_m3s, y)
  return y
}

/** Head over the crest for the whole river, h = (Q/(C_d·L·√(2g)))^(2/3), m (the weir equation inverted). */
export function crestHead(h: WeirHydraulics, flow_m3s: number): number {
  return flow_m3s > 0 ? (flow_m3s / h.crestConstant) ** (2 / 3) : 0
}

/** Gross head at river flow Q with the tail at `tail_m`: crest height + head over the crest, less the tail, never below 0, m. */
export function grossHeadWith(h: WeirHydraulics, flow_m3s: number, tail_m: number): number {
  return Math.max(0, h.crestHeight_m + crestHead(h, flow_m3s) - tail_m)
}

/** Whether the weir is drowned with the tail at `tail_m` (it stands above the crest; weirAeration.ts isDrowned). */
export function drownedWith(h: WeirHydraulics, tail_m: number): boolean {
  return isDrowned(tail_m, h.crestHeight_m)
}

/** Everything the hydraulics say at one river flow. */
export interface HydraulicState {
  riverFlow_m3s: number
  /** Head-pool level above the tail-pool bed: crest height + head over the crest, m. */
  poolLevel_m: number
  /** Tail depth over the tail-pool bed, m. */
  tailDepth_m: number
  /** Pool less tail, never below 0, m. */
  grossHead_m: number
  /** The tail stands above the crest. */
  drowned: boolean
}

/** Pool, tail, gross head and drowning at river flow Q. */
export function hydraulicState(h: WeirHydraulics, flow_m3s: number): HydraulicState {
  const Q = Math.max(0, flow_m3s)
  const tail = tailDepth(h, Q)
  return { riverFlow_m3s: Q, poolLevel_m: h.crestHeight_m + crestHead(h, Q), tailDepth_m: tail, grossHead_m: grossHeadWith(h, Q, tail), drowned: drownedWith(h, tail) }
}

/**
 * Depth of the throat below the tail surface at a tail depth: the option's throat depth is read as its depth below
 * the tail at the median river flow, and the throat stays where it is built, so it is deeper by as much as the tail
 * stands higher (and shallower as it falls, never above the surface).
 */
export function throatDepthAt(optionDepth_m: number, tail_m: number, medianTail_m: number): number {
  return Math.max(0, optionDepth_m + (tail_m - medianTail_m))
}

/**
 * The least river flow at which the weir is drowned (the tail reaches the crest), m³/s, or null when it never is
 * within reach: Manning's flow at the crest height, or the table read backwards (its slope carried past the last row).
 */
export function drowningFlow(h: WeirHydraulics): number | null {
  const t = h.tail
  const c = h.crestHeight_m
  if (t.kind === 'manning') return manningFlow(c, t.channelWidth_m, t.bedSlope, t.roughnessN)
  const rows = t.rows
  const first = rows[0]
  if (!first) return null
  // held at the first row's depth below it: drowned at every flow
  if (first.depth_m > c) return 0
  for (let i = 1; i < rows.length; i++) {
    const a = rows[i - 1] as TailRow
    const b = rows[i] as TailRow
    if (b.depth_m > c && b.depth_m > a.depth_m) return a.flow_m3s + ((c - a.depth_m) / (b.depth_m - a.depth_m)) * (b.flow_m3s - a.flow_m3s)
  }
  const a = rows[rows.length - 2]
  const b = rows[rows.length - 1] as TailRow
  if (!a || !(b.depth_m > a.depth_m) || !(b.flow_m3s > a.flow_m3s)) return null
  return b.flow_m3s + ((c - b.depth_m) / (b.depth_m - a.depth_m)) * (b.flow_m3s - a.flow_m3s)
}
