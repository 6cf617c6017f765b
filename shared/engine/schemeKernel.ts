// The inner loop of an assessment, kept apart from the scheme it serves (scheme.ts): per-scheme and
// per-temperature constants worked out once, and scratch records written in place.
import { airPathSetting, airPointInto, blankAirPoint, type AirOperatingPoint, type AirPathSetting } from './airPath'
import { leftInRiver } from './flowRules'
import { operate, type Candidate, type FlowSplit, type LevelControlInput, type ShutReason, type UnitCurve } from './operation'
import {
  cavitationIndex, cavitationMargin, headAtFlow, headForUnitFlow, suctionHead,
  throatVelocity, unitCapacity, vapourSuctionLimit, type HeadPoint,
} from './venturi'
import { vapourPressure, waterDensity } from './water'
import { grossHeadWith, tailDepth, throatDepthAt } from './weirHydraulics'
import type { Conditions, Scheme } from './scheme'

// An assessment evaluates the units at a few thousand river flows (the energy integral, the summary
// grids, the month table) but at only a handful of water temperatures. What depends only on the
// temperature (water properties, the suction limit, the air-path setting) is worked out once per
// temperature, the head table is sorted once, and each flow's figures are written into scratch
// records instead of fresh objects. Every figure comes from the same functions with the same
// arguments as a direct evaluation, so the answers are identical to the last bit
// (tests/unit/engine/speedups.test.ts checks this against a fresh composition).

/** Hydraulics and air path of one running unit at one unit flow, gross head and throat depth. */
export interface UnitPoint {
  /** Depth of the throat below the tail surface it was worked out at, m. */
  throatDepth_m: number
  workingHead_m: number
  throatVelocity_ms: number
  suction_m: number
  cavitationMargin_m: number
  cavitationIndex: number | null
  air: AirOperatingPoint
}

/** What every flow at one water temperature shares, and the last unit point computed there. */
export interface WaterAt {
  tC: number
  p_v: number
  rho: number
  /** (p_atm − p_v)/ρg, ≥ 0: the shut-off suction cap, and the cavitation margin of stopped units. */
  suctionLimit_m: number
  air: AirPathSetting
  /** The last unit point, valid for `lastFlow`, `lastHead` and `lastDepth`: a river above the units' capacity at a fixed head repeats it. */
  point: UnitPoint
  hasPoint: boolean
  lastFlow: number
  lastHead: number
  lastDepth: number
  /** The throat depth `air.dischargePressure_Pa` stands for (it moves with the tail when heads come from the weir's hydraulics). */
  airDepth_m: number
}

/** One river flow's split and unit point (scratch, see evaluate). */
interface Evaluation {
  river: number
  H: number
  /** Throat depth below the tail surface at this flow, m. */
  d: number
  /** Tail depth by the weir's hydraulics, m; null when heads come from the head table. */
  tail: number | null
  split: FlowSplit
  w: WaterAt
  point: UnitPoint
}

/** Per-scheme constants and scratch for the inner loop. */
interface Kernel {
  /** The head-vs-flow table sorted by flow once (headAtFlow sorts a copy on every call otherwise). */
  heads: readonly HeadPoint[]
  /** Unit capacity at the last gross head asked for: without a head table every flow has the same head. */
  capHead: number
  cap: number
  hasCap: boolean
  level: LevelControlInput
  curve: UnitCurve
  /** Calendar months (1–12) in which the units are shut. */
  closed: ReadonlySet<number>
  temps: WaterAt[]
  lastTemp: WaterAt | null
  /** Filled by evaluate once a flow has been asked (null before). */
  at: Evaluation | null
  /** The flow evaluate is asking about, read by `check` (one check function per scheme, not one per flow). */
  query: { w: WaterAt | null, river: number, H: number, d: number, riverCheck: RiverCheck | null }
  check: (cand: Candidate) => ShutReason | null
}

const kernels = new WeakMap<Scheme, Kernel>()

