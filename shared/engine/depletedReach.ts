// The depleted reach (ENGINE.md §13): the water left over the weir (everything not through running
// units) set against the river itself, as flow-duration curves, and the days a year the river below
// the weir runs at the hands-off (and pass) flow only. Read from the states the year is judged at
// (year.ts: each month's curve at YEAR_GRID_CELLS flows), each weighted by its share of the year as
// the year's flags are, so it needs no pass of its own.
import type { FlowRulesSetting } from '../schemas/flowRules'
import { DAYS_IN_MONTH } from './energy'
import { atHandsOffOnly, type FlowRules } from './flowRules'
import type { DepletedReach } from './results'
import type { YearStates } from './year'

/** Exceedances (% of time) the two curves are given at. */
export const DEPLETED_REACH_EXCEEDANCES = [1, 5, 10, 20, 30, 40, 50, 60, 70, 80, 90, 95, 99] as const

/**
 * The flow equalled or exceeded `p` % of the time among weighted values sorted by falling value
 * (the first whose running share of the weight reaches p; a step curve, so a set of flows each no
 * larger than another's, cell by cell, never gives a larger figure).
 */
function exceededFor(sorted: Float64Array, weights: Float64Array, order: Uint32Array, total: number, p: number): number {
  const target = (p / 100) * total
  let cum = 0
  for (let j = 0; j < order.length; j++) {
    const i = order[j] as number
    cum += weights[i] as number
    if (cum >= target) return sorted[i] as number
  }
  return order.length ? (sorted[order[order.length - 1] as number] as number) : 0
}

/** A weighted flow-duration curve at DEPLETED_REACH_EXCEEDANCES. */
function weightedCurve(values: Float64Array, weights: Float64Array, total: number): number[] {
  const order = Uint32Array.from(values.keys()).sort((a, b) => (values[b] as number) - (values[a] as number))
  return DEPLETED_REACH_EXCEEDANCES.map((p) => exceededFor(values, weights, order, total, p))
}

/** The depleted reach of a scheme run over the year under its flow rules. */
export function depletedReach(setting: FlowRulesSetting, rules: FlowRules, states: YearStates): DepletedReach {
  const n = states.reduce((s, m) => s + m.length, 0)
  const natural = new Float64Array(n)
  const left = new Float64Array(n)
  const weights = new Float64Array(n)
  let total = 0
  let handsOffShare = 0
  let i = 0
  states.forEach((monthStates, k) => {
    const w = (DAYS_IN_MONTH[k] ?? 30) / 365 / (monthStates.length || 1)
    for (const f of monthStates) {
      const river = f.riverFlow_m3s
      // Never above the river (rounding aside) and never below nothing.
      const over = Math.min(river, Math.max(0, f.reserved_m3s + f.spill_m3s))
      natural[i] = river
      left[i] = over
      weights[i] = w
      total += w
      if (f.unitsRunning > 0 && atHandsOffOnly(rules, river, over)) handsOffShare += w
      i++
    }
  })
  const nat = weightedCurve(natural, weights, total)
  const dep = weightedCurve(left, weights, total)
  return {
    preset: setting.preset,
    handsOff_m3s: rules.handsOff_m3s,
    passFlow_m3s: rules.pass_m3s,
    maxTake_m3s: Number.isFinite(rules.maxTake_m3s) ? rules.maxTake_m3s : null,
    keptShare_pct: rules.keptShare * 100,
    curve: DEPLETED_REACH_EXCEEDANCES.map((p, j) => ({ exceedance: p, natural_m3s: nat[j] ?? 0, withScheme_m3s: dep[j] ?? 0 })),
    annualHandsOffOnly_d: total > 0 ? (handsOffShare / total) * 365 : 0,
    basis: `Read from the ${n} flows the year is judged at (each month's curve, each flow weighted by its share of the year), `
      + 'with the units always available: the flow over the weir is everything not through running units. '
      + 'Days at the hands-off flow only count the time the units take all the rules allow, leaving the hands-off and pass flows alone below the weir.',
  }
}
