// One option at one site, resolved from an assessment input, and its state at one river flow.
import type { AssessInput } from '../schemas/assess'
import { isaPressure } from './atmosphere'
import { airOperatingPoint, type TurbineState } from './airPath'
import {
  bubbleContact, contactTime, diffuserLength, downstreamFromDeficitRatio, fieldTransfer, mixStreams, totalDissolvedGas,
  unitNitrogen, WATER_QUALITY_A, WEIR_SHAPE_B, weirDeficitRatio,
} from './oxygen'
import { nitrogenSaturation, oxygenSaturation } from './oxygenSaturation'
import {
  circleArea, constrictionDefaults, headAtFlow, splitFlow, unitCapacity, unitHydraulics, vapourSuctionLimit,
  type Regime, type UnitGeometry,
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

/** Resolve geometry, atmosphere, reserved flow and the unit rating of an input (ENGINE §2–3). */
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
  const p = unitAirPoint(partial, q, H, design, null)
  return { ...partial, ratedPerUnit_W: p.availableElectricalPower_W }
}

function env(s: Scheme, tC: number): { p_atm: number, p_v: number, rho: number } {
  return { p_atm: s.p_atm, p_v: vapourPressure(tC), rho: waterDensity(tC) }
}

function unitAirPoint(s: Scheme, unitFlow: number, grossHead: number, c: Conditions, rated: number | null): ReturnType<typeof airOperatingPoint> & { hyd: ReturnType<typeof unitHydraulics> } {
  const o = s.input.option
  const e = env(s, c.tC)
  const hyd = unitHydraulics(unitFlow, grossHead, o.throatDepth_m, s.geometry, e)
  const air = airOperatingPoint({
    suction_m: hyd.suction_m,
    suctionLimit_m: vapourSuctionLimit(e.p_atm, e.p_v, e.rho),
    dischargeDepth_m: o.throatDepth_m,
    unitFlow_m3s: unitFlow,
    workingHead_m: hyd.workingHead_m,
    waterDensity: e.rho,
    p_atm: e.p_atm,
    airTemperature_C: c.tC + s.input.settings.airTemperatureOffset_K,
    jetPumpEfficiency: o.air.jetPumpEfficiency,
    maxGasLiquidRatio: o.air.maxGasLiquidRatio,
    pipe: { diameter_m: o.air.pipeDiameter_m, length_m: o.air.pipeLength_m, lossK: o.air.pipeLossK, frictionFactor: o.air.frictionFactor },
    turbine: { efficiency: o.turbine.efficiency, generatorEfficiency: o.turbine.generatorEfficiency, ratedPower_W: rated, cutInFraction: o.turbine.cutInFraction },
  })
  return { ...air, hyd }
}

/** Gross head at a river flow, from the head-vs-flow table or the site's gross head. */
export function grossHeadAt(s: Scheme, flow_m3s: number): number {
  return headAtFlow(s.input.site.headTable, flow_m3s, s.input.site.grossHead_m)
}

/** Split, hydraulics and air path of all units at one river flow (ENGINE §2–3). */
export function powerState(s: Scheme, flow_m3s: number, c: Conditions): PowerState {
  const o = s.input.option
  const river = Math.max(0, flow_m3s)
  const H = grossHeadAt(s, river)
  const split = splitFlow({
    riverFlow_m3s: river, reservedFlow_m3s: s.reserved_m3s, units: o.units, capacity_m3s: unitCapacity(H, s.geometry),
    minUnitFlowFraction: o.minUnitFlowFraction, staging: o.staging,
  })
  const p = unitAirPoint(s, split.unitFlow_m3s, H, c, s.ratedPerUnit_W)
  const n = split.unitsRunning
  return {
    riverFlow_m3s: river, grossHead_m: H, regime: split.regime, unitsRunning: n,
    unitFlow_m3s: split.unitFlow_m3s, spill_m3s: split.spill_m3s, reserved_m3s: split.reserved_m3s,
    workingHead_m: n > 0 ? p.hyd.workingHead_m : 0,
    throatVelocity_ms: p.hyd.throatVelocity_ms,
    suction_m: n > 0 ? p.hyd.suction_m : 0,
    cavitationMargin_m: n > 0 ? p.hyd.cavitationMargin_m : vapourSuctionLimit(s.p_atm, vapourPressure(c.tC), waterDensity(c.tC)),
    cavitationIndex: n > 0 ? p.hyd.cavitationIndex : null,
    airFlow_m3s: n * p.airFlow_m3s,
    airMassFlowPerUnit_kgs: n > 0 ? p.airMassFlow_kgs : 0,
    electricalPower_W: n * p.electricalPower_W,
    hydraulicPower_W: n * p.hydraulicPower_W,
    waterToWire: n > 0 ? p.waterToWire : 0,
    turbineState: n > 0 ? p.state : 'stopped',
  }
}