function kernelOf(s: Scheme): Kernel {
  let k = kernels.get(s)
  if (k) return k
  const o = s.input.option
  const g = s.geometry
  const kk: Kernel = {
    heads: s.heads.table, capHead: 0, cap: 0, hasCap: false,
    level: { riverFlow_m3s: 0, reservedFlow_m3s: s.reserved_m3s, grossHead_m: 0, units: o.units, allowedDrawdown_m: o.operation.allowedDrawdown_m },
    // The full-head capacity is asked once per flow and again by level control: answer it from the kernel's cache.
    curve: { capacityAt: (h) => (kk.hasCap && Object.is(kk.capHead, h) ? kk.cap : unitCapacity(h, g)), headFor: (q) => headForUnitFlow(q, g) },
    closed: new Set(o.operation.closedMonths),
    temps: [], lastTemp: null, at: null,
    query: { w: null, river: 0, H: 0, d: o.throatDepth_m, riverCheck: null },
    check: (cand) => {
      const { w, river, H, d, riverCheck } = kk.query
      const p = unitPoint(w as WaterAt, cand.unitFlow_m3s, H, s, d)
      return unitVerdict(p) ?? (riverCheck ? riverCheck(cand, p, river, H, w as WaterAt) : null)
    },
  }
  k = kk
  kernels.set(s, k)
  return k
}

/** Water properties and the air-path setting at one temperature, for units rated `rated` W (null: no cap). */
export function waterAt(s: Scheme, tC: number, rated: number | null): WaterAt {
  const o = s.input.option
  const p_v = vapourPressure(tC)
  const rho = waterDensity(tC)
  const suctionLimit_m = vapourSuctionLimit(s.p_atm, p_v, rho)
  const air = airPathSetting({
    suctionLimit_m,
    dischargeDepth_m: o.throatDepth_m,
    waterDensity: rho,
    p_atm: s.p_atm,
    airTemperature_C: tC + s.input.settings.airTemperatureOffset_K,
    jetPumpEfficiency: o.air.jetPumpEfficiency,
    maxGasLiquidRatio: o.air.maxGasLiquidRatio,
    pipe: { diameter_m: o.air.pipeDiameter_m, length_m: o.air.pipeLength_m, lossK: o.air.pipeLossK, frictionFactor: o.air.frictionFactor },
    turbine: { efficiency: o.turbine.efficiency, generatorEfficiency: o.turbine.generatorEfficiency, ratedPower_W: rated, cutInFraction: o.turbine.cutInFraction },
  })
  return {
    tC, p_v, rho, suctionLimit_m, air,
    point: { throatDepth_m: o.throatDepth_m, workingHead_m: 0, throatVelocity_ms: 0, suction_m: 0, cavitationMargin_m: 0, cavitationIndex: null, air: blankAirPoint() },
    hasPoint: false, lastFlow: 0, lastHead: 0, lastDepth: o.throatDepth_m, airDepth_m: o.throatDepth_m,
  }
}

/** The scheme's per-temperature record for rated units, built on first use. */
function ratedWaterAt(s: Scheme, k: Kernel, tC: number): WaterAt {
  const last = k.lastTemp
  if (last !== null && Object.is(last.tC, tC)) return last
  let w = k.temps.find((t) => Object.is(t.tC, tC))
  if (!w) {
    w = waterAt(s, tC, s.ratedPerUnit_W)
    k.temps.push(w)
  }
  k.lastTemp = w
  return w
}

/**
 * Hydraulics and air path of one unit, as unitHydraulics and airOperatingPoint give them, with the throat `d` m
 * below the tail surface (the option's depth unless the weir's hydraulics move the tail); the result is
 * `w.point`, overwritten by the next call.
 */
