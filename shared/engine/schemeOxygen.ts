// The river stage at one power state: the units' oxygen and dissolved gas from the discrete-bubble
// model (bubbles.ts, the primary method) with the per-metre field transfer beside it as a cross-check,
// the weir's own aeration of the water still passing over it (weirAeration.ts: the chosen model and
// the range between models), the mix below the weir, and the total dissolved gas before and after it.
import { dissolvedGasState, bubbleTransfer, mixDissolvedGas, type BubbleTransferResult } from './bubbles'
import { downstreamFromDeficitRatio, fieldTransfer, mixTwoStreams, WATER_QUALITY_A, WEIR_SHAPE_B, type TransferResult } from './oxygen'
import { nitrogenSaturation, oxygenSaturation } from './oxygenSaturation'
import { circleArea } from './venturi'
import { waterDensity } from './water'
import { crestDischargePerMetre, crestFormOf, headOverCrest, WEIR_DISCHARGE_COEFFICIENT, weirAerationModels, type WeirAerationModels } from './weirAeration'
import type { AssessInput } from '../schemas/assess'
import type { Conditions, OxygenState, PowerState, Scheme } from './scheme'
import { siteHeads, tailDepthAt } from './siteHeads'
import { drownedWith } from './weirHydraulics'

type Site = AssessInput['site']

/** The units' side of the last oxygen state of a scheme, reused while its inputs repeat. */
interface UnitSide {
  tC: number
  upstream: number
  unitFlow: number
  airMass: number
  air: number
  suction: number
  depth: number
  field: TransferResult
  bubble: BubbleTransferResult
}

// Across a month's flows the units often run in the same state (every unit at full capacity while the
// rest spills), so their transfer and dissolved gas repeat: the last one is kept per scheme. The
// figures are those of computing afresh (tests/unit/engine/speedups.test.ts checks the state).
const lastUnitSide = new WeakMap<Scheme, UnitSide>()

function unitSide(s: Scheme, ps: PowerState, c: Conditions, n2In: number): UnitSide {
  const last = lastUnitSide.get(s)
  const air = ps.unitsRunning > 0 ? ps.airFlow_m3s / ps.unitsRunning : 0
  const suction = ps.unitsRunning > 0 ? ps.operatingSuction_m : 0
  if (last && Object.is(last.tC, c.tC) && Object.is(last.upstream, c.upstreamO2_mgL) && Object.is(last.unitFlow, ps.unitFlow_m3s)
    && Object.is(last.airMass, ps.airMassFlowPerUnit_kgs) && Object.is(last.air, air) && Object.is(last.suction, suction)
    && Object.is(last.depth, ps.throatDepth_m)) return last
  const side: UnitSide = {
    tC: c.tC, upstream: c.upstreamO2_mgL, unitFlow: ps.unitFlow_m3s, airMass: ps.airMassFlowPerUnit_kgs, air, suction, depth: ps.throatDepth_m,
    field: unitFieldTransfer(s, ps, c),
    bubble: unitBubbles(s, ps, c, air, suction, n2In),
  }
  lastUnitSide.set(s, side)
  return side
}

/**
 * Whether the weir is drowned at this state (ENGINE.md §13). With the weir's hydraulics: the tail, which the
 * whole river sets (what the units pass reaches it too), stands above the crest. Without them: the head over the
 * crest needed to pass what goes over it (weir equation, C_d by crest form) reaches past the fall, so the tail
 * stands above the crest. Needs the crest length; a site without one is taken as free.
 */
function drownedAt(site: Site, overWeir_m3s: number, fall_m: number, river_m3s: number): boolean {
  const heads = siteHeads(site)
  if (heads.hydraulics !== null) return drownedWith(heads.hydraulics, tailDepthAt(heads, river_m3s) as number)
  const L = site.crestLength_m
  const form = crestFormOf(site.weirShape)
  if (L === undefined || !(L > 0) || form === null || !(overWeir_m3s > 0)) return false
  return headOverCrest(overWeir_m3s, L, WEIR_DISCHARGE_COEFFICIENT[form].value) > fall_m
}

