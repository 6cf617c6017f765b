// Design sweep: throat diameter × number of units × submergence, and the best option that keeps every
// safety flag and the river's oxygen caution clear.
import type { AssessInput, SweepGrid } from '../schemas/assess'
import { assess } from './assess'
import type { FlagId } from './results'
import { EngineInputError } from './errors'

/** One point of a sweep. */
export interface SweepPoint {
  throatDiameter_m: number
  outletDiameter_m: number
  units: number
  throatDepth_m: number
  annualEnergy_MWh: number
  capacityFactor: number
  ratedPower_kW: number
  minCavitationMargin_m: number | null
  netOxygenGainSummerLowFlow_mgL: number
  /** Time-weighted mean net oxygen change over the year, mg/L. */
  meanNetOxygenGain_mgL: number
  /** Worst net oxygen change at any flow of the year, mg/L. */
  worstNetOxygenGain_mgL: number
  maxUnitTotalDissolvedGas: number
  lcoe: number | null
  /** Flags raised at this point. */
  raisedFlags: FlagId[]
  /** No safety flag raised. */
  safe: boolean
  /** No safety flag and no river caution (net oxygen loss beyond the acceptable one) raised. */
  acceptable: boolean
}

/** Result of a sweep. */
export interface SweepResult {
  points: SweepPoint[]
  /** Most annual energy among the acceptable points (ties: more mean net oxygen); null if none. */
  best: SweepPoint | null
  reason: string
}

/** Replace the throat diameter (outlet scaled to keep the area ratio), units and submergence of an input. */
export function withDesign(input: AssessInput, throatDiameter_m: number, units: number, throatDepth_m: number): AssessInput {
  const scale = throatDiameter_m / input.option.throatDiameter_m
  if (!Number.isFinite(input.option.outletDiameter_m * scale)) {
    throw new EngineInputError('option.throatDiameter_m', 'is too small to scale the outlet from for the sweep')
  }
  return {
    ...input,
    option: {
      ...input.option,
      throatDiameter_m,
      outletDiameter_m: input.option.outletDiameter_m * scale,
      diffuserLength_m: input.option.diffuserLength_m === undefined ? undefined : input.option.diffuserLength_m * scale,
      units,
      throatDepth_m,
    },
  }
}

/** Run assess over every grid point and pick the best option that keeps every safety flag clear. */
export function sweep(input: AssessInput, grid: SweepGrid): SweepResult {
  const points: SweepPoint[] = []
  for (const dt of grid.throatDiameters_m) {
    for (const n of grid.units) {
      for (const depth of grid.throatDepths_m) {
        const run = withDesign(input, dt, n, depth)
        const r = assess(run, { compareModes: false }).summary
        const raised = r.flags.filter((f) => f.raised)
        points.push({
          throatDiameter_m: dt, outletDiameter_m: run.option.outletDiameter_m, units: n, throatDepth_m: depth,
          annualEnergy_MWh: r.annualEnergy_MWh, capacityFactor: r.capacityFactor, ratedPower_kW: r.ratedPower_kW,
          minCavitationMargin_m: r.minCavitationMargin_m, netOxygenGainSummerLowFlow_mgL: r.netOxygenGainSummerLowFlow_mgL,
          meanNetOxygenGain_mgL: r.meanNetOxygenGain_mgL, worstNetOxygenGain_mgL: r.worstNetOxygenGain_mgL,
          maxUnitTotalDissolvedGas: r.maxUnitTotalDissolvedGas, lcoe: r.lcoe,
          raisedFlags: raised.map((f) => f.id), safe: raised.every((f) => f.level !== 'safety'),
          acceptable: raised.every((f) => f.level !== 'safety' && f.level !== 'river'),
        })
      }
    }
  }
  const best = bestPoint(points)
  return { points, best, reason: sweepReason(points, best) }
}

/** Most annual energy among the acceptable points that make energy (ties: more mean net oxygen); null if none. */
export function bestPoint(points: readonly SweepPoint[]): SweepPoint | null {
  return points.filter((p) => p.acceptable && p.annualEnergy_MWh > 0).reduce<SweepPoint | null>((b, p) => {
    if (b === null) return p
    if (p.annualEnergy_MWh > b.annualEnergy_MWh) return p
    if (p.annualEnergy_MWh === b.annualEnergy_MWh && p.meanNetOxygenGain_mgL > b.meanNetOxygenGain_mgL) return p
    return b
  }, null)
}

/** Why the best point is the best, or why no point qualifies. */
export function sweepReason(points: readonly SweepPoint[], best: SweepPoint | null): string {
  return best ? bestReason(points, points.filter((p) => p.acceptable && p.annualEnergy_MWh > 0).length, best) : noneReason(points)
}

function bestReason(points: readonly SweepPoint[], qualifying: number, best: SweepPoint): string {
  return `Of ${points.length} options, ${qualifying} make energy with every safety flag clear and cost the river no more oxygen than is acceptable; the best makes ${best.annualEnergy_MWh.toFixed(1)} MWh a year.`
}

/** Why no point qualifies: how many are stopped by each cause, most common first. */
function noneReason(points: readonly SweepPoint[]): string {
  const causes: Array<[string, number]> = [
    ['make no energy', points.filter((p) => !(p.annualEnergy_MWh > 0)).length],
    ['could cavitate', points.filter((p) => p.raisedFlags.includes('cavitation')).length],
    ['supersaturate the water with gas', points.filter((p) => p.raisedFlags.includes('gas-supersaturation')).length],
    ['push or keep the river below its oxygen target', points.filter((p) => p.raisedFlags.includes('scheme-below-target')).length],
    ['cost the river more oxygen than is acceptable', points.filter((p) => p.raisedFlags.includes('net-oxygen-loss')).length],
  ]
  const named = causes.filter(([, n]) => n > 0).sort((a, b) => b[1] - a[1]).map(([what, n]) => `${n} ${what}`)
  return `None of the ${points.length} options qualifies: ${named.join('; ')}. Options may fall under more than one cause. Running the units river first, or closing the months concerned, may leave an acceptable option.`
}
