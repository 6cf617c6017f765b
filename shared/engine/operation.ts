// The operating rule: which units run at one river flow and month, at what head, and why the rest
// stay shut. Pure hydraulics of level control here; the air, power and river checks a candidate must
// pass are handed in by the caller (schemeKernel.ts), which has the unit physics and the oxygen.

/** How the units are run: energy first (every unit that can run does), or river first (never at the river's cost). */
export type OperatingMode = 'energy-first' | 'river-first'

/** Operating state of the units at one river flow. */
export type Regime =
  /** No unit runs (see ShutReason). */
  | 'stopped'
  /** The running units pass their full capacity at the ordinary head-pool level; the rest spills over the weir. */
  | 'spilling'
  /** The running units take all the flow that may be taken, the head pool held within its allowed drawdown. */
  | 'taking-all'

/** Why no unit (or one unit fewer than the water allows) runs at a flow. */
export type ShutReason =
  | 'no-head'
  | 'too-little-flow'
  | 'no-suction'
  | 'below-cut-in'
  | 'closed-month'
  | 'river-first'

/** How one river flow is shared between the reserved flow, the units and the spill. */
export interface FlowSplit {
  regime: Regime
  unitsRunning: number
  /** Flow through each running unit, m³/s. */
  unitFlow_m3s: number
  /** Working head of each running unit, m (the gross head, or a little less when the pool is drawn within its allowance). */
  workingHead_m: number
  /** Flow over the weir beyond the reserved flow, m³/s: it falls the full gross head. */
  spill_m3s: number
  /** Flow the flow rules leave in the river (the reserved, hands-off flow with no other rule; ≤ river flow), m³/s: it falls the full gross head. */
  reserved_m3s: number
  /** Why units that the water could feed stay shut; null when every unit the water can feed runs. */
  shutReason: ShutReason | null
}

/** A way the units could run at one flow, most units first. */
export interface Candidate {
  regime: Exclude<Regime, 'stopped'>
  units: number
  unitFlow_m3s: number
  workingHead_m: number
  spill_m3s: number
}

/** What level control needs of the unit: its capacity at a head, and the head a unit flow needs. */
export interface UnitCurve {
  /** Q_cap(H), m³/s. */
  capacityAt: (head_m: number) => number
  /** H_w(Q_u), m. */
  headFor: (unitFlow_m3s: number) => number
}

/** Inputs of level control at one flow. */
export interface LevelControlInput {
  riverFlow_m3s: number
  reservedFlow_m3s: number
  grossHead_m: number
  units: number
  allowedDrawdown_m: number
}

/** The verdict of the caller's checks on one candidate: null to run it, or why it stays shut. */
export type CandidateCheck = (c: Candidate) => ShutReason | null

/**
 * The split at one flow under level control: the head pool is held within the allowed drawdown Δz of
 * its ordinary level, so a unit runs only at a working head H_w ≥ H − Δz, where it passes
 * Q_cap(H_w) ≥ Q_cap(H − Δz). Units open one at a time while each can be fed at that level. With n
 * units fed at the full head (n·Q_cap(H) ≤ Q_take) the rest spills; with one unit more than that, the
 * units take all of Q_take at a working head between H − Δz and H. No candidate draws the pool further
 * (operating practice of run-of-river plant, common practice, no source).
 *
 * The candidates, most units first, go to `check` one by one in a single record rewritten for each
 * (read it during the call, keep nothing: this runs thousands of times an assessment); the first that
 * passes runs, else the units stop with the reason the last one failed. A closed month shuts every unit.
 */
export function operate(i: LevelControlInput, curve: UnitCurve, closed: boolean, check: CandidateCheck): FlowSplit {
  const river = Math.max(0, i.riverFlow_m3s)
  const reserved_m3s = Math.min(river, Math.max(0, i.reservedFlow_m3s))
  const take = river - reserved_m3s
  const N = Math.max(0, Math.floor(i.units))
  const H = Math.max(0, i.grossHead_m)
  const capFull = curve.capacityAt(H)
  if (!(i.grossHead_m > 0) || !(curve.capacityAt(i.grossHead_m) > 0)) return stopped('no-head', take, reserved_m3s)
  if (!(capFull > 0) || N === 0 || !(take > 0)) return stopped('too-little-flow', take, reserved_m3s)
  const low = H - Math.max(0, i.allowedDrawdown_m)
  const capLow = low > 0 ? curve.capacityAt(low) : 0
  const nFull = Math.min(N, Math.floor(take / capFull))
  const nLow = capLow > 0 ? Math.min(N, Math.floor(take / capLow)) : N
  if (nLow <= nFull && nFull <= 0) return stopped('too-little-flow', take, reserved_m3s)
  if (closed) return stopped('closed-month', take, reserved_m3s)
  const c = scratch
  let reason: ShutReason | null = null
  for (let n = nLow; n > nFull; n--) {
    const q = take / n
    c.regime = 'taking-all'
    c.units = n
    c.unitFlow_m3s = q
    c.workingHead_m = Math.min(H, curve.headFor(q))
    c.spill_m3s = 0
    const verdict = check(c)
    if (verdict === null) return running(c, reserved_m3s, reason)
    reason = verdict
  }
  for (let n = nFull; n > 0; n--) {
    c.regime = 'spilling'
    c.units = n
    c.unitFlow_m3s = capFull
    c.workingHead_m = H
    c.spill_m3s = take - n * capFull
    const verdict = check(c)
    if (verdict === null) return running(c, reserved_m3s, reason)
    reason = verdict
  }
  return stopped(reason ?? 'too-little-flow', take, reserved_m3s)
}

/** The one candidate record operate rewrites (engine code runs on one thread at a time). */
const scratch: Candidate = { regime: 'spilling', units: 0, unitFlow_m3s: 0, workingHead_m: 0, spill_m3s: 0 }

function stopped(shutReason: ShutReason, take_m3s: number, reserved_m3s: number): FlowSplit {
  return { regime: 'stopped', unitsRunning: 0, unitFlow_m3s: 0, workingHead_m: 0, spill_m3s: take_m3s, reserved_m3s, shutReason }
}

function running(c: Candidate, reserved_m3s: number, shutReason: ShutReason | null): FlowSplit {
  return { regime: c.regime, unitsRunning: c.units, unitFlow_m3s: c.unitFlow_m3s, workingHead_m: c.workingHead_m, spill_m3s: c.spill_m3s, reserved_m3s, shutReason }
}