/** Deficit ratios of the water falling over the weir at river flow `river_m3s` (the chosen model, every model, the range). */
function weirModels(site: Site, overWeir_m3s: number, fall_m: number, tC: number, river_m3s: number = overWeir_m3s): WeirAerationModels {
  const L = site.crestLength_m
  const chosen = site.weirAeration.model === 'avery-novak' && !(L !== undefined && L > 0) ? 'butts-evans' : site.weirAeration.model
  return weirAerationModels({
    fall_m, q_m2s: L !== undefined && L > 0 ? crestDischargePerMetre(overWeir_m3s, L) : 0, tC,
    a: WATER_QUALITY_A[site.waterQuality].value, b: WEIR_SHAPE_B[site.weirShape].value,
    measured: site.weirAeration.measured, drowned: drownedAt(site, overWeir_m3s, fall_m, river_m3s), chosen,
  })
}

/**
 * Deficit ratio r of `overWeir_m3s` falling `fall_m` over the site's weir at `tC` °C, by the site's
 * chosen weir model (as the scheme's own "without" and weir-stream figures): for the conventional
 * baseline, whose water bypasses the weir. `river_m3s` sets the tail when heads come from the weir's hydraulics.
 */
export function weirDeficitRatio(site: Site, overWeir_m3s: number, fall_m: number, tC: number, river_m3s: number = overWeir_m3s): number {
  return weirModels(site, overWeir_m3s, fall_m, tC, river_m3s).chosen.r
}

/** The oxygen side of one power state that the river-first test needs, and that oxygenState builds on. */
interface RiverCore {
  cs: number
  n2Sat: number
  n2Up: number
  weirQ: number
  unitsQ: number
  alone: WeirAerationModels
  rest: WeirAerationModels
  without: number
  weirStream: number
  field: TransferResult
  bubble: BubbleTransferResult
  unitBubbleO2: number
  withField: number
  withBubble: number
  withScheme: number
  netGain: number
}

/** Units, weir and mix at one power state: the downstream oxygen with and without the scheme by both methods. */
function riverCore(s: Scheme, ps: PowerState, c: Conditions): RiverCore {
  const site = s.input.site
  const st = s.input.settings
  const cs = oxygenSaturation(c.tC, s.p_atm, site.salinity_gkg)
  const n2Sat = nitrogenSaturation(c.tC, s.p_atm, site.salinity_gkg)
  const n2Up = st.upstreamNitrogenSaturation * n2Sat
  const H = ps.grossHead_m
  const weirQ = ps.reserved_m3s + ps.spill_m3s
  const unitsQ = ps.unitsRunning * ps.unitFlow_m3s
  // Without the scheme the whole river falls over the weir; with it, what the units leave. Level
  // control holds the head pool, so both fall the full gross head; a flow-dependent model (Avery &
  // Novak) aerates the smaller overfall differently.
  const alone = weirModels(site, ps.riverFlow_m3s, H, c.tC)
  const rest = unitsQ > 0 ? weirModels(site, weirQ, H, c.tC, ps.riverFlow_m3s) : alone
  const without = ps.riverFlow_m3s > 0 ? downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, alone.chosen.r) : c.upstreamO2_mgL
  const weirStream = downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, rest.chosen.r)
  const { field, bubble } = unitSide(s, ps, c, n2Up)
  const unitBubbleO2 = unitsQ > 0 ? bubble.surface.o2_mgL : c.upstreamO2_mgL
  const withField = mixTwoStreams(unitsQ, field.cOut_mgL, weirQ, weirStream, c.upstreamO2_mgL)
  const withBubble = mixTwoStreams(unitsQ, unitBubbleO2, weirQ, weirStream, c.upstreamO2_mgL)
  const withScheme = st.oxygenMethod === 'field-transfer' ? withField : withBubble
  return {
    cs, n2Sat, n2Up, weirQ, unitsQ, alone, rest, without, weirStream, field, bubble, unitBubbleO2, withField, withBubble, withScheme,
    netGain: ps.riverFlow_m3s > 0 ? withScheme - without : 0,
  }
}

/**
 * The two figures the river-first test reads, as oxygenState gives them (the same steps; the gas
 * pressures and the spread between weir models, which the test does not read, left out): it runs at
 * every candidate of every flow the river-first power table asks about.
 */
export function riverTestOxygen(s: Scheme, ps: PowerState, c: Conditions): Pick<OxygenState, 'netGain_mgL' | 'withScheme_mgL'> {
  const r = riverCore(s, ps, c)
  return { netGain_mgL: r.netGain, withScheme_mgL: r.withScheme }
}

