// One option at one site, resolved from an assessment input, and its state at one river flow.
import type { AssessInput } from '../schemas/assess'
import { isaPressure } from './atmosphere'
import { airPathSetting, airPointInto, blankAirPoint, type AirOperatingPoint, type AirPathSetting, type TurbineState } from './airPath'
import {
  bubbleContact, contactTime, diffuserLength, downstreamFromDeficitRatio, fieldTransfer, mixStreams, totalDissolvedGas,
  unitNitrogen, WATER_QUALITY_A, WEIR_SHAPE_B, weirDeficitRatio, type TransferResult,
} from './oxygen'
import { nitrogenSaturation, oxygenSaturation } from './oxygenSaturation'
import {
  cavitationIndex, cavitationMargin, circleArea, constrictionDefaults, headAtFlow, headForUnitFlow, splitFlow, suctionHead,
  throatVelocity, unitCapacity, vapourSuctionLimit, type FlowSplit, type HeadPoint, type Regime, type SplitInput, type UnitGeometry,
} from './venturi'
import { vapourPressure, waterDensity } from './water'

/** Water conditions at one moment: temperature and upstream oxygen. */
export interface Conditions {
  tC: number
  upstreamO2_mgL: number
}

/** An option resolved for computation: geometry, pressures, reserved flow and rating. */
export interface Scheme {
  readonly input: AssessInput
  readonly geometry: UnitGeometry
  readonly p_atm: number
  readonly reserved_m3s: number
  readonly diffuserLength_m: number
  /** Electrical rating of one unit, W. */
  readonly ratedPerUnit_W: number
  readonly ratingSizedToDesign: boolean
}

/** Power-side state of the units at one river flow. */
export interface PowerState {
  riverFlow_m3s: number
  grossHead_m: number
  regime: Regime
  unitsRunning: number
  unitFlow_m3s: number
  spill_m3s: number
  reserved_m3s: number
  workingHead_m: number
  throatVelocity_ms: number
  suction_m: number
  cavitationMargin_m: number
  cavitationIndex: number | null
  /** Free-air flow of all units, m³/s. */
  airFlow_m3s: number
  airMassFlowPerUnit_kgs: number
  /** Electrical power of all units, W. */
  electricalPower_W: number
  /** ρgQ_uH_w of all running units, W. */
  hydraulicPower_W: number
  waterToWire: number
  turbineState: TurbineState | 'stopped'
}

/** Oxygen-side state at one river flow, mg/L. */
export interface OxygenState {
  saturation_mgL: number
  upstream_mgL: number
  withoutScheme_mgL: number
  weirStream_mgL: number
  unitFieldTransfer_mgL: number
  unitBubbleContact_mgL: number
  withSchemeFieldTransfer_mgL: number
  withSchemeBubbleContact_mgL: number
  /** With the method the summary uses. */
  withScheme_mgL: number
  netGain_mgL: number
  /** Total dissolved gas of the unit discharge at the surface, fraction of barometric pressure. */
  unitTdg: number
}

/** Everything at one river flow. */
export interface FlowState extends PowerState {
  oxygen: OxygenState
}

/** Resolve geometry, atmosphere, reserved flow and the unit rating of an input. */
export function buildScheme(input: AssessInput, reserved_m3s: number, design: Conditions): Scheme {
  const o = input.option
  const base = constrictionDefaults(o.constriction)
  const geometry: UnitGeometry = {
    throatDiameter_m: o.throatDiameter_m,
    outletDiameter_m: o.outletDiameter_m,
    inletLoss: o.inletLoss,
    diffuserEfficiency: o.diffuserEfficiency ?? base.diffuserEfficiency,
    flowCoefficient: o.flowCoefficient ?? base.flowCoefficient,
  }
  const partial: Scheme = {
    input, geometry, p_atm: isaPressure(input.site.altitude_m), reserved_m3s,
    diffuserLength_m: o.diffuserLength_m ?? diffuserLength(o.throatDiameter_m, o.outletDiameter_m, input.settings.diffuserHalfAngle_deg),
    ratedPerUnit_W: 0, ratingSizedToDesign: o.turbine.ratedPower_kW === null,
  }
  if (o.turbine.ratedPower_kW !== null) return { ...partial, ratedPerUnit_W: o.turbine.ratedPower_kW * 1000 }
  const H = input.site.grossHead_m
  const q = unitCapacity(H, geometry)
  const p = unitPoint(waterAt(partial, design.tC, null), q, H, partial)
  return { ...partial, ratedPerUnit_W: p.air.availableElectricalPower_W }
}

