// The money-and-baseline stage (ENGINE.md §11, §14): a conventional low-head unit at the same weir, under
// the same reserved flow, head and month conditions as the venturi scheme, its energy by the same
// integrals (energy.ts), its effect on the river's oxygen by the same weir model (schemeOxygen.ts),
// its money by the same formulas (money.ts), and what the venturi scheme gives up against it.
import type { AssessInput } from '../schemas/assess'
import { isaPressure } from './atmosphere'
import {
  BASELINE_DEFAULTS, BASELINE_KIND_LABEL, BASELINE_PRICE_PER_KW, EFFICIENCY_CURVES, ornlInstalledCost_usd2014, partLoadEfficiency,
  type BaselineKind, type EfficiencyCurve,
} from './baselineUnits'
import { G } from './constants'
import { annualEnergyFromFdc, annualEnergyFromSample, DAYS_IN_MONTH, loadFigures, type AnnualEnergy, type PowerAt } from './energy'
import { handsOffOnly, leftInRiver, riverForTake, type FlowRules } from './flowRules'
import { flowAtExceedance } from './hydrology'
import { annualOpex, lcoe, npv, simplePayback } from './money'
import { downstreamFromDeficitRatio, mixTwoStreams } from './oxygen'
import { oxygenSaturation } from './oxygenSaturation'
import type { AssessResult, BaselineLine, BaselineResult } from './results'
import type { Conditions } from './scheme'
import { weirDeficitRatio } from './schemeOxygen'
import { grossHeadAt, siteHeads, type SiteHeads } from './siteHeads'
import { waterDensity } from './water'
import type { MonthCurve, SiteHydrology, YearStates } from './year'

/** A baseline unit resolved for computation. */
export interface BaselineUnit {
  kind: BaselineKind
  curve: EfficiencyCurve
  designFlow_m3s: number
  designFlowFromRule: boolean
  headLossFraction: number
  generatorEfficiency: number
  reserved_m3s: number
  /** Where the site's heads come from (the weir's hydraulics or the head table), as the scheme reads them. */
  heads: SiteHeads
  /** The same flow rules as the venturi scheme's (same site, same rules). */
  rules: FlowRules
  /** Electrical rating: full-load power at the design flow, the most head the site gives and 4 °C water, W. */
  rating_W: number
}

/** The baseline at one river flow. */
export interface BaselineFlow {
  riverFlow_m3s: number
  /** Water through the unit: min(what the flow rules allow, design flow), 0 below the kind's least flow. */
  unitFlow_m3s: number
  grossHead_m: number
  netHead_m: number
  /** Turbine efficiency at this share of the design flow. */
  efficiency: number
  power_W: number
}

/** Design flow by the default rule: what the flow rules allow at Q30 of the annual curve (Q30 less the reserved flow, never below 0, with only a hands-off flow; common practice, no source). */
export function defaultDesignFlow(h: SiteHydrology, reserved_m3s: number, rules: FlowRules = handsOffOnly(reserved_m3s)): number {
  const q30 = flowAtExceedance(h.fdc, BASELINE_DEFAULTS.designFlowExceedance.value)
  return Math.max(0, q30 - leftInRiver(rules, q30))
}

/** Resolve the option's baseline at a site: curve, design flow (given, or the default rule), rating. */
export function baselineUnit(input: AssessInput, h: SiteHydrology, reserved_m3s: number, rules: FlowRules = handsOffOnly(reserved_m3s)): BaselineUnit {
  const b = input.option.baseline
  const heads = siteHeads(input.site)
  const designFlow = b.designFlow_m3s ?? defaultDesignFlow(h, reserved_m3s, rules)
  const curve = EFFICIENCY_CURVES[b.kind]
  const unit: BaselineUnit = {
    kind: b.kind, curve, designFlow_m3s: designFlow, designFlowFromRule: b.designFlow_m3s === null,
    headLossFraction: b.headLossFraction, generatorEfficiency: b.generatorEfficiency, reserved_m3s, rules, heads, rating_W: 0,
  }
  // Rated at full load at the most head the site gives and 4 °C water (the densest): no flow or month passes it.
  // With the weir's hydraulics the head varies smoothly with flow: the most it gives over the site's flow curve.
  const H_max = heads.hydraulics === null
    ? Math.max(input.site.grossHead_m, ...heads.table.map((p) => p.head_m))
    : Math.max(...Array.from({ length: 101 }, (_, p) => grossHeadAt(heads, flowAtExceedance(h.fdc, p))))
  const eta = partLoadEfficiency(curve, 1)
  unit.rating_W = eta * waterDensity(4) * G * designFlow * H_max * (1 - b.headLossFraction) * b.generatorEfficiency
  return unit
}