/** Oxygen and dissolved gas below the scheme at one power state: units, weir, mix, net gain. */
export function oxygenState(s: Scheme, ps: PowerState, c: Conditions): OxygenState {
  const site = s.input.site
  const r = riverCore(s, ps, c)
  const { cs, n2Sat, n2Up, weirQ, unitsQ, alone, rest, without, weirStream, bubble, unitBubbleO2 } = r
  const weirN2 = downstreamFromDeficitRatio(n2Sat, n2Up, rest.chosen.r)
  const unitBubbleN2 = unitsQ > 0 ? bubble.surface.n2_mgL : n2Up
  const unitGas = unitsQ > 0 ? bubble.surface : dissolvedGasState(c.upstreamO2_mgL, n2Up, c.tC, s.p_atm, site.salinity_gkg)
  const mixed = mixDissolvedGas([
    { flow_m3s: unitsQ, o2_mgL: unitBubbleO2, n2_mgL: unitBubbleN2 },
    { flow_m3s: weirQ, o2_mgL: weirStream, n2_mgL: weirN2 },
  ], c.tC, s.p_atm, site.salinity_gkg)
  const atMin = downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, alone.rMin)
  const atMax = downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, alone.rMax)
  const range = ps.riverFlow_m3s > 0
    ? { min_mgL: Math.min(atMin, atMax), max_mgL: Math.max(atMin, atMax) }
    : { min_mgL: c.upstreamO2_mgL, max_mgL: c.upstreamO2_mgL }
  return {
    saturation_mgL: cs, upstream_mgL: c.upstreamO2_mgL, withoutScheme_mgL: without, withoutSchemeRange_mgL: range,
    weirModel: alone.chosen.model, weirModelNote: alone.chosen.note, weirDrowned: alone.drowned, weirStream_mgL: weirStream,
    unitFieldTransfer_mgL: r.field.cOut_mgL, unitBubbleModel_mgL: unitBubbleO2,
    withSchemeFieldTransfer_mgL: r.withField, withSchemeBubbleModel_mgL: r.withBubble, withScheme_mgL: r.withScheme,
    netGain_mgL: r.netGain,
    unitTdg: unitGas.tdgFraction, unitGasExcess_mmHg: unitGas.tdgExcess_mmHg,
    mixedTdg: mixed.tdgFraction, mixedGasExcess_mmHg: mixed.tdgExcess_mmHg,
  }
}

/** Field transfer in one unit (ASCE/EWRI 2-06 form, per metre of submergence plus an in-device term): the cross-check. */
function unitFieldTransfer(s: Scheme, ps: PowerState, c: Conditions): TransferResult {
  const st = s.input.settings
  return fieldTransfer({
    cIn_mgL: c.upstreamO2_mgL, tC: c.tC, unitFlow_m3s: ps.unitFlow_m3s, airMassFlow_kgs: ps.airMassFlowPerUnit_kgs,
    submergence_m: ps.throatDepth_m, sotePerMetre: st.sotePerMetre, inDeviceTransfer: st.inDeviceTransfer,
    alpha: st.alpha, beta: st.beta, theta: st.theta, p_atm: s.p_atm, rho: waterDensity(c.tC), salinity_gkg: s.input.site.salinity_gkg,
  })
}

/**
 * The discrete-bubble model in one unit: bubbles form at the throat's operating pressure (the
 * atmosphere less what the air path holds), travel with the water through the diffuser, which is
 * taken as level so they leave at the throat's depth, then rise through the tail pool.
 */
function unitBubbles(s: Scheme, ps: PowerState, c: Conditions, perUnitAir: number, suction_m: number, n2In: number): BubbleTransferResult {
  const st = s.input.settings
  const d = ps.throatDepth_m
  return bubbleTransfer({
    tC: c.tC, airTemperatureC: c.tC + st.airTemperatureOffset_K, p_atm: s.p_atm, salinity_gkg: s.input.site.salinity_gkg,
    unitFlow_m3s: ps.unitsRunning > 0 ? ps.unitFlow_m3s : 0, airFlow_m3s: perUnitAir,
    // bubbles.ts counts suction below the local hydrostatic pressure: the venturi's vacuum against the atmosphere plus the depth
    suction_m: d + Math.max(0, suction_m), throatDepth_m: d, outletDepth_m: d,
    throatArea_m2: circleArea(s.geometry.throatDiameter_m), outletArea_m2: circleArea(s.geometry.outletDiameter_m),
    diffuserLength_m: s.diffuserLength_m, o2In_mgL: c.upstreamO2_mgL, n2In_mgL: n2In,
  }, { bubbleDiameter_m: st.bubbleDiameter_m, plumeVelocity_ms: st.plumeVelocity_ms, filmModel: st.filmModel, oxygenDiffusivity20: st.oxygenDiffusivity20 })
}