// ——— the inner loop ———
// An assessment evaluates the units at a few thousand river flows (the energy integral, the summary
// grids, the month table) but at only a handful of water temperatures. What depends only on the
// temperature (water properties, the suction limit, the air-path setting) is worked out once per
// temperature, the head table is sorted once, and each flow's figures are written into scratch
// records instead of fresh objects. Every figure comes from the same functions with the same
// arguments as a direct evaluation, so the answers are identical to the last bit
// (tests/unit/engine/speedups.test.ts checks this against a fresh composition).

/** Hydraulics and air path of one running unit at one unit flow and gross head. */
interface UnitPoint {
  workingHead_m: number
  throatVelocity_ms: number
  suction_m: number
  cavitationMargin_m: number
  cavitationIndex: number | null
  air: AirOperatingPoint
}

/** What every flow at one water temperature shares, and the last unit point computed there. */
interface WaterAt {
  tC: number
  p_v: number
  rho: number
  /** (p_atm − p_v)/ρg, ≥ 0: the shut-off suction cap, and the cavitation margin of stopped units. */
  suctionLimit_m: number
  air: AirPathSetting
  /** The last unit point, valid for `lastFlow` and `lastHead`: a river above the units' capacity at a fixed head repeats it. */
  point: UnitPoint
  hasPoint: boolean
  lastFlow: number
  lastHead: number
}

/** One river flow's split and unit point (scratch, see evaluate). */
interface Evaluation {
  river: number
  H: number
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
  split: SplitInput
  temps: WaterAt[]
  lastTemp: WaterAt | null
  /** Filled by evaluate once a flow has been asked (null before). */
  at: Evaluation | null
}

const kernels = new WeakMap<Scheme, Kernel>()

function kernelOf(s: Scheme): Kernel {
  let k = kernels.get(s)
  if (k) return k
  const o = s.input.option
  // Array sort is stable, so sorting once gives the very order headAtFlow's per-call sort gives.
  const heads = [...s.input.site.headTable].sort((a, b) => a.flow_m3s - b.flow_m3s)
  k = {
    heads, capHead: 0, cap: 0, hasCap: false,
    split: { riverFlow_m3s: 0, reservedFlow_m3s: s.reserved_m3s, units: o.units, capacity_m3s: 0, minUnitFlowFraction: o.minUnitFlowFraction, staging: o.staging },
    temps: [], lastTemp: null, at: null,
  }
  kernels.set(s, k)
  return k
}