/**
 * The unit at one river flow: Q = min(take allowed by the flow rules, Q_d), H_net = H_gross(river)·(1 − head-loss
 * fraction), P = η(Q/Q_d)·ρ·g·Q·H_net·η_gen (hydropower equation).
 */
export function baselineFlow(u: BaselineUnit, river_m3s: number, tC: number): BaselineFlow {
  const river = Math.max(0, river_m3s)
  const take = Math.max(0, river - leftInRiver(u.rules, river))
  const H = grossHeadAt(u.heads, river)
  const netHead = H * (1 - u.headLossFraction)
  const q = u.designFlow_m3s > 0 ? Math.min(take, u.designFlow_m3s) : 0
  const eta = q > 0 ? partLoadEfficiency(u.curve, q / u.designFlow_m3s) : 0
  const unitFlow = eta > 0 ? q : 0
  return { riverFlow_m3s: river, unitFlow_m3s: unitFlow, grossHead_m: H, netHead_m: netHead, efficiency: eta, power_W: baselinePower(u, river_m3s, waterDensity(tC)) }
}

/** baselineFlow's power, W, in water of density `rho`, without building its record: the energy integral asks it once a day of the record. */
function baselinePower(u: BaselineUnit, river_m3s: number, rho: number): number {
  const river = Math.max(0, river_m3s)
  const take = Math.max(0, river - leftInRiver(u.rules, river))
  const q = u.designFlow_m3s > 0 ? Math.min(take, u.designFlow_m3s) : 0
  const eta = q > 0 ? partLoadEfficiency(u.curve, q / u.designFlow_m3s) : 0
  if (!(eta > 0)) return 0
  const netHead = grossHeadAt(u.heads, river) * (1 - u.headLossFraction)
  return eta * rho * G * q * netHead * u.generatorEfficiency
}

/** Oxygen below the weir at one flow, without any scheme and with the baseline, mg/L. */
export interface BaselineOxygen {
  without_mgL: number
  /** The water still falling over the weir beside the unit, after its fall. */
  weirStream_mgL: number
  with_mgL: number
  netGain_mgL: number
}

/**
 * The baseline's water passes the unit at upstream oxygen and misses the weir's aeration (ENGINE.md
 * §11); the rest falls over the weir with the site's deficit ratio for that smaller overfall; the two
 * streams mix (flow-weighted). Without a scheme the whole river falls over the weir. At a weir the
 * whole river would drown, the smaller overfall may run free and aerate more: the weir model counts
 * that for the baseline exactly as it does for the venturi scheme's weir stream, and it can outweigh
 * the unit's loss (a net gain that comes from the weir, not from the unit).
 */
export function baselineOxygen(site: AssessInput['site'], p_atm: number, f: BaselineFlow, c: Conditions, without_mgL?: number): BaselineOxygen {
  if (!(f.riverFlow_m3s > 0)) return { without_mgL: c.upstreamO2_mgL, weirStream_mgL: c.upstreamO2_mgL, with_mgL: c.upstreamO2_mgL, netGain_mgL: 0 }
  const cs = oxygenSaturation(c.tC, p_atm, site.salinity_gkg)
  // without any scheme the whole river falls over the weir: the scheme's state at this flow has it already when given
  const without = without_mgL ?? downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, weirDeficitRatio(site, f.riverFlow_m3s, f.grossHead_m, c.tC))
  if (!(f.unitFlow_m3s > 0)) return { without_mgL: without, weirStream_mgL: without, with_mgL: without, netGain_mgL: 0 }
  const overWeir = f.riverFlow_m3s - f.unitFlow_m3s
  const weirStream = overWeir > 0 ? downstreamFromDeficitRatio(cs, c.upstreamO2_mgL, weirDeficitRatio(site, overWeir, f.grossHead_m, c.tC, f.riverFlow_m3s)) : c.upstreamO2_mgL
  const withUnit = mixTwoStreams(f.unitFlow_m3s, c.upstreamO2_mgL, overWeir, weirStream, c.upstreamO2_mgL)
  return { without_mgL: without, weirStream_mgL: weirStream, with_mgL: withUnit, netGain_mgL: withUnit - without }
}