export function unitPoint(w: WaterAt, unitFlow: number, grossHead: number, s: Scheme, d: number = s.input.option.throatDepth_m): UnitPoint {
  const pt = w.point
  if (w.hasPoint && Object.is(w.lastFlow, unitFlow) && Object.is(w.lastHead, grossHead) && Object.is(w.lastDepth, d)) return pt
  const g = s.geometry
  if (!Object.is(w.airDepth_m, d)) {
    // the air leaves with the water at the throat's depth: p_atm + ρg·d, as airPathSetting writes it
    w.air.dischargePressure_Pa = w.air.p_atm + w.air.rhoG * Math.max(0, d)
    w.airDepth_m = d
  }
  const Vt = throatVelocity(unitFlow, g)
  const Hw = unitFlow > 0 ? Math.min(grossHead, headForUnitFlow(unitFlow, g)) : 0
  const suction = unitFlow > 0 ? suctionHead(Hw, d, Vt, g.inletLoss) : -d
  pt.throatDepth_m = d
  pt.workingHead_m = Hw
  pt.throatVelocity_ms = Vt
  pt.suction_m = suction
  pt.cavitationMargin_m = cavitationMargin(s.p_atm, w.p_v, w.rho, suction)
  pt.cavitationIndex = cavitationIndex(s.p_atm, w.p_v, w.rho, suction, Vt)
  airPointInto(w.air, suction, unitFlow, Hw, pt.air)
  w.hasPoint = true
  w.lastFlow = unitFlow
  w.lastHead = grossHead
  w.lastDepth = d
  return pt
}

/**
 * A suction this small is zero to rounding: heads of a few metres are added and subtracted in double
 * precision, good to about 1e-15 m, so a suction the physics makes exactly zero can come out a few
 * times 1e-15 m either way. A nanometre is far above that and far below any suction that draws air.
 */
const SUCTION_ROUNDING_m = 1e-9

/**
 * Whether a candidate may run, from its unit point: it must draw air (suction above 0) and make power
 * above the turbine's cut-in; in river-first mode it must also not cost the river oxygen (`riverCheck`).
 */
function unitVerdict(p: UnitPoint): ShutReason | null {
  if (!(p.suction_m > SUCTION_ROUNDING_m) || !(p.air.airFlow_m3s > 0)) return 'no-suction'
  if (p.air.state !== 'running' && p.air.state !== 'at-rating') return 'below-cut-in'
  if (!(p.air.electricalPower_W > 0)) return 'below-cut-in'
  return null
}

/** A river check for river-first mode: why running `c` (its unit point `p`) would cost the river, or null. */
export type RiverCheck = (c: Candidate, p: UnitPoint, river: number, H: number, w: WaterAt) => ShutReason | null

/** Split and unit point at one river flow, written into the kernel's scratch record (read it before the next call). */
export function evaluate(s: Scheme, flow_m3s: number, c: Conditions, riverCheck: RiverCheck | null = null): Evaluation {
  const k = kernelOf(s)
  const river = Math.max(0, flow_m3s)
  const hyd = s.heads.hydraulics
  let H: number
  let d = s.input.option.throatDepth_m
  let tail: number | null = null
  if (hyd === null) H = headAtFlow(k.heads, river, s.input.site.grossHead_m)
  else {
    // heads from the weir's hydraulics (weirHydraulics.ts); siteHeads.grossHeadAt gives the same figure
    tail = tailDepth(hyd, river)
    H = grossHeadWith(hyd, river, tail)
    if (s.medianTail_m !== null) d = throatDepthAt(d, tail, s.medianTail_m)
  }
  if (!k.hasCap || !Object.is(k.capHead, H)) {
    k.cap = unitCapacity(H, s.geometry)
    k.capHead = H
    k.hasCap = true
  }
  k.level.riverFlow_m3s = river
  // The flow rules leave this much in the river at this flow; level control works on the rest.
  k.level.reservedFlow_m3s = leftInRiver(s.flowRules, river)
  k.level.grossHead_m = H
  const w = ratedWaterAt(s, k, c.tC)
  const q = k.query
  q.w = w
  q.river = river
  q.H = H
  q.d = d
  q.riverCheck = riverCheck
  const split = operate(k.level, k.curve, k.closed.has(c.month), k.check)
  const point = unitPoint(w, split.unitFlow_m3s, H, s, d)
  const at = k.at
  if (at === null) return (k.at = { river, H, d, tail, split, w, point })
  at.river = river
  at.H = H
  at.d = d
  at.tail = tail
  at.split = split
  at.w = w
  at.point = point
  return at
}
