// One option at one site, resolved from an assessment input, and its state at one river flow. The
// inner loop that computes it is in schemeKernel.ts, the oxygen side in schemeOxygen.ts.
import type { AssessInput } from '../schemas/assess'
import { isaPressure } from './atmosphere'
import { G } from './constants'
import type { TurbineState } from './airPath'
import { moneySummary, type MoneySummary } from './money'
import { diffuserLength } from './oxygen'
import { NET_LOSS_TOLERANCE_mgL } from './flags'
import { handsOffOnly, leftInRiver, type FlowRules } from './flowRules'
import type { Regime, ShutReason } from './operation'
import { evaluate, unitPoint, waterAt, type RiverCheck } from './schemeKernel'
import { oxygenState, riverTestOxygen } from './schemeOxygen'
import { constrictionDefaults, unitCapacity, type UnitGeometry } from './venturi'
import { grossHeadAt, siteHeads, tailDepthAt, type SiteHeads } from './siteHeads'

/** Water conditions at one moment: calendar month, temperature and upstream oxygen. */
export interface Conditions {
  /** Calendar month 1–12, or 0 for the year's mean conditions (never a closed month). */
  month: number
  tC: number
  upstreamO2_mgL: number
}

/** An option resolved for computation: geometry, pressures, reserved flow and rating. */
export interface Scheme {
  readonly input: AssessInput
  readonly geometry: UnitGeometry
  readonly p_atm: number
  /** Hands-off flow, m³/s. */
  readonly reserved_m3s: number
  /** The flow rules (flowRules.ts): what stays in the river at each flow. */
  readonly flowRules: FlowRules
  readonly diffuserLength_m: number
  /** Electrical rating of one unit, W. */
  readonly ratedPerUnit_W: number
  readonly ratingSizedToDesign: boolean
  /** Where the site's heads come from: the weir's hydraulics or the head table (siteHeads.ts). */
  readonly heads: SiteHeads
  /**
   * With the weir's hydraulics, the tail depth at the median river flow, m: the option's throat depth is its depth
   * below the tail there, and deeper or shallower as the tail moves. Null: the throat depth holds at every flow.
   */
  readonly medianTail_m: number | null
  /** Gross head the units are rated and priced at: the site's gross head, or by the hydraulics at the median flow, m. */
  readonly designHead_m: number
}

/** Power-side state of the units at one river flow. */
export interface PowerState {
  riverFlow_m3s: number
  grossHead_m: number
  regime: Regime
  /** Why units the water could feed stay shut (null when all it can feed run). */
  shutReason: ShutReason | null
  unitsRunning: number
  unitFlow_m3s: number
  spill_m3s: number
  reserved_m3s: number
  /** Depth of the throat below the tail surface at this flow, m (the option's, or moved with the tail by the weir's hydraulics). */
  throatDepth_m: number
  /** Tail depth over the tail-pool bed by the weir's hydraulics, m; null when heads come from the head table. */
  tailDepth_m: number | null
  workingHead_m: number
  throatVelocity_ms: number
  /** Suction head with the air valve shut (the vacuum the throat could hold), m. */
  suction_m: number
  /** Vacuum at the throat with the air flowing (the pressure the air path holds), m of water; 0 when stopped. */
  operatingSuction_m: number
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
  /** Below the weir without the scheme, by the site's chosen weir model. */
  withoutScheme_mgL: number
  /** The same by every applicable weir model: the spread between them. */
  withoutSchemeRange_mgL: { min_mgL: number, max_mgL: number }
  weirModel: 'butts-evans' | 'avery-novak' | 'measured'
  /** What the chosen weir figure stands on (e.g. a drowned weir taken as a submerged sluice). */
  weirModelNote: string
  /** The weir is drowned at this flow (tail above crest): its aeration is that of a submerged sluice. */
  weirDrowned: boolean
  /** The water still falling over the weir with the scheme, after its fall. */
  weirStream_mgL: number
  unitFieldTransfer_mgL: number
  unitBubbleModel_mgL: number
  withSchemeFieldTransfer_mgL: number
  withSchemeBubbleModel_mgL: number
  /** With the method the summary uses. */
  withScheme_mgL: number
  netGain_mgL: number
  /** Total dissolved gas of the unit discharge before mixing, fraction of barometric pressure (bubble model). */
  unitTdg: number
  /** Its excess pressure over the barometric pressure ΔP, mmHg. */
  unitGasExcess_mmHg: number
  /** Total dissolved gas below the weir after full mixing, fraction, and its ΔP, mmHg. */
  mixedTdg: number
  mixedGasExcess_mmHg: number
}