/** Water properties and the air-path setting at one temperature, for units rated `rated` W (null: no cap). */
function waterAt(s: Scheme, tC: number, rated: number | null): WaterAt {
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
    point: { workingHead_m: 0, throatVelocity_ms: 0, suction_m: 0, cavitationMargin_m: 0, cavitationIndex: null, air: blankAirPoint() },
    hasPoint: false, lastFlow: 0, lastHead: 0,
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

/** Hydraulics and air path of one unit, as unitHydraulics and airOperatingPoint give them; the result is `w.point`, overwritten by the next call. */
function unitPoint(w: WaterAt, unitFlow: number, grossHead: number, s: Scheme): UnitPoint {
  const pt = w.point
  if (w.hasPoint && Object.is(w.lastFlow, unitFlow) && Object.is(w.lastHead, grossHead)) return pt
  const g = s.geometry
  const d = s.input.option.throatDepth_m
  const Vt = throatVelocity(unitFlow, g)
  const Hw = unitFlow > 0 ? Math.min(grossHead, headForUnitFlow(unitFlow, g)) : 0
  const suction = unitFlow > 0 ? suctionHead(Hw, d, Vt, g.inletLoss) : -d
  pt.workingHead_m = Hw
  pt.throatVelocity_ms = Vt
  pt.suction_m = suction
  pt.cavitationMargin_m = cavitationMargin(s.p_atm, w.p_v, w.rho, suction)
  pt.cavitationIndex = cavitationIndex(s.p_atm, w.p_v, w.rho, suction, Vt)
  airPointInto(w.air, suction, unitFlow, Hw, pt.air)
  w.hasPoint = true
  w.lastFlow = unitFlow
  w.lastHead = grossHead
  return pt
}

/** Gross head at a river flow, from the head-vs-flow table or the site's gross head. */
export function grossHeadAt(s: Scheme, flow_m3s: number): number {
  return headAtFlow(kernelOf(s).heads, flow_m3s, s.input.site.grossHead_m)
}

/** Split and unit point at one river flow, written into the kernel's scratch record (read it before the next call). */
function evaluate(s: Scheme, flow_m3s: number, c: Conditions): Evaluation {
  const k = kernelOf(s)
  const river = Math.max(0, flow_m3s)
  const H = headAtFlow(k.heads, river, s.input.site.grossHead_m)
  if (!k.hasCap || !Object.is(k.capHead, H)) {
    k.cap = unitCapacity(H, s.geometry)
    k.capHead = H
    k.hasCap = true
  }
  k.split.riverFlow_m3s = river
  k.split.capacity_m3s = k.cap
  const split = splitFlow(k.split)
  const w = ratedWaterAt(s, k, c.tC)
  const point = unitPoint(w, split.unitFlow_m3s, H, s)
  const at = k.at
  if (at === null) return (k.at = { river, H, split, w, point })
  at.river = river
  at.H = H
  at.split = split
  at.w = w
  at.point = point
  return at
}

/** Split, hydraulics and air path of all units at one river flow. */
export function powerState(s: Scheme, flow_m3s: number, c: Conditions): PowerState {
  const { river, H, split, point: p, w } = evaluate(s, flow_m3s, c)
  const n = split.unitsRunning
  return {
    riverFlow_m3s: river, grossHead_m: H, regime: split.regime, unitsRunning: n,
    unitFlow_m3s: split.unitFlow_m3s, spill_m3s: split.spill_m3s, reserved_m3s: split.reserved_m3s,
    workingHead_m: n > 0 ? p.workingHead_m : 0,
    throatVelocity_ms: p.throatVelocity_ms,
    suction_m: n > 0 ? p.suction_m : 0,
    cavitationMargin_m: n > 0 ? p.cavitationMargin_m : w.suctionLimit_m,
    cavitationIndex: n > 0 ? p.cavitationIndex : null,
    airFlow_m3s: n * p.air.airFlow_m3s,
    airMassFlowPerUnit_kgs: n > 0 ? p.air.airMassFlow_kgs : 0,
    electricalPower_W: n * p.air.electricalPower_W,
    hydraulicPower_W: n * p.air.hydraulicPower_W,
    waterToWire: n > 0 ? p.air.waterToWire : 0,
    turbineState: n > 0 ? p.air.state : 'stopped',
  }
}

/** Turbine states in a fixed order, so each has a number in a power sample's state code. */
const TURBINE_STATES = ['stopped', 'no-suction', 'below-cut-in', 'running', 'at-rating'] as const

/** Electrical power of all units at one river flow, W, with a whole-number code of the operating state (units running × 8 + turbine state): powerState's figure without building the whole state. */
export function powerSample(s: Scheme, flow_m3s: number, c: Conditions): { power: number, state: number } {
  const { split, point: p } = evaluate(s, flow_m3s, c)
  const n = split.unitsRunning
  return { power: n * p.air.electricalPower_W, state: n * 8 + TURBINE_STATES.indexOf(n > 0 ? p.air.state : 'stopped') }
}

/** Oxygen below a weir of fall `fall` m from the upstream oxygen (Butts & Evans deficit ratio). */
function overWeir(cs: number, c: Conditions, a: number, b: number, fall: number): number {
  return downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, weirDeficitRatio(a, b, fall, c.tC))
}

/** The units' discharge mixed with the water passing over the weir. */
function mixWithWeir(unitsQ: number, unitC: number, weirQ: number, weirC: number, fallback: number): number {
  return mixStreams([{ flow_m3s: unitsQ, conc_mgL: unitC }, { flow_m3s: weirQ, conc_mgL: weirC }], fallback)
}

/** Oxygen below the scheme at one power state: units, weir streams, mix, net gain, total dissolved gas. */
export function oxygenState(s: Scheme, ps: PowerState, c: Conditions): OxygenState {
  const site = s.input.site
  const cs = oxygenSaturation(c.tC, s.p_atm, site.salinity_gkg)
  const a = WATER_QUALITY_A[site.waterQuality].value
  const b = WEIR_SHAPE_B[site.weirShape].value
  const without = ps.riverFlow_m3s > 0 ? overWeir(cs, c, a, b, ps.grossHead_m) : c.upstreamO2_mgL
  const weirStream = overWeir(cs, c, a, b, ps.regime === 'flow-limited' ? ps.workingHead_m : ps.grossHead_m)
  const ft = unitFieldTransfer(s, ps, c)
  const bc = unitBubbleContact(s, ps, c, ft)
  const unitsQ = ps.unitsRunning * ps.unitFlow_m3s
  const weirQ = ps.reserved_m3s + ps.spill_m3s
  const withFt = mixWithWeir(unitsQ, ft.cOut_mgL, weirQ, weirStream, c.upstreamO2_mgL)
  const withBc = mixWithWeir(unitsQ, bc.cOut_mgL, weirQ, weirStream, c.upstreamO2_mgL)
  const useBc = s.input.settings.oxygenMethod === 'bubble-contact'
  const withScheme = useBc ? withBc : withFt
  return {
    saturation_mgL: cs, upstream_mgL: c.upstreamO2_mgL, withoutScheme_mgL: without, weirStream_mgL: weirStream,
    unitFieldTransfer_mgL: ft.cOut_mgL, unitBubbleContact_mgL: bc.cOut_mgL,
    withSchemeFieldTransfer_mgL: withFt, withSchemeBubbleContact_mgL: withBc, withScheme_mgL: withScheme,
    netGain_mgL: ps.riverFlow_m3s > 0 ? withScheme - without : 0, unitTdg: tdgOf(s, ps, c, cs, useBc ? bc : ft),
  }
}