/** Power of the baseline at a flow and month (1–12), W, at that month's water temperature. */
function powerAtOf(u: BaselineUnit, months: readonly Conditions[], annual: Conditions): PowerAt {
  // water density by month (index 0: the year's mean conditions), worked out once
  const rho = [annual, ...months].map((c) => waterDensity(c.tC))
  return (flow, month) => baselinePower(u, flow, rho[month] ?? (rho[0] as number))
}

/**
 * Annual energy of the baseline by the venturi scheme's own integrals: a record sums its days
 * (annualEnergyFromSample); a curve site integrates each month's curve over the month's hours
 * (annualEnergyFromFdc with the twelve month curves, the midpoint rule on the same 2000-cell grid), and
 * the year is the sum of its months, as year.ts does for the scheme. Power is cheap here (one table
 * look-up), so it is evaluated exactly rather than tabulated.
 */
export function baselineEnergy(u: BaselineUnit, h: SiteHydrology, curves: readonly MonthCurve[], months: readonly Conditions[], annual: Conditions, availability: number): AnnualEnergy {
  const power = powerAtOf(u, months, annual)
  if (h.record) return annualEnergyFromSample(h.record.sample, power, { rating_W: u.rating_W, availability, memoise: false })
  const byCurve = annualEnergyFromFdc(h.fdc, power, { rating_W: u.rating_W, availability, monthlyFdcs: curves.map((c) => c.curve) })
  const energyByMonth_MWh = byCurve.energyByMonth_MWh.map((e) => e ?? 0)
  const annualEnergy_MWh = energyByMonth_MWh.reduce((a, b) => a + b, 0)
  return { annualEnergy_MWh, energyByMonth_MWh, ...loadFigures(annualEnergy_MWh, u.rating_W, 8760), hoursPerYear: 8760 }
}

/**
 * Time-weighted mean net oxygen change of the baseline over the year, judged at the same flows as the
 * scheme's year (its states: YEAR_GRID_CELLS a month, each a month's share of the year); the oxygen
 * below the weir without any scheme at each of them is the scheme's own figure there.
 */
function meanNetGain(u: BaselineUnit, site: AssessInput['site'], p_atm: number, states: YearStates, months: readonly Conditions[]): number {
  let mean = 0
  states.forEach((monthStates, k) => {
    const c = months[k] as Conditions
    const w = (DAYS_IN_MONTH[k] ?? 30) / 365 / monthStates.length
    for (const f of monthStates) mean += baselineOxygen(site, p_atm, baselineFlow(u, f.riverFlow_m3s, c.tC), c, f.oxygen.withoutScheme_mgL).netGain_mgL * w
  })
  return mean
}

/** What the stage needs from the scheme's run. */
export interface BaselineContext {
  input: AssessInput
  h: SiteHydrology
  reserved_m3s: number
  /** The venturi scheme's flow rules (default: the hands-off flow reserved_m3s only). */
  rules?: FlowRules
  curves: readonly MonthCurve[]
  months: readonly Conditions[]
  annual: Conditions
  /** The month table's flow for each month, January first (the scheme's worst-month figure is read there). */
  monthFlows_m3s: readonly number[]
  /** The venturi scheme's own annual energy and time-weighted mean net oxygen change. */
  venturi: { annualEnergy_MWh: number, meanNetGain_mgL: number }
  /** The states the scheme's year was judged at (year.ts): the baseline is judged at the same flows. */
  states: YearStates
}

const finiteOrNull = (x: number): number | null => (Number.isFinite(x) ? x : null)