/** Everything at one river flow. */
export interface FlowState extends PowerState {
  oxygen: OxygenState
}

/**
 * Resolve geometry, atmosphere, reserved flow, flow rules, heads and the unit rating of an input. Without `rules`,
 * only the hands-off flow `reserved_m3s` applies. `medianFlow_m3s`, the median river flow, sets where the option's
 * throat depth is read when heads come from the weir's hydraulics.
 */
export function buildScheme(
  input: AssessInput, reserved_m3s: number, design: Conditions, rules: FlowRules = handsOffOnly(reserved_m3s), medianFlow_m3s: number | null = null,
): Scheme {
  const o = input.option
  const base = constrictionDefaults(o.constriction)
  const geometry: UnitGeometry = {
    throatDiameter_m: o.throatDiameter_m,
    outletDiameter_m: o.outletDiameter_m,
    inletLoss: o.inletLoss,
    diffuserEfficiency: o.diffuserEfficiency ?? base.diffuserEfficiency,
    flowCoefficient: o.flowCoefficient ?? base.flowCoefficient,
  }
  const heads = siteHeads(input.site)
  const median = heads.hydraulics !== null ? medianFlow_m3s : null
  const partial: Scheme = {
    heads,
    medianTail_m: median !== null ? tailDepthAt(heads, median) : null,
    designHead_m: median !== null ? grossHeadAt(heads, median) : input.site.grossHead_m,
    input, geometry, p_atm: isaPressure(input.site.altitude_m), reserved_m3s, flowRules: rules,
    diffuserLength_m: o.diffuserLength_m ?? diffuserLength(o.throatDiameter_m, o.outletDiameter_m, input.settings.diffuserHalfAngle_deg),
    ratedPerUnit_W: 0, ratingSizedToDesign: o.turbine.ratedPower_kW === null,
  }
  if (o.turbine.ratedPower_kW !== null) return { ...partial, ratedPerUnit_W: o.turbine.ratedPower_kW * 1000 }
  const H = partial.designHead_m
  const q = unitCapacity(H, geometry)
  const p = unitPoint(waterAt(partial, design.tC, null), q, H, partial)
  return { ...partial, ratedPerUnit_W: p.air.availableElectricalPower_W }
}

/** The scheme's design flow: every unit at its capacity at the site's gross head, m³/s (what its civil works are priced on). */
function designFlow(s: Scheme): number {
  return s.input.option.units * unitCapacity(s.designHead_m, s.geometry)
}

/** The scheme's money at an annual energy: its costs on its rating and design flow, at the input's money settings (money.ts). */
export function schemeMoney(s: Scheme, annualEnergy_MWh: number): MoneySummary {
  const o = s.input.option
  const st = s.input.settings
  return moneySummary({
    ...o.costs, rating_W: s.ratedPerUnit_W * o.units, designFlow_m3s: designFlow(s), annualEnergy_MWh,
    opexFraction: st.opexFraction, discountRate: st.discountRate, life_yr: st.life_yr, exportPrice: st.exportPrice, gridFactor: st.gridFactor,
  })
}

/**
 * River-first mode: a unit stays shut where running it would lower downstream oxygen by more than the
 * acceptable loss, or lower it while the river is below its target (ENGINE.md §8). Null in
 * energy-first mode.
 */
