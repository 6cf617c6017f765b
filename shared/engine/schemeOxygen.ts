// Oxygen below the scheme at one power state: the units' transfer (field transfer or bubble
// contact), the weir's own aeration of the water passing over it, the mix, and the total dissolved
// gas of the units' discharge.
import {
  bubbleContact, contactTime, downstreamFromDeficitRatio, fieldTransfer, mixStreams, totalDissolvedGas,
  unitNitrogen, WATER_QUALITY_A, WEIR_SHAPE_B, weirDeficitRatio, type TransferResult,
} from './oxygen'
import { nitrogenSaturation, oxygenSaturation } from './oxygenSaturation'
import { circleArea } from './venturi'
import { waterDensity } from './water'
import type { Conditions, OxygenState, PowerState, Scheme } from './scheme'

/** Oxygen below a weir of fall `fall` m from the upstream oxygen (Butts & Evans deficit ratio). */
function overWeir(cs: number, c: Conditions, a: number, b: number, fall: number): number {
  return downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, weirDeficitRatio(a, b, fall, c.tC))
}

/** The units' discharge mixed with the water passing over the weir. */
function mixWithWeir(unitsQ: number, unitC: number, weirQ: number, weirC: number, fallback: number): number {
  return mixStreams([{ flow_m3s: unitsQ, conc_mgL: unitC }, { flow_m3s: weirQ, conc_mgL: weirC }], fallback)
}

/** The units' side of the last oxygen state of a scheme, reused while its inputs repeat. */
interface UnitSide {
  tC: number
  upstream: number
  unitFlow: number
  airMass: number
  air: number
  units: number
  field: TransferResult
  bubble: TransferResult
  tdg: number
}

// Across a month's flows the units often run in the same state (every unit at full capacity while the
// rest spills), so their transfer and dissolved gas repeat: the last one is kept per scheme. The
// figures are those of computing afresh (tests/unit/engine/speedups.test.ts checks the state).
const lastUnitSide = new WeakMap<Scheme, UnitSide>()

function unitSide(s: Scheme, ps: PowerState, c: Conditions, cs: number): UnitSide {
  const last = lastUnitSide.get(s)
  const air = ps.unitsRunning > 0 ? ps.airFlow_m3s / ps.unitsRunning : 0
  const running = ps.unitsRunning > 0 ? 1 : 0
  if (last && Object.is(last.tC, c.tC) && Object.is(last.upstream, c.upstreamO2_mgL) && Object.is(last.unitFlow, ps.unitFlow_m3s)
    && Object.is(last.airMass, ps.airMassFlowPerUnit_kgs) && Object.is(last.air, air) && last.units === running) return last
  const field = unitFieldTransfer(s, ps, c)
  const bubble = unitBubbleContact(s, ps, c, field)
  const side: UnitSide = {
    tC: c.tC, upstream: c.upstreamO2_mgL, unitFlow: ps.unitFlow_m3s, airMass: ps.airMassFlowPerUnit_kgs, air, units: running,
    field, bubble, tdg: tdgOf(s, ps, c, cs, s.input.settings.oxygenMethod === 'bubble-contact' ? bubble : field),
  }
  lastUnitSide.set(s, side)
  return side
}

/** Oxygen below the scheme at one power state: units, weir streams, mix, net gain, total dissolved gas. */
export function oxygenState(s: Scheme, ps: PowerState, c: Conditions): OxygenState {
  const site = s.input.site
  const cs = oxygenSaturation(c.tC, s.p_atm, site.salinity_gkg)
  const a = WATER_QUALITY_A[site.waterQuality].value
  const b = WEIR_SHAPE_B[site.weirShape].value
  // Level control holds the head pool, so the reserved flow and the spill fall the full gross head:
  // the water over the weir is aerated as all of it is without the scheme.
  const weirStream = overWeir(cs, c, a, b, ps.grossHead_m)
  const without = ps.riverFlow_m3s > 0 ? weirStream : c.upstreamO2_mgL
  const { field, bubble, tdg } = unitSide(s, ps, c, cs)
  const unitsQ = ps.unitsRunning * ps.unitFlow_m3s
  const weirQ = ps.reserved_m3s + ps.spill_m3s
  const withField = mixWithWeir(unitsQ, field.cOut_mgL, weirQ, weirStream, c.upstreamO2_mgL)
  const withBubble = mixWithWeir(unitsQ, bubble.cOut_mgL, weirQ, weirStream, c.upstreamO2_mgL)
  const withScheme = s.input.settings.oxygenMethod === 'bubble-contact' ? withBubble : withField
  return {
    saturation_mgL: cs, upstream_mgL: c.upstreamO2_mgL, withoutScheme_mgL: without, weirStream_mgL: weirStream,
    unitFieldTransfer_mgL: field.cOut_mgL, unitBubbleContact_mgL: bubble.cOut_mgL,
    withSchemeFieldTransfer_mgL: withField, withSchemeBubbleContact_mgL: withBubble, withScheme_mgL: withScheme,
    netGain_mgL: ps.riverFlow_m3s > 0 ? withScheme - without : 0, unitTdg: tdg,
  }
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
function unitBubbleContact(s: Scheme, ps: PowerState, c: Conditions, field: TransferResult): TransferResult {
  const st = s.input.settings
  const perUnitAir = ps.unitsRunning > 0 ? ps.airFlow_m3s / ps.unitsRunning : 0
  return bubbleContact({
    cIn_mgL: c.upstreamO2_mgL, cStar_mgL: field.cStar_mgL, tC: c.tC, unitFlow_m3s: ps.unitFlow_m3s, airFlow_m3s: perUnitAir,
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