/** The conventional baseline beside the venturi scheme: its energy, oxygen and money, and what the scheme gives up for the river. */
export function assessBaseline(ctx: BaselineContext): BaselineResult {
  const { input, h, curves, months, annual } = ctx
  const st = input.settings
  const b = input.option.baseline
  const u = baselineUnit(input, h, ctx.reserved_m3s, ctx.rules ?? handsOffOnly(ctx.reserved_m3s))
  const p_atm = isaPressure(input.site.altitude_m)
  const energy = baselineEnergy(u, h, curves, months, annual, st.availability)
  const meanGain = meanNetGain(u, input.site, p_atm, ctx.states, months)
  const worstMonth = Math.min(...ctx.monthFlows_m3s.map((q, m) => {
    const c = months[m] ?? annual
    return baselineOxygen(input.site, p_atm, baselineFlow(u, q, c.tC), c).netGain_mgL
  }))

  const rating_kW = u.rating_W / 1000
  const pricePerKw = b.costs.ratedPowerPrice ?? BASELINE_PRICE_PER_KW[b.kind].value
  const capex = b.costs.fixedCost + pricePerKw * rating_kW
  const opex = annualOpex(capex, st.opexFraction)
  const e = energy.annualEnergy_MWh

  const givenUp = e - ctx.venturi.annualEnergy_MWh
  const oxygenGained = ctx.venturi.meanNetGain_mgL - meanGain
  const designHead = grossHeadAt(u.heads, riverForTake(u.rules, u.designFlow_m3s))
  return {
    kind: b.kind,
    kindLabel: BASELINE_KIND_LABEL[b.kind],
    designFlow_m3s: u.designFlow_m3s,
    designFlowBasis: u.designFlowFromRule ? BASELINE_DEFAULTS.designFlowExceedance.source : 'given with the option',
    ratedPower_kW: rating_kW,
    annualEnergy_MWh: e,
    capacityFactor: energy.capacityFactor,
    meanNetOxygenGain_mgL: meanGain,
    worstMonthNetOxygenGain_mgL: Number.isFinite(worstMonth) ? worstMonth : 0,
    capex,
    ratedPowerPrice: pricePerKw,
    ratedPowerPriceSource: b.costs.ratedPowerPrice === null ? BASELINE_PRICE_PER_KW[b.kind].source : 'given with the option',
    capexCrossCheck_usd2014: ornlInstalledCost_usd2014(rating_kW, designHead),
    annualOpex: opex,
    lcoe: lcoe(capex, opex, e, st.discountRate, st.life_yr),
    npv: npv(capex, opex, e, st.exportPrice, st.discountRate, st.life_yr),
    simplePayback_yr: simplePayback(capex, opex, e, st.exportPrice),
    energyGivenUp_MWh: givenUp,
    oxygenGainedOverBaseline_mgL: oxygenGained,
    oxygenPerMWhGivenUp: givenUp > 0 ? finiteOrNull(oxygenGained / givenUp) : null,
    energyGivenUpPerMgL: givenUp > 0 && oxygenGained > 0 ? finiteOrNull(givenUp / oxygenGained) : null,
    curveSource: u.curve.source,
    curve: u.curve.points.map((p) => ({ ...p })),
    basis: `A ${BASELINE_KIND_LABEL[b.kind]} at the same weir takes what the flow rules allow above the hands-off flow, up to its design flow, `
      + `at the gross head less ${(b.headLossFraction * 100).toFixed(0)} % for losses; it stops below ${Math.round((u.curve.points[0]?.flowFraction ?? 0) * 100)} % of its design flow. `
      + 'P = η(Q/Q_d)·ρ·g·Q·H_net·η_gen, with the same availability and the same days or month curves as the scheme; it runs every month. '
      + 'Its water passes the unit at the upstream oxygen and misses the weir\'s aeration; the rest falls over the weir as the site\'s weir model says, and the two mix.',
  }
}

/** The one-line figures of a stored result's baseline, or null for a result stored before it. */
export function baselineLineOf(result: Pick<AssessResult, 'baseline' | 'summary'>): BaselineLine | null {
  const b = result.baseline
  if (!b) return null
  return {
    kindLabel: b.kindLabel, annualEnergy_MWh: b.annualEnergy_MWh, schemeEnergy_MWh: result.summary.annualEnergy_MWh,
    energyGivenUp_MWh: b.energyGivenUp_MWh, oxygenGainedOverBaseline_mgL: b.oxygenGainedOverBaseline_mgL,
  }
}