/**
 * Total dissolved gas of the unit discharge at one power state: oxygenState's `unitTdg` without the
 * weir and mixing figures, for the summary grids, which need only this. Both go through the same
 * functions (unitFieldTransfer, unitBubbleContact, tdgOf) with the same arguments, so the figure is
 * identical; bubble contact is skipped when the summary uses field transfer, as the figure then does
 * not depend on it.
 */
export function unitTotalDissolvedGas(s: Scheme, ps: PowerState, c: Conditions): number {
  const cs = oxygenSaturation(c.tC, s.p_atm, s.input.site.salinity_gkg)
  const ft = unitFieldTransfer(s, ps, c)
  return tdgOf(s, ps, c, cs, s.input.settings.oxygenMethod === 'bubble-contact' ? unitBubbleContact(s, ps, c, ft) : ft)
}

/** Field transfer in one unit (ASCE/EWRI 2-06). */
function unitFieldTransfer(s: Scheme, ps: PowerState, c: Conditions): TransferResult {
  const st = s.input.settings
  return fieldTransfer({
    cIn_mgL: c.upstreamO2_mgL, tC: c.tC, unitFlow_m3s: ps.unitFlow_m3s, airMassFlow_kgs: ps.airMassFlowPerUnit_kgs,
    submergence_m: s.input.option.throatDepth_m, sotePerMetre: st.sotePerMetre, alpha: st.alpha, beta: st.beta, theta: st.theta,
    p_atm: s.p_atm, rho: waterDensity(c.tC), salinity_gkg: s.input.site.salinity_gkg,
  })
}

/** Bubble contact in one unit (Higbie 1935), toward field transfer's C*. */
function unitBubbleContact(s: Scheme, ps: PowerState, c: Conditions, ft: TransferResult): TransferResult {
  const st = s.input.settings
  const perUnitAir = ps.unitsRunning > 0 ? ps.airFlow_m3s / ps.unitsRunning : 0
  return bubbleContact({
    cIn_mgL: c.upstreamO2_mgL, cStar_mgL: ft.cStar_mgL, tC: c.tC, unitFlow_m3s: ps.unitFlow_m3s, airFlow_m3s: perUnitAir,
    airMassFlow_kgs: ps.airMassFlowPerUnit_kgs, bubbleDiameter_m: st.bubbleDiameter_m, slipVelocity_ms: st.slipVelocity_ms,
    diffusivity20: st.oxygenDiffusivity20,
    contactTime_s: contactTime(s.diffuserLength_m, ps.unitFlow_m3s, circleArea(s.geometry.throatDiameter_m), circleArea(s.geometry.outletDiameter_m), st.plumeTime_s),
  })
}

/** Total dissolved gas of the unit discharge from the transfer the summary uses (`used`), O₂ saturation `cs` at the surface. */
function tdgOf(s: Scheme, ps: PowerState, c: Conditions, cs: number, used: TransferResult): number {
  const st = s.input.settings
  const site = s.input.site
  const unitsQ = ps.unitsRunning * ps.unitFlow_m3s
  const fraction = unitsQ > 0 ? used.fractionApproached : 0
  const n2 = unitNitrogen(c.tC, s.p_atm, waterDensity(c.tC), s.input.option.throatDepth_m, st.beta, site.salinity_gkg, st.upstreamNitrogenSaturation, fraction)
  const n2Sat = nitrogenSaturation(c.tC, s.p_atm, site.salinity_gkg)
  return totalDissolvedGas(c.tC, s.p_atm, cs > 0 ? used.cOut_mgL / cs : 0, n2Sat > 0 ? n2.cOut_mgL / n2Sat : 0)
}

/** Full state at one river flow: power side and oxygen side. */
export function flowState(s: Scheme, flow_m3s: number, c: Conditions): FlowState {
  const ps = powerState(s, flow_m3s, c)
  // The power state is fresh and no one else holds it: give it its oxygen in place rather than copy it.
  const fs = ps as FlowState
  fs.oxygen = oxygenState(s, ps, c)
  return fs
}