/** Oxygen below the scheme at one power state: units, weir streams, mix, net gain, total dissolved gas (ENGINE §5). */
export function oxygenState(s: Scheme, ps: PowerState, c: Conditions): OxygenState {
  const st = s.input.settings
  const site = s.input.site
  const rho = waterDensity(c.tC)
  const cs = oxygenSaturation(c.tC, s.p_atm, site.salinity_gkg)
  const a = WATER_QUALITY_A[site.waterQuality].value
  const b = WEIR_SHAPE_B[site.weirShape].value
  const overWeir = (fall: number): number => downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, weirDeficitRatio(a, b, fall, c.tC))
  const without = ps.riverFlow_m3s > 0 ? overWeir(ps.grossHead_m) : c.upstreamO2_mgL
  const weirStream = overWeir(ps.regime === 'flow-limited' ? ps.workingHead_m : ps.grossHead_m)
  const d = s.input.option.throatDepth_m
  const ft = fieldTransfer({
    cIn_mgL: c.upstreamO2_mgL, tC: c.tC, unitFlow_m3s: ps.unitFlow_m3s, airMassFlow_kgs: ps.airMassFlowPerUnit_kgs,
    submergence_m: d, sotePerMetre: st.sotePerMetre, alpha: st.alpha, beta: st.beta, theta: st.theta,
    p_atm: s.p_atm, rho, salinity_gkg: site.salinity_gkg,
  })
  const perUnitAir = ps.unitsRunning > 0 ? ps.airFlow_m3s / ps.unitsRunning : 0
  const bc = bubbleContact({
    cIn_mgL: c.upstreamO2_mgL, cStar_mgL: ft.cStar_mgL, tC: c.tC, unitFlow_m3s: ps.unitFlow_m3s, airFlow_m3s: perUnitAir,
    airMassFlow_kgs: ps.airMassFlowPerUnit_kgs, bubbleDiameter_m: st.bubbleDiameter_m, slipVelocity_ms: st.slipVelocity_ms,
    diffusivity20: st.oxygenDiffusivity20,
    contactTime_s: contactTime(s.diffuserLength_m, ps.unitFlow_m3s, circleArea(s.geometry.throatDiameter_m), circleArea(s.geometry.outletDiameter_m), st.plumeTime_s),
  })
  const unitsQ = ps.unitsRunning * ps.unitFlow_m3s
  const weirQ = ps.reserved_m3s + ps.spill_m3s
  const mix = (unitC: number): number => mixStreams([{ flow_m3s: unitsQ, conc_mgL: unitC }, { flow_m3s: weirQ, conc_mgL: weirStream }], c.upstreamO2_mgL)
  const withFt = mix(ft.cOut_mgL)
  const withBc = mix(bc.cOut_mgL)
  const useBc = st.oxygenMethod === 'bubble-contact'
  const withScheme = useBc ? withBc : withFt
  const unitO2 = useBc ? bc.cOut_mgL : ft.cOut_mgL
  const fraction = unitsQ > 0 ? (useBc ? bc.fractionApproached : ft.fractionApproached) : 0
  const n2 = unitNitrogen(c.tC, s.p_atm, rho, d, st.beta, site.salinity_gkg, st.upstreamNitrogenSaturation, fraction)
  const n2Sat = nitrogenSaturation(c.tC, s.p_atm, site.salinity_gkg)
  const tdg = totalDissolvedGas(c.tC, s.p_atm, cs > 0 ? unitO2 / cs : 0, n2Sat > 0 ? n2.cOut_mgL / n2Sat : 0)
  return {
    saturation_mgL: cs, upstream_mgL: c.upstreamO2_mgL, withoutScheme_mgL: without, weirStream_mgL: weirStream,
    unitFieldTransfer_mgL: ft.cOut_mgL, unitBubbleContact_mgL: bc.cOut_mgL,
    withSchemeFieldTransfer_mgL: withFt, withSchemeBubbleContact_mgL: withBc, withScheme_mgL: withScheme,
    netGain_mgL: ps.riverFlow_m3s > 0 ? withScheme - without : 0, unitTdg: tdg,
  }
}

/** Full state at one river flow: power side and oxygen side. */
export function flowState(s: Scheme, flow_m3s: number, c: Conditions): FlowState {
  const ps = powerState(s, flow_m3s, c)
  return { ...ps, oxygen: oxygenState(s, ps, c) }
}
