// The flow-rules stage (ENGINE.md §8 step 1, §13): what the scheme may take from the river at each
// flow, as a regulator sets it. Hands-off flow Q_hof (the reserved flow, hydrology.ts), a fish- or
// eel-pass flow Q_pass that always passes, a share of the flow above both that stays in the river,
// and a maximum take Q_max. What is not taken stays in the river and falls the weir's full height, as
// the reserved flow always has; level control (operation.ts) works on what may be taken.
import type { FlowRulesSetting } from '../schemas/flowRules'
import { checkNumber } from './errors'
import type { Fdc } from './hydrology'

/** Flow rules resolved against a site's hydrology, m³/s. */
export interface FlowRules {
  /** Hands-off flow Q_hof. */
  readonly handsOff_m3s: number
  /** Fish- or eel-pass flow Q_pass. */
  readonly pass_m3s: number
  /** Q_hof + Q_pass: below it nothing is taken. */
  readonly base_m3s: number
  /** Maximum take Q_max (Infinity: no cap). */
  readonly maxTake_m3s: number
  /** Share of the flow above base_m3s that stays in the river, 0–1. */
  readonly keptShare: number
  /** True when any rule beyond the hands-off flow is set (a cap, a kept share or a pass flow). */
  readonly beyondHandsOff: boolean
}

/** Rules with nothing beyond a hands-off flow: the scheme may take everything above it. */
export function handsOffOnly(handsOff_m3s: number): FlowRules {
  return { handsOff_m3s, pass_m3s: 0, base_m3s: handsOff_m3s, maxTake_m3s: Infinity, keptShare: 0, beyondHandsOff: false }
}

/** Resolve a site's rules: Q_max fixed, or k × the mean flow of the annual curve `fdc`. */
export function resolveFlowRules(setting: FlowRulesSetting, handsOff_m3s: number, fdc: Fdc): FlowRules {
  const pass = checkNumber(setting.passFlow_m3s, 'flowRules.passFlow_m3s', { min: 0 })
  const kept = checkNumber(setting.keptShare_pct, 'flowRules.keptShare_pct', { min: 0, max: 100 }) / 100
  const m = setting.maxTake
  const maxTake = m.kind === 'fixed'
    ? checkNumber(m.flow_m3s, 'flowRules.maxTake.flow_m3s', { min: 0 })
    : m.kind === 'mean-multiple' ? checkNumber(m.multiple, 'flowRules.maxTake.multiple', { min: 0 }) * fdc.meanFlow : Infinity
  // With nothing beyond the hands-off flow, base is Q_hof itself (not Q_hof + 0), so old figures stay bit for bit.
  const base = pass > 0 ? handsOff_m3s + pass : handsOff_m3s
  return { handsOff_m3s, pass_m3s: pass, base_m3s: base, maxTake_m3s: maxTake, keptShare: kept, beyondHandsOff: pass > 0 || kept > 0 || maxTake < Infinity }
}

/**
 * The flow that stays in the river at river flow Q (all of it below Q_hof + Q_pass), m³/s:
 * Q − take(Q) with take(Q) = min(Q_max, (1 − kept)·max(0, Q − Q_hof − Q_pass)). Runs once per flow in
 * the inner loop, so it builds nothing; with only a hands-off flow it is exactly min(Q, Q_hof).
 */
export function leftInRiver(r: FlowRules, river_m3s: number): number {
  const base = r.base_m3s
  if (!(river_m3s > base)) return river_m3s
  const above = river_m3s - base
  if (r.keptShare === 0 && !(above > r.maxTake_m3s)) return base
  const take = Math.min(r.maxTake_m3s, (1 - r.keptShare) * above)
  return river_m3s - take
}

/** The flow the scheme may take at river flow Q, m³/s (see leftInRiver). */
export function takeAllowed(r: FlowRules, river_m3s: number): number {
  const q = Math.max(0, river_m3s)
  return q - leftInRiver(r, q)
}

/**
 * The least river flow at which the rules allow `take_m3s`, m³/s: Q_hof + Q_pass + take/(1 − kept).
 * Past Q_max (or with everything kept) no flow allows it: the flow at which the take stops rising.
 */
export function riverForTake(r: FlowRules, take_m3s: number): number {
  if (!(r.keptShare < 1)) return r.base_m3s
  const t = Math.min(take_m3s, r.maxTake_m3s)
  return r.keptShare === 0 ? t + r.base_m3s : r.base_m3s + t / (1 - r.keptShare)
}

/** Whether, at river flow Q, the flow below the weir is held at Q_hof + Q_pass only (the units take all the rules allow, to the last drop above it). */
export function atHandsOffOnly(r: FlowRules, river_m3s: number, overWeir_m3s: number): boolean {
  return river_m3s > r.base_m3s && overWeir_m3s <= r.base_m3s * (1 + 1e-9) + 1e-12
}