function riverCheckOf(s: Scheme, c: Conditions): RiverCheck | null {
  if (s.input.option.operation.mode !== 'river-first') return null
  const st = s.input.settings
  return (cand, p, river, H, w) => {
    const n = cand.units
    const ps: PowerState = {
      riverFlow_m3s: river, grossHead_m: H, regime: cand.regime, shutReason: null, unitsRunning: n,
      unitFlow_m3s: cand.unitFlow_m3s, spill_m3s: cand.spill_m3s, reserved_m3s: leftInRiver(s.flowRules, river),
      throatDepth_m: p.throatDepth_m, tailDepth_m: tailDepthAt(s.heads, river),
      workingHead_m: p.workingHead_m, throatVelocity_ms: p.throatVelocity_ms, suction_m: p.suction_m,
      operatingSuction_m: p.air.pumpPressure_Pa / (w.rho * G),
      cavitationMargin_m: p.cavitationMargin_m, cavitationIndex: p.cavitationIndex,
      airFlow_m3s: n * p.air.airFlow_m3s, airMassFlowPerUnit_kgs: p.air.airMassFlow_kgs,
      electricalPower_W: n * p.air.electricalPower_W, hydraulicPower_W: n * p.air.hydraulicPower_W,
      waterToWire: p.air.waterToWire, turbineState: p.air.state,
    }
    return costsTheRiver(st, riverTestOxygen(s, ps, c)) ? 'river-first' : null
  }
}

/** The river-first test: running lowers downstream oxygen by more than the acceptable loss, or lowers it while the river is below its target. */
function costsTheRiver(st: AssessInput['settings'], ox: Pick<OxygenState, 'netGain_mgL' | 'withScheme_mgL'>): boolean {
  return ox.netGain_mgL < -st.acceptableOxygenLoss_mgL || (ox.withScheme_mgL < st.oxygenTarget_mgL && ox.netGain_mgL < -NET_LOSS_TOLERANCE_mgL)
}

/**
 * The state of a river-first scheme at one flow, given the same option's energy-first state there
 * (ENGINE.md §8): river first tries the same candidates in the same order and refuses only one that
 * costs the river, so where energy first runs nothing, or runs units that pass the river test, the
 * state is the same one (reused, not copied); only elsewhere is it worked out afresh.
 */
export function riverFirstState(s: Scheme, energyFirst: FlowState, c: Conditions): FlowState {
  if (energyFirst.unitsRunning === 0 || !costsTheRiver(s.input.settings, energyFirst.oxygen)) return energyFirst
  return flowState(s, energyFirst.riverFlow_m3s, c)
}

/** Split, hydraulics and air path of all units at one river flow, under the option's operating rule. */
export function powerState(s: Scheme, flow_m3s: number, c: Conditions): PowerState {
  const { river, H, d, tail, split, point: p, w } = evaluate(s, flow_m3s, c, riverCheckOf(s, c))
  const n = split.unitsRunning
  return {
    riverFlow_m3s: river, grossHead_m: H, regime: split.regime, shutReason: split.shutReason, unitsRunning: n,
    unitFlow_m3s: split.unitFlow_m3s, spill_m3s: split.spill_m3s, reserved_m3s: split.reserved_m3s,
    throatDepth_m: d, tailDepth_m: tail,
    workingHead_m: n > 0 ? p.workingHead_m : 0,
    throatVelocity_ms: p.throatVelocity_ms,
    suction_m: n > 0 ? p.suction_m : 0,
    operatingSuction_m: n > 0 ? p.air.pumpPressure_Pa / (w.rho * G) : 0,
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

/** Turbine states and regimes in a fixed order, so each has a number in a power sample's state code. */
const TURBINE_STATES = ['stopped', 'no-suction', 'below-cut-in', 'running', 'at-rating'] as const
const REGIMES: readonly Regime[] = ['stopped', 'spilling', 'taking-all']

/** Electrical power of all units at one river flow, W, with a whole-number code of the operating state (units running, regime, turbine state): powerState's figure without building the whole state. */
export function powerSample(s: Scheme, flow_m3s: number, c: Conditions): { power: number, state: number } {
  const { split, point: p } = evaluate(s, flow_m3s, c, riverCheckOf(s, c))
  const n = split.unitsRunning
  return { power: n * p.air.electricalPower_W, state: (n * 3 + REGIMES.indexOf(split.regime)) * 8 + TURBINE_STATES.indexOf(n > 0 ? p.air.state : 'stopped') }
}

/** Full state at one river flow: power side and oxygen side. */
export function flowState(s: Scheme, flow_m3s: number, c: Conditions): FlowState {
  const ps = powerState(s, flow_m3s, c)
  // The power state is fresh and no one else holds it: give it its oxygen in place rather than copy it.
  const fs = ps as FlowState
  fs.oxygen = oxygenState(s, ps, c)
  return fs
}
